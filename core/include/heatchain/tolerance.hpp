#pragma once
// Tolerances on typed quantities: "80 degC ± 2 K", "80 degC +/- 2 K",
// "4.2 t/h ± 5 %", "0.72 ± 0.03", "80 degC ± 2 K rect" (shared design
// project-format.md, "Tolerances and uncertainty"). The tolerance is one
// standard uncertainty of a normal distribution unless `rect` marks it as the
// half-width of a rectangular one (JCGM 100:2008, 4.3.7: u = a / √3).
// The project keeps the whole text as typed; this file only reads it.
#include <optional>
#include <string>
#include <string_view>

#include "heatchain/result.hpp"
#include "heatchain/units.hpp"

namespace heatchain {

enum class Distribution { Normal, Rectangular };

struct Tolerance {
    std::string text;        // the part after ± as typed ("2 K rect")
    Distribution distribution = Distribution::Normal;
    bool relative = false;   // typed as a percentage of the value
    double amount = 0;       // as typed, in SI (a difference), or a fraction when relative
    double u = 0;            // standard uncertainty in SI at the nominal value
    double halfWidth = 0;    // rectangular: the limit a in SI (u = a / √3); normal: equal to u
};

struct TolerancedValue {
    std::string nominalText;  // "80 degC"
    double si = 0;            // the nominal value in SI
    std::optional<Tolerance> tolerance;
};

// True when the text carries a tolerance (± or +/-).
bool hasTolerance(std::string_view text);

// Reads "<quantity> [± <tolerance> [rect]]". A tolerance on a temperature is
// a temperature difference (K, degC or degF as a difference); "%" is
// relative to the value as read (a gauge reading, not the absolute
// pressure); a dimensionless value takes a bare number. Errors say what is
// wrong with the tolerance; the caller adds the field.
Result<TolerancedValue> parseToleranced(std::string_view text, Dimension expected, const UnitContext& context = {});

}  // namespace heatchain
