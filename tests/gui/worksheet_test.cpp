// Offscreen tests of the desktop application. The core is the oracle: after
// every user action the ledger must show exactly the numbers heatchain::solve
// gives for a Project built here by hand with the same change.
#include <QFile>
#include <QSignalSpy>
#include <QTemporaryDir>
#include <QtTest>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/units.hpp"
#include "heatchain_view/format.hpp"
#include "ledger_model.hpp"
#include "main_window.hpp"

using namespace heatchain;
using heatchain::gui::LedgerModel;
using heatchain::gui::MainWindow;

namespace {

// A feed-water line of our own invention (steady flow, IAPWS-IF97).
constexpr const char* kBaseText = R"({
  "format": "heatchain-project",
  "version": 1,
  "meta": { "title": "GUI test: feed water" },
  "display": { "units": "metric-engineering" },
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "2 kg/s" },
  "start": { "T": "30 degC", "P": "5 bar" },
  "steps": [
    { "id": "preheat", "kind": "heat", "to": { "T": "120 degC" }, "source": { "T": "160 degC" } },
    { "id": "pump", "kind": "compress", "to": { "P": "12 bar" }, "path": "adiabatic", "efficiency": 0.7 },
    { "id": "trim", "kind": "cool", "to": { "T": "100 degC" }, "sink": { "T": "25 degC" } }
  ]
})";

Project parse(const char* text) {
    auto p = parseProject(text, "test");
    if (!p) qFatal("test project does not parse: %s", p.error().text().c_str());
    return std::move(p.value());
}

Quantity q(const char* text, Dimension d) {
    auto si = parseQuantity(text, d);
    if (!si) qFatal("bad test quantity %s", text);
    return Quantity{text, *si};
}

// Every number of the ledger against the core's result for `expected`.
void compareLedger(const LedgerModel& ledger, const Project& expected) {
    const SequenceResult r = solve(expected);
    QCOMPARE(r.steps.size(), expected.steps.size());
    for (std::size_t i = 0; i < r.steps.size(); ++i) {
        const StepResult& s = r.steps[i];
        const int row = ledger.rowOfStep(int(i));
        QVERIFY2(row >= 0, "every step has a ledger row");
        auto cell = [&](int col) { return ledger.data(ledger.index(row, col), LedgerModel::SiRole); };
        QCOMPARE(ledger.data(ledger.index(row, LedgerModel::ColStep), Qt::DisplayRole).toString(),
                 QStringLiteral("%1  %2").arg(i + 1).arg(QString::fromStdString(s.id)));
        if (!s.computed) {
            QVERIFY(!cell(LedgerModel::ColQ).isValid());
            continue;
        }
        // Exact equality: the same core call on the same Project.
        QCOMPARE(cell(LedgerModel::ColTin).toDouble(), s.start.T);
        QCOMPARE(cell(LedgerModel::ColTout).toDouble(), s.end.T);
        QCOMPARE(cell(LedgerModel::ColPin).toDouble(), s.start.P);
        QCOMPARE(cell(LedgerModel::ColPout).toDouble(), s.end.P);
        QVERIFY(cell(LedgerModel::ColQ).toDouble() == s.Q);
        QVERIFY(cell(LedgerModel::ColW).toDouble() == s.W);
        QVERIFY(cell(LedgerModel::ColdH).toDouble() == s.dH);
        QVERIFY(cell(LedgerModel::ColdU).toDouble() == s.dU);
        QVERIFY(cell(LedgerModel::ColdS).toDouble() == s.dS);
        QVERIFY(cell(LedgerModel::ColSgen).toDouble() == s.Sgen);
        QVERIFY(cell(LedgerModel::ColExd).toDouble() == s.exergyDestroyed);
        QCOMPARE(ledger.data(ledger.index(row, LedgerModel::ColPhase), Qt::DisplayRole).toString(),
                 view::phaseText(s.end));
    }
    const int total = ledger.rowCount() - 3;
    QVERIFY(ledger.data(ledger.index(total, LedgerModel::ColQ), LedgerModel::SiRole).toDouble() == r.totals.Q);
    QVERIFY(ledger.data(ledger.index(total, LedgerModel::ColSgen), LedgerModel::SiRole).toDouble() == r.totals.Sgen);
    QVERIFY(ledger.data(ledger.index(total + 1, LedgerModel::ColQ), LedgerModel::SiRole).toDouble() == r.totals.heatingDuty);
    QVERIFY(ledger.data(ledger.index(total + 2, LedgerModel::ColQ), LedgerModel::SiRole).toDouble() == r.totals.coolingDuty);
}

// What the user can see, as one comparable value: the file text and every
// numeric ledger cell.
struct Snapshot {
    std::string file;
    QList<QVariant> cells;
    bool operator==(const Snapshot& o) const { return file == o.file && cells == o.cells; }
};
Snapshot snapshot(MainWindow& w) {
    Snapshot s{writeProject(w.document()->project()), {}};
    const LedgerModel& m = *w.ledger();
    for (int r = 0; r < m.rowCount(); ++r)
        for (int c = 0; c < m.columnCount(); ++c) s.cells << m.data(m.index(r, c), LedgerModel::SiRole);
    return s;
}

QByteArray readAll(const QString& path) {
    QFile f(path);
    if (!f.open(QIODevice::ReadOnly)) return {};
    return f.readAll();
}

}  // namespace

class WorksheetTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        QCoreApplication::setOrganizationName(QStringLiteral("HeatchainTests"));
        QStandardPaths::setTestModeEnabled(true);
    }

    void editsFollowTheCore() {
        MainWindow w;
        w.setInteractive(false);
        Project expected = parse(kBaseText);
        w.document()->reset(expected);
        compareLedger(*w.ledger(), expected);
        QCOMPARE(w.chain()->cardCount(), 3);

        // Add by typing, after the selected first step.
        w.document()->setSelectedStep(0);
        QVERIFY(w.quickAddStep(QStringLiteral("heat to 150 degC source 200 degC")));
        Step added;
        added.id = "heat";
        added.kind = StepKind::Heat;
        added.to.T = q("150 degC", Dimension::Temperature);
        added.source = Reservoir{q("200 degC", Dimension::Temperature), std::nullopt, UnknownFields{}};
        expected.steps.insert(expected.steps.begin() + 1, added);
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        compareLedger(*w.ledger(), expected);
        QCOMPARE(w.chain()->cardCount(), 4);
        QCOMPARE(w.document()->selectedStep(), 1);

        // Edit the new step's target in the step editor.
        auto* target = w.editor()->field(QStringLiteral("target"));
        target->lineEdit()->setText(QStringLiteral("140 degC"));
        target->commit();
        QVERIFY(!target->hasError());
        expected.steps[1].to.T = q("140 degC", Dimension::Temperature);
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        compareLedger(*w.ledger(), expected);

        // Reorder with the keyboard on the canvas: Alt+Left moves "trim" before "pump".
        w.document()->setSelectedStep(3);
        QTest::keyClick(w.chain(), Qt::Key_Left, Qt::AltModifier);
        std::swap(expected.steps[2], expected.steps[3]);
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        compareLedger(*w.ledger(), expected);
        QCOMPARE(w.document()->selectedStep(), 2);

        // Reorder by dropping a card: the first card dropped after the third.
        const QRectF third = w.chain()->cardRect(2);
        const int to = w.chain()->dropIndex(0, third.center() + QPointF(third.width() * 0.6, 0));
        QCOMPARE(to, 2);
        emit w.chain()->moveRequested(0, to);
        std::rotate(expected.steps.begin(), expected.steps.begin() + 1, expected.steps.begin() + 3);
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        compareLedger(*w.ledger(), expected);

        // Duplicate from the card menu's request.
        emit w.chain()->duplicateRequested(0);
        Step copy = expected.steps[0];
        copy.id = copy.id + "-2";
        expected.steps.insert(expected.steps.begin() + 1, copy);
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        compareLedger(*w.ledger(), expected);

        // Delete with the keyboard.
        w.document()->setSelectedStep(0);
        QTest::keyClick(w.chain(), Qt::Key_Delete);
        expected.steps.erase(expected.steps.begin());
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        compareLedger(*w.ledger(), expected);
        QCOMPARE(w.chain()->cardCount(), int(expected.steps.size()));
    }

    void undoAndRedoRestoreExactly() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(kBaseText));
        std::vector<Snapshot> states{snapshot(w)};
        auto act = [&](auto f) { f(); states.push_back(snapshot(w)); };
        act([&] { w.document()->setSelectedStep(2); QVERIFY(w.quickAddStep(QStringLiteral("throttle to 2 bar"))); });
        act([&] {
            w.document()->setSelectedStep(0);
            auto* f = w.editor()->field(QStringLiteral("source"));
            f->lineEdit()->setText(QStringLiteral("180 degC"));
            f->commit();
        });
        act([&] { emit w.chain()->moveRequested(3, 1); });
        act([&] { emit w.chain()->duplicateRequested(1); });
        act([&] { emit w.chain()->removeRequested(0); });
        act([&] { w.setDisplayUnits(UnitSystem::USCustomary); });
        QUndoStack* undo = w.document()->undoStack();
        QCOMPARE(undo->count(), 6);
        for (int i = int(states.size()) - 2; i >= 0; --i) {
            undo->undo();
            QVERIFY2(snapshot(w) == states[std::size_t(i)], qPrintable(QStringLiteral("undo to state %1").arg(i)));
        }
        compareLedger(*w.ledger(), parse(kBaseText));
        for (std::size_t i = 1; i < states.size(); ++i) {
            undo->redo();
            QVERIFY2(snapshot(w) == states[i], qPrintable(QStringLiteral("redo to state %1").arg(i)));
        }
    }

    void invalidFieldIsRefusedWithItsReason() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(kBaseText));
        w.document()->setSelectedStep(0);
        const std::string before = writeProject(w.document()->project());
        auto* target = w.editor()->field(QStringLiteral("target"));
        for (const char* bad : {"180 degX", "6 barg", "hot"}) {
            target->lineEdit()->setText(QString::fromLatin1(bad));
            target->commit();
            QVERIFY2(target->hasError(), bad);
            // The reason shown is core's own parse error for that text.
            auto core = parseQuantity(bad, Dimension::Temperature);
            QVERIFY(!core);
            QCOMPARE(target->errorText(), QString::fromStdString(core.error().message));
            QCOMPARE(writeProject(w.document()->project()), before);
            QCOMPARE(w.document()->undoStack()->count(), 0);
        }
        // A number out of range on the pump.
        w.document()->setSelectedStep(1);
        auto* eff = w.editor()->field(QStringLiteral("efficiency"));
        eff->lineEdit()->setText(QStringLiteral("1.4"));
        eff->commit();
        QVERIFY(eff->hasError());
        // The reason gives the bounds the file has: above 0, at most 1.
        QVERIFY2(eff->errorText().contains(QStringLiteral("above 0 and at most 1")), qPrintable(eff->errorText()));
        QCOMPARE(writeProject(w.document()->project()), before);
        // A valid entry after the refusal is applied.
        target = w.editor()->field(QStringLiteral("target"));
        target->lineEdit()->setText(QStringLiteral("16 barg"));
        target->commit();
        QVERIFY(!target->hasError());
        QCOMPARE(w.document()->project().steps[1].to.P->text, std::string("16 barg"));
        // Quick add with a wrong word names it.
        QVERIFY(!w.quickAddStep(QStringLiteral("warm to 50 degC")));
        QVERIFY(w.lastError().contains(QStringLiteral("warm")));
    }

    void openSaveOpenIsByteForByte() {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        // The canonical form of a worksheet: core's writer applied once.
        const std::string canonical = writeProject(parse(kBaseText));
        const QString a = dir.filePath(QStringLiteral("a.hchain"));
        const QString b = dir.filePath(QStringLiteral("b.hchain"));
        {
            QFile f(a);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write(canonical.data(), qint64(canonical.size()));
        }
        MainWindow w;
        w.setInteractive(false);
        QVERIFY(w.openFile(a));
        QVERIFY(w.saveFile(b));
        QCOMPARE(readAll(b), readAll(a));
        QVERIFY(w.openFile(b));
        QCOMPARE(writeProject(w.document()->project()), canonical);

        // Every sample worksheet: what is saved is read back and saved again unchanged.
        const QDir samples(QStringLiteral(HEATCHAIN_SOURCE_DIR "/sample-projects"));
        for (const QString& name : samples.entryList({QStringLiteral("*.hchain")})) {
            QVERIFY2(w.openFile(samples.filePath(name)), qPrintable(w.lastError()));
            const QString c = dir.filePath(name), d = dir.filePath(QStringLiteral("again-") + name);
            QVERIFY(w.saveFile(c));
            QVERIFY(w.openFile(c));
            QVERIFY(w.saveFile(d));
            QCOMPARE(readAll(d), readAll(c));
        }
    }

    void malformedFileLeavesWorksheetIntact() {
        QTemporaryDir dir;
        const QString bad = dir.filePath(QStringLiteral("broken.hchain"));
        {
            QFile f(bad);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("{\n  \"format\": \"heatchain-project\",\n  \"version\": 1,\n  \"steps\": [ { \"id\": } ]\n}\n");
        }
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(kBaseText));
        w.document()->setSelectedStep(1);
        const std::string before = writeProject(w.document()->project());
        const QString pathBefore = w.document()->filePath();
        QVERIFY(!w.openFile(bad));
        auto core = loadProject(bad.toStdString());
        QVERIFY(!core);
        QVERIFY(core.error().line > 0);  // the error has a place in the file
        QVERIFY2(w.lastError().contains(QString::fromStdString(core.error().text())), qPrintable(w.lastError()));
        QCOMPARE(writeProject(w.document()->project()), before);
        QCOMPARE(w.document()->filePath(), pathBefore);
        QCOMPARE(w.chain()->cardCount(), 3);
        compareLedger(*w.ledger(), parse(kBaseText));

        // A file that does not exist is refused the same way.
        QVERIFY(!w.openFile(dir.filePath(QStringLiteral("missing.hchain"))));
        QCOMPARE(writeProject(w.document()->project()), before);
    }

    void displayUnitsFollowTheView() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(kBaseText));
        const LedgerModel& m = *w.ledger();
        QVERIFY(m.headerData(LedgerModel::ColTout, Qt::Horizontal, Qt::DisplayRole).toString().contains(QStringLiteral("°C")));
        w.setDisplayUnits(UnitSystem::USCustomary);
        const QString head = m.headerData(LedgerModel::ColTout, Qt::Horizontal, Qt::DisplayRole).toString();
        QVERIFY2(head.contains(view::unitSymbol(Dimension::Temperature, UnitSystem::USCustomary)), qPrintable(head));
        const SequenceResult r = solve(w.document()->project());
        const int row = m.rowOfStep(0);
        QCOMPARE(m.data(m.index(row, LedgerModel::ColTout), Qt::DisplayRole).toString(),
                 view::formatDisplay(r.steps[0].end.T, Dimension::Temperature, UnitSystem::USCustomary));
        w.document()->undoStack()->undo();
        QCOMPARE(w.document()->project().displayUnits, UnitSystem::MetricEngineering);
    }

    void ledgerCopiesAsTabSeparatedText() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(parse(kBaseText));
        const QString tsv = w.ledger()->toTabSeparated();
        QVERIFY(tsv.endsWith(QLatin1Char('\n')));
        const QStringList lines = tsv.chopped(1).split(QLatin1Char('\n'));
        QCOMPARE(lines.size(), w.ledger()->rowCount() + 1);
        for (const QString& l : lines) QVERIFY2(l.count(QLatin1Char('\t')) == LedgerModel::ColumnCount - 1, qPrintable(l));
        // The Q of the first step in display units (kW in metric engineering), full precision.
        const SequenceResult r = solve(parse(kBaseText));
        const QStringList cells = lines[w.ledger()->rowOfStep(0) + 1].split(QLatin1Char('\t'));
        QCOMPARE(cells[LedgerModel::ColQ].toDouble(),
                 QString::number(toDisplay(r.steps[0].Q, Dimension::Power, UnitSystem::MetricEngineering), 'g', 10).toDouble());
    }
};

QTEST_MAIN(WorksheetTest)
#include "worksheet_test.moc"
