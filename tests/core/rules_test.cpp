// Rules written once in core (rules.hpp): the valid range of each bounded
// number, which the loader applies exactly; when a closest approach is below
// the required one; what shows as zero.
#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/rules.hpp"
#include "heatchain/solver.hpp"

using namespace heatchain;

namespace {

std::string waterProject(const std::string& start, const std::string& step) {
    return R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow", "model": "reference",
      "substance": "water", "basis": { "massFlow": "1 kg/s" }, "start": )" +
           start + R"(, "steps": [)" + step + "] }";
}

std::string num(double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.17g", v);
    return buf;
}

}  // namespace

TEST(Rules, RangesAtTheirBounds) {
    EXPECT_TRUE(rangeOf(BoundedField::Quality).contains(0.0));
    EXPECT_TRUE(rangeOf(BoundedField::Quality).contains(1.0));
    EXPECT_FALSE(rangeOf(BoundedField::Quality).contains(1.0000001));
    EXPECT_FALSE(rangeOf(BoundedField::Fraction).contains(0.0));
    EXPECT_TRUE(rangeOf(BoundedField::Fraction).contains(1.0));
    EXPECT_FALSE(rangeOf(BoundedField::Ratio).contains(1.0));
    EXPECT_TRUE(rangeOf(BoundedField::Ratio).contains(1.0000001));
    EXPECT_FALSE(rangeOf(BoundedField::Efficiency).contains(0.0));
    EXPECT_TRUE(rangeOf(BoundedField::Efficiency).contains(1.0));
    EXPECT_FALSE(rangeOf(BoundedField::PolytropicExponent).contains(0.0));
    EXPECT_FALSE(rangeOf(BoundedField::Fraction).contains(std::numeric_limits<double>::quiet_NaN()));
    EXPECT_EQ(rangeOf(BoundedField::Fraction).text(), "in (0, 1]");
    EXPECT_EQ(rangeOf(BoundedField::Ratio).text(), "greater than 1");
}

// The loader accepts a bounded field exactly when checkBounded does: at the
// bounds, just inside and just outside.
TEST(Rules, TheLoaderAppliesTheSameRanges) {
    struct Case {
        BoundedField field;
        std::string (*step)(const std::string&);
    };
    const Case cases[] = {
        {BoundedField::Fraction, [](const std::string& v) { return R"({ "id": "b", "kind": "boil", "fraction": )" + v + " }"; }},
        {BoundedField::Ratio, [](const std::string& v) { return R"({ "id": "c", "kind": "compress", "to": { "ratio": )" + v + " } }"; }},
        {BoundedField::Efficiency, [](const std::string& v) {
             return R"({ "id": "c", "kind": "compress", "to": { "P": "5 bar" }, "path": "adiabatic", "efficiency": )" + v + " }";
         }},
        {BoundedField::PolytropicExponent, [](const std::string& v) {
             return R"({ "id": "c", "kind": "compress", "to": { "P": "5 bar" }, "path": "polytropic", "n": )" + v + " }";
         }},
        {BoundedField::Quality, [](const std::string& v) { return R"({ "id": "h", "kind": "heat", "to": { "quality": )" + v + " } }"; }},
    };
    for (const Case& c : cases) {
        for (double v : {-0.5, 0.0, 1e-9, 0.5, 1.0 - 1e-12, 1.0, 1.0 + 1e-12, 1.5}) {
            const std::string text = waterProject(R"({ "T": "20 degC", "P": "1 bar" })", c.step(num(v)));
            auto p = parseProject(text, "bounds.hchain");
            const bool valid = !checkBounded(c.field, v);
            EXPECT_EQ(p.ok(), valid) << c.step(num(v)) << (p ? std::string() : ": " + p.error().text());
            if (p) {
                EXPECT_TRUE(resolveProject(*p).ok());
            }
        }
    }
}

TEST(Rules, RequiredApproachRule) {
    EXPECT_TRUE(approachBelowRequired(9.0, 10.0, 1.0, true));
    EXPECT_FALSE(approachBelowRequired(10.0 - 1e-9, 10.0, 1.0, true));  // round-off of typed values
    EXPECT_FALSE(approachBelowRequired(9.0, 10.0, 0.0, true));         // nothing exchanged
    EXPECT_FALSE(approachBelowRequired(9.0, 10.0, 1.0, false));        // a plain temperature
    StepUtility u;
    u.minApproach = 9.0;
    u.duty = 2.0e4;
    EXPECT_TRUE(approachBelowRequired(u, 10.0));   // what the step panel, chart and report flag
    EXPECT_FALSE(approachBelowRequired(u, 9.0));
    u.duty = 0.0;
    EXPECT_FALSE(approachBelowRequired(u, 10.0));
}

TEST(Rules, WhatShowsAsZero) {
    EXPECT_TRUE(showsAsZero(7e-15, 1e5));    // a throttle's ΔH round-off beside its kW
    EXPECT_FALSE(showsAsZero(1e-3, 1e5));    // a real small value keeps its digits
    EXPECT_TRUE(showsAsZero(1e-13, 0.0));    // nothing to compare with: absolute floor
    EXPECT_EQ(forDisplay(-3e-12, 1e4), 0.0);
    EXPECT_EQ(forDisplay(2.5, 1e4), 2.5);
}

// The scales the rule judges against, for a step and for the totals, and a
// spread that is the solver's own noise.
TEST(Rules, ScalesAndSpreadsShownAsZero) {
    StepResult s;
    s.Q = -4.0e5;
    s.W = 1.0e3;
    s.dH = -3.99e5;
    s.dU = 2.0e5;
    s.dS = -1.2e3;
    s.Sgen = 3.5;
    EXPECT_EQ(energyScale(s), 4.0e5);
    EXPECT_EQ(entropyScale(s), 1.2e3);
    Totals t;
    t.W = -7.0e4;
    t.dU = 5.0e4;
    t.Sgen = 12.0;
    EXPECT_EQ(energyScale(t), 7.0e4);
    EXPECT_EQ(entropyScale(t), 12.0);
    EXPECT_EQ(spreadForDisplay(1e-7, 250.0e3), 0.0);    // 4e-13 of the value: noise
    EXPECT_EQ(spreadForDisplay(12.5, 250.0e3), 12.5);   // a real spread
    EXPECT_EQ(spreadForDisplay(0.0, 0.0), 0.0);
}
