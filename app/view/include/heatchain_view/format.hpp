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
// Pressures are always marked absolute or gauge: "bar(a)", "kPa(g)", "psia".
QString unitSymbol(Dimension d, UnitSystem system, const UnitContext& ctx = {});

// Core's UTF-8 text as a QString (std::string, string_view and literals alike).
inline QString qs(std::string_view s) { return QString::fromUtf8(s.data(), qsizetype(s.size())); }

// Text from core or a file for a message: valid UTF-8 as it is, stray bytes
// and control characters (but line feed and tab) as \xHH.
QString escapedText(std::string_view bytes);

// Whether the worksheet shows pressures as gauge readings (the display
// block's "pressure": "gauge", kept in the file beside "units").
bool gaugeDisplay(const Project& project);
void setGaugeDisplay(Project& project, bool gauge);
// The worksheet's unit context for display: its atmosphere and gauge choice.
UnitContext displayContext(const Project& project);
// Core unit symbol → printed form ("degC" → "°C", "m3" → "m³").
QString prettyUnit(std::string_view coreSymbol);

// A display-unit number with about `significant` significant digits but never
// more than `maxDecimals` decimals, no exponent for ordinary magnitudes, and
// a real minus sign so columns read cleanly. NaN prints as an en dash.
QString formatNumber(double value, int significant = 5, int maxDecimals = 4);
// Exactly `decimals` decimals (a column of a table), real minus sign.
QString formatFixed(double value, int decimals);
// The number only, converted to the display unit of `d`.
QString formatDisplay(double si, Dimension d, UnitSystem system, const UnitContext& ctx = {},
                      int significant = 5);
// Number and unit: "180.0 °C".
QString formatWithUnit(double si, Dimension d, UnitSystem system, const UnitContext& ctx = {},
                       int significant = 5);

// Dimensions of the extensive results of a system (closed: J, J/K; flow: W, W/K).
Dimension energyDimension(SystemKind system);
Dimension entropyDimension(SystemKind system);

// The glossary's phase names: "vapour", "solid + liquid", "liquid + vapour".
QString phaseName(Phase p);
// "liquid", "saturated vapour", "liquid + vapour, x = 0.350",
// "solid + liquid, 40.0 % liquid".
QString phaseText(const State& s);
// Short form for cards: "x = 0.35", "liquid".
QString phaseShort(const State& s);

// Step kind for people ("Heat", "Boil", …) and a one-line description of
// what the step asks for ("to 180 °C, source 240 °C").
QString stepKindTitle(StepKind k);
QString stepSpecSummary(const Step& step, SystemKind system);

// What a step kind does, in a few words ("vapour → solid"), for tooltips and
// the step panel: "Deposit" alone does not say it.
QString stepKindMeaning(StepKind k);

// A property model's name as the glossary gives it ("Temperature-dependent cp").
QString modelTitle(ModelKind m);

// A step that exchanged heat with no source or sink named (neither a
// temperature nor a utility): its exergy destroyed and η_II cannot be
// charged to anything, so views say "no source given" instead of 0 / 100 %.
bool noSourceGiven(const StepResult& s);
QString noSourceText();

// The notes (ordinary facts, below warnings) of a step or sequence result,
// or none when the core in use gives no notes.
template <class R>
const std::vector<std::string>& notesOf(const R& r) {
    if constexpr (requires { r.notes; }) {
        return r.notes;
    } else {
        static const std::vector<std::string> none;
        return none;
    }
}

// All step kinds in their menu order.
const std::vector<StepKind>& allStepKinds();

}  // namespace heatchain::view
