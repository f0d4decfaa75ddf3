#pragma once
// Which input drives a result's uncertainty: one horizontal bar per input
// that carries a tolerance (or the model's stated uncertainty), length = its
// share of the result's first-order variance (core's contributions, ranked
// largest first), labelled with the input as typed. Drawn with QPainter for
// the window and the PDF report.
#include <QPainter>
#include <QString>
#include <vector>

#include "heatchain/uncertainty.hpp"

namespace heatchain::view {

class ContributionChart {
public:
    struct Bar {
        QString input;  // the input's path ("start.T", "steps.compress.efficiency")
        QString typed;  // as typed ("20 degC ± 0.5 K"), or the model's statement
        double share = 0;  // 0–1
    };

    void setData(const UncertaintyResult& result);
    void clear() { bars_.clear(); of_.clear(); }
    const std::vector<Bar>& bars() const { return bars_; }
    // The output whose variance is split ("totals.heatingDuty").
    QString output() const { return of_; }
    double preferredHeight() const { return 30.0 + 22.0 * double(std::max<std::size_t>(1, bars_.size())); }
    void paint(QPainter& p, const QRectF& rect) const;

private:
    std::vector<Bar> bars_;
    QString of_;
};

// The words for an output path of the uncertainty ("totals.heatingDuty" →
// "heating duty", "steps.boil.Q" → "duty of boil").
QString uncertaintyOutputTitle(const QString& path);

}  // namespace heatchain::view
