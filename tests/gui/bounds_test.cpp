// Every bounded number the application lets a user type, edited to its
// bounds in the step panel and the start panel, saved, read back and
// compared: the application never saves a file its own reader refuses, and
// refuses in the panel exactly what the reader refuses. The bounds are the
// file format's (project-format.md): a quality and a starting liquid fraction
// in [0, 1], a phase change's fraction and an isentropic efficiency in (0, 1],
// a pressure ratio above 1, a polytropic exponent above 0.
#include <QComboBox>
#include <QLineEdit>
#include <QTemporaryDir>
#include <QtTest>

#include <functional>
#include <string>

#include "heatchain/project_file.hpp"
#include "main_window.hpp"

using namespace heatchain;
using heatchain::gui::MainWindow;
using heatchain::gui::QuantityField;

namespace {

// A worksheet of our own invention with one step for each bounded field.
constexpr const char* kText = R"({
  "format": "heatchain-project",
  "version": 1,
  "meta": { "title": "Bounds: every bounded field" },
  "display": { "units": "metric-engineering" },
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "1 kg/s" },
  "start": { "T": "30 degC", "P": "5 bar" },
  "steps": [
    { "id": "warm", "kind": "heat", "to": { "T": "151 degC" } },
    { "id": "boil", "kind": "boil", "fraction": 0.5 },
    { "id": "squeeze", "kind": "compress", "to": { "P": "12 bar" }, "path": "polytropic", "n": 1.3 },
    { "id": "pump", "kind": "compress", "to": { "ratio": 2 }, "path": "adiabatic", "efficiency": 0.7 }
  ]
})";

// One bounded field as the panel shows it: which step (-1: the start
// panel), which field, and how the file names it.
struct Field {
    int step;
    const char* name;      // the panel's field ("fraction", "target", ...)
    const char* fileKey;   // where the reader puts it ("fraction", "to.ratio", ...)
    std::function<double(const Project&)> read;
};

double num(const std::optional<Number>& n) { return n ? n->value : -1.0; }

const Field kFields[] = {
    {1, "fraction", "fraction", [](const Project& p) { return num(p.steps[1].fraction); }},
    {2, "n", "n", [](const Project& p) { return num(p.steps[2].n); }},
    {3, "efficiency", "efficiency", [](const Project& p) { return num(p.steps[3].efficiency); }},
    {3, "target", "to.ratio", [](const Project& p) { return num(p.steps[3].to.ratio); }},
    {0, "target", "to.quality", [](const Project& p) { return num(p.steps[0].to.quality); }},
    {-1, "quality", "start.quality", [](const Project& p) { return num(p.start.quality); }},
    {-1, "meltFraction", "start.meltFraction", [](const Project& p) { return num(p.start.meltFraction); }},
};

QuantityField* panelField(MainWindow& w, const Field& f) {
    if (f.step < 0) return w.startEditor()->field(QString::fromLatin1(f.name));
    w.document()->setSelectedStep(f.step);
    if (std::string(f.name) == "target") {
        // The quality target is chosen in the target's kind list first.
        QComboBox* kind = w.editor()->targetBox();
        const QString want = std::string(f.fileKey) == "to.quality" ? QStringLiteral("to quality x")
                                                                    : QStringLiteral("pressure ratio");
        const int at = kind->findText(want);
        if (at < 0) qFatal("no target kind %s", qPrintable(want));
        kind->setCurrentIndex(at);
    }
    return w.editor()->field(QString::fromLatin1(f.name));
}

// The file the reader is given: kText with one field set to `value`.
std::string fileWith(const Field& f, const std::string& value) {
    Json j = Json::parse(kText);
    Json* at = f.step < 0 ? &j["start"] : &j["steps"][std::size_t(f.step)];
    std::string key = f.fileKey;
    if (key.rfind("start.", 0) == 0) key = key.substr(6);
    if (key.rfind("to.", 0) == 0) {
        at = &(*at)["to"];
        *at = Json::object();
        key = key.substr(3);
    }
    (*at)[key] = Json::parse(value);
    return j.dump(2);
}

}  // namespace

class BoundsTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        QCoreApplication::setOrganizationName(QStringLiteral("HeatchainTests"));
        QStandardPaths::setTestModeEnabled(true);
    }

    // Each field at its closed bounds and just inside its open ones.
    void boundsSaveAndReadBack_data() {
        QTest::addColumn<int>("field");
        QTest::addColumn<QString>("typed");
        QTest::addColumn<double>("value");
        auto row = [](int field, const char* typed, double value) {
            QTest::addRow("%s=%s", kFields[field].fileKey, typed) << field << QString::fromLatin1(typed) << value;
        };
        row(0, "1", 1.0);            // fraction: the whole change
        row(0, "1e-9", 1e-9);        //           just above 0
        row(1, "1e-9", 1e-9);        // n: just above 0
        row(1, "1e9", 1e9);          //    no upper bound
        row(2, "1", 1.0);            // efficiency: reversible
        row(2, "1e-9", 1e-9);        //             just above 0
        row(3, "1.000001", 1.000001);  // ratio: just above 1
        row(3, "1e9", 1e9);            //        no upper bound
        row(4, "0", 0.0);            // quality: saturated liquid
        row(4, "1", 1.0);            //          saturated vapour
        row(5, "0", 0.0);
        row(5, "1", 1.0);
        row(6, "0", 0.0);
        row(6, "1", 1.0);
    }
    void boundsSaveAndReadBack() {
        QFETCH(int, field);
        QFETCH(QString, typed);
        QFETCH(double, value);
        const Field& f = kFields[field];
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        MainWindow w;
        w.setInteractive(false);
        auto start = parseProject(kText, "bounds");
        QVERIFY2(start, start ? "" : start.error().text().c_str());
        w.document()->reset(*start);

        QuantityField* edit = panelField(w, f);
        QVERIFY(edit);
        edit->lineEdit()->setText(typed);
        edit->commit();
        QVERIFY2(!edit->hasError(), qPrintable(edit->errorText()));
        QCOMPARE(f.read(w.document()->project()), value);

        // Saved by the application, read back by core's reader: the same worksheet.
        const QString path = dir.filePath(QStringLiteral("bounds.hchain"));
        QVERIFY2(w.saveFile(path), qPrintable(w.lastError()));
        auto back = loadProject(path.toStdString());
        QVERIFY2(back, back ? "" : back.error().text().c_str());
        QCOMPARE(f.read(*back), value);
        QCOMPARE(writeProject(*back), writeProject(w.document()->project()));
        // And opened again by the application, unchanged.
        QVERIFY2(w.openFile(path), qPrintable(w.lastError()));
        QCOMPARE(writeProject(w.document()->project()), writeProject(*back));
    }

    // Just outside: the panel refuses, the worksheet is unchanged, and the
    // reader refuses the same number in a file, naming the field.
    void outsideIsRefusedByBoth_data() {
        QTest::addColumn<int>("field");
        QTest::addColumn<QString>("typed");
        auto row = [](int field, const char* typed) {
            QTest::addRow("%s=%s", kFields[field].fileKey, typed) << field << QString::fromLatin1(typed);
        };
        row(0, "0");
        row(0, "1.000001");
        row(1, "0");
        row(1, "-1");
        row(2, "0");
        row(2, "1.000001");
        row(3, "1");
        row(3, "0.5");
        row(4, "-0.000001");
        row(4, "1.000001");
        row(5, "-0.000001");
        row(5, "1.000001");
        row(6, "-0.000001");
        row(6, "1.000001");
    }
    void outsideIsRefusedByBoth() {
        QFETCH(int, field);
        QFETCH(QString, typed);
        const Field& f = kFields[field];
        MainWindow w;
        w.setInteractive(false);
        auto start = parseProject(kText, "bounds");
        QVERIFY(start);
        w.document()->reset(*start);
        const std::string before = writeProject(w.document()->project());

        QuantityField* edit = panelField(w, f);
        QVERIFY(edit);
        edit->lineEdit()->setText(typed);
        edit->commit();
        QVERIFY2(edit->hasError(), qPrintable(typed));
        QCOMPARE(writeProject(w.document()->project()), before);

        auto read = parseProject(fileWith(f, typed.toStdString()), "bounds");
        QVERIFY2(!read, "the reader refuses what the panel refuses");
        QVERIFY2(read.error().text().find(std::string(f.fileKey).substr(std::string(f.fileKey).rfind('.') + 1)) !=
                     std::string::npos,
                 read.error().text().c_str());
    }

    // Rules between fields (core's resolveProject, the reader's rules): a
    // rated target needs an exchanger. Chosen in the panel on a step without
    // one, it is refused there with the reader's reason, the worksheet is
    // unchanged, and the file the reader would refuse is never written.
    void ratedWithoutExchangerIsRefused() {
        MainWindow w;
        w.setInteractive(false);
        auto start = parseProject(kText, "bounds");
        QVERIFY(start);
        w.document()->reset(*start);
        const std::string before = writeProject(w.document()->project());
        w.document()->setSelectedStep(0);
        QComboBox* kind = w.editor()->targetBox();
        const int rated = kind->findText(QStringLiteral("rated: what the exchanger reaches"));
        QVERIFY(rated >= 0);
        kind->setCurrentIndex(rated);
        emit kind->activated(rated);
        QCOMPARE(writeProject(w.document()->project()), before);
        QVERIFY2(w.editor()->problem().contains(QStringLiteral("needs the exchanger")), qPrintable(w.editor()->problem()));

        // The file that edit would have written: the reader refuses it for the same reason.
        Json j = Json::parse(kText);
        j["steps"][0]["to"] = Json{{"rated", true}};
        auto read = parseProject(j.dump(2), "bounds");
        QVERIFY(!read);
        QVERIFY2(read.error().message.find("needs the exchanger") != std::string::npos, read.error().text().c_str());

        // Another step selected: the reason, which was about the first, goes.
        w.document()->setSelectedStep(1);
        QVERIFY(w.editor()->problem().isEmpty());
    }
};

QTEST_MAIN(BoundsTest)
#include "bounds_test.moc"
