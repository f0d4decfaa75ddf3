// Heat recovery targets: the problem table against a published worked
// example, the laws every set of targets obeys, utility placement against
// the grand composite curve, and pieces built from solved streams.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/recovery.hpp"
#include "heatchain/solver.hpp"

using namespace heatchain;

namespace {

constexpr double kC = 273.15;  // K at 0 °C

HeatPiece stream(const char* id, double TsupplyC, double TtargetC, double CP_kW_per_K) {
    const double duty = std::abs(TsupplyC - TtargetC) * CP_kW_per_K * 1000.0;
    return {id, TsupplyC + kC, TtargetC + kC, duty, TsupplyC > TtargetC, std::nullopt};
}

// The four-stream example of Linnhoff et al., "A User Guide on Process
// Integration for the Efficient Use of Energy" (1982), used again in Kemp,
// "Pinch Analysis and Process Integration", 2nd ed. (2007), ch. 2 — stream
// data and results from memory (not found in a searchable copy), checked by
// working the problem table by hand:
//   shifted (ΔTmin = 10 K): cold 1 25→140, hot 2 165→55, cold 3 85→145, hot 4 145→25
//   165–145 +3.0·20 = +60 | 145–140 +0.5·5 = +2.5 | 140–85 −1.5·55 = −82.5
//   85–55 +2.5·30 = +75   | 55–25 −0.5·30 = −15
//   cascade 0, 60, 62.5, −20, 55, 40 → hot utility 20 kW, cold utility 60 kW,
//   pinch at 85 °C shifted (90 °C hot, 80 °C cold).
std::vector<HeatPiece> fourStreams() {
    return {stream("1", 20, 135, 2.0), stream("2", 170, 60, 3.0), stream("3", 80, 140, 4.0),
            stream("4", 150, 30, 1.5)};
}

double netHeatIn(const std::vector<HeatPiece>& pieces) {
    double net = 0;
    for (const HeatPiece& p : pieces) net += p.hot ? -p.duty : p.duty;
    return net;
}

// Laws: utilities balance the streams; the grand composite curve is never
// negative, is zero at each pinch, and its ends are the two utilities.
void checkLaws(const std::vector<HeatPiece>& pieces, const Targets& t) {
    const double scale = std::max(1.0, t.hotDuty + t.coldDuty);
    EXPECT_NEAR(t.hotUtilityMin - t.coldUtilityMin, netHeatIn(pieces), 1e-9 * scale);
    EXPECT_GE(t.hotUtilityMin, 0);
    EXPECT_GE(t.coldUtilityMin, 0);
    ASSERT_FALSE(t.grandComposite.empty());
    EXPECT_NEAR(t.grandComposite.back().Q, t.hotUtilityMin, 1e-9 * scale);
    EXPECT_NEAR(t.grandComposite.front().Q, t.coldUtilityMin, 1e-9 * scale);
    double least = t.grandComposite.front().Q;
    for (const CompositePoint& p : t.grandComposite) {
        EXPECT_GE(p.Q, 0);
        least = std::min(least, p.Q);
    }
    EXPECT_NEAR(least, 0, 1e-9 * scale);  // the cascade touches zero somewhere (pinch or an end)
    for (double S : t.pinchShifted) {
        bool found = false;
        for (const CompositePoint& p : t.grandComposite)
            if (std::abs(p.T - S) < 1e-9) found = found || std::abs(p.Q) < 1e-9 * scale;
        EXPECT_TRUE(found) << "the grand composite is zero at the pinch " << S;
    }
    // The composite curves end where the duties say.
    ASSERT_FALSE(t.hotComposite.empty());
    EXPECT_NEAR(t.hotComposite.back().Q - t.hotComposite.front().Q, t.hotDuty, 1e-9 * scale);
    if (!t.coldComposite.empty()) {
        EXPECT_NEAR(t.coldComposite.front().Q, t.coldUtilityMin, 1e-9 * scale);
        EXPECT_NEAR(t.coldComposite.back().Q - t.coldComposite.front().Q, t.coldDuty, 1e-9 * scale);
    }
}

}  // namespace

TEST(RecoveryTargets, FourStreamExampleMatchesPublishedTargets) {
    const auto pieces = fourStreams();
    auto t = pinchTargets(pieces, 10.0);
    ASSERT_TRUE(t.ok()) << t.error().text();
    EXPECT_NEAR(t->hotUtilityMin, 20e3, 1e-6);   // Linnhoff et al. 1982 / Kemp 2007 ch. 2 (from memory, hand-checked)
    EXPECT_NEAR(t->coldUtilityMin, 60e3, 1e-6);  // same source
    ASSERT_EQ(t->pinchShifted.size(), 1u);
    EXPECT_NEAR(t->pinchShifted[0], 85 + kC, 1e-9);  // same source: 85 °C shifted
    EXPECT_NEAR(t->pinchHot[0], 90 + kC, 1e-9);      // 90 °C on the hot streams
    EXPECT_NEAR(t->pinchCold[0], 80 + kC, 1e-9);     // 80 °C on the cold streams
    // Heat recovered between streams: 330 + 180 − 60 = 450 kW (stream duties above).
    EXPECT_NEAR(t->recovered(), 450e3, 1e-6);
    checkLaws(pieces, *t);
    // The problem table's intervals, as worked by hand above.
    const double surplus[] = {60e3, 2.5e3, -82.5e3, 75e3, -15e3};
    ASSERT_EQ(t->problemTable.size(), 5u);
    for (std::size_t i = 0; i < 5; ++i) EXPECT_NEAR(t->problemTable[i].surplus, surplus[i], 1e-6) << i;
}

TEST(RecoveryTargets, StreamContributionReplacesHalfTheMinimumDifference) {
    // Every stream giving 5 K is the same as ΔTmin = 10 K.
    auto pieces = fourStreams();
    for (HeatPiece& p : pieces) p.shift = 5.0;
    auto t = pinchTargets(pieces, 40.0);
    ASSERT_TRUE(t.ok());
    EXPECT_NEAR(t->hotUtilityMin, 20e3, 1e-6);  // as the four-stream example above
    EXPECT_NEAR(t->coldUtilityMin, 60e3, 1e-6);
}

TEST(RecoveryTargets, TargetsNeverIncreaseAsTheMinimumDifferenceFalls) {
    const auto pieces = fourStreams();
    auto sweep = dTminSweep(pieces, 40.0, 0.0, 81);
    ASSERT_TRUE(sweep.ok());
    for (std::size_t i = 1; i < sweep->size(); ++i) {
        EXPECT_LE((*sweep)[i].hotUtilityMin, (*sweep)[i - 1].hotUtilityMin + 1e-6);
        EXPECT_LE((*sweep)[i].coldUtilityMin, (*sweep)[i - 1].coldUtilityMin + 1e-6);
    }
    // At ΔTmin = 0, by hand: 170–150 +60, 150–140 +45, 140–135 +2.5,
    // 135–80 −82.5, 80–60 +50, 60–30 −15, 30–20 −20; the cascade never goes
    // below zero, so no hot utility and 40 kW of cooling (a threshold problem).
    EXPECT_NEAR(sweep->back().hotUtilityMin, 0, 1e-6);
    EXPECT_NEAR(sweep->back().coldUtilityMin, 40e3, 1e-6);
    auto threshold = pinchTargets(fourStreams(), 0.0);
    ASSERT_TRUE(threshold.ok());
    EXPECT_TRUE(threshold->pinchShifted.empty());
}

TEST(RecoveryTargets, RandomStreamsObeyTheLaws) {
    std::mt19937 rng(12345);
    std::uniform_real_distribution<double> T(280, 600), cp(100, 5000), d(0, 40);
    std::bernoulli_distribution plateau(0.2);
    for (int trial = 0; trial < 200; ++trial) {
        std::vector<HeatPiece> pieces;
        const int n = 2 + trial % 9;
        for (int i = 0; i < n; ++i) {
            const bool hot = i % 2 == 0;  // at least one hot and one cold stream
            const double x = T(rng), y = plateau(rng) ? x : T(rng);
            const double a = hot ? std::max(x, y) : std::min(x, y), b = hot ? std::min(x, y) : std::max(x, y);
            const double duty = a == b ? cp(rng) * 10 : std::abs(a - b) * cp(rng);
            pieces.push_back({"s" + std::to_string(i), a, b, duty, hot, std::nullopt});
        }
        const double dT = d(rng);
        auto t = pinchTargets(pieces, dT);
        ASSERT_TRUE(t.ok());
        checkLaws(pieces, *t);
        auto smaller = pinchTargets(pieces, dT / 2);
        ASSERT_TRUE(smaller.ok());
        EXPECT_LE(smaller->hotUtilityMin, t->hotUtilityMin + 1e-6);
        EXPECT_LE(smaller->coldUtilityMin, t->coldUtilityMin + 1e-6);
    }
}

TEST(RecoveryTargets, HeatAtOneTemperatureCrossesOnlyWithTheMinimumDifference) {
    // A condensing stream gives 50 kW at 150 °C, a boiling stream takes 50 kW
    // at 100 °C: all of it can be recovered at ΔTmin = 10 K, none at 60 K.
    const std::vector<HeatPiece> pieces{{"c", 150 + kC, 150 + kC, 50e3, true, {}},
                                        {"b", 100 + kC, 100 + kC, 50e3, false, {}}};
    auto near = pinchTargets(pieces, 10.0);
    ASSERT_TRUE(near.ok());
    EXPECT_NEAR(near->hotUtilityMin, 0, 1e-9);
    EXPECT_NEAR(near->coldUtilityMin, 0, 1e-9);
    checkLaws(pieces, *near);
    auto far = pinchTargets(pieces, 60.0);
    ASSERT_TRUE(far.ok());
    EXPECT_NEAR(far->hotUtilityMin, 50e3, 1e-9);
    EXPECT_NEAR(far->coldUtilityMin, 50e3, 1e-9);
    checkLaws(pieces, *far);
    // Exactly ΔTmin apart is allowed.
    auto exact = pinchTargets(pieces, 50.0);
    ASSERT_TRUE(exact.ok());
    EXPECT_NEAR(exact->hotUtilityMin, 0, 1e-9);
}

TEST(RecoveryTargets, BadPiecesNameTheStream) {
    std::vector<HeatPiece> pieces = fourStreams();
    pieces[2].duty = std::nan("");
    auto t = pinchTargets(pieces, 10);
    ASSERT_FALSE(t.ok());
    EXPECT_NE(t.error().text().find("stream \"3\""), std::string::npos) << t.error().text();
    pieces = fourStreams();
    pieces[1].shift = -2;
    t = pinchTargets(pieces, 10);
    ASSERT_FALSE(t.ok());
    EXPECT_NE(t.error().text().find("stream \"2\""), std::string::npos);
    EXPECT_FALSE(pinchTargets(fourStreams(), -1).ok());
}

TEST(RecoveryUtilities, LevelsAreFilledAgainstTheGrandComposite) {
    auto t = pinchTargets(fourStreams(), 10.0);
    ASSERT_TRUE(t.ok());
    // Below the pinch the grand composite falls 2.5 kW/K from 55 °C to 85 °C
    // shifted (the interval 85–55 above): a cold level at 65 °C (70 °C shifted)
    // can take 2.5 · 15 = 37.5 kW; the other 22.5 kW need a colder level.
    // Hot: a level at 60 °C is below the pinch and can supply nothing; steam at
    // 160 °C (155 °C shifted) supplies all 20 kW.
    const std::vector<UtilityLevel> levels{{"warm-water", false, 65 + kC, {}},
                                           {"brine", false, 10 + kC, {}},
                                           {"low-grade", true, 60 + kC, {}},
                                           {"steam", true, 160 + kC, {}}};
    const UtilityPlan plan = placeUtilities(*t, levels);
    ASSERT_EQ(plan.levels.size(), 4u);
    EXPECT_NEAR(plan.levels[0].duty, 37.5e3, 1e-6);
    EXPECT_NEAR(plan.levels[1].duty, 22.5e3, 1e-6);
    EXPECT_NEAR(plan.levels[2].duty, 0, 1e-6);
    EXPECT_NEAR(plan.levels[3].duty, 20e3, 1e-6);
    EXPECT_NEAR(plan.hotUnmet, 0, 1e-6);
    EXPECT_NEAR(plan.coldUnmet, 0, 1e-6);
    EXPECT_FALSE(hotFallsShort(plan, *t));
    EXPECT_FALSE(coldFallsShort(plan, *t));
    // With only the low-grade level, the whole hot target is unmet, and no
    // cold level at all leaves the whole cold target.
    const std::vector<UtilityLevel> onlyLow{{"low-grade", true, 60 + kC, {}}};
    const UtilityPlan short_ = placeUtilities(*t, onlyLow);
    EXPECT_NEAR(short_.hotUnmet, 20e3, 1e-6);
    EXPECT_TRUE(hotFallsShort(short_, *t));
    EXPECT_TRUE(coldFallsShort(short_, *t));
    // Round-off left over is not a shortfall.
    UtilityPlan noise = plan;
    noise.hotUnmet = 1e-9 * t->hotUtilityMin * 0.5;
    EXPECT_FALSE(hotFallsShort(noise, *t));
}

TEST(RecoveryUtilities, AHotLevelServesBoilingAtItsOwnShiftedTemperature) {
    // Boiling at 100 °C takes 40 kW; steam at 110 °C with ΔTmin 10 K sits at
    // the same shifted temperature (105 °C) and may supply it all.
    const std::vector<HeatPiece> pieces{{"b", 100 + kC, 100 + kC, 40e3, false, {}}};
    auto t = pinchTargets(pieces, 10.0);
    ASSERT_TRUE(t.ok());
    const std::vector<UtilityLevel> levels{{"steam", true, 110 + kC, {}}};
    EXPECT_NEAR(placeUtilities(*t, levels).levels[0].duty, 40e3, 1e-9);
}

// ---- From solved streams -----------------------------------------------------

namespace {

// An invented test liquid with cp = 1 kJ/(kg K) that does not boil in the
// range used, so a mass flow of N kg/s is a heat-capacity flow rate of N kW/K.
const char* kUnitLiquid = R"json({
  "id": "unit-liquid", "name": "Unit liquid", "molarMass": "0.1 kg/mol", "source": "invented test data",
  "phases": { "liquid": { "cp": "1 kJ/(kg K)" }, "vapor": { "cp": "1 kJ/(kg K)" } },
  "boiling": { "T": "700 K", "P": "1 atm", "enthalpy": "300 kJ/kg" }
})json";

std::string projectText(const std::string& model, const std::string& substance, const std::string& basis,
                        const std::string& start, const std::string& steps, const std::string& system = "steady-flow") {
    return R"({ "format": "heatchain-project", "version": 1, "system": ")" + system + R"(", "model": ")" + model +
           R"(", "substance": )" + substance + R"(, "basis": )" + basis + R"(, "start": )" + start +
           R"(, "steps": [)" + steps + "] }";
}

struct Solved {
    Project project;
    SequenceResult result;
};

Solved solveText(const std::string& text) {
    auto p = parseProject(text, "test.hchain");
    EXPECT_TRUE(p.ok()) << (p.ok() ? "" : p.error().text());
    Solved s{p.ok() ? *p : Project{}, {}};
    s.result = solve(s.project);
    EXPECT_TRUE(s.result.ok()) << (s.result.firstError() ? s.result.firstError()->text() : "");
    return s;
}

Solved unitStream(double fromC, double toC, double CP) {
    const std::string kind = toC > fromC ? "heat" : "cool";
    return solveText(projectText("constant-cp", kUnitLiquid,
                                 R"({ "massFlow": ")" + std::to_string(CP) + R"( kg/s" })",
                                 R"({ "T": ")" + std::to_string(fromC) + R"( degC", "P": "1 atm" })",
                                 R"({ "id": "x", "kind": ")" + kind + R"(", "to": { "T": ")" + std::to_string(toC) +
                                     R"( degC" } })"));
}

// Every piece lies within the tolerance of the model's own temperature at a
// quarter, half and three quarters of its heat (h = h_start + Q / m).
void expectWithinTolerance(const Solved& s, const StreamPieces& pieces, double tolerance) {
    const double m = s.project.massBasis();
    const double h0 = s.result.start.h;
    const double P = s.result.start.P;
    double Q = 0;
    ASSERT_FALSE(pieces.pieces.empty());
    for (const HeatPiece& piece : pieces.pieces) {
        const double sign = piece.hot ? -1 : 1;
        for (double f : {0.25, 0.5, 0.75}) {
            const double q = Q + sign * f * piece.duty;
            auto st = s.result.model->stateP(P, Property::Enthalpy, h0 + q / m);
            ASSERT_TRUE(st.ok());
            const double line = piece.Tfrom + f * (piece.Tto - piece.Tfrom);
            EXPECT_LE(std::abs(st->T - line), tolerance) << "at Q = " << q << " W";
        }
        Q += sign * piece.duty;
    }
}

}  // namespace

TEST(RecoveryStreams, FourStreamsBuiltAsStepsGiveTheSameTargets) {
    const Solved s1 = unitStream(20, 135, 2.0), s2 = unitStream(170, 60, 3.0), s3 = unitStream(80, 140, 4.0),
                 s4 = unitStream(150, 30, 1.5);
    const std::vector<RecoveryStream> streams{{"1", &s1.project, &s1.result, {}},
                                              {"2", &s2.project, &s2.result, {}},
                                              {"3", &s3.project, &s3.result, {}},
                                              {"4", &s4.project, &s4.result, {}}};
    auto r = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(r.ok());
    EXPECT_TRUE(r->excluded.empty());
    // The four-stream example (Linnhoff et al. 1982; Kemp 2007 ch. 2), as above.
    EXPECT_NEAR(r->targets.hotUtilityMin, 20e3, 1e-6);
    EXPECT_NEAR(r->targets.coldUtilityMin, 60e3, 1e-6);
    ASSERT_EQ(r->targets.pinchHot.size(), 1u);
    EXPECT_NEAR(r->targets.pinchHot[0], 90 + kC, 1e-6);
    // Today every heating and cooling is done by utilities: 230 + 240 kW of
    // heating and 330 + 180 kW of cooling (the stream duties).
    EXPECT_NEAR(r->hotUtilityNow, 470e3, 1e-6);
    EXPECT_NEAR(r->coldUtilityNow, 510e3, 1e-6);
    // Law: the targets and today's use differ by the same heat on both sides.
    EXPECT_NEAR(r->hotUtilityNow - r->targets.hotUtilityMin, r->coldUtilityNow - r->targets.coldUtilityMin, 1e-6);
}

TEST(RecoveryStreams, AStreamsOwnCoolingHeatsItsOwnHeating) {
    // Heated from 50 °C to 200 °C, then cooled to 100 °C, 1 kW/K. By hand at
    // ΔTmin = 10 K (shifted: cold 55→205, hot 195→95): 205–195 needs 10 kW,
    // 195–95 balances, 95–55 needs 40 kW → hot utility 50 kW, cold 0; the
    // 100 kW of cooling all goes into the heating.
    const Solved s = solveText(projectText("constant-cp", kUnitLiquid, R"({ "massFlow": "1 kg/s" })",
                                           R"({ "T": "50 degC", "P": "1 atm" })",
                                           R"({ "id": "up", "kind": "heat", "to": { "T": "200 degC" } },
                                              { "id": "down", "kind": "cool", "to": { "T": "100 degC" } })"));
    const std::vector<RecoveryStream> streams{{"only", &s.project, &s.result, {}}};
    auto r = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(r.ok());
    EXPECT_NEAR(r->targets.hotUtilityMin, 50e3, 1e-6);
    EXPECT_NEAR(r->targets.coldUtilityMin, 0, 1e-6);
    EXPECT_NEAR(r->hotUtilityNow, 150e3, 1e-6);
    EXPECT_NEAR(r->coldUtilityNow, 100e3, 1e-6);
}

TEST(RecoveryStreams, BoilingPlateauIsWithinTheStatedTolerance) {
    // Water at 2 bar heated to saturation, boiled and superheated (IAPWS-IF97).
    const Solved s = solveText(projectText("reference", "\"water\"", R"({ "massFlow": "0.5 kg/s" })",
                                           R"({ "T": "30 degC", "P": "2 bar" })",
                                           R"({ "id": "pre", "kind": "heat", "to": { "quality": 0 } },
                                              { "id": "boil", "kind": "boil" },
                                              { "id": "sh", "kind": "heat", "to": { "T": "250 degC" } })"));
    const std::vector<RecoveryStream> streams{{"w", &s.project, &s.result, {}}};
    const StreamPieces pieces = piecesFromStreams(streams, 0.05);
    EXPECT_LE(pieces.largestErrorK, 0.05);
    expectWithinTolerance(s, pieces, 0.05);
    // The plateau is there: pieces at one temperature carry the latent heat,
    // 2201.6 kJ/kg at 2 bar (IAPWS-IF97 saturation table, hfg at 0.2 MPa), × 0.5 kg/s.
    double plateau = 0;
    for (const HeatPiece& p : pieces.pieces)
        if (std::abs(p.Tfrom - p.Tto) < 1e-6) plateau += p.duty;
    EXPECT_NEAR(plateau, 0.5 * 2201.6e3, 0.5 * 1e3);
}

TEST(RecoveryStreams, TemperatureDependentCpIsWithinTheStatedTolerance) {
    // Nitrogen gas from 300 K to 1200 K, where cp rises by about a sixth.
    const Solved s = solveText(projectText("temperature-dependent-cp", "\"nitrogen\"", R"({ "massFlow": "1 kg/s" })",
                                           R"({ "T": "300 K", "P": "1 atm" })",
                                           R"({ "id": "h", "kind": "heat", "to": { "T": "1200 K" } })"));
    const std::vector<RecoveryStream> streams{{"n2", &s.project, &s.result, {}}};
    for (double tol : {0.5, 0.05, 0.005}) {
        const StreamPieces pieces = piecesFromStreams(streams, tol);
        EXPECT_LE(pieces.largestErrorK, tol);
        expectWithinTolerance(s, pieces, tol);
    }
}

TEST(RecoveryStreams, ClosedStreamsAreLeftOutWithAReason) {
    const Solved batch = solveText(projectText("constant-cp", kUnitLiquid, R"({ "mass": "100 kg" })",
                                               R"({ "T": "20 degC", "P": "1 atm" })",
                                               R"({ "id": "h", "kind": "heat", "to": { "T": "90 degC" } })", "closed"));
    const Solved flow = unitStream(150, 40, 1.0);
    const std::vector<RecoveryStream> streams{{"tank", &batch.project, &batch.result, {}},
                                              {"line", &flow.project, &flow.result, {}}};
    auto r = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(r.ok());
    ASSERT_EQ(r->excluded.size(), 1u);
    EXPECT_EQ(r->excluded[0].stream, "tank");
    EXPECT_NE(r->excluded[0].reason.find("closed"), std::string::npos);
    EXPECT_NEAR(r->targets.coldUtilityMin, 110e3, 1e-6);  // 110 K × 1 kW/K, nothing to recover against
    const Json j = recoveryToJson(*r);
    EXPECT_EQ(j["excluded"][0]["stream"], "tank");
    EXPECT_NEAR(j["coldUtilityMin_W"].get<double>(), 110e3, 1e-6);
}

TEST(RecoveryStreams, ABatchWithACycleTimeEntersWithItsMeanDuty) {
    // The four-stream example (Linnhoff et al. 1982; Kemp 2007 ch. 2) with
    // cold stream 3 (80 → 140 °C, 4 kW/K) heated instead as a batch: 14.4 t
    // of the unit liquid per batch, one batch an hour, is 4 kg/s on average,
    // so the time-averaged targets are the published ones: 20 kW hot, 60 kW
    // cold, pinch at 90 °C hot side.
    const Solved s1 = unitStream(20, 135, 2.0), s2 = unitStream(170, 60, 3.0), s4 = unitStream(150, 30, 1.5);
    const Solved s3 = solveText(projectText("constant-cp", kUnitLiquid, R"({ "mass": "14.4 t" })",
                                            R"({ "T": "80 degC", "P": "1 atm" })",
                                            R"({ "id": "h", "kind": "heat", "to": { "T": "140 degC" } })", "closed"));
    std::vector<RecoveryStream> streams{{"1", &s1.project, &s1.result, {}},
                                        {"2", &s2.project, &s2.result, {}},
                                        {"3", &s3.project, &s3.result, {}, 3600.0},
                                        {"4", &s4.project, &s4.result, {}}};
    auto r = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(r.ok());
    EXPECT_TRUE(r->excluded.empty());
    ASSERT_EQ(r->timeAveraged.size(), 1u);
    EXPECT_EQ(r->timeAveraged[0], "3");
    EXPECT_NEAR(r->targets.hotUtilityMin, 20e3, 1e-6);   // Linnhoff et al. 1982 / Kemp 2007 ch. 2
    EXPECT_NEAR(r->targets.coldUtilityMin, 60e3, 1e-6);  // same source
    ASSERT_EQ(r->targets.pinchHot.size(), 1u);
    EXPECT_NEAR(r->targets.pinchHot[0], 90 + kC, 1e-6);  // same source
    // Today's heating counts the batch at its mean duty: 230 + 240 kW.
    EXPECT_NEAR(r->hotUtilityNow, 470e3, 1e-6);
    const Json j = recoveryToJson(*r);
    EXPECT_EQ(j["timeAveraged"][0], "3");

    // Without a cycle time the batch is left out, and the reason says how to
    // bring it in.
    streams[2].cycleTime.reset();
    auto without = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(without.ok());
    ASSERT_EQ(without->excluded.size(), 1u);
    EXPECT_NE(without->excluded[0].reason.find("cycle time"), std::string::npos);
    EXPECT_TRUE(without->timeAveraged.empty());
    // Law: twice the cycle time halves the batch's mean duty; the utilities
    // still balance the streams' net heat (in: 230 + 120 kW, out: 330 + 180 kW).
    streams[2].cycleTime = 7200.0;
    auto slower = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(slower.ok());
    EXPECT_NEAR(slower->hotUtilityNow, 350e3, 1e-6);
    EXPECT_NEAR(slower->targets.hotUtilityMin - slower->targets.coldUtilityMin, 350e3 - 510e3, 1e-6);
}

TEST(RecoveryStreams, ABatchWithKnownStepTimesUsesTheirSumAsItsCycle) {
    // One tonne of the unit liquid (cp 1 kJ/(kg K)) heated from 20 to 80 °C
    // in a jacket of UA 2.4 kW/K against a medium held at 140 °C. A stirred
    // batch against an isothermal medium takes t = (M c / UA) ln((Ts − T0) /
    // (Ts − T1)) (Kern, "Process Heat Transfer", 1950, ch. 18, batch heating
    // with an isothermal heating medium) = (1e6 / 2400) ln(120 / 60) s, and
    // takes M c ΔT = 60 MJ a batch: its mean duty is 60 MJ over that time.
    const Solved batch = solveText(projectText(
        "constant-cp", kUnitLiquid, R"({ "mass": "1 t" })", R"({ "T": "20 degC", "P": "1 atm" })",
        R"({ "id": "warm", "kind": "heat", "to": { "T": "80 degC" }, "source": { "T": "140 degC" },
             "transfer": { "UA": "2.4 kW/K" } })",
        "closed"));
    ASSERT_TRUE(batch.result.totals.cycleTime);
    const double t = 1e6 / 2400 * std::log(120.0 / 60.0);
    EXPECT_NEAR(*batch.result.totals.cycleTime, t, 1e-3 * t);
    const std::vector<RecoveryStream> streams{{"kettle", &batch.project, &batch.result, {}}};
    auto r = recoveryTargets(streams, 10.0);
    ASSERT_TRUE(r.ok());
    EXPECT_TRUE(r->excluded.empty());
    ASSERT_EQ(r->timeAveraged.size(), 1u);
    EXPECT_NEAR(r->hotUtilityNow, 60e6 / t, 1e-3 * 60e6 / t);
    // Alone, the batch's heating needs it all from a utility.
    EXPECT_NEAR(r->targets.hotUtilityMin, r->hotUtilityNow, 1e-6 * r->hotUtilityNow);
}
