// Process cautions: which apply follows from the conditions typed into the
// worksheet (the thresholds are cited in cautions.hpp), and every view words
// them the same way through processCautionSentences.
#include "heatchain/cautions.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"

using namespace heatchain;

namespace {

ProcessCautions cautionsOf(const std::string& start, const std::string& steps, const std::string& substance = "water") {
    auto p = parseProject(R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "substance": ")" + substance + R"(", "basis": { "massFlow": "1 kg/s" }, "start": )" + start +
                          R"(, "steps": )" + steps + " }");
    EXPECT_TRUE(p.ok()) << p.error().text();
    if (!p) return {};
    const SequenceResult r = solve(*p);
    EXPECT_TRUE(r.startError == std::nullopt);
    return processCautions(*p, r);
}

}  // namespace

TEST(Cautions, NoneForWarmWaterAtAtmosphericPressure) {
    const auto c = cautionsOf(R"({ "T": "15 degC", "P": "1 atm" })",
                              R"([ { "id": "warm", "kind": "heat", "to": { "T": "45 degC" } } ])");
    EXPECT_FALSE(c.any());
    EXPECT_TRUE(processCautionSentences(c, [](double, Dimension, bool) { return std::string("x"); }).empty());
}

TEST(Cautions, SteamAboveSixtyDegreesAndUnderPressure) {
    // Water pumped to 10 bar (above 0.5 bar gauge) and boiled and superheated
    // to 250 °C (above 60 °C): hot surfaces with steam, and high pressure.
    const auto c = cautionsOf(R"({ "T": "20 degC", "P": "1 atm" })",
                              R"([ { "id": "pump", "kind": "compress", "to": { "P": "10 bar" } },
                                   { "id": "raise", "kind": "heat", "to": { "T": "250 degC" } } ])");
    ASSERT_TRUE(c.hottest_K.has_value());
    EXPECT_NEAR(*c.hottest_K, 250 + 273.15, 1e-6);
    EXPECT_TRUE(c.steam);
    ASSERT_TRUE(c.highestP_Pa.has_value());
    EXPECT_NEAR(*c.highestP_Pa, 10e5, 1e-3);
    EXPECT_FALSE(c.coldest_K.has_value());
    const auto words = processCautionSentences(c, [](double si, Dimension d, bool gauge) {
        if (d == Dimension::Pressure) return std::to_string(int(std::lround((gauge ? si - 101325.0 : si) / 1e3))) + " kPa";
        return std::to_string(int(std::lround(si - 273.15))) + " C";
    });
    ASSERT_EQ(words.size(), 2u);
    EXPECT_EQ(words[0].rfind("Steam and hot surfaces above about 60 °C: the material reaches 250 C", 0), 0u) << words[0];
    EXPECT_EQ(words[1].rfind("High pressure: up to 1000 kPa (899 kPa)", 0), 0u) << words[1];
}

TEST(Cautions, HotWaterBelowBoilingIsNotSteam) {
    const auto c = cautionsOf(R"({ "T": "20 degC", "P": "1 atm" })",
                              R"([ { "id": "pasteurise", "kind": "heat", "to": { "T": "72 degC" } } ])");
    ASSERT_TRUE(c.hottest_K.has_value());
    EXPECT_NEAR(*c.hottest_K, 72 + 273.15, 1e-6);
    EXPECT_FALSE(c.steam);
    EXPECT_FALSE(c.highestP_Pa.has_value());  // 1 atm is no gauge pressure
}

TEST(Cautions, ASaturatedLiquidHoldsNoSteam) {
    // Water starting as saturated liquid at 1 atm (x = 0, its boiling point,
    // about 100 °C) and cooled: hot, but no vapour anywhere along the path.
    const auto c = cautionsOf(R"({ "P": "1 atm", "quality": 0 })",
                              R"([ { "id": "cool", "kind": "cool", "to": { "T": "70 degC" } } ])");
    ASSERT_TRUE(c.hottest_K.has_value());
    EXPECT_NEAR(*c.hottest_K, 373.12, 0.05);  // IAPWS-IF97 saturation at 101.325 kPa: 373.124 K (python3-iapws, IAPWS97(P=0.101325, x=0))
    EXPECT_FALSE(c.steam);
    // With one per cent boiled, there is steam.
    const auto wet = cautionsOf(R"({ "P": "1 atm", "quality": 0.01 })",
                                R"([ { "id": "cool", "kind": "cool", "to": { "T": "70 degC" } } ])");
    EXPECT_TRUE(wet.steam);
}

TEST(Cautions, AHotSinkIsNamedAsASink) {
    // Cooled from 95 °C against a sink at 75 °C: the sink is a hot surface
    // too, and is said to be a sink, not a heat source.
    const auto c = cautionsOf(R"({ "T": "95 degC", "P": "1 atm" })",
                              R"([ { "id": "trim", "kind": "cool", "to": { "T": "85 degC" }, "sink": { "T": "75 degC" } } ])");
    ASSERT_TRUE(c.hottestSink_K.has_value());
    EXPECT_NEAR(*c.hottestSink_K, 75 + 273.15, 1e-6);
    EXPECT_FALSE(c.hottestSource_K.has_value());
    const auto words = processCautionSentences(c, [](double si, Dimension, bool) {
        return std::to_string(int(std::lround(si - 273.15))) + " C";
    });
    ASSERT_EQ(words.size(), 1u);
    EXPECT_EQ(words[0].rfind("Hot surfaces above about 60 °C: the material reaches 95 C, sinks up to 75 C.", 0), 0u)
        << words[0];
}

TEST(Cautions, AHotSourceAloneIsCautioned) {
    // The material stays at 40 °C; the heating medium is at 90 °C.
    const auto c = cautionsOf(R"({ "T": "20 degC", "P": "1 atm" })",
                              R"([ { "id": "warm", "kind": "heat", "to": { "T": "40 degC" }, "source": { "T": "90 degC" } } ])");
    EXPECT_FALSE(c.hottest_K.has_value());
    ASSERT_TRUE(c.hottestSource_K.has_value());
    EXPECT_NEAR(*c.hottestSource_K, 90 + 273.15, 1e-6);
}

TEST(Cautions, CryogenicNitrogen) {
    // Liquid nitrogen at 1 atm boils near -196 °C (77 K), far below -150 °C.
    const auto c = cautionsOf(R"({ "T": "-200 degC", "P": "1 atm" })",
                              R"([ { "id": "warm-up", "kind": "heat", "to": { "T": "-180 degC" } } ])", "nitrogen");
    ASSERT_TRUE(c.coldest_K.has_value());
    EXPECT_NEAR(*c.coldest_K, -200 + 273.15, 1e-6);
    EXPECT_FALSE(c.hottest_K.has_value());
}
