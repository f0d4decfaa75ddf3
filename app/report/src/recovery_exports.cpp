// The composite and grand composite curves as PNG or SVG.
#include <QBuffer>
#include <QImage>
#include <QPainter>
#include <QSvgGenerator>

#include "gui_app.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/recovery_report.hpp"
#include "recovery_chart.hpp"

namespace heatchain {

Status exportRecoveryChart(const StreamSet& set, const Recovery& recovery, RecoveryChartKind kind,
                           const std::filesystem::path& out, const ChartImageOptions& options) {
    auto format = imageFormatFor(out);
    if (!format) return format.error();
    if (auto st = report_detail::ensureGuiApplication(); !st) return st.error();
    if (options.width < 200 || options.height < 150 || options.width > 10000 || options.height > 10000)
        return makeError("chart size must be between 200 × 150 and 10000 × 10000");
    view::RecoveryChart chart(kind == RecoveryChartKind::Composite ? view::RecoveryChart::Kind::Composite
                                                                   : view::RecoveryChart::Kind::GrandComposite);
    chart.setData(recovery, set.shared.displayUnits, set.shared.unitContext());
    const QRectF rect(0, 0, options.width, options.height);
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    if (*format == ImageFormat::Svg) {
        QSvgGenerator svg;
        svg.setOutputDevice(&buffer);
        svg.setSize(QSize(options.width, options.height));
        svg.setViewBox(rect);
        svg.setTitle(QString::fromStdString(set.shared.meta.title));
        svg.setDescription(kind == RecoveryChartKind::Composite ? QStringLiteral("Composite curves")
                                                                : QStringLiteral("Grand composite curve"));
        QPainter p;
        if (!p.begin(&svg)) return makeError("cannot start drawing the SVG");
        chart.paint(p, rect);
        p.end();
    } else {
        QImage image(options.width, options.height, QImage::Format_ARGB32_Premultiplied);
        image.fill(Qt::white);
        QPainter p(&image);
        chart.paint(p, rect);
        p.end();
        if (!image.save(&buffer, "PNG")) return makeError("cannot encode the PNG");
    }
    const QByteArray data = buffer.data();
    return writeFileAtomically(out, std::string_view(data.constData(), std::size_t(data.size())), false);
}

}  // namespace heatchain
