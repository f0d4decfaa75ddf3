// Offscreen test of the heat-transfer fields and the time chart. Core is the
// oracle: the step panel's edit is the same change made by hand, and the
// areas and times shown come from heatchain::solve of that worksheet.
#include <QtTest>

#include <cmath>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
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
