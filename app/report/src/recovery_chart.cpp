#include "recovery_chart.hpp"

#include <QPainterPath>
#include <algorithm>
#include <cmath>

#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/process_chart.hpp"

namespace heatchain::view {

namespace {

const QColor kHot(0xc0, 0x39, 0x2b);
const QColor kCold(0x1f, 0x5f, 0xa8);
const QColor kGrand(0x3a, 0x3f, 0x46);

}  // namespace

void RecoveryChart::setData(const Recovery& recovery, UnitSystem units, const UnitContext& ctx) {
    r_ = recovery;
    units_ = units;
    ctx_ = ctx;
}

void RecoveryChart::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing);
    const Targets& t = r_.targets;
    auto T = [&](double K) { return toDisplay(K, Dimension::Temperature, units_, ctx_); };
    auto Q = [&](double W) { return toDisplay(W, Dimension::Power, units_, ctx_); };
    const bool grand = kind_ == Kind::GrandComposite;

    // Data range in display units.
    double qmin = 0, qmax = 0, tmin = 1e300, tmax = -1e300;
    auto take = [&](const std::vector<CompositePoint>& pts) {
        for (const CompositePoint& c : pts) {
            qmax = std::max(qmax, Q(c.Q));
            tmin = std::min(tmin, T(c.T));
            tmax = std::max(tmax, T(c.T));
        }
    };
    if (grand) {
        take(t.grandComposite);
        for (const UtilityPlacement& u : r_.utilities.levels) {
            tmin = std::min(tmin, T(u.Tshifted));
            tmax = std::max(tmax, T(u.Tshifted));
        }
    } else {
        take(t.hotComposite);
        take(t.coldComposite);
    }
    const QFont base = p.font();
    QFont small = base;
    small.setPixelSize(11);
    p.setFont(small);
    const QFontMetricsF fm(small);
    if (tmin > tmax) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter, QStringLiteral("No steady-flow heating or cooling to set targets for"));
        p.restore();
        return;
    }
    if (qmax <= qmin) qmax = qmin + 1;
    if (tmax - tmin < 1) {
        tmin -= 1;
        tmax += 1;
    }
    const double qStep = niceTickStep(qmax - qmin, 6), tStep = niceTickStep(tmax - tmin, 6);
    qmax = std::ceil(qmax / qStep) * qStep;
    tmin = std::floor(tmin / tStep) * tStep;
    tmax = std::ceil(tmax / tStep) * tStep;

    const QString tUnit = unitSymbol(Dimension::Temperature, units_, ctx_);
    const QString qUnit = unitSymbol(Dimension::Power, units_, ctx_);
    const QRectF plot = rect.adjusted(64, 36, -20, -48);
    auto X = [&](double q) { return plot.left() + (q - qmin) / (qmax - qmin) * plot.width(); };
    auto Y = [&](double tt) { return plot.bottom() - (tt - tmin) / (tmax - tmin) * plot.height(); };

    // Grid, ticks, titles.
    p.setPen(QPen(ink::grid(), 1));
    for (double q = qmin; q <= qmax + qStep / 2; q += qStep) p.drawLine(QPointF(X(q), plot.top()), QPointF(X(q), plot.bottom()));
    for (double tt = tmin; tt <= tmax + tStep / 2; tt += tStep)
        p.drawLine(QPointF(plot.left(), Y(tt)), QPointF(plot.right(), Y(tt)));
    p.setPen(QPen(ink::axis(), 1));
    p.drawRect(plot);
    p.setPen(ink::text());
    for (double q = qmin; q <= qmax + qStep / 2; q += qStep)
        p.drawText(QRectF(X(q) - 40, plot.bottom() + 4, 80, 16), Qt::AlignHCenter | Qt::AlignTop, formatNumber(q, 4));
    for (double tt = tmin; tt <= tmax + tStep / 2; tt += tStep)
        p.drawText(QRectF(rect.left(), Y(tt) - 8, 58, 16), Qt::AlignRight | Qt::AlignVCenter, formatNumber(tt, 4));
    p.drawText(QRectF(plot.left(), plot.bottom() + 22, plot.width(), 18), Qt::AlignHCenter,
               (grand ? QStringLiteral("Heat flow [") : QStringLiteral("Duty [")) + qUnit + QStringLiteral("]"));
    p.save();
    p.translate(rect.left() + 12, plot.center().y());
    p.rotate(-90);
    p.drawText(QRectF(-plot.height() / 2, -8, plot.height(), 16), Qt::AlignCenter,
               (grand ? QStringLiteral("Shifted temperature [") : QStringLiteral("Temperature [")) + tUnit +
                   QStringLiteral("]"));
    p.restore();

    auto polyline = [&](const std::vector<CompositePoint>& pts) {
        QPolygonF line;
        for (const CompositePoint& c : pts) line << QPointF(X(Q(c.Q)), Y(T(c.T)));
        return line;
    };
    p.setClipRect(plot.adjusted(-1, -1, 1, 1));
    QString heading;
    if (!grand) {
        // Heat recovered: between the curves where both exist.
        const double lo = t.coldComposite.empty() ? 0 : t.coldComposite.front().Q;
        const double hi = t.hotComposite.empty() ? 0 : t.hotComposite.back().Q;
        if (hi > lo) {
            QPainterPath overlap;
            overlap.addRect(QRectF(QPointF(X(Q(lo)), plot.top()), QPointF(X(Q(hi)), plot.bottom())));
            QPainterPath between;
            QPolygonF poly = polyline(t.hotComposite);
            QPolygonF cold = polyline(t.coldComposite);
            std::reverse(cold.begin(), cold.end());
            poly << cold;
            between.addPolygon(poly);
            between.closeSubpath();
            QColor shade = kHot;
            shade.setAlpha(40);
            p.fillPath(between.intersected(overlap), shade);
        }
        p.setPen(QPen(kHot, 2.2));
        p.drawPolyline(polyline(t.hotComposite));
        p.setPen(QPen(kCold, 2.2));
        p.drawPolyline(polyline(t.coldComposite));
        for (std::size_t i = 0; i < t.pinchHot.size(); ++i) {
            p.setPen(QPen(ink::muted(), 1, Qt::DashLine));
            const double yh = Y(T(t.pinchHot[i])), yc = Y(T(t.pinchCold[i]));
            p.drawLine(QPointF(plot.left(), yh), QPointF(plot.right(), yh));
            p.drawLine(QPointF(plot.left(), yc), QPointF(plot.right(), yc));
            p.setPen(ink::text());
            p.drawText(QPointF(plot.left() + 6, yh - 4), QStringLiteral("pinch ") + formatNumber(T(t.pinchHot[i]), 4) +
                                                              QStringLiteral(" / ") + formatNumber(T(t.pinchCold[i]), 4) +
                                                              QStringLiteral(" ") + tUnit);
        }
        heading = QStringLiteral("Composite curves: hot (red) and cold (blue), heat recovered shaded");
    } else {
        p.setPen(QPen(kGrand, 2.2));
        p.drawPolyline(polyline(t.grandComposite));
        for (const UtilityPlacement& u : r_.utilities.levels) {
            const double y = Y(T(u.Tshifted));
            const QColor c = u.hot ? kHot : kCold;
            p.setPen(QPen(c, 1, Qt::DashLine));
            p.drawLine(QPointF(plot.left(), y), QPointF(plot.right(), y));
            if (u.duty > 0) {
                p.setPen(QPen(c, 5));
                p.drawLine(QPointF(X(0), y), QPointF(X(Q(u.duty)), y));
            }
            p.setPen(c);
            p.drawText(QPointF(plot.right() - fm.horizontalAdvance(QString::fromStdString(u.id)) - 160, y - 4),
                       QString::fromStdString(u.id) + QStringLiteral(": ") + formatNumber(Q(u.duty), 4) +
                           QStringLiteral(" ") + qUnit);
        }
        heading = QStringLiteral("Grand composite curve and utility levels (heat each level can take)");
    }
    p.setClipping(false);
    p.setPen(ink::text());
    QFont bold = small;
    bold.setPixelSize(12);
    bold.setBold(true);
    p.setFont(bold);
    p.drawText(QRectF(plot.left(), rect.top() + 4, plot.width(), 18), Qt::AlignLeft, heading);
    p.setFont(small);
    p.drawText(QRectF(plot.left(), rect.top() + 19, plot.width(), 16), Qt::AlignLeft,
               QStringLiteral("ΔTmin ") + formatNumber(toDisplay(t.dTmin, Dimension::TemperatureDifference, units_, ctx_), 4) +
                   QStringLiteral(" ") + unitSymbol(Dimension::TemperatureDifference, units_, ctx_) +
                   QStringLiteral(" · minimum hot utility ") + formatNumber(Q(t.hotUtilityMin), 4) + QStringLiteral(" ") +
                   qUnit + QStringLiteral(" · minimum cold utility ") + formatNumber(Q(t.coldUtilityMin), 4) +
                   QStringLiteral(" ") + qUnit);
    p.setFont(base);
    p.restore();
}

}  // namespace heatchain::view
