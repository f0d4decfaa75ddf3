// Heat transfer (transfer.hpp): exchanger area of steady-flow steps zone by
// zone, rating, batch time through a jacket or coil, hold, heat loss; and the
// project fields that ask for them. Expected values are closed forms of the
// textbooks named beside each, worked out here from the inputs, never taken
// from the program.
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/sweep.hpp"

using namespace heatchain;

namespace {

#define EXPECT_CONTAINS(hay, needle) EXPECT_NE(std::string(hay).find(needle), std::string::npos) << (hay)

// Invented test data with constant heat capacities (the constant-cp model's
// closed forms are then exact): liquid cp 4.0 kJ/(kg K), vapour 1.5, boiling
// at 350 K under 1 atm with 1200 kJ/kg.
const char* kFluid = R"json({
  "id": "test-fluid", "name": "Test fluid", "molarMass": "0.030 kg/mol",
  "source": "invented test data",
  "phases": { "solid": { "cp": "2.0 kJ/(kg K)" }, "liquid": { "cp": "4.0 kJ/(kg K)" },
              "vapor": { "cp": "1.5 kJ/(kg K)" } },
  "melting": { "T": "250 K", "enthalpy": "300 kJ/kg" },
  "boiling": { "T": "350 K", "P": "1 atm", "enthalpy": "1200 kJ/kg" }
})json";

std::string projectText(const std::string& system, const std::string& basis, const std::string& start,
                        const std::string& steps, const std::string& utilities = "[]",
                        const std::string& extraTop = "") {
    return std::string(R"j({ "format": "heatchain-project", "version": 1, "system": ")j") + system +
           R"j(", "model": "constant-cp", "substance": )j" + kFluid + R"j(, "basis": )j" + basis +
           R"j(, "surroundings": { "T": "290 K", "P": "1 atm" }, "start": )j" + start + "," + extraTop +
           R"j( "utilities": )j" + utilities + R"j(, "steps": [)j" + steps + "] }";
}

SequenceResult solveText(const std::string& text) {
    auto p = parseProject(text);
    EXPECT_TRUE(p.ok()) << p.error().text();
    if (!p) return {};
    return solve(*p);
}

const char* kFlow = R"j({ "massFlow": "2 kg/s" })j";
const char* kLiquid300 = R"j({ "T": "300 K", "P": "1 atm" })j";

// Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed., eq. 11.15.
double lmtd(double a, double b) { return (a - b) / std::log(a / b); }

}  // namespace

// ---- Sizing, steady flow ---------------------------------------------------

// A liquid heated 300 → 340 K by a source at 380 K (condensing steam holds
// one temperature): A = Q / (U ΔT_lm), ΔT_lm of 80 K and 40 K
// (Incropera & DeWitt, 6th ed., ch. 11, eqs. 11.14–11.15).
TEST(TransferSizing, SensibleAgainstConstantTemperature) {
    auto r = solveText(projectText("steady-flow", kFlow, kLiquid300,
                                   R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                        "transfer": { "U": "500 W/(m2 K)" } })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    ASSERT_TRUE(s.transfer);
    const double Q = 2.0 * 4000.0 * 40.0;
    const double A = Q / (500.0 * lmtd(80.0, 40.0));
    EXPECT_NEAR(*s.transfer->area, A, 1e-9 * A);
    EXPECT_NEAR(s.transfer->UA, 500.0 * A, 1e-9 * 500.0 * A);
    EXPECT_NEAR(s.transfer->meanDeltaT, lmtd(80.0, 40.0), 1e-9 * 60.0);
    ASSERT_EQ(s.transfer->zones.size(), 1u);
    EXPECT_EQ(s.transfer->zones[0].key, "liquid");
    EXPECT_NEAR(s.transfer->zones[0].LMTD, lmtd(80.0, 40.0), 1e-9 * 60.0);
    ASSERT_TRUE(r.totals.area);
    EXPECT_NEAR(*r.totals.area, A, 1e-9 * A);
}

// Against a counter-current sensible utility, oil 345 → 320 K: the ends are
// 345 − 340 = 5 K and 320 − 300 = 20 K (Incropera & DeWitt, 6th ed., eq. 11.15
// with counter-flow end differences, Fig. 11.8).
TEST(TransferSizing, SensibleAgainstCounterCurrentUtility) {
    auto r = solveText(projectText(
        "steady-flow", kFlow, kLiquid300,
        R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "utility": "oil" },
             "transfer": { "U": "300 W/(m2 K)" } })j",
        R"j([{ "id": "oil", "kind": "sensible", "in": "345 K", "out": "320 K", "cp": "2.1 kJ/(kg K)" }])j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double Q = 2.0 * 4000.0 * 40.0;
    const double A = Q / (300.0 * lmtd(5.0, 20.0));
    EXPECT_NEAR(*r.steps[0].transfer->area, A, 1e-9 * A);
}

// A sensible utility given by its flow: its outlet is T_in − Q / (ṁ c_p)
// (first law over the utility), then the same counter-current formula.
TEST(TransferSizing, FlowingUtilityOutletFromTheDuty) {
    auto r = solveText(projectText(
        "steady-flow", kFlow, kLiquid300,
        R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "utility": "oil" },
             "transfer": { "U": "300 W/(m2 K)" } })j",
        R"j([{ "id": "oil", "kind": "sensible", "in": "360 K", "flow": "8 kg/s", "cp": "2.0 kJ/(kg K)" }])j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double Q = 2.0 * 4000.0 * 40.0;
    const double Tout = 360.0 - Q / (8.0 * 2000.0);  // 340 K
    const double A = Q / (300.0 * lmtd(360.0 - 340.0, Tout - 300.0));
    EXPECT_NEAR(*r.steps[0].transfer->area, A, 1e-9 * A);
    EXPECT_NEAR(r.steps[0].utility->mass, 8.0, 1e-12);
}

// Condensing then subcooling against cooling water 290 → 310 K, one U per
// zone: a hand zone calculation. The water's temperature where condensing
// ends follows from its straight line over the whole duty.
TEST(TransferSizing, CondenseAndSubcoolZoneSum) {
    auto r = solveText(projectText(
        "steady-flow", R"j({ "massFlow": "0.5 kg/s" })j", R"j({ "P": "1 atm", "quality": 1 })j",
        R"j({ "id": "c", "kind": "cool", "to": { "T": "320 K" }, "sink": { "utility": "cw" },
             "transfer": { "U": { "two-phase": "1200 W/(m2 K)", "liquid": "400 W/(m2 K)" } } })j",
        R"j([{ "id": "cw", "kind": "sensible", "in": "290 K", "out": "310 K", "cp": "4.18 kJ/(kg K)" }])j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double Qc = 0.5 * 1200e3, Qs = 0.5 * 4000.0 * 30.0, Qt = Qc + Qs;
    // Counter-current: the water leaves (310 K) where the vapour enters.
    const double Tw = 310.0 - 20.0 * Qc / Qt;
    const double A1 = Qc / (1200.0 * lmtd(350.0 - 310.0, 350.0 - Tw));
    const double A2 = Qs / (400.0 * lmtd(350.0 - Tw, 320.0 - 290.0));
    const auto& t = *r.steps[0].transfer;
    ASSERT_EQ(t.zones.size(), 2u);
    EXPECT_EQ(t.zones[0].key, "two-phase");
    EXPECT_EQ(t.zones[1].key, "liquid");
    EXPECT_NEAR(t.zones[0].area, A1, 1e-9 * A1);
    EXPECT_NEAR(t.zones[1].area, A2, 1e-9 * A2);
    EXPECT_NEAR(*t.area, A1 + A2, 1e-9 * (A1 + A2));
    // One LMTD over the whole step (ends 40 K and 30 K) would be wrong:
    const double oneLmtd = Qt / (400.0 * lmtd(350.0 - 310.0, 320.0 - 290.0));
    EXPECT_GT(std::fabs(oneLmtd - *t.area), 0.05 * *t.area);
}

TEST(TransferSizing, MissingZoneKeyIsAnErrorNamingIt) {
    auto r = solveText(projectText(
        "steady-flow", R"j({ "massFlow": "0.5 kg/s" })j", R"j({ "P": "1 atm", "quality": 1 })j",
        R"j({ "id": "c", "kind": "cool", "to": { "T": "320 K" }, "sink": { "T": "280 K" },
             "transfer": { "U": { "liquid": "400 W/(m2 K)" } } })j"));
    ASSERT_FALSE(r.ok());
    EXPECT_CONTAINS(r.firstError()->text(), "\"two-phase\"");
    EXPECT_CONTAINS(r.firstError()->text(), "step \"c\"");
}

// Law: the area grows without bound as the approach goes to zero. The
// liquid boils at 350 K on the way, so the last zone is vapour: each tenfold
// smaller approach adds (m c_p,vap / U) ln 10 to the area (the constant-
// temperature closed form, A = (m c_p / U) ln(ΔT_in / ΔT_out), Incropera &
// DeWitt, 6th ed., eq. 11.15): it has no upper bound.
TEST(TransferSizing, AreaGrowsWithoutBoundAsApproachVanishes) {
    double last = 0;
    const double perDecade = 2.0 * 1500.0 / 500.0 * std::log(10.0);
    for (const char* to : {"370 K", "379 K", "379.9 K", "379.99 K", "379.999 K"}) {
        auto r = solveText(projectText("steady-flow", kFlow, kLiquid300,
                                       std::string(R"j({ "id": "h", "kind": "heat", "to": { "T": ")j") + to +
                                           R"j(" }, "source": { "T": "380 K" }, "transfer": { "U": "500 W/(m2 K)" } })j"));
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        const double A = *r.steps[0].transfer->area;
        if (last > 0) {
            EXPECT_NEAR(A - last, perDecade, 1e-6 * perDecade) << to;
        }
        EXPECT_GT(A, last) << to;
        last = A;
    }
    auto r = solveText(projectText("steady-flow", kFlow, kLiquid300,
                                   R"j({ "id": "h", "kind": "heat", "to": { "T": "380 K" }, "source": { "T": "380 K" },
                                        "transfer": { "U": "500 W/(m2 K)" } })j"));
    ASSERT_FALSE(r.ok());
    EXPECT_CONTAINS(r.firstError()->text(), "no finite exchanger");
}

// ---- Rating ---------------------------------------------------------------

// The area sized for 340 K, given back as the exchanger, reaches 340 K.
TEST(TransferRating, RatedAreaGivesBackTheSizedOutlet) {
    const double Q = 2.0 * 4000.0 * 40.0;
    const double A = Q / (300.0 * lmtd(5.0, 20.0));  // as in SensibleAgainstCounterCurrentUtility
    char area[64];
    std::snprintf(area, sizeof area, "%.17g m2", A);
    auto r = solveText(projectText(
        "steady-flow", kFlow, kLiquid300,
        std::string(R"j({ "id": "h", "kind": "heat", "to": { "rated": true }, "source": { "utility": "oil" },
             "transfer": { "U": "300 W/(m2 K)", "area": ")j") + area + R"j(" } })j",
        R"j([{ "id": "oil", "kind": "sensible", "in": "345 K", "out": "320 K", "cp": "2.1 kJ/(kg K)" }])j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    EXPECT_NEAR(r.steps[0].end.T, 340.0, 1e-6);
    EXPECT_NEAR(r.steps[0].Q, Q, 1e-6 * Q);
}

TEST(TransferRating, UtilityThatCannotHeatIsAnError) {
    auto r = solveText(projectText("steady-flow", kFlow, kLiquid300,
                                   R"j({ "id": "h", "kind": "heat", "to": { "rated": true }, "source": { "T": "290 K" },
                                        "transfer": { "U": "300 W/(m2 K)", "area": "5 m2" } })j"));
    ASSERT_FALSE(r.ok());
    EXPECT_CONTAINS(r.firstError()->text(), "cannot heat");
}

// ---- Batch time -------------------------------------------------------------

// Heating a batch of constant-cp liquid from 300 to 340 K with a source at
// 380 K: t = (m c_p / UA) ln((Ts − T1)/(Ts − T2)) (Kern, Process Heat
// Transfer, 1950, ch. 18, isothermal heating medium).
TEST(BatchTime, IsothermalMediumClosedForm) {
    auto r = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                   R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                        "transfer": { "U": "400 W/(m2 K)", "area": "5 m2" } })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double t = 1000.0 * 4000.0 / 2000.0 * std::log(80.0 / 40.0);
    ASSERT_TRUE(r.steps[0].batch);
    const auto& b = *r.steps[0].batch;
    EXPECT_NEAR(b.duration, t, 1e-6 * t);
    EXPECT_NEAR(b.peakDuty, 2000.0 * 80.0, 1e-9 * 160e3);     // UA (Ts − T1) at the start
    EXPECT_NEAR(b.meanDuty, 1000.0 * 4000.0 * 40.0 / t, 1e-6 * 1e5);
    ASSERT_TRUE(r.totals.cycleTime);
    EXPECT_NEAR(*r.totals.cycleTime, t, 1e-6 * t);
}

// Cooling a batch with cooling water (inlet t1, flow w, c) through a coil:
// t = (M C / (w c)) · (K1 / (K1 − 1)) · ln((T1 − t1)/(T2 − t1)),
// K1 = exp(UA / (w c)) (Kern, Process Heat Transfer, 1950, ch. 18,
// non-isothermal cooling medium).
TEST(BatchTime, CoilWithCoolingWaterClosedForm) {
    auto r = solveText(projectText(
        "closed", R"j({ "mass": "1000 kg" })j", R"j({ "T": "345 K", "P": "1 atm" })j",
        R"j({ "id": "c", "kind": "cool", "to": { "T": "310 K" }, "sink": { "utility": "cw" },
             "transfer": { "UA": "3 kW/K" } })j",
        R"j([{ "id": "cw", "kind": "sensible", "in": "293 K", "flow": "1.5 kg/s", "cp": "4.18 kJ/(kg K)" }])j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double wc = 1.5 * 4180.0, K1 = std::exp(3000.0 / wc);
    const double t = 1000.0 * 4000.0 / wc * K1 / (K1 - 1.0) * std::log((345.0 - 293.0) / (310.0 - 293.0));
    EXPECT_NEAR(r.steps[0].batch->duration, t, 1e-6 * t);
    // The water used is its flow over that time.
    EXPECT_NEAR(r.steps[0].utility->mass, 1.5 * t, 1e-6 * 1.5 * t);
}

// A time target gives back the temperature of the closed form.
TEST(BatchTime, TimeTargetGivesTheTemperature) {
    const double t = 1000.0 * 4000.0 / 2000.0 * std::log(80.0 / 40.0);
    char time[64];
    std::snprintf(time, sizeof time, "%.17g s", t);
    auto r = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                   std::string(R"j({ "id": "h", "kind": "heat", "to": { "time": ")j") + time +
                                       R"j(" }, "source": { "T": "380 K" }, "transfer": { "UA": "2 kW/K" } })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    EXPECT_NEAR(r.steps[0].end.T, 340.0, 1e-6);
    EXPECT_NEAR(r.steps[0].batch->duration, t, 1e-6 * t);
}

// With a heat loss λ (T − T0) the batch settles at Teq = (UA Ts + λ T0)/(UA + λ)
// and t = m c_p/(UA + λ) ln((Teq − T1)/(Teq − T2)); the heat lost is
// λ[(Teq − T0) t − (Teq − T1) τ (1 − e^(−t/τ))], τ = m c_p/(UA + λ)
// (the same first-order balance, solved here): the utility gives the
// material's heat plus the loss (energy balance).
TEST(BatchTime, HeatLossEnergyBalance) {
    auto r = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                   R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                        "transfer": { "UA": "2 kW/K" } })j",
                                   "[]", R"j("heatLoss": { "UA": "500 W/K" },)j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double UA = 2000.0, lam = 500.0, T0 = 290.0, mc = 1000.0 * 4000.0;
    const double Teq = (UA * 380.0 + lam * T0) / (UA + lam), tau = mc / (UA + lam);
    const double t = tau * std::log((Teq - 300.0) / (Teq - 340.0));
    const double lost = lam * ((Teq - T0) * t - (Teq - 300.0) * tau * (1.0 - std::exp(-t / tau)));
    const auto& b = *r.steps[0].batch;
    EXPECT_NEAR(b.duration, t, 1e-6 * t);
    EXPECT_NEAR(b.heatLost, lost, 1e-6 * lost);
    EXPECT_NEAR(b.meanDuty * b.duration, mc * 40.0 + lost, 1e-6 * (mc * 40.0 + lost));
    // Past Teq the batch never gets there.
    auto never = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                       R"j({ "id": "h", "kind": "heat", "to": { "T": "370 K" }, "source": { "T": "380 K" },
                                            "transfer": { "UA": "2 kW/K" } })j",
                                       "[]", R"j("heatLoss": { "UA": "500 W/K" },)j"));
    ASSERT_FALSE(never.ok());
    EXPECT_CONTAINS(never.firstError()->text(), "never gets there");
}

// Law: the time grows without bound as the end approaches the source: each
// tenfold smaller approach adds (m c_p,vap / UA) ln 10 (Kern's isothermal
// closed form over the vapour stretch).
TEST(BatchTime, TimeGrowsWithoutBoundAsApproachVanishes) {
    double last = 0;
    const double perDecade = 1000.0 * 1500.0 / 2000.0 * std::log(10.0);
    for (const char* to : {"370 K", "379 K", "379.9 K", "379.99 K"}) {
        auto r = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                       std::string(R"j({ "id": "h", "kind": "heat", "to": { "T": ")j") + to +
                                           R"j(" }, "source": { "T": "380 K" }, "transfer": { "UA": "2 kW/K" } })j"));
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        if (last > 0) {
            EXPECT_NEAR(r.steps[0].batch->duration - last, perDecade, 1e-6 * perDecade) << to;
        }
        EXPECT_GT(r.steps[0].batch->duration, last) << to;
        last = r.steps[0].batch->duration;
    }
}

// Melting at one temperature: t = m h_fus / (UA (Ts − T_melt)) (the rate is
// constant while the temperature is).
TEST(BatchTime, PhaseChangeAtConstantRate) {
    auto r = solveText(projectText("closed", R"j({ "mass": "200 kg" })j", R"j({ "P": "1 atm", "meltFraction": 0 })j",
                                   R"j({ "id": "m", "kind": "melt", "source": { "T": "290 K" },
                                        "transfer": { "U": { "solid-liquid": "250 W/(m2 K)" }, "area": "4 m2" } })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double t = 200.0 * 300e3 / (1000.0 * 40.0);
    EXPECT_NEAR(r.steps[0].batch->duration, t, 1e-9 * t);
}

// A hold with no loss needs no heat; with a loss its duty is the loss.
TEST(BatchTime, HoldNeedsOnlyWhatTheLossTakes) {
    const std::string hold = R"j({ "id": "keep", "kind": "hold", "duration": "2 h", "source": { "T": "380 K" } })j";
    auto none = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300, hold));
    ASSERT_TRUE(none.ok()) << none.firstError()->text();
    EXPECT_EQ(none.steps[0].Q, 0.0);
    EXPECT_EQ(none.steps[0].batch->meanDuty, 0.0);
    EXPECT_EQ(none.steps[0].batch->duration, 7200.0);
    auto loss = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300, hold, "[]",
                                      R"j("heatLoss": { "UA": "25 W/K" },)j"));
    ASSERT_TRUE(loss.ok()) << loss.firstError()->text();
    EXPECT_NEAR(loss.steps[0].batch->meanDuty, 25.0 * (300.0 - 290.0), 1e-12);
    EXPECT_NEAR(*loss.totals.cycleTime, 7200.0, 1e-12);
    EXPECT_EQ(loss.steps[0].end.T, 300.0);
}

// ---- The project fields ----------------------------------------------------

TEST(TransferFields, RoundTripAsTypedWithUnknownFieldsKept) {
    const std::string text = projectText(
        "closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
        R"j({ "id": "h", "kind": "heat", "to": { "time": "45 min" }, "source": { "utility": "cw" },
             "transfer": { "U": { "liquid": "450 W/(m2 K)", "solid": "120 W/(m2 K)", "fouled": "yes" },
                           "area": "6.5 m2", "tag": "J-1" },
             "heatLoss": { "UA": "25 W/K" } },
           { "id": "keep", "kind": "hold", "duration": "2 h" })j",
        R"j([{ "id": "cw", "kind": "sensible", "in": "360 K", "flow": "3 kg/s", "cp": "4.18 kJ/(kg K)" }])j",
        R"j("heatLoss": { "UA": "40 W/K", "note": "lagged" },)j");
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    const Step& h = p->steps[0];
    ASSERT_TRUE(h.transfer && h.to.time && h.heatLoss);
    EXPECT_EQ(h.to.time->si, 2700.0);
    EXPECT_EQ(h.transfer->zoneU.size(), 2u);
    EXPECT_EQ(h.transfer->area->si, 6.5);
    EXPECT_EQ(p->steps[1].kind, StepKind::Hold);
    EXPECT_EQ((*p->utilities)[0].flow->si, 3.0);
    const std::string written = writeProject(*p);
    for (const char* typed : {"\"time\": \"45 min\"", "\"liquid\": \"450 W/(m2 K)\"", "\"fouled\": \"yes\"",
                              "\"tag\": \"J-1\"", "\"UA\": \"25 W/K\"", "\"note\": \"lagged\"", "\"flow\": \"3 kg/s\"",
                              "\"duration\": \"2 h\"", "\"kind\": \"hold\""})
        EXPECT_CONTAINS(written, typed);
    auto again = parseProject(written);
    ASSERT_TRUE(again.ok()) << again.error().text();
    EXPECT_EQ(writeProject(*again), written);
}

TEST(TransferFields, BadValuesNameTheirPath) {
    auto bad = [](const std::string& steps, const std::string& system = "closed", const std::string& top = "") {
        auto p = parseProject(projectText(system, system == "closed" ? R"j({ "mass": "1 kg" })j" : kFlow, kLiquid300,
                                          steps, "[]", top));
        EXPECT_FALSE(p.ok());
        return p ? std::string() : p.error().text();
    };
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "transfer": { "U": "5 m2" } })j"),
                    "step \"h\" (steps[0]).transfer.U");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "transfer": { "U": "-5 W/(m2 K)" } })j"),
                    "negative");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "transfer": { "area": "5 m2" } })j"),
                    "needs an overall coefficient U");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" },
                             "transfer": { "U": "5 W/(m2 K)", "UA": "1 kW/K" } })j"),
                    "not UA with them");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "time": "5 min" }, "source": { "T": "400 K" } })j"),
                    "a time target needs");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "time": "5 min" } })j", "steady-flow"),
                    "belongs to a closed system");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "hold" })j"), "needs its \"duration\"");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "hold", "duration": "1 h" })j", "steady-flow"), "closed system");
    EXPECT_CONTAINS(bad(R"j({ "id": "h", "kind": "heat", "to": { "rated": false } })j", "steady-flow"), "\"rated\" is true");
    EXPECT_CONTAINS(bad("", "steady-flow", R"j("heatLoss": { "UA": "1 W/K" },)j"), "heatLoss");
    EXPECT_CONTAINS(bad(R"j({ "id": "c", "kind": "compress", "to": { "P": "2 atm" }, "transfer": { "UA": "1 kW/K" } })j"),
                    "does not belong to a compress step");
}

TEST(TransferFields, ResultsJsonCarriesTheContractKeys) {
    auto p = parseProject(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                      R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                           "transfer": { "U": "400 W/(m2 K)", "area": "5 m2" } })j"));
    ASSERT_TRUE(p.ok()) << p.error().text();
    const Json j = resultsToJson(*p, solve(*p));
    const Json& s = j["steps"][0];
    for (const char* k : {"UA_W_per_K", "area_m2", "meanDeltaT_K", "zones"}) EXPECT_TRUE(s["transfer"].contains(k)) << k;
    for (const char* k : {"label", "Q", "U_W_per_m2K", "LMTD_K", "area_m2"}) EXPECT_TRUE(s["transfer"]["zones"][0].contains(k)) << k;
    for (const char* k : {"duration_s", "peakDuty_W", "meanDuty_W", "profile"}) EXPECT_TRUE(s.contains(k)) << k;
    for (const char* k : {"t_s", "T_K", "Qdot_W"}) EXPECT_TRUE(s["profile"][0].contains(k)) << k;
    // A batch's steps share their jacket: its area is not added up.
    EXPECT_TRUE(j["totals"]["area_m2"].is_null());
    EXPECT_TRUE(j["totals"]["cycleTime_s"].is_number());
}

// Sweeps accept the exchanger as an input: each point's time is Kern's
// isothermal closed form at that area (Process Heat Transfer, 1950, ch. 18).
TEST(TransferFields, SweepOverAreaGivesKernTimes) {
    auto p = parseProject(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                      R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                           "transfer": { "U": "400 W/(m2 K)", "area": "5 m2" } })j"));
    ASSERT_TRUE(p.ok()) << p.error().text();
    SweepSpec spec{"h", "transfer.area", "2 m2", "10 m2", 5, {"step:h.duration", "total.cycleTime", "step:h.area"}};
    auto r = sweep(*p, spec);
    ASSERT_TRUE(r.ok()) << r.error().text();
    ASSERT_EQ(r->points.size(), 5u);
    for (const auto& pt : r->points) {
        ASSERT_FALSE(pt.error) << pt.error->text();
        const double t = 1000.0 * 4000.0 / (400.0 * pt.x) * std::log(80.0 / 40.0);
        EXPECT_NEAR(*pt.values[0], t, 1e-6 * t) << pt.text;
        EXPECT_NEAR(*pt.values[1], t, 1e-6 * t) << pt.text;
        EXPECT_NEAR(*pt.values[2], pt.x, 1e-12 * pt.x) << pt.text;
    }
}

// ---- Entropy generation against a flowing utility --------------------------

namespace {

// Dilogarithm Li2(x) = Σ x^k / k² for |x| < 1 (Abramowitz & Stegun, Handbook
// of Mathematical Functions, eq. 27.7.1), d Li2/dx = −ln(1 − x)/x.
double dilog(double x) {
    double sum = 0, term = x;
    for (int k = 1; k < 200; ++k) {
        sum += term / (double(k) * k);
        term *= x;
    }
    return sum;
}

}  // namespace

// Balanced counterflow, C = ṁ c_p = 8000 W/K on both sides: the material
// 300 → 340 K, the oil in at 340 + a, out at 300 + a. The entropy generated
// is the two streams' own entropy changes,
//   S_gen = C ln(340/300) + C ln((300 + a)/(340 + a))
// (Bejan, Advanced Engineering Thermodynamics, 3rd ed., ch. 3, entropy
// generation in a counterflow heat exchanger), ≥ 0, and it vanishes with the
// approach a; exergy destroyed is T0 S_gen (Gouy–Stodola).
TEST(TransferEntropy, BalancedCounterflowVanishesWithTheApproach) {
    const double C = 2.0 * 4000.0;
    double first = 0, last = 0, before = 1e300;
    for (double a : {5.0, 1.0, 0.1, 0.001}) {
        char oil[200];
        std::snprintf(oil, sizeof oil,
                      R"j([{ "id": "oil", "kind": "sensible", "in": "%.17g K", "flow": "4 kg/s", "cp": "2.0 kJ/(kg K)" }])j",
                      340.0 + a);
        auto r = solveText(projectText("steady-flow", kFlow, kLiquid300,
                                       R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" },
                                            "source": { "utility": "oil" }, "transfer": { "U": "300 W/(m2 K)" } })j",
                                       oil));
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        const auto& s = r.steps[0];
        const double Sgen = C * std::log(340.0 / 300.0) + C * std::log((300.0 + a) / (340.0 + a));
        EXPECT_NEAR(s.Sgen, Sgen, 1e-9 * C) << a;
        EXPECT_GE(s.Sgen, 0.0) << a;
        EXPECT_LT(s.Sgen, before) << a;
        EXPECT_NEAR(s.exergyDestroyed, 290.0 * s.Sgen, 1e-9 * 290.0 * C) << a;
        before = s.Sgen;
        if (first == 0) first = s.Sgen;
        last = s.Sgen;
    }
    EXPECT_LT(last, 1e-3 * first);
}

// A batch heated through a coil by oil flowing at w c = 6270 W/K, inlet
// t1 = 360 K, UA = 3 kW/K: the oil leaves at t1 − ε (t1 − T),
// ε = 1 − exp(−UA/(w c)) (Kern, Process Heat Transfer, 1950, ch. 18), so its
// own entropy change over the heat-up is
//   ΔS_oil = ∫ w c ln(T_out/t1) dt = (M C/ε) [Li2(x2) − Li2(x1)],
//   x = ε (t1 − T)/t1,
// with dt = M C dT / (w c ε (t1 − T)), worked out here; the batch's is
// M C ln(T2/T1). S_gen is their sum (Bejan, Advanced Engineering
// Thermodynamics, 3rd ed., ch. 3: the entropy generated is the entropy
// change of everything that took part), less than the figure that would
// treat the oil as a reservoir held at its inlet temperature.
TEST(TransferEntropy, BatchAgainstFlowingUtilityUsesItsOwnEntropyChange) {
    auto r = solveText(projectText(
        "closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
        R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "utility": "oil" },
             "transfer": { "UA": "3 kW/K" } })j",
        R"j([{ "id": "oil", "kind": "sensible", "in": "360 K", "flow": "1.5 kg/s", "cp": "4.18 kJ/(kg K)" }])j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const double MC = 1000.0 * 4000.0, wc = 1.5 * 4180.0, t1 = 360.0;
    const double eps = 1.0 - std::exp(-3000.0 / wc);
    const double x1 = eps * (t1 - 300.0) / t1, x2 = eps * (t1 - 340.0) / t1;
    const double dSoil = MC / eps * (dilog(x2) - dilog(x1));
    const double dSbatch = MC * std::log(340.0 / 300.0);
    const double Sgen = dSbatch + dSoil;
    const auto& s = r.steps[0];
    EXPECT_NEAR(s.batch->utilityEntropy, dSoil, 1e-9 * std::fabs(dSoil));
    EXPECT_NEAR(s.Sgen, Sgen, 1e-7 * Sgen);
    EXPECT_GT(s.Sgen, 0.0);
    EXPECT_LT(s.Sgen, dSbatch - MC * 40.0 / t1);  // the reservoir-at-inlet figure overstates it
    EXPECT_NEAR(s.exergyDestroyed, 290.0 * s.Sgen, 1e-9 * 290.0 * Sgen);
    EXPECT_NEAR(r.totals.Sgen, s.Sgen, 1e-12 * Sgen);
}

// ---- A batch on the tail of its approach -------------------------------------

// Against a constant-temperature source the step spans t/τ = ln((Ts − T1)/(Ts − T2))
// time constants, τ = M c_p / UA (Kern, ch. 18): ln 2 for 300 → 340 K at 380 K,
// and no warning.
TEST(BatchTail, TimeConstantsOfAnIsothermalHeatUp) {
    auto r = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                   R"j({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                        "transfer": { "UA": "2 kW/K" } })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    EXPECT_NEAR(r.steps[0].batch->timeConstants, std::log(2.0), 1e-9);
    EXPECT_TRUE(r.steps[0].warnings.empty());
}

// Forty time constants (τ = M c_p / UA = 2000 s, the liquid held below its
// boiling point by a source at 340 K) asked for: the batch has settled at the
// source's temperature long before, the time is all tail, and the step says so
// as a warning naming itself; the time asked for is still the step's time.
TEST(BatchTail, FortyTimeConstantsWarn) {
    auto r = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                   R"j({ "id": "soak", "kind": "heat", "to": { "time": "80000 s" },
                                        "source": { "T": "340 K" }, "transfer": { "UA": "2 kW/K" } })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    EXPECT_NEAR(s.end.T, 340.0, 1e-6);
    EXPECT_NEAR(s.batch->duration, 80000.0, 1e-9);
    bool warned = false;
    for (const Message& m : s.messages())
        if (m.level == MessageLevel::Warning && m.text.find("time constants") != std::string::npos) {
            warned = true;
            EXPECT_CONTAINS(m.text, "step \"soak\"");
            EXPECT_CONTAINS(m.text, "check");
        }
    EXPECT_TRUE(warned);
    // Ten time constants: no warning.
    auto ten = solveText(projectText("closed", R"j({ "mass": "1000 kg" })j", kLiquid300,
                                     R"j({ "id": "soak", "kind": "heat", "to": { "time": "20000 s" },
                                          "source": { "T": "340 K" }, "transfer": { "UA": "2 kW/K" } })j"));
    ASSERT_TRUE(ten.ok()) << ten.firstError()->text();
    EXPECT_NEAR(ten.steps[0].batch->timeConstants, 10.0, 1e-6);
    EXPECT_TRUE(ten.steps[0].warnings.empty());
}
