// Measures edit → redraw on a 100-step worksheet: one EditStepField command
// (a new target temperature on step 50) pushed on the undo stack, the whole
// sequence re-solved, and then the event loop run until the window has
// painted what the edit changed (canvas, ledger, both charts) — exactly the
// work the application does for one edit. Prints the median and the 90th
// percentile over many edits, then a breakdown: each view forced to repaint
// in full on its own (an upper bound per view; a forced repaint of one view
// also flushes whatever else is pending, so the views are flushed first).
// Run: QT_QPA_PLATFORM=offscreen ./gui_edit_timing
#include <QApplication>
#include <QElapsedTimer>
#include <QHeaderView>
#include <QMap>
#include <QPaintEvent>
#include <algorithm>
#include <ctime>
#include <cstdio>
#include <vector>

#include "commands.hpp"
#include "heatchain/project_file.hpp"
#include "main_window.hpp"
#include "support/hundred_steps.hpp"

using namespace heatchain;

// Counts paint events by widget class and painted area (what an edit makes
// the window redraw).
class PaintCounter : public QObject {
public:
    QMap<QString, QPair<int, qint64>> seen;
    bool on = false;
    bool eventFilter(QObject* o, QEvent* e) override {
        if (on && e->type() == QEvent::Paint) {
            const QRect r = static_cast<QPaintEvent*>(e)->rect();
            QString name = QString::fromLatin1(o->metaObject()->className());
            if (o->parent() && name == QStringLiteral("QWidget"))
                name += QStringLiteral(" in ") + QString::fromLatin1(o->parent()->metaObject()->className());
            auto& v = seen[name];
            v.first += 1;
            v.second += qint64(r.width()) * r.height();
        }
        return false;
    }
};

int main(int argc, char** argv) {
    QApplication app(argc, argv);
    QCoreApplication::setOrganizationName(QStringLiteral("HeatchainTiming"));

    const std::string text = heatchain::testing::hundredStepWorksheet();
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
    const int runs = argc > 1 ? std::max(5, std::atoi(argv[1])) : 200;
    auto edit = [&](int i) {
        Step s = w.document()->project().steps[50];
        const std::string t = (i % 2 ? "50" : "55") + std::string(" degC");
        s.to.T = Quantity{t, *parseQuantity(t, Dimension::Temperature)};
        w.document()->undoStack()->push(new gui::EditStepField(w.document(), 50, s, QStringLiteral("target")));
    };

    // 1. Edit → everything it changed on screen, as the application runs it.
    std::vector<double> total, totalCpu, pushCpu, solveOnly;
    for (int i = 0; i < runs; ++i) {
        QElapsedTimer timer;
        timer.start();
        const double c0 = cpuMs();
        edit(i);
        pushCpu.push_back(cpuMs() - c0);
        QApplication::processEvents();  // the posted update: one paint of the dirty views
        total.push_back(double(timer.nsecsElapsed()) / 1e6);
        totalCpu.push_back(cpuMs() - c0);
        solveOnly.push_back(w.document()->lastSolveMs());
    }

    // What one edit repaints.
    PaintCounter counter;
    app.installEventFilter(&counter);
    counter.on = true;
    for (int i = 0; i < 10; ++i) {
        edit(i);
        QApplication::processEvents();
    }
    counter.on = false;

    // 2. Breakdown: each view repainted in full on its own.
    std::vector<double> stage[5];  // push (solve + model updates), canvas, ledger, T-s, T-Q
    for (int i = 0; i < runs; ++i) {
        double t = cpuMs();
        edit(i);
        auto mark = [&](int k) { const double n = cpuMs(); stage[k].push_back(n - t); t = n; };
        mark(0);
        QApplication::processEvents();
        t = cpuMs();
        w.chain()->viewport()->repaint();
        mark(1);
        w.ledgerView()->viewport()->repaint();
        w.ledgerView()->horizontalHeader()->viewport()->repaint();
        mark(2);
        w.tsChart()->repaint();
        mark(3);
        w.tqChart()->repaint();
        mark(4);
    }
    auto pct = [](std::vector<double> v, double p) {
        std::sort(v.begin(), v.end());
        return v[std::size_t(p * double(v.size() - 1))];
    };
    std::printf("100-step worksheet, %d edits (edit -> solve -> the window paints what changed)\n", runs);
    std::printf("  edit->redraw  wall median %.2f ms   p90 %.2f ms   min %.2f ms\n", pct(total, 0.5),
                pct(total, 0.9), pct(total, 0.0));
    std::printf("  edit->redraw  CPU  median %.2f ms   p90 %.2f ms\n", pct(totalCpu, 0.5), pct(totalCpu, 0.9));
    std::printf("    of which push (solve + view updates) CPU median %.2f ms; solve alone (wall) %.2f ms\n",
                pct(pushCpu, 0.5), pct(solveOnly, 0.5));
    std::printf("breakdown, each view forced to repaint in full alone (CPU medians):\n");
    const char* names[5] = {"push: solve + update views", "repaint canvas", "repaint ledger",
                            "repaint T-s", "repaint T-Q"};
    for (int k = 0; k < 5; ++k) std::printf("  %-28s %.2f ms\n", names[k], pct(stage[k], 0.5));
    std::printf("paint events per edit (mean of 10), by widget class, and painted pixels:\n");
    for (auto it = counter.seen.begin(); it != counter.seen.end(); ++it)
        std::printf("  %-40s %5.1f  %9lld px\n", qPrintable(it.key()), it.value().first / 10.0,
                    static_cast<long long>(it.value().second / 10));
    return 0;
}
