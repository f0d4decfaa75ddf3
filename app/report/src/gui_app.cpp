#include "gui_app.hpp"

#include <QGuiApplication>
#include <cstdio>

namespace heatchain::report_detail {

Status ensureGuiApplication() {
    if (QCoreApplication* app = QCoreApplication::instance()) {
        if (!qobject_cast<QGuiApplication*>(app))
            return makeError("drawing the report needs a QGuiApplication, but this process runs a QCoreApplication");
        return Ok{};
    }
    // A report draws no window. Without a display the default platform
    // plugin would abort the process, so choose the offscreen one unless the
    // caller chose a platform.
    const bool display = !qEnvironmentVariableIsEmpty("DISPLAY") || !qEnvironmentVariableIsEmpty("WAYLAND_DISPLAY");
    if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM") && !display) qputenv("QT_QPA_PLATFORM", "offscreen");
    // Qt keeps references to argc/argv for the application's life.
    static int argc = 1;
    static char name[] = "heatchain-report";
    static char* argv[] = {name, nullptr};
    // Deliberately never destroyed: it lives until the process exits, and
    // destroying it during static destruction would outlive Qt's own statics.
    // Start-up chatter about the session (no XDG_RUNTIME_DIR on a build
    // machine) is noise on a command line; warnings after start-up pass.
    const QtMessageHandler previous = qInstallMessageHandler([](QtMsgType type, const QMessageLogContext&, const QString& m) {
        if (type == QtFatalMsg || type == QtCriticalMsg) fprintf(stderr, "%s\n", qPrintable(m));
    });
    static QGuiApplication* app = new QGuiApplication(argc, argv);
    (void)app;
    qInstallMessageHandler(previous);
    return Ok{};
}

}  // namespace heatchain::report_detail
