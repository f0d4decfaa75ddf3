// Edit → redraw in the desktop application on a 100-step worksheet (the
// figure the README's performance table gives for the GUI): one edit of step
// 50's target pushed on the undo stack, the sequence re-solved, every view
// updated, and the event loop run until the window has painted what changed.
// Beside it, the parts: the edit without the paint, and core's solve alone.
// Run: QT_QPA_PLATFORM=offscreen ./bench_gui_edit --benchmark_repetitions=5
#include <benchmark/benchmark.h>

#include <QApplication>
#include <cstdio>
#include <memory>
#include <string>

#include "commands.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "main_window.hpp"
#include "support/hundred_steps.hpp"

using namespace heatchain;

namespace {

Project hundredSteps() {
    const std::string text = heatchain::testing::hundredStepWorksheet();
    auto project = parseProject(text, "bench");
    if (!project) {
        std::fprintf(stderr, "cannot build the benchmark worksheet: %s\n", project.error().text().c_str());
        std::exit(1);
    }
    return project.value();
}

// One window for every benchmark, as one running application (made in
// main, after the QApplication, and gone before it).
gui::MainWindow* theWindow = nullptr;
gui::MainWindow& window() { return *theWindow; }

// A new target for step 50, alternating so that every edit changes results.
void editStep50(gui::MainWindow& w, long i) {
    Step s = w.document()->project().steps[50];
    const std::string t = (i % 2 ? "50" : "55") + std::string(" degC");
    s.to.T = Quantity{t, *parseQuantity(t, Dimension::Temperature)};
    w.document()->undoStack()->push(new gui::EditStepField(w.document(), 50, s, QStringLiteral("target")));
}

void BM_EditRedraw100(benchmark::State& state) {
    gui::MainWindow& w = window();
    long i = 0;
    for (auto _ : state) {
        editStep50(w, i++);
        QApplication::processEvents();  // the posted update: one paint of what the edit changed
    }
}
BENCHMARK(BM_EditRedraw100)->Unit(benchmark::kMillisecond)->UseRealTime()->MinTime(2.0);

void BM_EditWithoutPaint100(benchmark::State& state) {
    gui::MainWindow& w = window();
    long i = 0;
    for (auto _ : state) {
        editStep50(w, i++);
        state.PauseTiming();
        QApplication::processEvents();
        state.ResumeTiming();
    }
}
BENCHMARK(BM_EditWithoutPaint100)->Unit(benchmark::kMillisecond)->UseRealTime()->MinTime(2.0);

void BM_CoreSolve100(benchmark::State& state) {
    const Project p = hundredSteps();
    auto model = makeModel(p.model, p.substance);
    for (auto _ : state) benchmark::DoNotOptimize(solve(p, model.value()));
}
BENCHMARK(BM_CoreSolve100)->Unit(benchmark::kMillisecond)->UseRealTime();

}  // namespace

int main(int argc, char** argv) {
    QApplication app(argc, argv);
    QCoreApplication::setOrganizationName(QStringLiteral("HeatchainBench"));
    benchmark::Initialize(&argc, argv);
    auto w = std::make_unique<gui::MainWindow>();
    w->setInteractive(false);
    w->resize(1600, 1000);
    w->show();
    w->document()->reset(hundredSteps());
    QApplication::processEvents();
    if (!w->document()->result().ok()) {
        std::fprintf(stderr, "the benchmark worksheet does not solve\n");
        return 1;
    }
    theWindow = w.get();
    // HEATCHAIN_GRAB_DIR=<folder>: after two edits, save what each view shows
    // as PNG and stop, so that a change meant to be faster can be shown to
    // paint the same pixels (compare the files before and after it).
    if (const QByteArray dir = qgetenv("HEATCHAIN_GRAB_DIR"); !dir.isEmpty()) {
        editStep50(*w, 0);
        QApplication::processEvents();
        editStep50(*w, 1);
        QApplication::processEvents();
        const QString folder = QString::fromLocal8Bit(dir);
        const std::pair<const char*, QWidget*> views[] = {
            {"chain", w->chain()->viewport()}, {"ledger", w->ledgerView()->viewport()}, {"ts", w->tsChart()},
            {"tq", w->tqChart()}, {"exergy", w->exergyChart()}, {"secondlaw", w->secondLaw()},
            {"window", w.get()}};
        for (const auto& [name, widget] : views)
            widget->grab().save(folder + QLatin1Char('/') + QLatin1String(name) + QStringLiteral(".png"));
        return 0;
    }
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}
