// The composite and grand composite curves as PNG or SVG.
#include <QPainter>

#include "gui_app.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/recovery_report.hpp"
#include "heatchain_view/recovery_chart.hpp"

namespace heatchain {

Status exportRecoveryChart(const StreamSet& set, const Recovery& recovery, RecoveryChartKind kind,
                           const std::filesystem::path& out, const ChartImageOptions& options) {
    auto format = imageFormatFor(out);
    if (!format) return format.error();
    if (auto st = report_detail::ensureGuiApplication(); !st) return st.error();
    view::RecoveryChart chart(kind == RecoveryChartKind::Composite ? view::RecoveryChart::Kind::Composite
                                                                   : view::RecoveryChart::Kind::GrandComposite);
    chart.setData(recovery, set.shared.displayUnits, set.shared.unitContext());
    auto bytes = report_detail::paintImage(*format, options, QString::fromStdString(set.shared.meta.title),
                                           kind == RecoveryChartKind::Composite ? QStringLiteral("Composite curves")
                                                                                : QStringLiteral("Grand composite curve"),
                                           [&](QPainter& p, const QRectF& rect) { chart.paint(p, rect); });
    if (!bytes) return bytes.error();
    return writeFileAtomically(out, *bytes, /*keepBackup=*/false);
}

}  // namespace heatchain
