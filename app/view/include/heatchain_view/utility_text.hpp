#pragma once
// Words and numbers for utilities and the second-law account, shared by the
// window and the report: how much of a utility a step uses, where its
// closest approach is, a utility's temperatures. Only formats core's values.
#include <QString>
#include <optional>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/units.hpp"

namespace heatchain::view {

// "steam", "sensible", "fixed T".
QString utilityKindText(UtilityKind k);
// Consumption in display units: the volume flow of a sensible stream with a
// density ("12.4 m³/h"), else its mass ("0.412 t/h"); "–" for a fixed
// temperature (no stream to count). Closed systems print kg / m³.
QString utilityUseText(UtilityKind kind, double mass, const std::optional<double>& volume,
                       SystemKind system, UnitSystem units, const UnitContext& ctx = {});
// The mass alone ("0.412 t/h"), "–" for fixed.
QString utilityMassText(UtilityKind kind, double mass, SystemKind system, UnitSystem units,
                        const UnitContext& ctx = {});
// Where a step's smallest approach is: "start of liquid, sensible".
QString approachWhereText(const StepResult& step);
// A utility's temperatures: "143.6 °C at 4.013 bar" (steam), "28.0 → 32.0 °C"
// (sensible), "350.0 °C" (fixed); empty when not resolved.
QString utilityTemperaturesText(const UtilityProfile& p, UnitSystem units, const UnitContext& ctx = {});
// Second-law efficiency as a percentage ("83.1 %"), "–" when nothing was supplied.
QString efficiencyText(const std::optional<double>& eta);

}  // namespace heatchain::view
