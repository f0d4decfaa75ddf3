#pragma once
// Formatting of core results for people: numbers in the display unit system,
// unit symbols as an engineer writes them, phase and step-kind labels. Only
// presentation; every number comes from core.
#include <QString>
#include <QStringList>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/state.hpp"
#include "heatchain/units.hpp"

namespace heatchain::view {

// The unit of `d` in `system` as printed in headers and axis titles
// ("°C", "kJ/(kg·K)", "m³/kg"): the core's symbol with typographic signs.
QString unitSymbol(Dimension d, UnitSystem system);
// Core unit symbol → printed form ("degC" → "°C", "m3" → "m³").
QString prettyUnit(std::string_view coreSymbol);

// A display-unit number with about `significant` significant digits but never
// more than `maxDecimals` decimals, no exponent for ordinary magnitudes, and
// a real minus sign so columns read cleanly. NaN prints as an en dash.
QString formatNumber(double value, int significant = 5, int maxDecimals = 4);
// The number only, converted to the display unit of `d`.
QString formatDisplay(double si, Dimension d, UnitSystem system, const UnitContext& ctx = {},
                      int significant = 5);
// Number and unit: "180.0 °C".
QString formatWithUnit(double si, Dimension d, UnitSystem system, const UnitContext& ctx = {},
                       int significant = 5);

// Dimensions of the extensive results of a system (closed: J, J/K; flow: W, W/K).
Dimension energyDimension(SystemKind system);
Dimension entropyDimension(SystemKind system);

// "liquid", "vapour", "two-phase, x = 0.350", "solid–liquid, 40.0 % liquid".
QString phaseText(const State& s);
// Short form for cards: "x = 0.35", "liquid".
QString phaseShort(const State& s);

// Step kind for people ("Heat", "Boil", …) and a one-line description of
// what the step asks for ("to 180 °C, source 240 °C").
QString stepKindTitle(StepKind k);
QString stepSpecSummary(const Step& step, SystemKind system);

// All step kinds in their menu order.
const std::vector<StepKind>& allStepKinds();

}  // namespace heatchain::view
