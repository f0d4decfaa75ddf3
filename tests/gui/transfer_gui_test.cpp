// Offscreen test of the heat-transfer fields and the time chart. Core is the
// oracle: the step panel's edit is the same change made by hand, and the
// areas and times shown come from heatchain::solve of that worksheet.
#include <QComboBox>
#include <QtTest>

#include <cmath>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "ledger_model.hpp"
#include "main_window.hpp"
#include "step_editor.hpp"
#include "time_chart_widget.hpp"

using namespace heatchain;
using heatchain::gui::MainWindow;

namespace {

Project sample(const char* name) {
    auto p = loadProject(std::string(HEATCHAIN_SOURCE_DIR) + "/sample-projects/" + name + ".hchain");
    if (!p) qFatal("sample does not load: %s", p.error().text().c_str());
    return std::move(p.value());
}

}  // namespace

class TransferGuiTest : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() {
        QCoreApplication::setOrganizationName(QStringLiteral("HeatchainTests"));
        QStandardPaths::setTestModeEnabled(true);
    }

    // Typing U in the step panel = the same change by hand; the area is core's.
    void overallCoefficientIsOneUndoableEdit() {
        MainWindow w;
        w.setInteractive(false);
        const Project base = sample("solvent-recovery");
        w.document()->reset(base);
        w.document()->setSelectedStep(0);
        auto* U = w.editor()->field(QStringLiteral("transferU"));
        QVERIFY(U);
        QCOMPARE(U->text(), QStringLiteral("450 W/(m2 K)"));
        U->lineEdit()->setText(QStringLiteral("600 W/(m2 K)"));
        U->commit();
        Project expected = base;
        expected.steps[0].transfer->U = Quantity{"600 W/(m2 K)", 600.0};
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        const SequenceResult r = solve(expected);
        QVERIFY(w.document()->result().steps[0].transfer);
        QVERIFY(*w.document()->result().steps[0].transfer->area == *r.steps[0].transfer->area);
        // Law: a larger U needs a smaller area for the same duty.
        QVERIFY(*r.steps[0].transfer->area < *solve(base).steps[0].transfer->area);
        w.document()->undoStack()->undo();
        QCOMPARE(writeProject(w.document()->project()), writeProject(base));
    }

    // A zone's own U in the step panel = the same change by hand, one undo
    // step; the batch time shown is core's, and a better coefficient in one
    // zone shortens it (law: the rate grows with U).
    void zoneCoefficientIsOneUndoableEdit() {
        MainWindow w;
        w.setInteractive(false);
        const Project base = sample("melt-tank");
        w.document()->reset(base);
        w.document()->setSelectedStep(0);
        auto* solid = w.editor()->field(QStringLiteral("transferU.solid"));
        auto* liquid = w.editor()->field(QStringLiteral("transferU.liquid"));
        QVERIFY(solid && liquid);
        QVERIFY(!solid->isHidden());
        QVERIFY(liquid->isHidden());  // the warm-up stays solid
        QCOMPARE(solid->text(), QStringLiteral("60 W/(m2 K)"));
        solid->lineEdit()->setText(QStringLiteral("75 W/(m2 K)"));
        solid->commit();
        Project expected = base;
        expected.steps[0].transfer->zoneU = {{"solid", Quantity{"75 W/(m2 K)", 75.0}}};
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        const SequenceResult r = solve(expected);
        QVERIFY(w.document()->result().steps[0].batch);
        QVERIFY(w.document()->result().steps[0].batch->duration == r.steps[0].batch->duration);
        QVERIFY(r.steps[0].batch->duration < solve(base).steps[0].batch->duration);
        QCOMPARE(w.document()->undoStack()->count(), 1);
        w.document()->undoStack()->undo();
        QCOMPARE(writeProject(w.document()->project()), writeProject(base));
    }

    // A step through melting with one overall U: a row per zone it passes
    // through; typing the liquid's U makes the others the overall U, as the
    // file's per-zone object, in one undoable edit.
    void overallCoefficientSplitsIntoZones() {
        MainWindow w;
        w.setInteractive(false);
        Project base = sample("melt-tank");
        base.steps.resize(1);
        base.steps[0].to.T = Quantity{"70 degC", 343.15};
        base.steps[0].transfer->zoneU.clear();
        base.steps[0].transfer->U = Quantity{"80 W/(m2 K)", 80.0};
        w.document()->reset(base);
        w.document()->setSelectedStep(0);
        QVERIFY(w.document()->result().ok());
        for (const char* zone : {"solid", "solid-liquid", "liquid"})
            QVERIFY2(!w.editor()->field(QStringLiteral("transferU.%1").arg(QLatin1String(zone)))->isHidden(), zone);
        for (const char* zone : {"two-phase", "vapour", "solid-vapour"})
            QVERIFY2(w.editor()->field(QStringLiteral("transferU.%1").arg(QLatin1String(zone)))->isHidden(), zone);
        auto* liquid = w.editor()->field(QStringLiteral("transferU.liquid"));
        liquid->lineEdit()->setText(QStringLiteral("170 W/(m2 K)"));
        liquid->commit();
        Project expected = base;
        expected.steps[0].transfer->U.reset();
        expected.steps[0].transfer->zoneU = {{"solid", Quantity{"80 W/(m2 K)", 80.0}},
                                             {"solid-liquid", Quantity{"80 W/(m2 K)", 80.0}},
                                             {"liquid", Quantity{"170 W/(m2 K)", 170.0}}};
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        const SequenceResult r = solve(expected);
        QVERIFY(r.ok());
        QVERIFY(w.document()->result().steps[0].batch->duration == r.steps[0].batch->duration);
        QVERIFY(r.steps[0].batch->duration < solve(base).steps[0].batch->duration);
        w.document()->undoStack()->undo();
        QCOMPARE(writeProject(w.document()->project()), writeProject(base));
    }

    // The step panel says a step is rated, and offers "after a time" for a
    // batch: choosing it and typing 30 min is the same change by hand.
    void ratedAndTimedTargets() {
        MainWindow w;
        w.setInteractive(false);
        w.document()->reset(sample("solvent-recovery-existing"));
        w.document()->setSelectedStep(1);
        auto* kind = w.editor()->findChild<QComboBox*>(QStringLiteral("targetKind"));
        QVERIFY(kind);
        QVERIFY(kind->currentText().startsWith(QStringLiteral("rated")));
        QVERIFY(kind->findText(QStringLiteral("after a time")) < 0);  // steady flow has no times
        const Project base = sample("melt-tank");
        w.document()->reset(base);
        w.document()->setSelectedStep(2);
        const int timed = kind->findText(QStringLiteral("after a time"));
        QVERIFY(timed >= 0);
        kind->setCurrentIndex(timed);
        emit kind->activated(timed);
        auto* target = w.editor()->field(QStringLiteral("target"));
        target->lineEdit()->setText(QStringLiteral("30 min"));
        target->commit();
        Project expected = base;
        expected.steps[2].to = StepTarget{};
        expected.steps[2].to.time = Quantity{"30 min", 1800.0};
        QCOMPARE(writeProject(w.document()->project()), writeProject(expected));
        const SequenceResult r = solve(expected);
        QVERIFY(r.ok());
        QCOMPARE(w.document()->result().steps[2].end.T, r.steps[2].end.T);
        QVERIFY(std::fabs(r.steps[2].batch->duration - 1800.0) < 1e-6);
    }

    // The ledger's area and time columns: shown when a step has them, the
    // numbers core's (steady flow: each exchanger's area and their sum; a
    // batch: each step's time and the cycle time).
    void ledgerShowsAreaAndTime() {
        MainWindow w;
        w.setInteractive(false);
        w.show();
        w.document()->reset(sample("melt-tank"));
        auto* ledger = w.findChild<QTableView*>(QStringLiteral("ledger"));
        QVERIFY(ledger);
        auto* m = ledger->model();
        QVERIFY(!ledger->isColumnHidden(gui::LedgerModel::ColTime));
        const SequenceResult batch = solve(sample("melt-tank"));
        bool total = false;
        for (int row = 0; row < m->rowCount(); ++row) {
            const int step = m->index(row, 0).data(gui::LedgerModel::RowStepRole).toInt();
            const int kind = m->index(row, 0).data(gui::LedgerModel::RowKindRole).toInt();
            const QVariant t = m->index(row, gui::LedgerModel::ColTime).data(gui::LedgerModel::SiRole);
            if (kind == int(gui::LedgerModel::RowKind::Step) && batch.steps[std::size_t(step)].batch)
                QCOMPARE(t.toDouble(), batch.steps[std::size_t(step)].batch->duration);
            if (kind == int(gui::LedgerModel::RowKind::Total)) {
                QCOMPARE(t.toDouble(), *batch.totals.cycleTime);
                total = true;
            }
        }
        QVERIFY(total);
        QVERIFY(m->headerData(gui::LedgerModel::ColTime, Qt::Horizontal).toString().contains(QStringLiteral("Time")));
        w.document()->reset(sample("solvent-recovery"));
        QVERIFY(ledger->isColumnHidden(gui::LedgerModel::ColTime));
        QVERIFY(!ledger->isColumnHidden(gui::LedgerModel::ColArea));
        const SequenceResult flow = solve(sample("solvent-recovery"));
        const int last = m->rowCount() - 3;  // the totals row, above the two duty rows
        QCOMPARE(m->index(last, 0).data(gui::LedgerModel::RowKindRole).toInt(), int(gui::LedgerModel::RowKind::Total));
        QCOMPARE(m->index(last, gui::LedgerModel::ColArea).data(gui::LedgerModel::SiRole).toDouble(), *flow.totals.area);
        QVERIFY(m->headerData(gui::LedgerModel::ColArea, Qt::Horizontal).toString().contains(QStringLiteral("Area")));
    }

    // The time chart shows for a batch, with one series per step that has a
    // time, and hides for steady flow.
    void timeChartFollowsTheSystem() {
        MainWindow w;
        w.setInteractive(false);
        w.show();
        w.document()->reset(sample("melt-tank"));
        auto* chart = w.findChild<gui::TimeChartWidget*>(QStringLiteral("timeChart"));
        QVERIFY(chart);
        QVERIFY(chart->isVisible());
        int timed = 0;
        for (const auto& s : w.document()->result().steps) timed += s.batch ? 1 : 0;
        QCOMPARE(int(chart->chart().series().size()), timed);
        QVERIFY(timed >= 4);
        w.document()->reset(sample("solvent-recovery"));
        QVERIFY(!chart->isVisible());
    }
};

QTEST_MAIN(TransferGuiTest)
#include "transfer_gui_test.moc"
