#include "heatchain_view/process_chart.hpp"

#include <QFontMetricsF>
#include <QPaintEngine>
#include <QPainterPath>
#include <algorithm>
#include <cmath>
#include <limits>

#include "heatchain/rules.hpp"
#include "heatchain_view/format.hpp"
#include "heatchain_view/palette.hpp"
#include "heatchain_view/utility_text.hpp"

namespace heatchain::view {

double niceTickStep(double span, int count) {
    if (!(span > 0) || count < 1) return 1.0;
    const double raw = span / count;
    const double mag = std::pow(10.0, std::floor(std::log10(raw)));
    for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
        if (raw <= m * mag) return m * mag;
    return 10.0 * mag;
}

// Decimals a tick label needs to tell neighbouring ticks apart (2.5 → 1).
static int decimalsFor(double tickStep) {
    int d = 0;
    double v = tickStep;
    while (d < 6 && std::fabs(v - std::round(v)) > 1e-6 * std::max(1.0, std::fabs(v))) {
        v *= 10;
        ++d;
    }
    return d;
}

QString tickLabel(double value, double tickStep) {
    return QString::number(std::fabs(value) < tickStep * 1e-6 ? 0.0 : value, 'f', decimalsFor(tickStep))
        .replace(QLatin1Char('-'), QChar(0x2212));
}

QPolygonF simplifyPolyline(const QPolygonF& line, double tolerance) {
    const qsizetype n = line.size();
    if (n < 3) return line;
    std::vector<char> keep(std::size_t(n), 0);
    keep.front() = keep.back() = 1;
    std::vector<std::pair<qsizetype, qsizetype>> stack{{0, n - 1}};
    const double tol2 = tolerance * tolerance;
    // Every pass splits a range at an interior point or ends it: at most n
    // passes.
    while (!stack.empty()) {
        const auto [a, b] = stack.back();
        stack.pop_back();
        if (b - a < 2) continue;
        const QPointF A = line[a], d = line[b] - A;
        const double len2 = d.x() * d.x() + d.y() * d.y();
        double worst = -1;
        qsizetype at = -1;
        for (qsizetype i = a + 1; i < b; ++i) {
            const QPointF v = line[i] - A;
            // Squared distance to the chord (to A when the chord is a point).
            double dist2;
            if (len2 <= 1e-18) {
                dist2 = v.x() * v.x() + v.y() * v.y();
            } else {
                const double cross = v.x() * d.y() - v.y() * d.x();
                dist2 = cross * cross / len2;
            }
            if (dist2 > worst) { worst = dist2; at = i; }
        }
        if (worst > tol2) {
            keep[std::size_t(at)] = 1;
            stack.push_back({a, at});
            stack.push_back({at, b});
        }
    }
    QPolygonF out;
    out.reserve(n);
    for (qsizetype i = 0; i < n; ++i)
        if (keep[std::size_t(i)]) out << line[i];
    return out;
}

namespace {
// Display conversion of one dimension as a + b·x. Unit conversions are
// linear or affine (temperature scales, gauge pressure), so two calls give
// the line and a per-point call to the unit tables is not needed; a third
// point confirms it, else every point is converted the long way.
struct DisplayMap {
    Dimension dim;
    UnitSystem units;
    UnitContext ctx;
    double a = 0, b = 1;
    bool affine = false;
    DisplayMap(Dimension d, UnitSystem u, const UnitContext& c) : dim(d), units(u), ctx(c) {
        a = toDisplay(0.0, d, u, c);
        b = toDisplay(1.0, d, u, c) - a;
        const double probe = toDisplay(1000.0, d, u, c);
        affine = std::isfinite(a) && std::isfinite(b) &&
                 std::fabs(probe - (a + 1000.0 * b)) <= 1e-9 * std::max(1.0, std::fabs(probe));
    }
    double operator()(double si) const { return affine ? a + b * si : toDisplay(si, dim, units, ctx); }
};
}  // namespace

QPointF ProcessChart::Frame::map(QPointF v) const {
    const double fx = (v.x() - x0) / (x1 - x0);
    const double fy = (v.y() - y0) / (y1 - y0);
    return {plot.left() + fx * plot.width(), plot.bottom() - fy * plot.height()};
}

void ProcessChart::setData(const Project& project, const SequenceResult& result,
                           const DomeCurve* dome) {
    units_ = project.displayUnits;
    ctx_ = displayContext(project);
    system_ = result.system;
    series_.clear();
    reservoirs_.clear();
    dome_.clear();
    approach_.reset();
    stepApproaches_.clear();
    minApproachK_ = project.minApproachK();

    const Dimension xDim = kind_ == Kind::TemperatureEntropy ? Dimension::SpecificEntropy
                                                              : energyDimension(system_);
    xUnit_ = unitSymbol(xDim, units_);
    yUnit_ = unitSymbol(Dimension::Temperature, units_);
    xTitle_ = (kind_ == Kind::TemperatureEntropy ? QStringLiteral("s") : QStringLiteral("Q cumulative"))
              + QStringLiteral(" [%1]").arg(xUnit_);
    yTitle_ = QStringLiteral("T [%1]").arg(yUnit_);

    linesFor_ = QRectF();
    lines_.clear();
    const DisplayMap toX(xDim, units_, ctx_), toY(Dimension::Temperature, units_, ctx_);
    auto X = [&](const CurvePoint& c) { return kind_ == Kind::TemperatureEntropy ? toX(c.s) : toX(c.Q); };
    auto Y = [&](double T) { return toY(T); };

    double qRunning = 0;  // fallback cumulative duty when a step carries no curve
    double minDT = std::numeric_limits<double>::infinity();
    for (std::size_t i = 0; i < result.steps.size(); ++i) {
        const StepResult& st = result.steps[i];
        if (!st.computed) continue;
        const double qStart = qRunning;
        qRunning += st.Q;
        std::vector<CurvePoint> stepPts;
        for (const SegmentResult& seg : st.segments) {
            Series s;
            s.step = int(i);
            s.stepId = QString::fromStdString(st.id);
            s.label = QString::fromStdString(seg.label);
            s.colour = (i < colours_.size() ? colours_[i] : stepColour(int(i)));
            s.raw = seg.curve;
            if (s.raw.empty()) {
                // No sampled curve: the straight chord between the segment's ends.
                s.raw.push_back({seg.start.T, seg.start.s, qStart, seg.start.P, seg.start.h});
                s.raw.push_back({seg.end.T, seg.end.s, qStart + seg.Q, seg.end.P, seg.end.h});
            }
            for (const CurvePoint& c : s.raw) s.pts.emplace_back(X(c), Y(c.T));
            stepPts.insert(stepPts.end(), s.raw.begin(), s.raw.end());
            series_.push_back(std::move(s));
        }
        if (st.segments.empty()) {
            Series s;
            s.step = int(i);
            s.stepId = QString::fromStdString(st.id);
            s.colour = (i < colours_.size() ? colours_[i] : stepColour(int(i)));
            s.raw = {{st.start.T, st.start.s, qStart, st.start.P, st.start.h},
                     {st.end.T, st.end.s, qRunning, st.end.P, st.end.h}};
            for (const CurvePoint& c : s.raw) s.pts.emplace_back(X(c), Y(c.T));
            stepPts = s.raw;
            series_.push_back(std::move(s));
        }
        if (kind_ == Kind::TemperatureDuty && st.utility && !st.utility->line.empty()) {
            // A served step: core's own utility line and closest point.
            const StepUtility& u = *st.utility;
            ReservoirLine r;
            r.step = int(i);
            r.source = u.asSource;
            r.label = QString::fromStdString(u.id);
            r.utility = true;
            r.colour = (i < colours_.size() ? colours_[i] : stepColour(int(i)));
            for (const UtilityLinePoint& lp : u.line)
                r.pts.emplace_back(toDisplay(lp.Q, xDim, units_, ctx_), Y(lp.T));
            reservoirs_.push_back(std::move(r));
            // approachDuty is counted from the step's start as |heat|; the
            // cumulative axis runs the way the step's Q does.
            const double q = qStart + (st.Q >= 0 ? u.approachDuty : -u.approachDuty);
            Approach a{int(i), toDisplay(q, xDim, units_, ctx_), Y(u.Tmaterial), Y(u.Tutility),
                       toDisplay(u.minApproach, Dimension::TemperatureDifference, units_, ctx_),
                       approachBelowRequired(u, minApproachK_)};
            stepApproaches_.push_back(a);
            if (u.minApproach < minDT) {
                minDT = u.minApproach;
                approach_ = a;
            }
        } else if (kind_ == Kind::TemperatureDuty && st.reservoirT && !stepPts.empty()) {
            ReservoirLine r;
            r.step = int(i);
            r.source = st.Q >= 0;
            r.label = r.source ? QStringLiteral("source") : QStringLiteral("sink");
            const double T = Y(*st.reservoirT);
            r.pts = {{X(stepPts.front()), T}, {X(stepPts.back()), T}};
            r.colour = (i < colours_.size() ? colours_[i] : stepColour(int(i)));
            reservoirs_.push_back(r);
            // Approach: how far the reservoir stays hotter (source) or colder
            // (sink) than the material along the step, in kelvin.
            std::optional<Approach> best;
            double bestDT = std::numeric_limits<double>::infinity();
            for (const CurvePoint& c : stepPts) {
                const double dT = r.source ? *st.reservoirT - c.T : c.T - *st.reservoirT;
                if (dT < bestDT) {
                    bestDT = dT;
                    best = Approach{int(i), X(c), Y(c.T), T,
                                    toDisplay(dT, Dimension::TemperatureDifference, units_, ctx_),
                                    approachBelowRequired(dT, minApproachK_, st.Q, /*utility=*/false)};
                }
            }
            if (best) {
                stepApproaches_.push_back(*best);
                if (bestDT < minDT) {
                    minDT = bestDT;
                    approach_ = best;
                }
            }
        }
    }

    if (kind_ == Kind::TemperatureEntropy && dome && !dome->liquidSide.empty()) {
        for (const CurvePoint& c : dome->liquidSide) dome_.emplace_back(X(c), Y(c.T));
        for (auto it = dome->vaporSide.rbegin(); it != dome->vaporSide.rend(); ++it)
            dome_.emplace_back(X(*it), Y(it->T));
    }

    // Ranges: the paths (and the start point), widened to the dome when the
    // paths reach into its temperature span, so the dome gives context
    // without squashing a small process into a corner.
    buildBands(result);
    double x0 = std::numeric_limits<double>::infinity(), x1 = -x0, y0 = x0, y1 = -x0;
    auto grow = [&](QPointF v) {
        if (!std::isfinite(v.x()) || !std::isfinite(v.y())) return;
        x0 = std::min(x0, v.x()); x1 = std::max(x1, v.x());
        y0 = std::min(y0, v.y()); y1 = std::max(y1, v.y());
    };
    for (const Series& s : series_)
        for (QPointF v : s.pts) grow(v);
    for (const ReservoirLine& r : reservoirs_)
        for (QPointF v : r.pts) grow(v);
    for (const Band& b : bands_)
        for (QPointF v : b.pts) grow(v);
    if (!std::isfinite(x0)) {
        x0 = 0; x1 = 1; y0 = 0; y1 = 100;
    }
    if (!dome_.empty()) {
        double dy0 = std::numeric_limits<double>::infinity(), dy1 = -dy0;
        for (QPointF v : dome_) { dy0 = std::min(dy0, v.y()); dy1 = std::max(dy1, v.y()); }
        if (y1 >= dy0 && y0 <= dy1)
            for (QPointF v : dome_) grow(v);
    }
    if (kind_ == Kind::TemperatureDuty) x0 = std::min(x0, 0.0);
    // A sheet with no duty yet (only a throttle, say) has every point at
    // Q = 0: give the axis a span of one display unit around it, not 1e-9
    // with ticks reading "-0 0 0".
    if (x1 - x0 < 1e-6 * std::max(1.0, std::fabs(x0))) {
        const double half = kind_ == Kind::TemperatureDuty ? 0.5 : 0.05;
        x0 -= half;
        x1 += half;
    }
    const double padX = std::max((x1 - x0) * 0.05, 1e-9 + std::fabs(x1) * 0.01);
    const double padY = std::max((y1 - y0) * 0.06, 1.0);
    xmin_ = x0 - padX; xmax_ = x1 + padX;
    ymin_ = y0 - padY; ymax_ = y1 + padY;
    if (kind_ == Kind::TemperatureDuty && x0 >= 0) xmin_ = std::min(0.0, xmin_);
}

const std::vector<QPolygonF>& ProcessChart::screenLines(const Frame& f) const {
    if (linesFor_ == f.plot && lines_.size() == series_.size()) return lines_;
    lines_.clear();
    lines_.reserve(series_.size());
    for (const Series& s : series_) {
        QPolygonF line;
        line.reserve(qsizetype(s.pts.size()));
        for (QPointF v : s.pts) line << f.map(v);
        // A quarter pixel: below what antialiasing can show, and a 100-step
        // sheet's 6,400 points mostly lie on near-straight runs.
        lines_.push_back(simplifyPolyline(line, 0.25));
    }
    linesFor_ = f.plot;
    return lines_;
}

ProcessChart::Frame ProcessChart::frame(const QRectF& rect) const {
    Frame f;
    f.plot = rect.adjusted(62, 14, -14, -42);
    f.x0 = xmin_; f.x1 = xmax_ > xmin_ ? xmax_ : xmin_ + 1;
    f.y0 = ymin_; f.y1 = ymax_ > ymin_ ? ymax_ : ymin_ + 1;
    return f;
}

void ProcessChart::drawAxes(QPainter& p, const Frame& f) const {
    const QFontMetricsF fm(p.font());
    const double xs = niceTickStep(f.x1 - f.x0, std::max(2, int(f.plot.width() / 90)));
    const double ys = niceTickStep(f.y1 - f.y0, std::max(3, int(f.plot.height() / 34)));
    p.setPen(QPen(ink::grid(), 1));
    for (double x = std::ceil(f.x0 / xs) * xs; x <= f.x1 + 1e-9 * xs; x += xs) {
        const QPointF a = f.map({x, f.y0});
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(a.x(), f.plot.top()), QPointF(a.x(), f.plot.bottom()));
        p.setPen(ink::muted());
        const QString t = tickLabel(x, xs);
        p.drawText(QRectF(a.x() - 50, f.plot.bottom() + 3, 100, fm.height()), Qt::AlignHCenter, t);
    }
    for (double y = std::ceil(f.y0 / ys) * ys; y <= f.y1 + 1e-9 * ys; y += ys) {
        const QPointF a = f.map({f.x0, y});
        p.setPen(QPen(ink::grid(), 1));
        p.drawLine(QPointF(f.plot.left(), a.y()), QPointF(f.plot.right(), a.y()));
        p.setPen(ink::muted());
        const QString t = tickLabel(y, ys);
        p.drawText(QRectF(f.plot.left() - 60, a.y() - fm.height() / 2, 55, fm.height()),
                   Qt::AlignRight | Qt::AlignVCenter, t);
    }
    p.setPen(QPen(ink::axis(), 1));
    p.setBrush(Qt::NoBrush);
    p.drawRect(f.plot);
    p.setPen(ink::text());
    p.drawText(QRectF(f.plot.left(), f.plot.bottom() + fm.height() + 6, f.plot.width(), fm.height()),
               Qt::AlignHCenter, xTitle_);
    p.save();
    p.translate(f.plot.left() - 50, f.plot.center().y());
    p.rotate(-90);
    p.drawText(QRectF(-f.plot.height() / 2, -fm.height(), f.plot.height(), fm.height()),
               Qt::AlignHCenter, yTitle_);
    p.restore();
}

void ProcessChart::paint(QPainter& p, const QRectF& rect) const {
    p.save();
    p.setRenderHint(QPainter::Antialiasing, true);
    p.fillRect(rect, Qt::white);
    const Frame f = frame(rect);
    drawAxes(p, f);
    p.setClipRect(f.plot.adjusted(1, 1, -1, -1));

    for (const Band& b : bands_) {
        QPolygonF poly;
        for (QPointF v : b.pts) poly << f.map(v);
        QColor fill = b.colour;
        fill.setAlpha(b.step == selected_ ? 70 : 45);
        p.setPen(Qt::NoPen);
        p.setBrush(fill);
        p.drawPolygon(poly);
    }

    if (!dome_.empty()) {
        QPolygonF poly;
        for (QPointF v : dome_) poly << f.map(v);
        p.setPen(Qt::NoPen);
        p.setBrush(QColor(0xee, 0xf0, 0xf3));
        p.drawPolygon(poly);
        p.setPen(QPen(ink::dome(), 1.3));
        p.setBrush(Qt::NoBrush);
        p.drawPolyline(poly);
        // Label where the two sides meet (the critical point).
        const QPointF top = *std::max_element(poly.begin(), poly.end(),
                                              [](QPointF a, QPointF b) { return a.y() > b.y(); });
        p.setPen(ink::muted());
        p.drawText(top + QPointF(8, 14), QStringLiteral("saturation"));
    }

    // On screen, a long sheet draws its unselected lines one pixel wide: the
    // raster engine then draws them directly instead of filling an outline
    // per line (a 100-step T–Q chart otherwise spends ~10 ms on outlines),
    // and dozens of overlapping paths read better thin. Print keeps widths.
    const bool dense = series_.size() > 40 && p.paintEngine() && p.paintEngine()->type() == QPaintEngine::Raster;
    QStringList labelled;  // a utility's id once, on its first line
    // Labels never cover each other: each takes the first free place near
    // its line (nudged up or down), or is left out when there is none.
    std::vector<QRectF> taken;
    auto place = [&](QRectF box, double stepY) -> std::optional<QRectF> {
        for (int k = 0; k < 9; ++k) {
            const double dy = (k % 2 == 1 ? 1 : -1) * double((k + 1) / 2) * stepY;
            QRectF b = box.translated(0, dy);
            if (b.top() < f.plot.top() || b.bottom() > f.plot.bottom()) continue;
            bool clear = true;
            for (const QRectF& t : taken) clear = clear && !t.intersects(b);
            if (clear) {
                taken.push_back(b);
                return b;
            }
        }
        return std::nullopt;
    };
    const QFontMetricsF lfm(p.font());
    for (const ReservoirLine& r : reservoirs_) {
        if (r.pts.size() < 2) continue;
        QPolygonF line;
        for (QPointF v : r.pts) line << f.map(v);
        QPen pen(r.colour, r.step == selected_ ? 2.2 : dense ? 1.0 : 1.4, Qt::DashLine);
        p.setPen(pen);
        p.setBrush(Qt::NoBrush);
        p.drawPolyline(line);
        // Words on every line would bury a long sheet: label the selected
        // step's line, or all of them on a short sheet.
        if ((reservoirs_.size() <= 12 && !(r.utility && labelled.contains(r.label))) || r.step == selected_) {
            labelled << r.label;
            p.setPen(r.colour.darker(120));
            const QPointF a = line.front(), b = line.back();
            const QPointF left = a.x() <= b.x() ? a : b;
            // On the side away from the material (below a source, above a
            // sink), where the line's left end leaves room.
            const QPointF at = left + QPointF(3, r.source ? 2 : -3 - lfm.height());
            QRectF want(at, QSizeF(lfm.horizontalAdvance(r.label) + 2, lfm.height()));
            // A line that starts near the right edge (the last step's) keeps
            // its word inside the plot, ending where the plot ends.
            if (want.right() > f.plot.right() - 2) want.moveRight(f.plot.right() - 2);
            if (auto box = place(want, (r.source ? 1 : -1) * lfm.height()))
                p.drawText(*box, Qt::AlignLeft | Qt::AlignVCenter, r.label);
        }
    }

    // Unselected steps first, the selected one on top with a halo.
    const std::vector<QPolygonF>& lines = screenLines(f);
    auto drawSeries = [&](std::size_t k, bool selected) {
        const Series& s = series_[k];
        const QPolygonF& line = lines[k];
        if (selected) {
            p.setPen(QPen(QColor(255, 235, 150), 7, Qt::SolidLine, Qt::RoundCap, Qt::RoundJoin));
            p.drawPolyline(line);
        }
        QColor c = s.colour;
        if (selected_ >= 0 && !selected) c.setAlpha(150);
        // Bevel joins: round joins cost a trigonometric arc at every vertex.
        p.setPen(QPen(c, selected ? 3.0 : dense ? 1.0 : 1.8, Qt::SolidLine, Qt::FlatCap, Qt::BevelJoin));
        p.drawPolyline(line);
    };
    for (std::size_t k = 0; k < series_.size(); ++k)
        if (series_[k].step != selected_) drawSeries(k, false);
    for (std::size_t k = 0; k < series_.size(); ++k)
        if (series_[k].step == selected_) drawSeries(k, true);

    // State points: the ends of each step (on long sheets only the selected
    // step's, where dozens of dots would hide the paths).
    int lastStep = -2;
    const bool allMarkers = series_.empty() || series_.back().step < 40;
    for (std::size_t k = 0; k < series_.size(); ++k) {
        const Series& s = series_[k];
        if (s.pts.empty()) continue;
        if (!allMarkers && s.step != selected_) continue;
        const bool lastOfStep = k + 1 == series_.size() || series_[k + 1].step != s.step;
        if (s.step != lastStep) {
            p.setPen(QPen(ink::text(), 1));
            p.setBrush(Qt::white);
            p.drawEllipse(f.map(s.pts.front()), 2.8, 2.8);
            lastStep = s.step;
        }
        if (lastOfStep) {
            p.setPen(QPen(ink::text(), 1));
            p.setBrush(s.colour);
            p.drawEllipse(f.map(s.pts.back()), 3.2, 3.2);
        }
    }

    // Each step's closest point: a short bar from material to source/sink.
    // Red (with its value) when closer than the worksheet's minimum, quiet
    // otherwise; the sheet's smallest approach always carries its value.
    const QFontMetricsF fm(p.font());
    const QString dTUnit = unitSymbol(Dimension::TemperatureDifference, units_);
    auto label = [&](const Approach& a, QPointF m, QPointF r, const QColor& ink) {
        const QString text = QStringLiteral("ΔT %1 %2").arg(formatNumber(a.dT, 4, 1), dTUnit);
        QRectF want(QPointF(0, 0), QSizeF(fm.horizontalAdvance(text) + 8, fm.height() + 4));
        want.moveCenter((m + r) / 2 + QPointF(want.width() / 2 + 6, 0));
        if (want.right() > f.plot.right()) want.moveRight((m.x() + r.x()) / 2 - 6);
        const auto placed = place(want, want.height());
        const QRectF box = placed ? *placed : want;
        p.setPen(Qt::NoPen);
        p.setBrush(QColor(255, 255, 255, 225));
        p.drawRect(box);
        p.setPen(ink);
        p.drawText(box, Qt::AlignCenter, text);
    };
    for (const Approach& a : stepApproaches_) {
        const bool sheetMin = approach_ && a.step == approach_->step;
        const QPointF m = f.map({a.Q, a.T}), r = f.map({a.Q, a.Treservoir});
        const QColor ink = a.belowMinimum ? ink::error() : ink::axis();
        p.setPen(QPen(ink, a.belowMinimum ? 1.6 : 1.0, a.belowMinimum ? Qt::SolidLine : Qt::DotLine));
        p.drawLine(m, r);
        p.setBrush(Qt::NoBrush);
        p.drawEllipse(m, a.belowMinimum || sheetMin ? 5 : 3.5, a.belowMinimum || sheetMin ? 5 : 3.5);
        if (a.belowMinimum || sheetMin || a.step == selected_) label(a, m, r, ink);
    }
    p.restore();
}

std::optional<ProcessChart::Hover> ProcessChart::hoverAt(QPointF pos, const QRectF& rect,
                                                         double radius) const {
    const Frame f = frame(rect);
    if (!f.plot.contains(pos)) return std::nullopt;
    double best = radius * radius;
    const Series* bestS = nullptr;
    std::size_t bestI = 0;
    for (const Series& s : series_) {
        for (std::size_t i = 0; i < s.pts.size(); ++i) {
            const QPointF d = f.map(s.pts[i]) - pos;
            const double d2 = d.x() * d.x() + d.y() * d.y();
            if (d2 < best) { best = d2; bestS = &s; bestI = i; }
        }
    }
    if (!bestS) return std::nullopt;
    const CurvePoint& c = bestS->raw[bestI];
    Hover h;
    h.at = f.map(bestS->pts[bestI]);
    h.step = bestS->step;
    QStringList lines;
    lines << (bestS->label.isEmpty() ? bestS->stepId
                                     : QStringLiteral("%1 · %2").arg(bestS->stepId, bestS->label));
    lines << QStringLiteral("T = %1").arg(formatWithUnit(c.T, Dimension::Temperature, units_, ctx_));
    lines << QStringLiteral("P = %1").arg(formatWithUnit(c.P, Dimension::Pressure, units_, ctx_));
    lines << QStringLiteral("s = %1").arg(formatWithUnit(c.s, Dimension::SpecificEntropy, units_, ctx_));
    lines << QStringLiteral("h = %1").arg(formatWithUnit(c.h, Dimension::SpecificEnergy, units_, ctx_));
    lines << QStringLiteral("Q cum. = %1").arg(formatWithUnit(c.Q, energyDimension(system_), units_, ctx_));
    h.text = lines.join(QLatin1Char('\n'));
    return h;
}

}  // namespace heatchain::view

namespace heatchain::view {

// ± one standard uncertainty around each step's path: the uncertainties of
// the temperature and of the x quantity (specific entropy, or cumulative
// duty) at the step's start and end, from core's band outputs, interpolated
// along the path. The outline runs on the side of the path a joint shift of
// both would reach (above-left and below-right of a rising path).
void ProcessChart::buildBands(const SequenceResult& result) {
    bands_.clear();
    const UncertaintyResult* u = uncertainty_;
    if (!u) return;
    const bool ts = kind_ == Kind::TemperatureEntropy;
    const Dimension xDim = ts ? Dimension::SpecificEntropy : energyDimension(system_);
    auto uOf = [&](const std::string& path) {
        const UncertainOutput* o = u->find(path);
        return o ? o->u : 0.0;
    };
    double uT0 = 0;
    for (const UncertainInput& in : u->inputs)
        if (in.path == "start.T") uT0 = in.u;
    double ux0 = ts ? uOf("start.s_J_per_kgK") : 0.0;
    for (std::size_t i = 0; i < result.steps.size(); ++i) {
        const StepResult& st = result.steps[i];
        if (!st.computed) break;
        const std::string at = "steps." + st.id + ".";
        const double uT1 = uOf(at + "end.T_K");
        const double ux1 = uOf(at + (ts ? "end.s_J_per_kgK" : "Qcumulative"));
        std::vector<QPointF> path;
        for (const Series& s : series_)
            if (s.step == int(i)) path.insert(path.end(), s.pts.begin(), s.pts.end());
        if (path.size() >= 2 && (uT0 > 0 || uT1 > 0 || ux0 > 0 || ux1 > 0)) {
            const double rising = (path.back().x() - path.front().x()) * (path.back().y() - path.front().y()) >= 0 ? 1 : -1;
            std::vector<QPointF> upper, lower;
            const std::size_t n = path.size();
            for (std::size_t k = 0; k < n; ++k) {
                const double t = double(k) / double(n - 1);
                const double dT = toDisplay(uT0 + t * (uT1 - uT0), Dimension::TemperatureDifference, units_, ctx_);
                const double dx = toDisplay(ux0 + t * (ux1 - ux0), xDim, units_, ctx_);
                upper.emplace_back(path[k].x() - rising * dx, path[k].y() + dT);
                lower.emplace_back(path[k].x() + rising * dx, path[k].y() - dT);
            }
            Band b;
            b.step = int(i);
            b.colour = i < colours_.size() ? colours_[i] : stepColour(int(i));
            b.pts = std::move(upper);
            b.pts.insert(b.pts.end(), lower.rbegin(), lower.rend());
            bands_.push_back(std::move(b));
        }
        uT0 = uT1;
        ux0 = ux1;
    }
}

}  // namespace heatchain::view
