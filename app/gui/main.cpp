// heatchain: the desktop worksheet for thermal processes.
#include <QApplication>
#include <QElapsedTimer>
#include <cstdio>
#include <cstring>

#include "heatchain/version.hpp"

#include "heatchain_view/step_icons.hpp"
#include "main_window.hpp"

int main(int argc, char** argv) {
    // Answered before Qt starts, so it works without a display.
    for (int i = 1; i < argc; ++i) {
        if (std::strcmp(argv[i], "--version") == 0) {
            std::printf("heatchain %s\n", HEATCHAIN_VERSION_STRING);
            return 0;
        }
    }
    QElapsedTimer sinceMain;
    sinceMain.start();
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Heatchain"));
    QApplication::setApplicationName(QStringLiteral("Heatchain"));
    QApplication::setApplicationVersion(QStringLiteral(HEATCHAIN_VERSION_STRING));
    QApplication::setWindowIcon(heatchain::view::appIcon());

    heatchain::gui::MainWindow window;
    QStringList args = QApplication::arguments();
    args.removeFirst();
    window.startUp(args);
    window.show();
    // Start-up timing: draw the window once, say how long it took, leave.
    if (args.contains(QStringLiteral("--quit-after-show"))) {
        QApplication::processEvents();
        window.repaint();
        std::printf("window shown %.1f ms after main()\n", double(sinceMain.nsecsElapsed()) / 1e6);
        return 0;
    }
    return app.exec();
}
