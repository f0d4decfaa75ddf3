#pragma once
// Rules every surface applies the same way, written once: the valid range of
// each bounded number of a worksheet (the loader, the step panel and quick add
// all call these), when a closest approach is below the required one, and
// what counts as zero when a result is shown.
#include <optional>
#include <string>
#include <string_view>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"

namespace heatchain {

// The bounded numbers of a worksheet.
enum class BoundedField {
    Quality,            // to.quality, start.quality: [0, 1]
    MeltFraction,       // start.meltFraction: [0, 1]
    Fraction,           // a phase change's share: (0, 1]
    Ratio,              // to.ratio: (1, ∞)
    Efficiency,         // isentropic efficiency: (0, 1]
    PolytropicExponent, // n: (0, ∞)
};

struct NumberRange {
    double lo, hi;       // hi is +∞ where unbounded
    bool loOpen, hiOpen;
    std::string_view what;  // "fraction", "pressure ratio", ...
    bool contains(double v) const;
    std::string text() const;  // "(0, 1]", "greater than 1"
};

NumberRange rangeOf(BoundedField field);

// Nothing when `value` is valid for `field`, else what is wrong and what
// would be valid ("a fraction must be in (0, 1]; found 0").
std::optional<std::string> checkBounded(BoundedField field, double value);

// ---- Approach ------------------------------------------------------------
// Whether a closest approach (StepUtility::minApproach, found by the solver)
// is below the worksheet's required minimum approach. Only a utility is held
// to it: a plain source or sink temperature is an ideal reservoir. Nothing
// exchanged (duty 0), nothing to hold. 1 µK of slack: "38 degC" against
// "28 degC" is 10 K, not 9.999999999999943 K.
bool approachBelowRequired(double closest_K, double required_K, double duty, bool utility);
// The same for a step served by a utility: its closest approach and duty.
bool approachBelowRequired(const StepUtility& u, double required_K);

// ---- Showing results -----------------------------------------------------
// A result shown as zero: |v| below 1e-9 of the largest magnitude the step
// (or the column) holds, or below 1e-12 absolute. Round-off such as a
// throttle's ΔH of 7e-15 kW then reads 0, while a real small value beside
// large ones keeps its digits as far as the display's decimals allow.
bool showsAsZero(double v, double scale);
// The value to show: 0 when showsAsZero, else v.
double forDisplay(double v, double scale);
// The scales a step's figures are judged against: its largest |Q|, |W|,
// |ΔH|, |ΔU| (energies) and its largest |ΔS|, |S_gen| (entropies).
double energyScale(const StepResult& s);
double entropyScale(const StepResult& s);
// The same for the totals row: its |Q|, |W|, |ΔH|, |ΔU|, and |ΔS|, |S_gen|.
// A segment is judged against its step.
double energyScale(const Totals& t);
double entropyScale(const Totals& t);
// A standard deviation shown: none (0) when at or below 1e-9 of the value's
// magnitude, the solver's own noise, else u.
double spreadForDisplay(double u, double value);

}  // namespace heatchain
