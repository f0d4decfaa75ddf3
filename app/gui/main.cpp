// heatchain: the desktop worksheet for thermal processes.
#include <QApplication>

#include "heatchain_qt/step_icons.hpp"
#include "main_window.hpp"

int main(int argc, char** argv) {
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Heatchain"));
    QApplication::setApplicationName(QStringLiteral("Heatchain"));
    QApplication::setApplicationVersion(QStringLiteral("0.1.0"));
    QApplication::setWindowIcon(heatchain::view::appIcon());

    heatchain::gui::MainWindow window;
    QStringList args = QApplication::arguments();
    args.removeFirst();
    window.startUp(args);
    window.show();
    return app.exec();
}
