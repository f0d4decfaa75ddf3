#include "heatchain_view/recovery_chart.hpp"

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

QFont chartFont(const QFont& base, int pixels, bool bold = false) {
    QFont f = base;
    f.setPixelSize(pixels);
    f.setBold(bold);
    return f;
}

// The plot frame of a recovery chart in display units: grid, frame, tick
// labels, the axis titles (the y title turned, shortened to the plot's
// height when it is longer), and the heading with its line of figures.
struct Axes {
    QRectF plot;
    double x0 = 0, x1 = 1, y0 = 0, y1 = 1;
    double X(double x) const { return plot.left() + (x - x0) / (x1 - x0) * plot.width(); }
    double Y(double y) const { return plot.bottom() - (y - y0) / (y1 - y0) * plot.height(); }
};

// Rounds the ranges out to whole ticks, draws, and returns the frame.
Axes drawAxes(QPainter& p, const QRectF& rect, double x0, double x1, double y0, double y1, const QString& xTitle,
              const QString& yTitle) {
    Axes a;
    a.plot = rect.adjusted(64, 40, -20, -46);
    if (!(x1 > x0)) x1 = x0 + 1;
    if (!(y1 - y0 >= 1e-9)) {
        y0 -= 1;
        y1 += 1;
    }
    const double xs = niceTickStep(x1 - x0, std::max(2, int(a.plot.width() / 90)));
    const double ys = niceTickStep(y1 - y0, std::max(2, int(a.plot.height() / 32)));
    a.x0 = std::floor(x0 / xs) * xs;
    a.x1 = std::ceil(x1 / xs - 1e-9) * xs;
    a.y0 = std::floor(y0 / ys) * ys;
    a.y1 = std::ceil(y1 / ys - 1e-9) * ys;
    const QFontMetricsF fm(p.font());
    p.setPen(QPen(ink::grid(), 1));
    for (double x = a.x0; x <= a.x1 + xs / 1000; x += xs) p.drawLine(QPointF(a.X(x), a.plot.top()), QPointF(a.X(x), a.plot.bottom()));
    for (double y = a.y0; y <= a.y1 + ys / 1000; y += ys) p.drawLine(QPointF(a.plot.left(), a.Y(y)), QPointF(a.plot.right(), a.Y(y)));
    p.setPen(QPen(ink::axis(), 1));
    p.drawRect(a.plot);
    p.setPen(ink::text());
    for (double x = a.x0; x <= a.x1 + xs / 1000; x += xs)
        p.drawText(QRectF(a.X(x) - 45, a.plot.bottom() + 4, 90, fm.height()), Qt::AlignHCenter | Qt::AlignTop, tickLabel(x, xs));
    for (double y = a.y0; y <= a.y1 + ys / 1000; y += ys)
        p.drawText(QRectF(rect.left(), a.Y(y) - fm.height() / 2, a.plot.left() - rect.left() - 6, fm.height()),
                   Qt::AlignRight | Qt::AlignVCenter, tickLabel(y, ys));
    p.drawText(QRectF(a.plot.left(), a.plot.bottom() + 6 + fm.height(), a.plot.width(), fm.height() + 2), Qt::AlignHCenter,
               xTitle);
    p.save();
    p.translate(rect.left() + fm.height() / 2 + 2, a.plot.center().y());
    p.rotate(-90);
    const double room = std::max(a.plot.height() + 30, 40.0);
    p.drawText(QRectF(-room / 2, -fm.height() / 2, room, fm.height()), Qt::AlignCenter,
               fm.elidedText(yTitle, Qt::ElideRight, room));
    p.restore();
    return a;
}

void drawHeading(QPainter& p, const QRectF& rect, double left, const QString& title, const QString& figures) {
    const QFont base = p.font();
    p.setPen(ink::text());
    p.setFont(chartFont(base, 12, true));
    p.drawText(QRectF(left, rect.top() + 4, rect.right() - left - 8, 18), Qt::AlignLeft, title);
    p.setFont(base);
    if (!figures.isEmpty())
        p.drawText(QRectF(left, rect.top() + 20, rect.right() - left - 8, 16), Qt::AlignLeft,
                   QFontMetricsF(base).elidedText(figures, Qt::ElideRight, rect.right() - left - 8));
}

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
    const QFont base = p.font();
    p.setFont(chartFont(base, 11));
    const QFontMetricsF fm(p.font());

    // Data range in display units.
    double qmax = 0, tmin = 1e300, tmax = -1e300;
    auto take = [&](const std::vector<CompositePoint>& pts) {
        for (const CompositePoint& c : pts) {
            qmax = std::max(qmax, Q(c.Q));
            tmin = std::min(tmin, T(c.T));
            tmax = std::max(tmax, T(c.T));
        }
    };
    if (grand) {
        take(t.grandComposite);
        qmax *= 1.02;  // room for the curve's top end
        for (const UtilityPlacement& u : r_.utilities.levels) {
            tmin = std::min(tmin, T(u.Tshifted));
            tmax = std::max(tmax, T(u.Tshifted));
        }
    } else {
        take(t.hotComposite);
        take(t.coldComposite);
    }
    if (tmin > tmax) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter, QStringLiteral("No steady-flow heating or cooling to set targets for"));
        p.setFont(base);
        p.restore();
        return;
    }
    const QString tUnit = unitSymbol(Dimension::Temperature, units_, ctx_);
    const QString qUnit = unitSymbol(Dimension::Power, units_, ctx_);
    // A little room above and below, so no line lies on the frame.
    const double pad = 0.03 * std::max(tmax - tmin, 1.0);
    tmin -= pad;
    tmax += pad;
    const Axes a = drawAxes(p, rect, 0, qmax, tmin, tmax,
                            (grand ? QStringLiteral("Heat flow [") : QStringLiteral("Duty [")) + qUnit + QStringLiteral("]"),
                            (grand ? QStringLiteral("Shifted temperature [") : QStringLiteral("Temperature [")) + tUnit +
                                QStringLiteral("]"));

    auto polyline = [&](const std::vector<CompositePoint>& pts) {
        QPolygonF line;
        for (const CompositePoint& c : pts) line << QPointF(a.X(Q(c.Q)), a.Y(T(c.T)));
        return line;
    };
    p.setClipRect(a.plot.adjusted(-1, -1, 1, 1));
    QString heading;
    if (!grand) {
        // Heat recovered: between the curves where both exist.
        const double lo = t.coldComposite.empty() ? 0 : t.coldComposite.front().Q;
        const double hi = t.hotComposite.empty() ? 0 : t.hotComposite.back().Q;
        if (hi > lo) {
            QPainterPath overlap;
            overlap.addRect(QRectF(QPointF(a.X(Q(lo)), a.plot.top()), QPointF(a.X(Q(hi)), a.plot.bottom())));
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
            const double yh = a.Y(T(t.pinchHot[i])), yc = a.Y(T(t.pinchCold[i]));
            p.drawLine(QPointF(a.plot.left(), yh), QPointF(a.plot.right(), yh));
            p.drawLine(QPointF(a.plot.left(), yc), QPointF(a.plot.right(), yc));
            const QString label = QStringLiteral("pinch ") + formatNumber(T(t.pinchHot[i]), 4) + QStringLiteral(" / ") +
                                  formatNumber(T(t.pinchCold[i]), 4) + QStringLiteral(" ") + tUnit;
            // On a white ground, so a curve under it never makes it unreadable.
            const QRectF box(a.plot.left() + 4, yh - fm.height() - 2, fm.horizontalAdvance(label) + 6, fm.height());
            p.fillRect(box, QColor(255, 255, 255, 215));
            p.setPen(ink::text());
            p.drawText(box, Qt::AlignCenter, label);
        }
        heading = QStringLiteral("Composite curves: hot (red) and cold (blue), heat recovered shaded");
    } else {
        // The utility levels behind the curve: a thin line at the level's
        // shifted temperature, a translucent bar for the heat it can take.
        struct Label {
            QRectF box;
            QString text;
            QColor colour;
        };
        std::vector<Label> labels;
        for (const UtilityPlacement& u : r_.utilities.levels) {
            const double y = a.Y(T(u.Tshifted));
            const QColor c = u.hot ? kHot : kCold;
            const double xEnd = a.X(Q(u.duty));
            p.setPen(QPen(c, 1, Qt::DashLine));
            p.drawLine(QPointF(xEnd, y), QPointF(a.plot.right(), y));
            if (u.duty > 0) {
                QColor bar = c;
                bar.setAlpha(130);
                p.setPen(QPen(bar, 6, Qt::SolidLine, Qt::FlatCap));
                p.drawLine(QPointF(a.X(0), y), QPointF(xEnd, y));
            }
            const QString text = QString::fromStdString(u.id) + QStringLiteral(" ") + formatNumber(Q(u.duty), 4) +
                                 QStringLiteral(" ") + qUnit;
            // At the heat axis, where the level's bar starts: the grand
            // composite curve meets that axis only at a pinch. Above the
            // line unless that leaves the plot.
            const double w = fm.horizontalAdvance(text) + 4;
            double top = y - fm.height() - 4;
            if (top < a.plot.top() + 1) top = y + 4;
            labels.push_back({QRectF(a.plot.left() + 4, top, w, fm.height()), text, c});
        }
        p.setPen(QPen(kGrand, 2.2));
        p.drawPolyline(polyline(t.grandComposite));
        // Levels close in temperature: a label that would cover another
        // moves along beside it.
        for (std::size_t i = 0; i < labels.size(); ++i)
            for (std::size_t k = 0; k < i; ++k)
                if (labels[i].box.intersects(labels[k].box.adjusted(-4, -1, 4, 1)))
                    labels[i].box.moveLeft(labels[k].box.right() + 10);
        for (const Label& l : labels) {
            p.fillRect(l.box, QColor(255, 255, 255, 215));
            p.setPen(l.colour.darker(115));
            p.drawText(l.box, Qt::AlignCenter, l.text);
        }
        heading = QStringLiteral("Grand composite curve and utility levels (heat each level can take)");
    }
    p.setClipping(false);
    drawHeading(p, rect, a.plot.left(), heading,
                QStringLiteral("ΔTmin ") + formatNumber(toDisplay(t.dTmin, Dimension::TemperatureDifference, units_, ctx_), 4) +
                    QStringLiteral(" ") + unitSymbol(Dimension::TemperatureDifference, units_, ctx_) +
                    QStringLiteral(" · minimum hot utility ") + formatNumber(Q(t.hotUtilityMin), 4) + QStringLiteral(" ") +
                    qUnit + QStringLiteral(" · minimum cold utility ") + formatNumber(Q(t.coldUtilityMin), 4) +
                    QStringLiteral(" ") + qUnit);
    p.setFont(base);
    p.restore();
}

void TargetsSweepChart::setData(std::vector<TargetsAtDTmin> sweep, std::optional<double> markedDTmin, UnitSystem units,
                                const UnitContext& ctx) {
    sweep_ = std::move(sweep);
    marked_ = markedDTmin;
    units_ = units;
    ctx_ = ctx;
}

void TargetsSweepChart::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing);
    auto dT = [&](double K) { return toDisplay(K, Dimension::TemperatureDifference, units_, ctx_); };
    auto Q = [&](double W) { return toDisplay(W, Dimension::Power, units_, ctx_); };
    const QFont base = p.font();
    p.setFont(chartFont(base, 11));
    const QFontMetricsF fm(p.font());
    if (sweep_.size() < 2) {
        p.setPen(ink::muted());
        p.drawText(rect, Qt::AlignCenter, QStringLiteral("No steady-flow heating or cooling to set targets for"));
        p.setFont(base);
        p.restore();
        return;
    }
    double ymax = 0;
    for (const TargetsAtDTmin& s : sweep_) ymax = std::max({ymax, Q(s.hotUtilityMin), Q(s.coldUtilityMin)});
    const QString dUnit = unitSymbol(Dimension::TemperatureDifference, units_, ctx_);
    const QString qUnit = unitSymbol(Dimension::Power, units_, ctx_);
    const Axes a = drawAxes(p, rect, dT(sweep_.front().dTmin), dT(sweep_.back().dTmin), 0, std::max(ymax, 1e-9),
                            QStringLiteral("ΔTmin [") + dUnit + QStringLiteral("]"),
                            QStringLiteral("Minimum utility [") + qUnit + QStringLiteral("]"));
    p.setClipRect(a.plot.adjusted(-1, -1, 1, 1));
    QPolygonF hot, cold;
    for (const TargetsAtDTmin& s : sweep_) {
        hot << QPointF(a.X(dT(s.dTmin)), a.Y(Q(s.hotUtilityMin)));
        cold << QPointF(a.X(dT(s.dTmin)), a.Y(Q(s.coldUtilityMin)));
    }
    p.setPen(QPen(kHot, 2));
    p.drawPolyline(hot);
    p.setPen(QPen(kCold, 2));
    p.drawPolyline(cold);
    if (marked_) {
        p.setPen(QPen(ink::selection(), 1.2, Qt::DashLine));
        const double x = a.X(dT(*marked_));
        p.drawLine(QPointF(x, a.plot.top()), QPointF(x, a.plot.bottom()));
    }
    p.setClipping(false);

    // Heading, and the key on the line under it, never over the lines.
    drawHeading(p, rect, a.plot.left(), QStringLiteral("Targets against ΔTmin"), QString());
    double x = a.plot.left();
    const double y = rect.top() + 28;
    auto key = [&](const QColor& c, const QString& text, Qt::PenStyle style) {
        p.setPen(QPen(c, 2, style));
        p.drawLine(QPointF(x, y), QPointF(x + 18, y));
        p.setPen(ink::text());
        p.drawText(QPointF(x + 22, y + fm.ascent() / 2 - 1), text);
        x += 22 + fm.horizontalAdvance(text) + 16;
    };
    key(kHot, QStringLiteral("minimum hot utility"), Qt::SolidLine);
    key(kCold, QStringLiteral("minimum cold utility"), Qt::SolidLine);
    if (marked_)
        key(ink::selection(), QStringLiteral("ΔTmin in use ") + formatNumber(dT(*marked_), 4) + QStringLiteral(" ") + dUnit,
            Qt::DashLine);
    p.setFont(base);
    p.restore();
}

}  // namespace heatchain::view
