// Tolerances on typed quantities; see tolerance.hpp.
#include "heatchain/tolerance.hpp"

#include <cmath>
#include <cstdlib>
#include <string>

namespace heatchain {

namespace {

constexpr std::string_view kPlusMinus = "\xC2\xB1";  // U+00B1 in UTF-8
constexpr std::string_view kAsciiPlusMinus = "+/-";

std::string_view trim(std::string_view s) {
    while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
    return s;
}

// Where the tolerance sign starts and how long it is; npos when none.
std::pair<std::size_t, std::size_t> findSign(std::string_view text) {
    const std::size_t a = text.find(kPlusMinus);
    const std::size_t b = text.find(kAsciiPlusMinus);
    if (a == std::string_view::npos && b == std::string_view::npos) return {std::string_view::npos, 0};
    if (b == std::string_view::npos || (a != std::string_view::npos && a < b)) return {a, kPlusMinus.size()};
    return {b, kAsciiPlusMinus.size()};
}

// The unit part of "<number> <unit>" (empty for a bare number).
std::string_view unitOf(std::string_view text) {
    const std::string s(text);
    char* end = nullptr;
    std::strtod(s.c_str(), &end);
    return trim(text.substr(static_cast<std::size_t>(end - s.c_str())));
}

// The SI value of zero in the unit of `text`: a reading's origin (0 barg is
// the atmosphere), so that differences and percentages apply to the reading.
double originOf(std::string_view text, Dimension d, const UnitContext& context) {
    const std::string_view unit = unitOf(text);
    if (unit.empty()) return 0;
    auto zero = parseQuantity("0 " + std::string(unit), d, context);
    return zero ? *zero : 0;
}

}  // namespace

bool hasTolerance(std::string_view text) { return findSign(text).first != std::string_view::npos; }

Result<TolerancedValue> parseToleranced(std::string_view text, Dimension expected, const UnitContext& context) {
    const auto [at, len] = findSign(text);
    TolerancedValue out;
    if (at == std::string_view::npos) {
        auto si = parseQuantity(text, expected, context);
        if (!si) return si.error();
        out.nominalText = std::string(text);
        out.si = *si;
        return out;
    }
    const std::string_view nominal = trim(text.substr(0, at));
    std::string_view tol = trim(text.substr(at + len));
    const std::string typed(text);
    if (nominal.empty()) return makeError("\"" + typed + "\": the value before the tolerance is missing");
    auto si = parseQuantity(nominal, expected, context);
    if (!si) return si.error();
    out.nominalText = std::string(nominal);
    out.si = *si;

    Tolerance t;
    t.text = std::string(tol);
    constexpr std::string_view kRect = "rect";
    if (tol.size() >= kRect.size() && tol.substr(tol.size() - kRect.size()) == kRect) {
        const std::string_view before = tol.substr(0, tol.size() - kRect.size());
        if (before.empty() || before.back() == ' ' || before.back() == '\t' || before.back() == '%' ||
            (before.back() >= '0' && before.back() <= '9')) {
            t.distribution = Distribution::Rectangular;
            tol = trim(before);
        }
    }
    if (tol.empty())
        return makeError("\"" + typed + "\": the tolerance after the ± is missing (e.g. \"" +
                         std::string(nominal) + " ± " +
                         (expected == Dimension::Dimensionless ? "0.03" : "2 %") + "\")");

    double magnitude = 0;  // SI difference, or fraction
    if (tol.back() == '%') {
        const std::string number(trim(tol.substr(0, tol.size() - 1)));
        char* end = nullptr;
        const double pct = std::strtod(number.c_str(), &end);
        if (number.empty() || end != number.c_str() + number.size() || !std::isfinite(pct))
            return makeError("\"" + typed + "\": the tolerance \"" + std::string(tol) + "\" is not a number of percent");
        if (expected == Dimension::Temperature)
            return makeError("\"" + typed +
                             "\": a tolerance on a temperature is a temperature difference such as \"2 K\" or "
                             "\"3.6 degF\", not a percentage (of which zero?)");
        t.relative = true;
        t.amount = pct / 100.0;
        magnitude = t.amount * std::abs(*si - originOf(nominal, expected, context));
    } else {
        const Dimension dd = expected == Dimension::Temperature ? Dimension::TemperatureDifference : expected;
        auto v = parseQuantity(tol, dd, context);
        if (!v) {
            std::string what = expected == Dimension::Temperature
                                   ? "a temperature difference (K, or degC / degF as a difference)"
                                   : expected == Dimension::Dimensionless ? "a number" : "a " + std::string(dimensionName(expected)) + " with a unit";
            return makeError("\"" + typed + "\": the tolerance \"" + std::string(tol) + "\" must be " + what +
                             ", or a percentage such as \"5 %\" (" + v.error().message + ")");
        }
        magnitude = *v - (expected == Dimension::Temperature ? 0.0 : originOf(tol, expected, context));
        t.amount = magnitude;
    }
    if (!(t.amount >= 0) || !std::isfinite(magnitude))
        return makeError("\"" + typed + "\": a tolerance must be zero or positive; found \"" + std::string(tol) + "\"");
    t.halfWidth = magnitude;
    // JCGM 100:2008, 4.3.7: a rectangular distribution of half-width a has u = a / √3.
    t.u = t.distribution == Distribution::Rectangular ? magnitude / std::sqrt(3.0) : magnitude;
    out.tolerance = t;
    return out;
}

}  // namespace heatchain
