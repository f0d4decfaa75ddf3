#include "heatchain_view/time_chart.hpp"

#include <QFontMetricsF>
#include <algorithm>
#include <cmath>

#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::view {

namespace {

// Decimals a tick label needs for its spacing (2.5 → 1).
int tickDecimals(double step) {
    int d = 0;
    double v = step;
    while (d < 6 && std::fabs(v - std::round(v)) > 1e-6 * std::max(1.0, std::fabs(v))) {
        v *= 10;
        ++d;
    }
    return d;
}

QString tickText(double v, double step) {
    return QString::number(std::fabs(v) < step * 1e-6 ? 0.0 : v, 'f', tickDecimals(step))
        .replace(QLatin1Char('-'), QChar(0x2212));
}

}  // namespace

void TimeChart::setData(const Project& project, const SequenceResult& result) {
    series_.clear();
    const UnitSystem us = project.displayUnits;
    const UnitContext ctx = project.unitContext();
    double total = 0;
    for (const auto& s : result.steps)
        if (s.computed && s.batch) total += s.batch->duration;
    // Minutes for a short batch, hours for a long one.
    const double perUnit = total > 3 * 3600.0 ? 3600.0 : 60.0;
    timeUnit_ = perUnit == 3600.0 ? QStringLiteral("h") : QStringLiteral("min");
    tUnit_ = QString::fromStdString(unitLabel(displayUnit(Dimension::Temperature, us)));
    dutyUnit_ = QString::fromStdString(unitLabel(displayUnit(Dimension::Power, us)));
    auto T = [&](double K) { return toDisplay(K, Dimension::Temperature, us, ctx); };
    auto D = [&](double W) { return toDisplay(W, Dimension::Power, us, ctx); };
    double t0 = 0;
    ymin_ = 1e300;
    ymax_ = -1e300;
    dmax_ = 0;
    for (std::size_t i = 0; i < result.steps.size(); ++i) {
        const auto& s = result.steps[i];
        if (!s.computed || !s.batch || s.batch->profile.empty()) continue;
        Series se;
        se.step = int(i);
        se.stepId = QString::fromStdString(s.id);
        se.colour = i < colours_.size() ? colours_[i] : stepColour(int(i));
        for (const auto& pt : s.batch->profile) {
            const double x = (t0 + pt.t) / perUnit;
            se.T.push_back({x, T(pt.T)});
            se.Tutility.push_back({x, T(pt.Tutility)});
            se.duty.push_back({x, D(std::fabs(pt.Qdot))});
            ymin_ = std::min({ymin_, T(pt.T), T(pt.Tutility)});
            ymax_ = std::max({ymax_, T(pt.T), T(pt.Tutility)});
            dmax_ = std::max(dmax_, D(std::fabs(pt.Qdot)));
        }
        t0 += s.batch->duration;
        series_.push_back(std::move(se));
    }
    tmax_ = t0 > 0 ? t0 / perUnit : 1;
    if (series_.empty()) {
        ymin_ = 0;
        ymax_ = 1;
    }
    const double pad = std::max(1.0, 0.05 * (ymax_ - ymin_));
    ymin_ -= pad;
    ymax_ += pad;
    if (!(dmax_ > 0)) dmax_ = 1;
    dmax_ *= 1.1;
}

void TimeChart::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    const QFontMetricsF fm(p.font());
    const QRectF plot = rect.adjusted(62, 14, -80, -42);
    auto map = [&](QPointF v) {
        return QPointF(plot.left() + v.x() / tmax_ * plot.width(),
                       plot.bottom() - (v.y() - ymin_) / (ymax_ - ymin_) * plot.height());
    };
    auto mapDuty = [&](QPointF v) {
        return QPointF(plot.left() + v.x() / tmax_ * plot.width(), plot.bottom() - v.y() / dmax_ * plot.height());
    };
    if (series_.empty()) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter | Qt::TextWordWrap,
                   QStringLiteral("No step has a batch time: give a closed-system step a transfer "
                                  "(U and area, or UA) and a source or sink."));
        p.restore();
        return;
    }
    // Grid and axes.
    const double xs = niceTickStep(tmax_, std::max(2, int(plot.width() / 90)));
    const double ys = niceTickStep(ymax_ - ymin_, std::max(3, int(plot.height() / 34)));
    const double ds = niceTickStep(dmax_, std::max(3, int(plot.height() / 34)));
    for (double x = 0; x <= tmax_ + 1e-9 * xs; x += xs) {
        const QPointF a = map({x, ymin_});
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(a.x(), plot.top()), QPointF(a.x(), plot.bottom()));
        p.setPen(ink::muted());
        p.drawText(QRectF(a.x() - 50, plot.bottom() + 3, 100, fm.height()), Qt::AlignHCenter, tickText(x, xs));
    }
    for (double y = std::ceil(ymin_ / ys) * ys; y <= ymax_ + 1e-9 * ys; y += ys) {
        const QPointF a = map({0, y});
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(plot.left(), a.y()), QPointF(plot.right(), a.y()));
        p.setPen(ink::muted());
        p.drawText(QRectF(plot.left() - 60, a.y() - fm.height() / 2, 55, fm.height()),
                   Qt::AlignRight | Qt::AlignVCenter, tickText(y, ys));
    }
    for (double d = 0; d <= dmax_ + 1e-9 * ds; d += ds) {
        const QPointF a = mapDuty({0, d});
        p.setPen(ink::muted());
        p.drawText(QRectF(plot.right() + 5, a.y() - fm.height() / 2, 50, fm.height()),
                   Qt::AlignLeft | Qt::AlignVCenter, tickText(d, ds));
    }
    p.setPen(QPen(ink::axis(), 1));
    p.setBrush(Qt::NoBrush);
    p.drawRect(plot);
    p.setPen(ink::text());
    p.drawText(QRectF(plot.left(), plot.bottom() + fm.height() + 6, plot.width(), fm.height()), Qt::AlignHCenter,
               QStringLiteral("time [%1]").arg(timeUnit_));
    p.save();
    p.translate(plot.left() - 50, plot.center().y());
    p.rotate(-90);
    p.drawText(QRectF(-plot.height() / 2, -fm.height(), plot.height(), fm.height()), Qt::AlignHCenter,
               QStringLiteral("temperature [%1]  (utility dashed)").arg(tUnit_));
    p.restore();
    p.save();
    // Rotated a quarter turn, the title's line runs down the right edge.
    p.translate(rect.right() - fm.height() - 2, plot.center().y());
    p.rotate(90);
    p.drawText(QRectF(-plot.height() / 2, -fm.height(), plot.height(), fm.height()), Qt::AlignHCenter,
               QStringLiteral("duty [%1]  (grey)").arg(dutyUnit_));
    p.restore();
    // Duty first (behind), then the utility's and the material's temperatures.
    p.setClipRect(plot.adjusted(-2, -2, 2, 2));
    for (const auto& se : series_) {
        QPolygonF d;
        for (const auto& v : se.duty) d << mapDuty(v);
        p.setPen(QPen(ink::muted(), 1.4));
        p.drawPolyline(d);
        QPolygonF u;
        for (const auto& v : se.Tutility) u << map(v);
        QPen dashed(se.colour, 1.2, Qt::DashLine);
        p.setPen(dashed);
        p.drawPolyline(u);
        QPolygonF t;
        for (const auto& v : se.T) t << map(v);
        p.setPen(QPen(se.colour, 2.2));
        p.drawPolyline(t);
        // The step's name where it starts.
        if (!t.isEmpty()) {
            p.setPen(se.colour.darker(130));
            p.drawText(t.front() + QPointF(4, -6), se.stepId);
        }
    }
    p.restore();
}

}  // namespace heatchain::view
