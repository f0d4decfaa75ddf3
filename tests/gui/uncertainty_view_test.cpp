// How sure, on screen: the ledger's ± columns, the bands on the T–Q and T–s
// charts, the contributions chart, and tolerances typed in the step panel.
// Expected values are the GUM's analytic combination (JCGM 100:2008, eq. 10)
// for Q = m·cp·ΔT of an invented constant-cp test liquid, where first order
// is exact.
#include <QAction>
#include <QApplication>
#include <QLineEdit>
#include <QSettings>
#include <QStandardPaths>
#include <QTableView>
#include <QtTest>
#include <cmath>

#include "heatchain/project_file.hpp"
#include "heatchain_view/format.hpp"
#include "ledger_model.hpp"
#include "main_window.hpp"

using namespace heatchain;
using heatchain::gui::LedgerModel;
using heatchain::gui::MainWindow;

namespace {

// Invented test liquid (test data, not a real material), constant cp.
constexpr const char* kSheet = R"json({
  "format": "heatchain-project", "version": 1, "meta": { "title": "tolerances" },
  "system": "steady-flow", "model": "constant-cp",
  "substance": { "id": "test-liquid", "name": "Test liquid", "molarMass": "0.030 kg/mol",
                 "source": "invented test data",
                 "phases": { "liquid": { "cp": "4.0 kJ/(kg K)" }, "vapor": { "cp": "1.5 kJ/(kg K)" } },
                 "boiling": { "T": "450 K", "P": "1 atm", "enthalpy": "1200 kJ/kg" } },
  "basis": { "massFlow": "2 kg/s" }, "surroundings": { "T": "25 degC", "P": "1 atm" },
  "start": { "T": "20 degC ± 0.5 K", "P": "3 bar" },
  "steps": [
    { "id": "warm", "kind": "heat", "to": { "T": "50 degC" } },
    { "id": "hot", "kind": "heat", "to": { "T": "80 degC ± 0.8 K" } }
  ]
})json";

Project parse(const char* text) {
    auto p = parseProject(text);
    if (!p) qFatal("%s", p.error().text().c_str());
    return *p;
}

double siAt(LedgerModel* m, int row, int column) { return m->data(m->index(row, column), LedgerModel::SiRole).toDouble(); }

}  // namespace

class UncertaintyViewTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        QStandardPaths::setTestModeEnabled(true);
        QSettings().clear();
    }

    void ledgerColumnsBandsAndContributions() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(kSheet));
        LedgerModel* m = w.ledger();
        const double m_ = 2, cp = 4000;
        // ± Q: the first step carries the start's 0.5 K, the second the
        // target's 0.8 K (its start is the first step's fixed target).
        const int warm = m->rowOfStep(0), hot = m->rowOfStep(1);
        QCOMPARE(siAt(m, warm, LedgerModel::ColQ), m_ * cp * 30);
        QVERIFY(std::fabs(siAt(m, warm, LedgerModel::ColUQ) - m_ * cp * 0.5) < 1e-6 * m_ * cp);
        QVERIFY(std::fabs(siAt(m, hot, LedgerModel::ColUQ) - m_ * cp * 0.8) < 1e-6 * m_ * cp);
        QVERIFY(std::fabs(siAt(m, hot, LedgerModel::ColUTout) - 0.8) < 1e-9);
        QVERIFY(std::fabs(siAt(m, warm, LedgerModel::ColUTout)) < 1e-9);
        QVERIFY(!w.ledgerView()->isColumnHidden(LedgerModel::ColUQ));
        QVERIFY(m->headerData(LedgerModel::ColUQ, Qt::Horizontal, Qt::DisplayRole).toString().startsWith(QStringLiteral("± Q")));

        // The T–Q band: at the end of the sequence it spans the cumulative
        // duty's u, m·cp·√(0.5² + 0.8²) (the steps' correlation kept), either
        // side of the path, in display units (kW).
        const auto& tq = w.tqChart()->chart();
        QCOMPARE(int(tq.bands().size()), 2);
        const auto& band = tq.bands()[1].pts;
        double left = 1e300, right = -1e300;
        for (QPointF v : band) { left = std::min(left, v.x()); right = std::max(right, v.x()); }
        const double uCumKW = m_ * cp * std::hypot(0.5, 0.8) / 1000;
        const double endKW = m_ * cp * 60 / 1000;
        QVERIFY2(std::fabs(right - (endKW + uCumKW)) < 1e-6, qPrintable(QString::number(right)));
        QCOMPARE(int(w.tsChart()->chart().bands().size()), 2);

        // Which input drives the heating duty: T0 and T2 by their variances.
        const auto& bars = w.contributionChart()->chart().bars();
        QCOMPARE(int(bars.size()), 2);
        QCOMPARE(bars[0].input, QStringLiteral("steps.hot.to.T"));
        QVERIFY(std::fabs(bars[0].share - 0.64 / 0.89) < 1e-6);
        QCOMPARE(bars[1].typed, QStringLiteral("20 degC ± 0.5 K"));

        // View ▸ Uncertainty off: columns hidden, no bands.
        QAction* toggle = nullptr;
        for (QAction* a : w.findChildren<QAction*>())
            if (a->text().contains(QStringLiteral("Uncertainty (±)"))) toggle = a;
        QVERIFY(toggle);
        toggle->setChecked(false);
        QVERIFY(w.ledgerView()->isColumnHidden(LedgerModel::ColUQ));
        QVERIFY(w.tqChart()->chart().bands().empty());
        toggle->setChecked(true);
        QVERIFY(!w.ledgerView()->isColumnHidden(LedgerModel::ColUQ));

        // A worksheet with no tolerance has no ± columns.
        std::string plain = kSheet;
        for (const std::string tol : {" ± 0.5 K", " ± 0.8 K"}) plain.replace(plain.find(tol), tol.size(), "");
        w.document()->reset(parse(plain.c_str()));
        QVERIFY(w.ledgerView()->isColumnHidden(LedgerModel::ColUQ));
        QVERIFY(w.tqChart()->chart().bands().empty());
    }

    // A tolerance typed in the step panel is kept as typed and shown
    // without the quotes the file needs.
    void toleranceTypedInTheStepPanel() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(R"({
  "format": "heatchain-project", "version": 1, "system": "steady-flow", "model": "reference",
  "substance": "air", "basis": { "massFlow": "0.75 kg/s" }, "start": { "T": "25 degC", "P": "1 bar" },
  "steps": [ { "id": "stage", "kind": "compress", "to": { "P": "3 bar" }, "path": "adiabatic", "efficiency": 0.8 } ]
})"));
        w.document()->setSelectedStep(0);
        auto* eff = w.editor()->field(QStringLiteral("efficiency"));
        QVERIFY(eff);
        eff->lineEdit()->setText(QStringLiteral("0.8 ± 0.03"));
        eff->commit();
        QVERIFY(!eff->hasError());
        const Step& s = w.document()->project().steps[0];
        QVERIFY(s.efficiency);
        QCOMPARE(s.efficiency->value, 0.8);
        QCOMPARE(QString::fromStdString(s.efficiency->typed()), QStringLiteral("0.8 ± 0.03"));
        QCOMPARE(eff->lineEdit()->text(), QStringLiteral("0.8 ± 0.03"));
        // The compressor's work: the efficiency is its only uncertain input.
        const auto& bars = w.contributionChart()->chart().bars();
        QCOMPARE(int(bars.size()), 1);
        QCOMPARE(bars[0].input, QStringLiteral("steps.stage.efficiency"));
        QVERIFY(w.document()->uncertainty()->find("steps.stage.W")->u > 0);
        // Out of range with a tolerance still names the bound.
        eff->lineEdit()->setText(QStringLiteral("1.2 ± 0.03"));
        eff->commit();
        QVERIFY(eff->hasError());
    }
};

QTEST_MAIN(UncertaintyViewTest)
#include "uncertainty_view_test.moc"
