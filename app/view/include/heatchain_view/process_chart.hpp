#pragma once
// The two process charts, drawn with QPainter so the same code paints the
// window and the PDF report:
//   - T–s: every step's path in its own colour over the saturation dome;
//   - T–Q: temperature against cumulative duty, each step's heat source or
//     sink as a line over the step's duty span (a utility's own T–Q line from
//     core: flat for steam and fixed, sloped counter-current for a sensible
//     stream), each served step's closest point marked with its approach
//     (red below the worksheet's minimum approach), and the smallest
//     approach of the sheet.
// The chart only converts core's SI curves to display units and draws them.
#include <QColor>
#include <QPainter>
#include <QString>
#include <optional>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/uncertainty.hpp"

namespace heatchain::view {

class ProcessChart {
public:
    enum class Kind { TemperatureEntropy, TemperatureDuty };

    explicit ProcessChart(Kind kind) : kind_(kind) {}

    // Takes the curves of `result` (display units of `project`); `dome` may be
    // null (a model without a liquid–vapour line, or not wanted).
    void setData(const Project& project, const SequenceResult& result, const DomeCurve* dome);
    // Colours of the steps by index, used by setData (else by index).
    void setStepColours(std::vector<QColor> colours) { colours_ = std::move(colours); }
    // Standard uncertainties (core's first-order propagation) to draw as a
    // band of ± one standard uncertainty around each step's path; null for
    // none. Used by the next setData.
    void setUncertainty(const UncertaintyResult* u) { uncertainty_ = u; }
    struct Band {
        int step = -1;
        std::vector<QPointF> pts;  // closed outline, display units
        QColor colour;
    };
    const std::vector<Band>& bands() const { return bands_; }
    void setSelectedStep(int index) { selected_ = index; }
    int selectedStep() const { return selected_; }
    Kind kind() const { return kind_; }

    void paint(QPainter& p, const QRectF& rect) const;

    struct Hover {
        QPointF at;    // widget position of the nearest point
        QString text;  // several lines
        int step = -1;
    };
    // The curve point nearest `pos` within `radius` pixels, if any.
    std::optional<Hover> hoverAt(QPointF pos, const QRectF& rect, double radius = 14) const;

    // The smallest approach over all steps with a source or sink (T–Q only):
    // step index, the cumulative duty and the temperature of the material
    // where it occurs, the reservoir temperature, all in display units.
    struct Approach {
        int step = -1;
        double Q = 0, T = 0, Treservoir = 0, dT = 0;
        bool belowMinimum = false;  // closer than the worksheet's minimum approach
    };
    std::optional<Approach> smallestApproach() const { return approach_; }
    // One closest point per step that has a source or sink (display units).
    const std::vector<Approach>& stepApproaches() const { return stepApproaches_; }

    // A source or sink line as drawn (display units): two points for a flat
    // temperature, core's utility line for a served step.
    struct ReservoirLine {
        int step = -1;
        std::vector<QPointF> pts;  // (Q cumulative, T) in display units
        bool source = true;
        QString label;             // "source", "sink" or the utility id
        bool utility = false;      // core's utility line (else a typed temperature)
        QColor colour;
    };
    const std::vector<ReservoirLine>& reservoirLines() const { return reservoirs_; }

    QString xTitle() const { return xTitle_; }
    QString yTitle() const { return yTitle_; }

private:
    std::vector<QColor> colours_;
    struct Series {
        int step = -1;
        QString stepId, label;
        QColor colour;
        std::vector<QPointF> pts;  // (x, y) in display units
        std::vector<CurvePoint> raw;
    };
    struct Frame {
        QRectF plot;
        double x0, x1, y0, y1;
        QPointF map(QPointF v) const;
    };
    Frame frame(const QRectF& rect) const;
    void drawAxes(QPainter& p, const Frame& f) const;
    // The series as screen polylines for `f`, simplified to what a pixel
    // can show; built once per data and size, reused by every repaint
    // (selection, hover).
    const std::vector<QPolygonF>& screenLines(const Frame& f) const;

    Kind kind_;
    int selected_ = -1;
    UnitSystem units_ = UnitSystem::SI;
    UnitContext ctx_;
    SystemKind system_ = SystemKind::SteadyFlow;
    std::vector<Series> series_;
    const UncertaintyResult* uncertainty_ = nullptr;
    std::vector<Band> bands_;
    void buildBands(const SequenceResult& result);
    std::vector<ReservoirLine> reservoirs_;
    std::vector<QPointF> dome_;  // closed outline, display units
    std::optional<Approach> approach_;
    double minApproachK_ = Project::kDefaultMinApproach;
    std::vector<Approach> stepApproaches_;
    double xmin_ = 0, xmax_ = 1, ymin_ = 0, ymax_ = 1;
    QString xTitle_, yTitle_, xUnit_, yUnit_;
    mutable QRectF linesFor_;
    mutable std::vector<QPolygonF> lines_;
};

// Keeps the vertices of `line` a viewer can tell apart: drops every point
// closer than `tolerance` (pixels) to the chord that replaces it
// (Douglas–Peucker, iterative, bounded by the point count).
QPolygonF simplifyPolyline(const QPolygonF& line, double tolerance);

// Round tick spacing for a span shown with about `count` ticks.
double niceTickStep(double span, int count);
// A tick's label: as many decimals as the step needs (2.5 → one), a
// typographic minus, and no "−0".
QString tickLabel(double value, double tickStep);

}  // namespace heatchain::view
