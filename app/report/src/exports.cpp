// Exports of a solved project: each chart as PNG or SVG (the same drawing
// as the report), the ledger as CSV and the results as JSON (core's
// formats). Files are written atomically.
#include <QBuffer>
#include <QImage>
#include <QPainter>
#include <QSvgGenerator>
#include <algorithm>
#include <cctype>

#include "gui_app.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/report.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain_view/process_chart.hpp"
#include "heatchain_view/time_chart.hpp"
#include "report_layout.hpp"

namespace heatchain {

Result<ImageFormat> imageFormatFor(const std::filesystem::path& file) {
    std::string ext = file.extension().string();
    for (char& ch : ext) ch = char(std::tolower(static_cast<unsigned char>(ch)));
    if (ext == ".png") return ImageFormat::Png;
    if (ext == ".svg") return ImageFormat::Svg;
    return makeError("the chart file name must end in .png or .svg", file.string());
}

Result<std::string> renderChart(const Project& project, const SequenceResult& result, ChartKind kind,
                                ImageFormat format, const ChartImageOptions& options) {
    if (auto st = report_detail::ensureGuiApplication(); !st) return st.error();
    const QString title = QString::fromStdString(project.meta.title);
    if (kind == ChartKind::TemperatureTime) {
        // The time chart of a batch, drawn like the other charts (the view draws it).
        view::TimeChart chart;
        chart.setData(project, result);
        return report_detail::paintImage(format, options, title, QStringLiteral("Temperature and duty against time"),
                                         [&](QPainter& p, const QRectF& rect) { chart.paint(p, rect); });
    }
    const auto chartKind = kind == ChartKind::TemperatureEntropy ? view::ProcessChart::Kind::TemperatureEntropy
                                                                 : view::ProcessChart::Kind::TemperatureDuty;
    view::ProcessChart chart(chartKind);
    std::optional<DomeCurve> dome;
    if (kind == ChartKind::TemperatureEntropy && result.model) dome = saturationDome(*result.model);
    chart.setData(project, result, dome && !dome->liquidSide.empty() ? &*dome : nullptr);
    // Lay the chart out at a width where its 11-pixel labels read well, and
    // scale that to the requested size.
    const double logicalW = std::clamp(double(options.width), 640.0, 1000.0);
    return report_detail::paintImage(format, options, title,
                                     kind == ChartKind::TemperatureEntropy ? QStringLiteral("Temperature–entropy chart")
                                                                           : QStringLiteral("Temperature–duty chart"),
                                     [&](QPainter& p, const QRectF& rect) {
                                         report_detail::paintChartFigure(p, rect, chart, result, logicalW,
                                                                         options.legend);
                                     });
}

Status exportChart(const Project& project, const SequenceResult& result, ChartKind kind,
                   const std::filesystem::path& out, const ChartImageOptions& options) {
    auto format = imageFormatFor(out);
    if (!format) return format.error();
    auto bytes = renderChart(project, result, kind, *format, options);
    if (!bytes) return bytes.error();
    return writeFileAtomically(out, *bytes, /*keepBackup=*/false);
}

Status exportLedgerCsv(const Project& project, const SequenceResult& result, const std::filesystem::path& out) {
    return writeFileAtomically(out, resultsToCsv(project, result), /*keepBackup=*/false);
}

Status exportResultsJson(const Project& project, const SequenceResult& result,
                         const std::filesystem::path& out) {
    return writeFileAtomically(out, resultsToJson(project, result).dump(2) + "\n", /*keepBackup=*/false);
}

namespace report_detail {

Result<std::string> paintImage(ImageFormat format, const ChartImageOptions& options, const QString& title,
                               const QString& description,
                               const std::function<void(QPainter&, const QRectF&)>& draw) {
    if (auto st = ensureGuiApplication(); !st) return st.error();
    if (options.width < 200 || options.height < 150 || options.width > 10000 || options.height > 10000)
        return makeError("chart size must be between 200 × 150 and 10000 × 10000");
    const QRectF rect(0, 0, options.width, options.height);
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    if (format == ImageFormat::Svg) {
        QSvgGenerator svg;
        svg.setOutputDevice(&buffer);
        svg.setSize(QSize(options.width, options.height));
        svg.setViewBox(rect);
        svg.setTitle(title);
        svg.setDescription(description);
        QPainter p;
        if (!p.begin(&svg)) return makeError("cannot start drawing the SVG");
        draw(p, rect);
        p.end();
    } else {
        QImage image(options.width, options.height, QImage::Format_ARGB32_Premultiplied);
        image.fill(Qt::white);
        QPainter p(&image);
        draw(p, rect);
        p.end();
        if (!image.save(&buffer, "PNG")) return makeError("cannot encode the PNG");
    }
    const QByteArray data = buffer.data();
    return std::string(data.constData(), std::size_t(data.size()));
}

}  // namespace report_detail

}  // namespace heatchain
