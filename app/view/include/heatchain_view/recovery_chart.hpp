#pragma once
// The heat recovery charts, drawn with QPainter in the style of the process
// charts: the hot and cold composite curves (heat recovered between them
// shaded, the pinch marked), the grand composite curve with the worksheet's
// utility levels as horizontal bars of the heat each can take, and the
// targets against ΔTmin. Shared by the application, the report and
// `heatchain-cli chart`; every number is core's.
#include <QPainter>
#include <QString>
#include <optional>
#include <vector>

#include "heatchain/recovery.hpp"
#include "heatchain/units.hpp"

namespace heatchain::view {

class RecoveryChart {
public:
    enum class Kind { Composite, GrandComposite };
    explicit RecoveryChart(Kind kind) : kind_(kind) {}
    void setData(const Recovery& recovery, UnitSystem units, const UnitContext& ctx);
    void paint(QPainter& p, const QRectF& rect) const;
    Kind kind() const { return kind_; }

private:
    Kind kind_;
    Recovery r_;
    UnitSystem units_ = UnitSystem::SI;
    UnitContext ctx_;
};

// The minimum hot and cold utility against ΔTmin (core's dTminSweep), with
// the ΔTmin in use marked.
class TargetsSweepChart {
public:
    void setData(std::vector<TargetsAtDTmin> sweep, std::optional<double> markedDTmin, UnitSystem units,
                 const UnitContext& ctx);
    void paint(QPainter& p, const QRectF& rect) const;

private:
    std::vector<TargetsAtDTmin> sweep_;
    std::optional<double> marked_;
    UnitSystem units_ = UnitSystem::SI;
    UnitContext ctx_;
};

}  // namespace heatchain::view
