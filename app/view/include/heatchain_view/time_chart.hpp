#pragma once
// The time chart of a batch: the material's temperature against time over
// the steps that have a time (each in its step's colour), the utility's
// temperature at the surface dashed above or below it, and the utility's
// duty against time on the right-hand axis. Steps without a time take none
// and are not drawn. The chart only converts core's SI profiles
// (StepResult::batch) to display units and draws them.
#include <QColor>
#include <QPainter>
#include <QString>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain::view {

class TimeChart {
public:
    void setData(const Project& project, const SequenceResult& result);
    void setStepColours(std::vector<QColor> colours) { colours_ = std::move(colours); }
    void paint(QPainter& p, const QRectF& rect) const;
    // False when no step has a time (the chart then says so).
    bool hasData() const { return !series_.empty(); }

    struct Series {
        int step = -1;
        QString stepId;
        QColor colour;
        std::vector<QPointF> T;        // (time, temperature) in display units
        std::vector<QPointF> Tutility; // (time, utility temperature)
        std::vector<QPointF> duty;     // (time, utility duty) in kW (or Btu/h)
    };
    const std::vector<Series>& series() const { return series_; }
    QString timeUnit() const { return timeUnit_; }

private:
    std::vector<QColor> colours_;
    std::vector<Series> series_;
    QString timeUnit_, tUnit_, dutyUnit_;
    double tmax_ = 1, ymin_ = 0, ymax_ = 1, dmax_ = 1;
};

}  // namespace heatchain::view
