#include "heatchain_view/sweep_plot.hpp"

#include <QFontMetricsF>
#include <algorithm>
#include <cmath>
#include <limits>

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::view {

void SweepPlot::setData(const SweepResult& result, std::vector<int> outputs, UnitSystem units,
                        const UnitContext& ctx) {
    panels_.clear();
    failed_.clear();
    const QString xUnit = unitSymbol(result.inputDimension, units);
    xTitle_ = QStringLiteral("%1 · %2").arg(QString::fromStdString(result.spec.step),
                                            QString::fromStdString(result.spec.input));
    if (!xUnit.isEmpty() && result.inputDimension != Dimension::Dimensionless)
        xTitle_ += QStringLiteral(" [%1]").arg(xUnit);
    for (const SweepPoint& pt : result.points) failed_.push_back(pt.error.has_value());
    for (int o : outputs) {
        if (o < 0 || o >= int(result.outputs.size())) continue;
        const SweepOutput& out = result.outputs[std::size_t(o)];
        Panel panel;
        panel.output = o;
        panel.title = QString::fromStdString(out.label);
        const QString u = unitSymbol(out.dimension, units);
        if (out.dimension != Dimension::Dimensionless && !u.isEmpty())
            panel.title += QStringLiteral(" [%1]").arg(u);
        for (const SweepPoint& pt : result.points) {
            panel.x.push_back(toDisplay(pt.x, result.inputDimension, units, ctx));
            const auto& v = pt.values[std::size_t(o)];
            panel.y.push_back(v ? std::optional<double>(toDisplay(*v, out.dimension, units, ctx)) : std::nullopt);
        }
        panels_.push_back(std::move(panel));
    }
}


void SweepPlot::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    p.fillRect(rect, Qt::white);
    const QFontMetricsF fm(p.font());
    if (panels_.empty()) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter, QStringLiteral("Run a sweep and choose a result to plot."));
        p.restore();
        return;
    }
    double x0 = std::numeric_limits<double>::infinity(), x1 = -x0;
    for (double x : panels_.front().x) { x0 = std::min(x0, x); x1 = std::max(x1, x); }
    if (!(x1 > x0)) { x0 -= 0.5; x1 += 0.5; }
    const double bottomRoom = fm.height() * 2 + 10;
    const double panelH = (rect.height() - bottomRoom) / double(panels_.size());
    const double left = rect.left() + 66, right = rect.right() - 14;
    auto mapX = [&](double x) { return left + (x - x0) / (x1 - x0) * (right - left); };
    const double xs = niceTickStep(x1 - x0, std::max(2, int((right - left) / 90)));

    for (std::size_t k = 0; k < panels_.size(); ++k) {
        const Panel& P = panels_[k];
        const QRectF plot(left, rect.top() + panelH * double(k) + fm.height() + 8, right - left,
                          panelH - fm.height() - 14);
        double y0 = std::numeric_limits<double>::infinity(), y1 = -y0;
        for (const auto& y : P.y)
            if (y && std::isfinite(*y)) { y0 = std::min(y0, *y); y1 = std::max(y1, *y); }
        if (!std::isfinite(y0)) { y0 = 0; y1 = 1; }
        const double pad = std::max((y1 - y0) * 0.08, std::max(1e-9, std::fabs(y1) * 0.01));
        y0 -= pad; y1 += pad;
        auto mapY = [&](double y) { return plot.bottom() - (y - y0) / (y1 - y0) * plot.height(); };
        const double ys = niceTickStep(y1 - y0, std::max(2, int(plot.height() / 30)));
        p.setPen(ink::text());
        p.drawText(QRectF(plot.left(), plot.top() - fm.height() - 4, plot.width(), fm.height()),
                   Qt::AlignLeft | Qt::AlignVCenter, P.title);
        for (double y = std::ceil(y0 / ys) * ys; y <= y1 + 1e-9 * ys; y += ys) {
            p.setPen(QPen(ink::grid(), 1));
            p.drawLine(QPointF(plot.left(), mapY(y)), QPointF(plot.right(), mapY(y)));
            p.setPen(ink::muted());
            p.drawText(QRectF(rect.left(), mapY(y) - fm.height() / 2, 60, fm.height()),
                       Qt::AlignRight | Qt::AlignVCenter, tickLabel(y, ys));
        }
        for (double x = std::ceil(x0 / xs) * xs; x <= x1 + 1e-9 * xs; x += xs) {
            p.setPen(QPen(ink::grid(), 1));
            p.drawLine(QPointF(mapX(x), plot.top()), QPointF(mapX(x), plot.bottom()));
            if (k + 1 == panels_.size()) {
                p.setPen(ink::muted());
                p.drawText(QRectF(mapX(x) - 45, plot.bottom() + 3, 90, fm.height()), Qt::AlignHCenter,
                           tickLabel(x, xs));
            }
        }
        p.setPen(QPen(ink::axis(), 1));
        p.setBrush(Qt::NoBrush);
        p.drawRect(plot);
        // The line breaks at a point with no value: joining across it would
        // draw a result core never computed.
        const QColor c = stepColour(int(k) + 1);
        QPolygonF run;
        auto flush = [&] {
            if (run.size() > 1) { p.setPen(QPen(c, 2.0)); p.drawPolyline(run); }
            run.clear();
        };
        for (std::size_t i = 0; i < P.x.size(); ++i) {
            if (!P.y[i]) { flush(); continue; }
            run << QPointF(mapX(P.x[i]), mapY(*P.y[i]));
        }
        flush();
        for (std::size_t i = 0; i < P.x.size(); ++i) {
            if (P.y[i]) {
                p.setPen(QPen(ink::text(), 1));
                p.setBrush(c);
                p.drawEllipse(QPointF(mapX(P.x[i]), mapY(*P.y[i])), 3, 3);
            } else if (i < failed_.size() && failed_[i]) {
                p.setPen(QPen(ink::error(), 2));
                const double px = mapX(P.x[i]);
                p.drawLine(QPointF(px - 4, plot.bottom() - 4), QPointF(px + 4, plot.bottom() - 12));
                p.drawLine(QPointF(px - 4, plot.bottom() - 12), QPointF(px + 4, plot.bottom() - 4));
            }
        }
    }
    p.setPen(ink::text());
    p.drawText(QRectF(left, rect.bottom() - fm.height() - 2, right - left, fm.height()), Qt::AlignHCenter, xTitle_);
    p.restore();
}

}  // namespace heatchain::view
