#pragma once
// A sweep's results against the swept input, one small panel per chosen
// result (each with its own value axis, so a duty and a temperature never
// share a scale), drawn with QPainter in the style of the process charts.
// Points core could not compute leave a gap in the line and a red tick on
// the input axis, so a failure is seen, not hidden.
#include <QPainter>
#include <QString>
#include <vector>

#include "heatchain/sweep.hpp"
#include "heatchain/units.hpp"

namespace heatchain::view {

class SweepPlot {
public:
    // `outputs`: indices into result.outputs to draw, in panel order.
    void setData(const SweepResult& result, std::vector<int> outputs, UnitSystem units,
                 const UnitContext& ctx);
    void paint(QPainter& p, const QRectF& rect) const;

    struct Panel {
        int output = -1;
        QString title;                 // "Total work [kW]"
        std::vector<double> x;         // display units of the input
        std::vector<std::optional<double>> y;  // display units; none where not computed
    };
    const std::vector<Panel>& panels() const { return panels_; }
    QString xTitle() const { return xTitle_; }

private:
    std::vector<Panel> panels_;
    std::vector<bool> failed_;  // per point
    QString xTitle_;
};

}  // namespace heatchain::view
