// Exergy: the exergy balance of every step, the Gouy–Stodola
// theorem, a reversible (Carnot) cycle, a throttle. The exergy of each state
// is recomputed here from the states and the dead state (the substance at
// the surroundings' T0, P0, same model), and the heat's exergy from
// Q (1 − T0 / T_reservoir), so the balance
//     ΔEx = Ex_Q + W_u − T0 S_gen
// is checked against numbers the solver did not combine itself.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "support/samples.hpp"

using namespace heatchain;

namespace {

double rel(double a, double b) { return std::fabs(a - b) / std::max({1.0, std::fabs(a), std::fabs(b)}); }

std::string kelvin(double T) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.17g K", T);
    return buf;
}
std::string pascal(double P) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.17g Pa", P);
    return buf;
}

// The balance of every computed step, to 1e-9 of its largest term.
void checkBalance(const Project& p, const SequenceResult& r, const std::string& name) {
    ASSERT_TRUE(r.exergyAvailable) << name;
    const Surroundings& s0 = p.surroundingsOrDefault();
    auto dead = r.model->stateTP(s0.T.si, s0.P.si);
    ASSERT_TRUE(dead.ok()) << name;
    const bool closed = p.system == SystemKind::Closed;
    const double T0 = s0.T.si, P0 = s0.P.si, m = p.massBasis();
    auto ex = [&](const State& s) {
        return closed ? (s.u - dead->u) + P0 * (s.v - dead->v) - T0 * (s.s - dead->s)
                      : (s.h - dead->h) - T0 * (s.s - dead->s);
    };
    for (const auto& s : r.steps) {
        if (!s.computed) continue;
        const double dEx = m * (ex(s.end) - ex(s.start));
        double exQ = 0;
        if (s.Q != 0) {
            ASSERT_TRUE(s.reservoirT) << name << " " << s.id << ": the samples name a source or sink for every heat";
            exQ = s.Q * (1 - T0 / *s.reservoirT);
        }
        const double Wu = closed ? s.W + P0 * m * (s.end.v - s.start.v) : s.W;
        const double destroyed = T0 * s.Sgen;  // Gouy–Stodola
        const double scale = std::max({std::fabs(dEx), std::fabs(exQ), std::fabs(Wu), std::fabs(destroyed), 1e-300});
        EXPECT_LE(std::fabs(dEx - (exQ + Wu - destroyed)), 1e-9 * scale) << name << " " << s.id;
        EXPECT_LE(rel(s.exergyDestroyed, destroyed), 1e-12) << name << " " << s.id;
        EXPECT_LE(std::fabs(s.dEx - dEx), 1e-9 * scale) << name << " " << s.id;
        EXPECT_LE(std::fabs(s.exergyHeat - exQ), 1e-9 * scale) << name << " " << s.id;
        if (s.secondLawEfficiency) {
            EXPECT_GE(*s.secondLawEfficiency, 0.0);
            EXPECT_LE(*s.secondLawEfficiency, 1.0);
        }
    }
    // The shares of the bar chart add up to one.
    double share = 0;
    for (const auto& s : r.steps) share += s.exergyDestroyedShare;
    if (r.totals.exergyDestroyed > 0) {
        EXPECT_NEAR(share, 1.0, 1e-12) << name;
    }
}

}  // namespace

TEST(Exergy, BalanceOfEveryStepOfEverySample) {
    for (const char* name : {"melt-tank", "nitrogen-warmup", "compressor-aftercooler", "solvent-recovery", "boiler-feed"}) {
        auto p = loadProject(heatchain::testing::samplePath(name));
        ASSERT_TRUE(p.ok()) << name << ": " << p.error().text();
        auto r = solve(*p);
        ASSERT_TRUE(r.ok()) << name << ": " << r.firstError()->text();
        checkBalance(*p, r, name);
        // The sequence as one process: ΔEx = Σ Ex_Q + Σ W_u − Σ X_destroyed.
        const auto& t = r.totals;
        const double rhs = t.exergyHeatIn - t.exergyHeatOut + t.workIn - t.workOut - t.exergyDestroyed;
        EXPECT_LE(std::fabs(t.dEx - rhs), 1e-9 * std::max(t.exergySupplied, 1.0)) << name;
        ASSERT_TRUE(t.secondLawEfficiency) << name;
        EXPECT_GT(*t.secondLawEfficiency, 0.0) << name;
        EXPECT_LT(*t.secondLawEfficiency, 1.0) << name;
    }
}

// A throttle destroys T0 ΔS, and that is the exergy the stream loses.
TEST(Exergy, ThrottleDestroysT0DeltaS) {
    const std::string text = R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "model": "reference", "substance": "water", "basis": { "massFlow": "2 kg/s" },
      "surroundings": { "T": "20 degC", "P": "1 atm" }, "start": { "T": "250 degC", "P": "10 bar" },
      "steps": [ { "id": "valve", "kind": "throttle", "to": { "P": "2 bar" } } ] })";
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_TRUE(r.ok());
    auto a = r.model->stateTP(523.15, 10e5);
    ASSERT_TRUE(a.ok());
    auto b = r.model->statePH(2e5, a->h);
    ASSERT_TRUE(b.ok());
    const double expected = 293.15 * 2.0 * (b->s - a->s);
    EXPECT_GT(expected, 0);
    EXPECT_LE(rel(r.steps[0].exergyDestroyed, expected), 1e-9);
    EXPECT_LE(rel(-r.steps[0].dEx, expected), 1e-9);
    // Nothing useful comes out of a valve.
    ASSERT_TRUE(r.steps[0].secondLawEfficiency);
    EXPECT_NEAR(*r.steps[0].secondLawEfficiency, 0.0, 1e-9);
    checkBalance(*p, r, "throttle");
}

// A Carnot cycle of an ideal gas (nitrogen, constant cp): isothermal
// compression rejecting heat to a sink at its own temperature, isentropic
// compression, isothermal expansion taking heat from a source at its own
// temperature, isentropic expansion back to the start. Every step is
// reversible: no exergy is destroyed, the cycle's efficiency is Carnot's
// 1 − T_lo / T_hi, and its second-law efficiency is 1.
TEST(Exergy, ReversibleCycleDestroysNothing) {
    auto sub = SubstanceLibrary::builtin().find("nitrogen");
    ASSERT_NE(sub, nullptr);
    auto model = makeModel(ModelKind::ConstantCp, *sub);
    ASSERT_TRUE(model.ok()) << model.error().text();
    const double Tlo = 300.0, P1 = 1e5, P2 = 3e5, P3 = 12e5;
    auto s2 = (*model)->stateTP(Tlo, P2);
    ASSERT_TRUE(s2.ok());
    auto s3 = (*model)->statePS(P3, s2->s);
    ASSERT_TRUE(s3.ok());
    const double Thi = s3->T;
    const double P4 = P3 * P1 / P2;  // ideal gas: equal pressure ratios close the cycle
    const std::string text = R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "model": "constant-cp", "substance": "nitrogen", "basis": { "massFlow": "1 kg/s" },
      "surroundings": { "T": "15 degC", "P": "1 atm" }, "start": { "T": "300 K", "P": "1 bar" },
      "utilities": [ { "id": "cold", "kind": "fixed", "T": ")" + kelvin(Tlo) + R"(" },
                     { "id": "hot", "kind": "fixed", "T": ")" + kelvin(Thi) + R"(" } ],
      "steps": [
        { "id": "c1", "kind": "compress", "to": { "P": "3 bar" }, "path": "polytropic", "n": 1, "sink": { "utility": "cold" } },
        { "id": "c2", "kind": "compress", "to": { "P": "12 bar" }, "path": "isentropic" },
        { "id": "e1", "kind": "expand", "to": { "P": ")" + pascal(P4) + R"(" }, "path": "polytropic", "n": 1, "source": { "utility": "hot" } },
        { "id": "e2", "kind": "expand", "to": { "P": "1 bar" }, "path": "isentropic" } ] })";
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    double Qin = 0, Wnet = 0, destroyed = 0;
    for (const auto& s : r.steps) {
        if (s.Q > 0) Qin += s.Q;
        Wnet -= s.W;
        destroyed += s.exergyDestroyed;
    }
    EXPECT_NEAR(r.steps.back().end.T, Tlo, 1e-6);  // the cycle closes
    EXPECT_LE(destroyed, 1e-9 * Qin);
    EXPECT_LE(r.totals.exergyDestroyed, 1e-9 * Qin);
    EXPECT_LE(rel(Wnet / Qin, 1 - Tlo / Thi), 1e-9);
    ASSERT_TRUE(r.totals.secondLawEfficiency);
    EXPECT_NEAR(*r.totals.secondLawEfficiency, 1.0, 1e-9);
    checkBalance(*p, r, "carnot");
}

// A closed batch: the atmosphere's share of the work (P0 ΔV) is not useful.
TEST(Exergy, ClosedSystemUsesUsefulWork) {
    const std::string text = R"({ "format": "heatchain-project", "version": 1, "system": "closed",
      "model": "reference", "substance": "water", "basis": { "mass": "3 kg" },
      "surroundings": { "T": "25 degC", "P": "1 atm" }, "start": { "T": "30 degC", "P": "2 bar" },
      "steps": [ { "id": "boil-off", "kind": "heat", "to": { "T": "180 degC" }, "source": { "T": "250 degC" } } ] })";
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    EXPECT_LT(s.W, 0);  // the vapour pushes back the surroundings
    EXPECT_NEAR(s.usefulWork, s.W + 101325.0 * 3.0 * (s.end.v - s.start.v), 1e-9 * std::fabs(s.W));
    checkBalance(*p, r, "closed");
}
