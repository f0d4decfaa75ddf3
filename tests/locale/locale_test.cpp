// The application's number fields under a comma locale (de_DE): a German
// engineer types "80,5 degC", the worksheet stores and solves "80.5 degC"
// exactly as a file would, and fields show the stored value with a comma.
// Files and the command line keep the point whatever the locale.
#include <QtTest>

#include "heatchain/project_file.hpp"
#include "heatchain/units.hpp"
#include "locale_decimal.hpp"
#include "main_window.hpp"
#include "quantity_field.hpp"
#include "step_editor.hpp"

using namespace heatchain;
using heatchain::gui::fromLocaleDecimal;
using heatchain::gui::QuantityField;
using heatchain::gui::toLocaleDecimal;

namespace {

// The field's check as the step editor does it: core's parser, nothing else.
QString checkTemperature(const QString& text) {
    auto v = parseQuantity(text.toStdString(), Dimension::Temperature);
    return v ? QString() : QString::fromStdString(v.error().message);
}

}  // namespace

class LocaleTest : public QObject {
    Q_OBJECT
private slots:
    void init() { QLocale::setDefault(QLocale(QLocale::German, QLocale::Germany)); }
    void cleanup() { QLocale::setDefault(QLocale::c()); }

    void conversionBothWays() {
        const QLocale de(QLocale::German, QLocale::Germany);
        QCOMPARE(de.decimalPoint(), QStringLiteral(","));
        QCOMPARE(fromLocaleDecimal(QStringLiteral("80,5 degC"), de), QStringLiteral("80.5 degC"));
        QCOMPARE(fromLocaleDecimal(QStringLiteral("-0,25 bar"), de), QStringLiteral("-0.25 bar"));
        QCOMPARE(fromLocaleDecimal(QStringLiteral(",5"), de), QStringLiteral(".5"));
        QCOMPARE(fromLocaleDecimal(QStringLiteral("1,5e3 kPa"), de), QStringLiteral("1.5e3 kPa"));
        // Typed with the file's point: kept. Units and stray commas: untouched.
        QCOMPARE(fromLocaleDecimal(QStringLiteral("80.5 degC"), de), QStringLiteral("80.5 degC"));
        QCOMPARE(fromLocaleDecimal(QStringLiteral("2,3 kJ/(kg K)"), de), QStringLiteral("2.3 kJ/(kg K)"));
        QCOMPARE(fromLocaleDecimal(QStringLiteral("80, 5 degC"), de), QStringLiteral("80, 5 degC"));
        QCOMPARE(toLocaleDecimal(QStringLiteral("80.5 degC"), de), QStringLiteral("80,5 degC"));
        QCOMPARE(toLocaleDecimal(QStringLiteral("1.5e3 kPa"), de), QStringLiteral("1,5e3 kPa"));
        QCOMPARE(toLocaleDecimal(QStringLiteral("6 barg"), de), QStringLiteral("6 barg"));
        // A point locale changes nothing, and a comma stays an error there.
        const QLocale us(QLocale::English, QLocale::UnitedStates);
        QCOMPARE(fromLocaleDecimal(QStringLiteral("80,5 degC"), us), QStringLiteral("80,5 degC"));
        QCOMPARE(toLocaleDecimal(QStringLiteral("80.5 degC"), us), QStringLiteral("80.5 degC"));
    }

    void fieldTakesTheCommaAndCommitsThePoint() {
        QuantityField f;
        f.setCheck(checkTemperature);
        f.showValue(QStringLiteral("78 degC"));
        QSignalSpy committed(&f, &QuantityField::committed);
        f.lineEdit()->setText(QStringLiteral("80,5 degC"));
        f.commit();
        QVERIFY2(!f.hasError(), qPrintable(f.errorText()));
        QCOMPARE(committed.count(), 1);
        QCOMPARE(committed.at(0).at(0).toString(), QStringLiteral("80.5 degC"));
        QCOMPARE(f.text(), QStringLiteral("80.5 degC"));
        // The stored value comes back shown with the locale's comma.
        f.showValue(QStringLiteral("92.25 degC"));
        QCOMPARE(f.lineEdit()->text(), QStringLiteral("92,25 degC"));
        // Unchanged text (shown with a comma) is not committed again.
        f.commit();
        QCOMPARE(committed.count(), 1);
        // A malformed number is refused with core's reason and not committed.
        f.lineEdit()->setText(QStringLiteral("80,,5 degC"));
        f.commit();
        QVERIFY(f.hasError());
        QCOMPARE(committed.count(), 1);
    }

    void worksheetStoresAndSolvesThePoint() {
        gui::MainWindow w;
        w.setInteractive(false);
        auto base = loadProject(std::string(HEATCHAIN_SOURCE_DIR) + "/sample-projects/melt-tank.hchain");
        QVERIFY(base.ok());
        w.document()->reset(*base);
        w.document()->setSelectedStep(2);  // "to-pouring", heat to 78 degC
        auto* target = w.editor()->field(QStringLiteral("target"));
        QCOMPARE(target->lineEdit()->text(), QStringLiteral("78 degC"));
        target->lineEdit()->setText(QStringLiteral("80,5 degC"));
        target->commit();
        QVERIFY2(!target->hasError(), qPrintable(target->errorText()));
        const Project& p = w.document()->project();
        QCOMPARE(QString::fromStdString(p.steps[2].to.T->text), QStringLiteral("80.5 degC"));
        // The file written from the worksheet carries the point.
        const std::string file = writeProject(p);
        QVERIFY(file.find("\"80.5 degC\"") != std::string::npos);
        QVERIFY(file.find("80,5") == std::string::npos);
        // 80.5 degC = 353.65 K (Celsius offset 273.15 K, exact by definition).
        const auto& r = w.document()->result();
        QVERIFY(r.steps.size() > 2 && !r.steps[2].error);
        QVERIFY(std::fabs(r.steps[2].end.T - 353.65) < 1e-9);
    }
};

QTEST_MAIN(LocaleTest)
#include "locale_test.moc"
