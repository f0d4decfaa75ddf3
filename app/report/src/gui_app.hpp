#pragma once
// The report draws text and charts with QPainter, which needs a
// QGuiApplication. The GUI has one; the CLI does not.
#include "heatchain/result.hpp"

namespace heatchain::report_detail {

// Makes sure a QGuiApplication exists: creates one, for the life of the
// process, when there is no Qt application at all (on the offscreen platform
// unless QT_QPA_PLATFORM says otherwise). An error when the process runs a
// plain QCoreApplication, which cannot draw text.
Status ensureGuiApplication();

}  // namespace heatchain::report_detail
