// Rules every surface applies the same way: valid ranges of bounded numbers,
// the required-approach rule, and what shows as zero.
#include "heatchain/rules.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>
#include <sstream>

namespace heatchain {

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
}

bool NumberRange::contains(double v) const {
    if (!std::isfinite(v)) return false;
    const bool okLow = loOpen ? v > lo : v >= lo;
    const bool okHigh = std::isinf(hi) || (hiOpen ? v < hi : v <= hi);
    return okLow && okHigh;
}

std::string NumberRange::text() const {
    std::ostringstream o;
    if (std::isinf(hi)) {
        o << (loOpen ? "greater than " : "at least ") << lo;
    } else {
        o << "in " << (loOpen ? "(" : "[") << lo << ", " << hi << (hiOpen ? ")" : "]");
    }
    return o.str();
}

NumberRange rangeOf(BoundedField field) {
    switch (field) {
        case BoundedField::Quality: return {0, 1, false, false, "quality (vapour fraction)"};
        case BoundedField::MeltFraction: return {0, 1, false, false, "meltFraction"};
        case BoundedField::Fraction: return {0, 1, true, false, "fraction"};
        // Expand divides by the ratio, compress multiplies: 1 would change nothing.
        case BoundedField::Ratio: return {1, kInf, true, true, "a pressure ratio"};
        case BoundedField::Efficiency: return {0, 1, true, false, "efficiency"};
        case BoundedField::PolytropicExponent: return {0, kInf, true, true, "the polytropic exponent n"};
    }
    return {0, 1, false, false, "value"};
}

std::optional<std::string> checkBounded(BoundedField field, double value) {
    const NumberRange r = rangeOf(field);
    if (r.contains(value)) return std::nullopt;
    // The shortest text that reads back as the value, as JSON writes it.
    char buf[64];
    const auto end = std::to_chars(buf, buf + sizeof buf, value).ptr;
    std::string msg = std::string(r.what) + " must be " + r.text();
    if (field == BoundedField::Ratio) msg += " (expand divides by it)";
    return msg + "; found " + std::string(buf, end);
}

bool approachBelowRequired(double closest_K, double required_K, double duty, bool utility) {
    return utility && duty != 0 && closest_K < required_K - 1e-6;
}

bool approachBelowRequired(const StepUtility& u, double required_K) {
    return approachBelowRequired(u.minApproach, required_K, u.duty, true);
}

bool showsAsZero(double v, double scale) {
    return std::fabs(v) < std::max(1e-9 * std::fabs(scale), 1e-12);
}

double forDisplay(double v, double scale) { return showsAsZero(v, scale) ? 0.0 : v; }

double energyScale(const StepResult& s) {
    return std::max({std::fabs(s.Q), std::fabs(s.W), std::fabs(s.dH), std::fabs(s.dU)});
}

double entropyScale(const StepResult& s) { return std::max(std::fabs(s.dS), std::fabs(s.Sgen)); }

double energyScale(const Totals& t) {
    return std::max({std::fabs(t.Q), std::fabs(t.W), std::fabs(t.dH), std::fabs(t.dU)});
}

double entropyScale(const Totals& t) { return std::max(std::fabs(t.dS), std::fabs(t.Sgen)); }

double spreadForDisplay(double u, double value) { return u <= 1e-9 * std::fabs(value) ? 0.0 : u; }

}  // namespace heatchain
