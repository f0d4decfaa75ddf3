// Messages of the solver: their levels (error, warning, note), the null
// step, the sign of a duty, display units in messages, the exergy of steps
// with no source given, and incomplete totals.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "heatchain/project_file.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain/solver.hpp"

using namespace heatchain;

namespace {

std::string project(const std::string& substance, const std::string& start, const std::string& steps,
                    const std::string& units = "metric-engineering", const std::string& system = "steady-flow") {
    return R"({ "format": "heatchain-project", "version": 1, "display": { "units": ")" + units +
           R"(" }, "system": ")" + system + R"(", "model": "reference", "substance": ")" + substance +
           R"(", "basis": { ")" + (system == "closed" ? std::string("mass") : std::string("massFlow")) +
           R"(": "1 kg)" + (system == "closed" ? std::string("") : std::string("/s")) +
           R"(" }, "surroundings": { "T": "25 degC", "P": "1 atm" }, "start": )" + start + R"(, "steps": [)" +
           steps + "] }";
}

SequenceResult solveText(const std::string& text) {
    auto p = parseProject(text, "messages.hchain");
    EXPECT_TRUE(p.ok()) << p.error().text();
    if (!p) return {};
    return solve(*p);
}

bool anyContains(const std::vector<std::string>& texts, const std::string& needle) {
    return std::any_of(texts.begin(), texts.end(), [&](const std::string& t) { return t.find(needle) != std::string::npos; });
}

std::string joined(const std::vector<std::string>& texts) {
    std::string out;
    for (const auto& t : texts) out += t + " | ";
    return out;
}

const char* kWater20 = R"({ "T": "20 degC", "P": "1 atm" })";

}  // namespace

// A heat step whose target lies past the boiling point boils the stream:
// a warning, with the latent share of the duty. Check value from
// python3-iapws IAPWS97 at 0.101325 MPa: h_f 418.991, h_g 2675.531,
// h(20 °C) 84.013, h(150 °C) 2776.495 kJ/kg, so boiling is
// (2675.531 − 418.991) / (2776.495 − 84.013) = 83.8 % of the duty.
TEST(Messages, HeatPastTheBoilingPointWarns) {
    auto r = solveText(project("water", kWater20, R"({ "id": "h", "kind": "heat", "to": { "T": "150 degC" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    ASSERT_EQ(s.warnings.size(), 1u) << joined(s.warnings);
    EXPECT_NE(s.warnings[0].find("crosses the boiling point"), std::string::npos) << s.warnings[0];
    EXPECT_NE(s.warnings[0].find("83.8 %"), std::string::npos) << s.warnings[0];
    const auto msgs = s.messages();
    ASSERT_FALSE(msgs.empty());
    EXPECT_EQ(msgs[0].level, MessageLevel::Warning);
    // Below the boiling point nothing is crossed and nothing is said.
    auto below = solveText(project("water", kWater20, R"({ "id": "h", "kind": "heat", "to": { "T": "90 degC" } })"));
    EXPECT_TRUE(below.steps[0].warnings.empty()) << joined(below.steps[0].warnings);
}

// Heat given as a duty that stops inside the dome: the step ends part-way
// through boiling, which a duty target seldom means.
TEST(Messages, HeatEndingMidLineWarns) {
    auto r = solveText(project("water", kWater20, R"({ "id": "h", "kind": "heat", "to": { "duty": "1000 kW" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    EXPECT_TRUE(anyContains(r.steps[0].warnings, "part-way through boiling")) << joined(r.steps[0].warnings);
    // Asking for a quality asks for the boiling line: no warning.
    auto q = solveText(project("water", kWater20, R"({ "id": "h", "kind": "heat", "to": { "quality": 0.5 } })"));
    ASSERT_TRUE(q.ok()) << q.firstError()->text();
    EXPECT_TRUE(q.steps[0].warnings.empty()) << joined(q.steps[0].warnings);
}

// The sensible part of a boil step and a throttle's temperature drop are
// ordinary facts: notes, not warnings.
TEST(Messages, RoutineFactsAreNotes) {
    auto r = solveText(project("water", kWater20,
                               R"({ "id": "b", "kind": "boil" },
                                  { "id": "v", "kind": "throttle", "to": { "P": "0.5 bar" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    EXPECT_TRUE(r.steps[0].warnings.empty()) << joined(r.steps[0].warnings);
    EXPECT_TRUE(anyContains(r.steps[0].notes, "includes sensible heating")) << joined(r.steps[0].notes);
    EXPECT_TRUE(r.steps[1].warnings.empty()) << joined(r.steps[1].warnings);
    EXPECT_TRUE(anyContains(r.steps[1].notes, "Joule–Thomson")) << joined(r.steps[1].notes);
    const auto msgs = r.steps[1].messages();
    ASSERT_FALSE(msgs.empty());
    EXPECT_EQ(msgs.back().level, MessageLevel::Note);
}

// Saturated vapour (x = 1) into a compressor and saturated liquid (x = 0)
// into a pump are the normal design inlets, not a two-phase mixture.
TEST(Messages, CompressingSaturatedEndsIsNotTwoPhase) {
    auto vap = solveText(project("ammonia", R"({ "T": "-10 degC", "quality": 1 })",
                                 R"({ "id": "c", "kind": "compress", "to": { "P": "12 bar" }, "path": "isentropic" })"));
    ASSERT_TRUE(vap.ok()) << vap.firstError()->text();
    EXPECT_FALSE(anyContains(vap.steps[0].warnings, "two-phase")) << joined(vap.steps[0].warnings);
    auto pump = solveText(project("water", R"({ "P": "1 bar", "quality": 0 })",
                                  R"({ "id": "p", "kind": "compress", "to": { "P": "10 bar" }, "path": "isentropic" })"));
    ASSERT_TRUE(pump.ok()) << pump.firstError()->text();
    EXPECT_FALSE(anyContains(pump.steps[0].warnings, "two-phase")) << joined(pump.steps[0].warnings);
    // A wet inlet still warns.
    auto wet = solveText(project("ammonia", R"({ "T": "-10 degC", "quality": 0.9 })",
                                 R"({ "id": "c", "kind": "compress", "to": { "P": "12 bar" }, "path": "isentropic" })"));
    ASSERT_TRUE(wet.ok()) << wet.firstError()->text();
    EXPECT_TRUE(anyContains(wet.steps[0].warnings, "compressing a two-phase mixture")) << joined(wet.steps[0].warnings);
}

// A step whose target is where the material already is, for every kind
// that has a target: computed, nothing exchanged, a warning that says so;
// the same as a duty of zero.
TEST(Messages, NullStepsAreComputedAndSaySo) {
    const char* steps[] = {
        R"({ "id": "n", "kind": "heat", "to": { "T": "20 degC" } })",
        R"({ "id": "n", "kind": "cool", "to": { "T": "20 degC" } })",
        R"({ "id": "n", "kind": "heat", "to": { "duty": "0 kW" } })",
        R"({ "id": "n", "kind": "compress", "to": { "P": "1 atm" } })",
        R"({ "id": "n", "kind": "throttle", "to": { "P": "1 atm" } })",
    };
    for (const char* step : steps) {
        auto r = solveText(project("water", kWater20, step));
        ASSERT_TRUE(r.ok()) << step << ": " << r.firstError()->text();
        const auto& s = r.steps[0];
        EXPECT_TRUE(s.computed) << step;
        EXPECT_EQ(s.Q, 0.0) << step;
        EXPECT_EQ(s.W, 0.0) << step;
        EXPECT_EQ(s.dS, 0.0) << step;
        EXPECT_EQ(s.end.T, s.start.T) << step;
        EXPECT_TRUE(anyContains(s.warnings, "changes nothing")) << step << ": " << joined(s.warnings);
        EXPECT_FALSE(anyContains(s.warnings, "would cool")) << step;
    }
}

// The sign rule of to.duty: the heat a step moves, written positive.
TEST(Messages, NegativeDutySaysWhatTheSignMeans) {
    auto r = solveText(project("water", kWater20, R"({ "id": "c", "kind": "cool", "to": { "duty": "-50 kW" } })"));
    ASSERT_FALSE(r.ok());
    const std::string msg = r.firstError()->text();
    EXPECT_NE(msg.find("taken from the material"), std::string::npos) << msg;
    EXPECT_NE(msg.find("positive"), std::string::npos) << msg;
    EXPECT_NE(msg.find("-50 kW"), std::string::npos) << msg;
}

// Messages quote temperatures and pressures in the display units.
TEST(Messages, UseTheDisplayUnits) {
    const char* wrongWay = R"({ "id": "h", "kind": "heat", "to": { "T": "10 degC" } })";
    auto us = solveText(project("water", kWater20, wrongWay, "US-customary"));
    ASSERT_FALSE(us.ok());
    std::string msg = us.firstError()->text();
    // 10 °C = 50 °F and 20 °C = 68 °F (°F = 1.8 °C + 32, NIST SP 811).
    EXPECT_NE(msg.find("50 °F"), std::string::npos) << msg;
    EXPECT_NE(msg.find("68 °F"), std::string::npos) << msg;
    EXPECT_EQ(msg.find("°C"), std::string::npos) << msg;
    auto metric = solveText(project("water", kWater20, wrongWay));
    msg = metric.firstError()->text();
    EXPECT_NE(msg.find("10 °C"), std::string::npos) << msg;
    // 1 atm = 14.696 psi (NIST SP 811, B.8); 0.5 bar = 7.2519 psi.
    auto p = solveText(project("water", kWater20, R"({ "id": "c", "kind": "compress", "to": { "P": "0.5 bar" } })",
                               "US-customary"));
    ASSERT_FALSE(p.ok());
    msg = p.firstError()->text();
    EXPECT_NE(msg.find("7.2519 psi"), std::string::npos) << msg;
    EXPECT_NE(msg.find("14.696 psi"), std::string::npos) << msg;
}

// A heat step with no source, sink or utility has no exergy-destroyed
// figure, and the sequence's exergy figures leave it out: with one charged
// heating step beside it, the sequence's exergy supplied is that step's.
TEST(Messages, NoSourceGivenLeavesExergyOut) {
    auto r = solveText(project("water", kWater20,
                               R"({ "id": "charged", "kind": "heat", "to": { "T": "60 degC" }, "source": { "T": "90 degC" } },
                                  { "id": "free", "kind": "heat", "to": { "T": "80 degC" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    ASSERT_TRUE(r.exergyAvailable);
    const auto& charged = r.steps[0];
    const auto& free = r.steps[1];
    EXPECT_FALSE(charged.exergyNotCharged);
    ASSERT_TRUE(free.exergyNotCharged);
    EXPECT_EQ(*free.exergyNotCharged, "no source given");
    EXPECT_FALSE(free.secondLawEfficiency);
    EXPECT_NEAR(r.totals.exergySupplied, charged.exergySupplied, 1e-9 * charged.exergySupplied);
    ASSERT_TRUE(r.totals.secondLawEfficiency);
    EXPECT_NEAR(*r.totals.secondLawEfficiency, *charged.secondLawEfficiency, 1e-12);
    EXPECT_TRUE(anyContains(r.notes, "\"free\"")) << joined(r.notes);
    auto p = parseProject(project("water", kWater20, R"({ "id": "free", "kind": "heat", "to": { "T": "80 degC" } })"));
    ASSERT_TRUE(p.ok());
    const Json j = resultsToJson(*p, solve(*p));
    EXPECT_TRUE(j["steps"][0]["exergyDestroyed"].is_null());
    EXPECT_EQ(j["steps"][0]["exergy"]["notCharged"], "no source given");
    EXPECT_TRUE(j["steps"][0]["exergy"]["secondLawEfficiency"].is_null());
}

// When a step fails, the totals say they are incomplete, add only the
// steps computed, and the sequence has no η_II.
TEST(Messages, IncompleteTotals) {
    const std::string text = project("water", kWater20,
                                     R"({ "id": "ok", "kind": "heat", "to": { "T": "60 degC" }, "source": { "T": "90 degC" } },
                                        { "id": "bad", "kind": "heat", "to": { "T": "40 degC" } })");
    auto r = solveText(text);
    ASSERT_FALSE(r.ok());
    EXPECT_FALSE(r.totals.complete);
    EXPECT_EQ(r.totals.Q, r.steps[0].Q);
    EXPECT_FALSE(r.totals.secondLawEfficiency);
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok());
    const Json j = resultsToJson(*p, r);
    EXPECT_EQ(j["totals"]["complete"], false);
    for (const auto& st : j["steps"]) {
        EXPECT_TRUE(st.contains("warnings"));
        EXPECT_TRUE(st.contains("notes"));
    }
    EXPECT_TRUE(j.contains("warnings"));
    EXPECT_TRUE(j.contains("notes"));
    auto whole = solveText(project("water", kWater20, R"({ "id": "ok", "kind": "heat", "to": { "T": "60 degC" } })"));
    EXPECT_TRUE(whole.totals.complete);
}

// A step answers for the states it passes through, not for the one it
// inherits. Toluene vapour at 1.2 bar and its boiling point (about 118 °C)
// departs from the ideal gas by about 4 %: the second-virial estimate
// Z = 1 + (B0 + ω·B1)·Pr/Tr with Abbott's B0 = 0.083 − 0.422/Tr^1.6 and
// B1 = 0.139 − 0.172/Tr^4.2 (Smith, Van Ness & Abbott, Introduction to
// Chemical Engineering Thermodynamics, 7th ed., eq. 3.65, 3.66), with
// Tc 591.75 K, Pc 4.1263 MPa, ω 0.2657 (Lemmon & Span, J. Chem. Eng. Data
// 51 (2006) 785), gives Tr 0.66, Pr 0.029, Z ≈ 0.96. So the
// condense step, which starts as that vapour, warns; the subcool step after
// it passes through liquid only and must not.
TEST(Messages, StateWarningsBelongToTheStepThatReachesTheState) {
    const std::string text = R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
        "model": "temperature-dependent-cp", "substance": "toluene", "basis": { "massFlow": "1 kg/s" },
        "surroundings": { "T": "25 degC", "P": "1 atm" }, "start": { "T": "125 degC", "P": "1.2 bar" },
        "steps": [ { "id": "condense", "kind": "condense" },
                   { "id": "subcool", "kind": "cool", "to": { "T": "40 degC" } } ] })";
    auto r = solveText(text);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    ASSERT_EQ(r.steps.size(), 2u);
    EXPECT_TRUE(anyContains(r.steps[0].warnings, "ideal-gas")) << joined(r.steps[0].warnings);
    EXPECT_FALSE(anyContains(r.steps[1].warnings, "ideal-gas")) << joined(r.steps[1].warnings);
}
