// Measures edit → redraw on a 100-step worksheet: one EditStepField command
// (a new target temperature on step 50) pushed on the undo stack, the whole
// sequence re-solved, and the canvas, ledger and both charts repainted
// synchronously. Prints the median and the 90th percentile over many edits.
// Run: QT_QPA_PLATFORM=offscreen ./gui_edit_timing
#include <QApplication>
#include <QElapsedTimer>
#include <QHeaderView>
#include <algorithm>
#include <ctime>
#include <cstdio>
#include <vector>

#include "commands.hpp"
#include "heatchain/project_file.hpp"
#include "main_window.hpp"

using namespace heatchain;

int main(int argc, char** argv) {
    QApplication app(argc, argv);
    QCoreApplication::setOrganizationName(QStringLiteral("HeatchainTiming"));

    // 100 steps of our own: liquid water heated and cooled by 10 K in turn,
    // each against a source or sink, so no step changes phase.
    std::string text = R"({"format":"heatchain-project","version":1,"meta":{"title":"100 steps"},)"
                       R"("display":{"units":"metric-engineering"},"system":"steady-flow",)"
                       R"("model":"reference","substance":"water","basis":{"massFlow":"1 kg/s"},)"
                       R"("start":{"T":"40 degC","P":"3 bar"},"steps":[)";
    for (int i = 0; i < 100; ++i) {
        if (i) text += ",";
        if (i % 2 == 0)
            text += R"({"id":"h)" + std::to_string(i) + R"(","kind":"heat","to":{"T":"50 degC"},"source":{"T":"90 degC"}})";
        else
            text += R"({"id":"c)" + std::to_string(i) + R"(","kind":"cool","to":{"T":"40 degC"},"sink":{"T":"20 degC"}})";
    }
    text += "]}";
    auto project = parseProject(text, "timing");
    if (!project) {
        std::fprintf(stderr, "cannot build the timing worksheet: %s\n", project.error().text().c_str());
        return 1;
    }

    gui::MainWindow w;
    w.setInteractive(false);
    w.resize(1600, 1000);
    w.show();
    w.document()->reset(project.value());
    QApplication::processEvents();
    if (!w.document()->result().ok()) {
        std::fprintf(stderr, "the timing worksheet does not solve: %s\n",
                     w.document()->result().firstError()->text().c_str());
        return 1;
    }

    // CPU time of this thread as well as wall time: on a shared, loaded
    // machine the wall clock also counts time spent waiting for a core.
    auto cpuMs = [] {
        timespec ts{};
        clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
        return double(ts.tv_sec) * 1e3 + double(ts.tv_nsec) / 1e6;
    };
    std::vector<double> stage[5];  // push (solve + model updates), canvas, ledger, T-s, T-Q
    auto redraw = [&] {
        double t = cpuMs();
        auto mark = [&](int k) { const double n = cpuMs(); stage[k].push_back(n - t); t = n; };
        w.chain()->viewport()->repaint();
        mark(1);
        w.ledgerView()->viewport()->repaint();
        w.ledgerView()->horizontalHeader()->viewport()->repaint();
        mark(2);
        w.tsChart()->repaint();
        mark(3);
        w.tqChart()->repaint();
        mark(4);
    };
    const int runs = argc > 1 ? std::max(5, std::atoi(argv[1])) : 200;
    std::vector<double> total, totalCpu, solveOnly;
    for (int i = 0; i < runs; ++i) {
        Step s = w.document()->project().steps[50];
        const std::string t = (i % 2 ? "50" : "55") + std::string(" degC");
        s.to.T = Quantity{t, *parseQuantity(t, Dimension::Temperature)};
        QElapsedTimer timer;
        timer.start();
        const double c0 = cpuMs();
        w.document()->undoStack()->push(new gui::EditStepField(w.document(), 50, s, QStringLiteral("target")));
        stage[0].push_back(cpuMs() - c0);
        redraw();
        total.push_back(double(timer.nsecsElapsed()) / 1e6);
        totalCpu.push_back(cpuMs() - c0);
        solveOnly.push_back(w.document()->lastSolveMs());
    }
    auto pct = [](std::vector<double> v, double p) {
        std::sort(v.begin(), v.end());
        return v[std::size_t(p * double(v.size() - 1))];
    };
    std::printf("100-step worksheet, %d edits (edit -> solve -> canvas, ledger, both charts repainted)\n", runs);
    std::printf("  edit->redraw  median %.2f ms   p90 %.2f ms   min %.2f ms\n", pct(total, 0.5),
                pct(total, 0.9), pct(total, 0.0));
    std::printf("  edit->redraw  CPU time median %.2f ms   p90 %.2f ms\n", pct(totalCpu, 0.5), pct(totalCpu, 0.9));
    std::printf("  solve (wall) median %.2f ms\n", pct(solveOnly, 0.5));
    const char* names[5] = {"push: solve + update views", "repaint canvas", "repaint ledger",
                            "repaint T-s", "repaint T-Q"};
    for (int k = 0; k < 5; ++k) std::printf("  CPU %-28s median %.2f ms\n", names[k], pct(stage[k], 0.5));
    return 0;
}
