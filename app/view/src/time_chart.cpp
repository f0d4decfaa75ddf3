#include "heatchain_view/time_chart.hpp"

#include <QFontMetricsF>
#include <algorithm>
#include <cmath>

#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::view {

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
    const double lineH = fm.height();
    if (series_.empty()) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter | Qt::TextWordWrap,
                   QStringLiteral("No step has a batch time: give a closed-system step a transfer "
                                  "(U and area, or UA) and a source or sink."));
        p.restore();
        return;
    }
    // Margins from what goes in them: the rotated axis titles (one line
    // each), the widest tick label of each vertical axis, the time labels and
    // title below, and the key and the step names above. The ticks depend on
    // the plot's size, so it is laid out twice.
    const QString yTitle = QStringLiteral("T [%1]").arg(tUnit_);  // as on the T–s and T–Q charts
    const QString dTitle = QStringLiteral("duty [%1]").arg(dutyUnit_);
    const QString xTitle = QStringLiteral("time [%1]").arg(timeUnit_);
    const double gap = 6;
    const double top = 2 * lineH + 2 * gap;  // the key, then the step names
    const double bottom = 2 * lineH + 2 * gap + 2;
    auto tickStep = [&](double span, double room, double spacing, int least = 2) {
        return niceTickStep(span, std::max(least, int(room / spacing)));
    };
    auto widest = [&](double from, double to, double step) {
        double w = 0;
        for (double v = from; v <= to + 1e-9 * step; v += step) w = std::max(w, fm.horizontalAdvance(tickLabel(v, step)));
        return w;
    };
    double left = lineH + 3 * gap + fm.horizontalAdvance(QStringLiteral("000.0"));
    double right = lineH + 3 * gap + fm.horizontalAdvance(QStringLiteral("000.0"));
    double ys = 1, ds = 1;
    for (int pass = 0; pass < 2; ++pass) {
        const double h = std::max(40.0, rect.height() - top - bottom);
        // A tick every two lines or so: labels never touch.
        ys = tickStep(ymax_ - ymin_, h, 2.2 * lineH, 4);
        ds = tickStep(dmax_, h, 2.2 * lineH, 3);
        left = lineH + 3 * gap + widest(std::ceil(ymin_ / ys) * ys, ymax_, ys);
        right = lineH + 3 * gap + widest(0, dmax_, ds);
    }
    const QRectF plot = rect.adjusted(left, top, -right, -bottom);
    if (plot.width() < 40 || plot.height() < 30) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter | Qt::TextWordWrap, QStringLiteral("Too small to draw the time chart"));
        p.restore();
        return;
    }
    auto map = [&](QPointF v) {
        return QPointF(plot.left() + v.x() / tmax_ * plot.width(),
                       plot.bottom() - (v.y() - ymin_) / (ymax_ - ymin_) * plot.height());
    };
    auto mapDuty = [&](QPointF v) {
        return QPointF(plot.left() + v.x() / tmax_ * plot.width(), plot.bottom() - v.y() / dmax_ * plot.height());
    };
    // Time ticks spaced by their widest label and a gap of twice it.
    const double xs0 = tickStep(tmax_, plot.width(), 90);
    const double xs = tickStep(tmax_, plot.width(), 3 * std::max(widest(0, tmax_, xs0), fm.horizontalAdvance(QStringLiteral("00"))));
    for (double x = 0; x <= tmax_ + 1e-9 * xs; x += xs) {
        const QPointF a = map({x, ymin_});
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(a.x(), plot.top()), QPointF(a.x(), plot.bottom()));
        p.setPen(ink::muted());
        p.drawText(QRectF(a.x() - 50, plot.bottom() + 3, 100, lineH), Qt::AlignHCenter, tickLabel(x, xs));
    }
    for (double y = std::ceil(ymin_ / ys) * ys; y <= ymax_ + 1e-9 * ys; y += ys) {
        const QPointF a = map({0, y});
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(plot.left(), a.y()), QPointF(plot.right(), a.y()));
        p.setPen(ink::muted());
        p.drawText(QRectF(plot.left() - gap - 200, a.y() - lineH / 2, 200, lineH), Qt::AlignRight | Qt::AlignVCenter,
                   tickLabel(y, ys));
    }
    for (double d = 0; d <= dmax_ + 1e-9 * ds; d += ds) {
        const QPointF a = mapDuty({0, d});
        // A short tick on the right edge ties each duty label to its height.
        p.setPen(QPen(ink::axis(), 1));
        p.drawLine(QPointF(plot.right(), a.y()), QPointF(plot.right() + 3, a.y()));
        p.setPen(ink::muted());
        p.drawText(QRectF(plot.right() + gap, a.y() - lineH / 2, 200, lineH), Qt::AlignLeft | Qt::AlignVCenter,
                   tickLabel(d, ds));
    }
    p.setPen(QPen(ink::axis(), 1));
    p.setBrush(Qt::NoBrush);
    p.drawRect(plot);
    // Axis titles, each on one line, elided if the plot is shorter than it.
    p.setPen(ink::text());
    p.drawText(QRectF(plot.left(), plot.bottom() + lineH + gap, plot.width(), lineH), Qt::AlignHCenter, xTitle);
    p.save();
    p.translate(rect.left() + gap, plot.center().y());
    p.rotate(-90);
    p.drawText(QRectF(-plot.height() / 2, 0, plot.height(), lineH), Qt::AlignHCenter,
               fm.elidedText(yTitle, Qt::ElideRight, plot.height()));
    p.restore();
    p.save();
    p.translate(rect.right() - gap, plot.center().y());
    p.rotate(90);
    p.drawText(QRectF(-plot.height() / 2, 0, plot.height(), lineH), Qt::AlignHCenter,
               fm.elidedText(dTitle, Qt::ElideRight, plot.height()));
    p.restore();
    // The key above the plot: what the three kinds of line are.
    {
        double x = plot.left();
        const double y = rect.top() + gap / 2 + lineH / 2;
        auto key = [&](const QPen& pen, const QString& text) {
            p.setPen(pen);
            p.drawLine(QPointF(x, y), QPointF(x + 22, y));
            p.setPen(ink::muted());
            p.drawText(QRectF(x + 27, y - lineH / 2, fm.horizontalAdvance(text) + 2, lineH), Qt::AlignVCenter, text);
            x += 27 + fm.horizontalAdvance(text) + 16;
        };
        const QColor c = series_.front().colour;
        key(QPen(c, 2.2), QStringLiteral("material"));
        key(QPen(c, 1.2, Qt::DashLine), QStringLiteral("utility at the surface"));
        key(QPen(ink::muted(), 1.4), QStringLiteral("duty (right axis)"));
    }
    // Each step's name over its stretch of time, between thin separators;
    // a name that does not fit its stretch gives way to the step's number.
    {
        double t0 = 0;
        const double y = plot.top() - gap / 2 - lineH;
        for (const auto& se : series_) {
            const double t1 = se.T.empty() ? t0 : se.T.back().x();
            const double xa = map({t0, ymin_}).x(), xb = map({t1, ymin_}).x();
            if (t0 > 0) {
                p.setPen(QPen(ink::axis(), 1, Qt::DotLine));
                p.drawLine(QPointF(xa, plot.top()), QPointF(xa, plot.bottom()));
            }
            QString name = se.stepId;
            if (fm.horizontalAdvance(name) > xb - xa - 4) name = QString::number(se.step + 1);
            if (fm.horizontalAdvance(name) <= xb - xa - 2) {
                p.setPen(se.colour.darker(130));
                p.drawText(QRectF(xa, y, xb - xa, lineH), Qt::AlignHCenter | Qt::AlignVCenter, name);
            }
            t0 = t1;
        }
    }
    // Duty first (behind), then the utility's and the material's temperatures.
    p.setClipRect(plot.adjusted(-2, -2, 2, 2));
    for (const auto& se : series_) {
        QPolygonF d;
        for (const auto& v : se.duty) d << mapDuty(v);
        p.setPen(QPen(ink::muted(), 1.4));
        p.drawPolyline(d);
        QPolygonF u;
        for (const auto& v : se.Tutility) u << map(v);
        p.setPen(QPen(se.colour, 1.2, Qt::DashLine));
        p.drawPolyline(u);
        QPolygonF t;
        for (const auto& v : se.T) t << map(v);
        p.setPen(QPen(se.colour, 2.2));
        p.drawPolyline(t);
    }
    p.restore();
}

}  // namespace heatchain::view
