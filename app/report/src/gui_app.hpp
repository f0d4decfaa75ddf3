#pragma once
// The report draws text and charts with QPainter, which needs a
// QGuiApplication. The GUI has one; the CLI does not.
#include <QPainter>
#include <QString>
#include <functional>
#include <string>

#include "heatchain/report.hpp"
#include "heatchain/result.hpp"

namespace heatchain::report_detail {

// Makes sure a QGuiApplication exists: creates one, for the life of the
// process, when there is no Qt application at all (on the offscreen platform
// unless QT_QPA_PLATFORM says otherwise). An error when the process runs a
// plain QCoreApplication, which cannot draw text.
Status ensureGuiApplication();

// A chart image: `draw` paints into (0, 0, width, height) on a white PNG or
// into an SVG carrying `title` and `description`; the encoded bytes. Checks
// the size the options ask for and that a Qt application can draw.
Result<std::string> paintImage(ImageFormat format, const ChartImageOptions& options, const QString& title,
                               const QString& description,
                               const std::function<void(QPainter&, const QRectF&)>& draw);

}  // namespace heatchain::report_detail
