// The sequence solver against the closed forms of the constant-cp model
// (incompressible condensed phases, ideal-gas vapour with constant cp) and
// against the laws every step must obey: energy balance, S_gen >= 0,
// Gouy–Stodola, path independence and heat-then-cool symmetry.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "support/samples.hpp"

using namespace heatchain;

namespace {

constexpr double R_universal = 8.314462618;  // J/(mol K), CODATA 2018 (exact)

// A made-up test substance with constant heat capacities: test data, not a
// real material. Its closed forms are exact under the constant-cp model.
const char* kTestSubstance = R"json({
  "id": "test-fluid", "name": "Test fluid", "molarMass": "0.030 kg/mol",
  "source": "invented test data",
  "phases": { "solid": { "cp": "2.0 kJ/(kg K)" }, "liquid": { "cp": "4.0 kJ/(kg K)" },
              "vapor": { "cp": "1.5 kJ/(kg K)" } },
  "melting": { "T": "250 K", "enthalpy": "300 kJ/kg" },
  "boiling": { "T": "350 K", "P": "1 atm", "enthalpy": "1200 kJ/kg" }
})json";

std::string projectText(const std::string& system, const std::string& basis, const std::string& start,
                        const std::string& steps, const std::string& model = "constant-cp",
                        const std::string& substance = kTestSubstance) {
    return std::string(R"({ "format": "heatchain-project", "version": 1, "meta": { "title": "t" },)") +
           R"("system": ")" + system + R"(", "model": ")" + model + R"(", "substance": )" + substance +
           R"(, "basis": )" + basis + R"(, "surroundings": { "T": "298.15 K", "P": "1 atm" }, "start": )" +
           start + R"(, "steps": [)" + steps + "] }";
}

Project parse(const std::string& text) {
    auto p = parseProject(text, "test.hchain");
    EXPECT_TRUE(p.ok()) << (p.ok() ? "" : p.error().text());
    return p.ok() ? *p : Project{};
}

SequenceResult solveText(const std::string& text) {
    auto p = parse(text);
    return solve(p);
}

void expectRel(double actual, double expected, double rel, const char* what) {
    EXPECT_NEAR(actual, expected, rel * std::max(1.0, std::fabs(expected))) << what;
}

// Laws every computed step obeys.
void checkLaws(const Project& p, const SequenceResult& r) {
    const bool closed = p.system == SystemKind::Closed;
    for (const auto& s : r.steps) {
        if (!s.computed) continue;
        const double lhs = closed ? s.dU : s.dH;
        // Closure is judged against the energy the material carries, m·h, since an
        // adiabatic throttle has Q = W = ΔH = 0 and only round-off remains.
        const double carried = r.massBasis * std::max({std::fabs(s.start.h), std::fabs(s.end.h), 1.0});
        const double scale = std::max({std::fabs(s.Q), std::fabs(s.W), std::fabs(lhs), carried});
        EXPECT_NEAR(lhs, s.Q + s.W, 1e-9 * scale) << "energy balance of step " << s.id;
        EXPECT_GE(s.Sgen, -1e-12) << "S_gen of step " << s.id;
        EXPECT_NEAR(s.exergyDestroyed, r.T0 * s.Sgen, 1e-12 * std::max(1.0, s.exergyDestroyed))
            << "Gouy–Stodola for step " << s.id;
        double qseg = 0;
        for (const auto& g : s.segments) qseg += g.Q;
        if (s.kind != StepKind::Compress && s.kind != StepKind::Expand) {
            EXPECT_NEAR(qseg, s.Q, 1e-9 * std::max(1.0, std::fabs(s.Q))) << "segments add up for " << s.id;
        }
    }
}

}  // namespace

// Closed form: isobaric heating of an incompressible liquid, Q = m cp ΔT,
// ΔS = m cp ln(T2/T1), S_gen = ΔS − Q/T_source.
TEST(SolverClosedForm, IsobaricLiquidHeatingWithSource) {
    auto r = solveText(projectText("steady-flow", R"({ "massFlow": "2 kg/s" })", R"({ "T": "280 K", "P": "1 atm" })",
                                   R"({ "id": "h", "kind": "heat", "to": { "T": "320 K" }, "source": { "T": "400 K" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    const double Q = 2 * 4000.0 * 40.0, dS = 2 * 4000.0 * std::log(320.0 / 280.0);
    expectRel(s.Q, Q, 1e-12, "Q");
    expectRel(s.dH, Q, 1e-12, "dH");
    EXPECT_EQ(s.W, 0.0);
    expectRel(s.dS, dS, 1e-12, "dS");
    expectRel(s.Sgen, dS - Q / 400.0, 1e-10, "Sgen");
}

// Closed form through melting and boiling: liquid sensible + latent heats.
TEST(SolverClosedForm, HeatingThroughBoilingSplitsSegments) {
    auto r = solveText(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "300 K", "P": "1 atm" })",
                                   R"({ "id": "h", "kind": "heat", "to": { "T": "400 K" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    ASSERT_EQ(s.segments.size(), 3u);
    EXPECT_EQ(s.segments[0].label, "liquid, sensible");
    EXPECT_EQ(s.segments[1].label, "boiling");
    EXPECT_EQ(s.segments[2].label, "vapour, sensible");
    // The model's boiling point at its own anchor pressure is the anchor, 350 K.
    expectRel(s.segments[0].end.T, 350.0, 1e-9, "boiling temperature at 1 atm");
    expectRel(s.segments[0].Q, 4000.0 * 50.0, 1e-9, "liquid sensible Q");
    expectRel(s.segments[1].Q, 1.2e6, 1e-9, "latent heat at the anchor");
    expectRel(s.segments[2].Q, 1500.0 * 50.0, 1e-9, "vapour sensible Q");
    expectRel(s.dS, 4000.0 * std::log(350.0 / 300.0) + 1.2e6 / 350.0 + 1500.0 * std::log(400.0 / 350.0), 1e-9, "dS");
}

// Phase change at its own temperature: ΔS = ΔH / T exactly, and a source at
// the transition temperature makes it reversible (S_gen = 0).
TEST(SolverClosedForm, MeltingEntropyIsLatentOverT) {
    auto r = solveText(projectText("closed", R"({ "mass": "3 kg" })", R"({ "P": "1 atm", "meltFraction": 0 })",
                                   R"({ "id": "m", "kind": "melt", "source": { "T": "250 K" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& s = r.steps[0];
    expectRel(s.dH, 3 * 300e3, 1e-12, "dH = m h_fus");
    expectRel(s.dS, 3 * 300e3 / 250.0, 1e-12, "dS = dH/T");
    EXPECT_NEAR(s.Sgen, 0.0, 1e-9);
}

// Ideal gas closed forms: isentropic T2 = T1 (P2/P1)^(R/cp), W = m cp ΔT;
// isothermal W = m R T ln(P2/P1) = −Q; throttle keeps T, ΔS = m R ln(P1/P2);
// polytropic T2 = T1 (P2/P1)^((n−1)/n), W = n/(n−1) m R ΔT (steady flow).
TEST(SolverClosedForm, IdealGasCompressionPaths) {
    const double R = R_universal / 0.030, cp = 1500.0, T1 = 500.0, P1 = 101325.0, P2 = 5 * 101325.0;
    const std::string start = R"({ "T": "500 K", "P": "1 atm" })";
    auto run = [&](const std::string& step) {
        return solveText(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", start, step));
    };
    {
        auto r = run(R"({ "id": "c", "kind": "compress", "to": { "P": "5 atm" }, "path": "isentropic" })");
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        const double T2 = T1 * std::pow(P2 / P1, R / cp);
        expectRel(r.steps[0].end.T, T2, 1e-9, "isentropic T2");
        expectRel(r.steps[0].W, cp * (T2 - T1), 1e-9, "isentropic W");
        EXPECT_NEAR(r.steps[0].Sgen, 0.0, 1e-8);
    }
    {
        auto r = run(R"({ "id": "c", "kind": "compress", "to": { "P": "5 atm" }, "path": "adiabatic", "efficiency": 0.8 })");
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        const double T2s = T1 * std::pow(P2 / P1, R / cp);
        const double T2 = T1 + (T2s - T1) / 0.8;
        expectRel(r.steps[0].end.T, T2, 1e-9, "adiabatic T2");
        expectRel(r.steps[0].Sgen, cp * std::log(T2 / T1) - R * std::log(P2 / P1), 1e-8, "adiabatic Sgen");
    }
    {
        auto r = run(R"({ "id": "c", "kind": "compress", "to": { "ratio": 5 }, "path": "isothermal" })");
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        expectRel(r.steps[0].W, R * T1 * std::log(5.0), 1e-9, "isothermal W");
        expectRel(r.steps[0].Q, -R * T1 * std::log(5.0), 1e-9, "isothermal Q");
    }
    {
        auto r = run(R"({ "id": "c", "kind": "compress", "to": { "P": "5 atm" }, "path": "polytropic", "n": 1.3 })");
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        const double T2 = T1 * std::pow(5.0, 0.3 / 1.3);
        expectRel(r.steps[0].end.T, T2, 1e-8, "polytropic T2");
        expectRel(r.steps[0].W, 1.3 / 0.3 * R * (T2 - T1), 1e-8, "polytropic W");
    }
    {
        auto r = run(R"({ "id": "t", "kind": "throttle", "to": { "P": "0.5 atm" } })");
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        expectRel(r.steps[0].end.T, T1, 1e-9, "ideal-gas throttle keeps T");
        expectRel(r.steps[0].dS, R * std::log(2.0), 1e-9, "throttle dS");
        expectRel(r.steps[0].Sgen, R * std::log(2.0), 1e-9, "throttle Sgen = dS");
    }
}

// The drawn path of an adiabatic compression with efficiency below 1 is the
// line of constant polytropic efficiency. For an ideal gas of constant cp
// that line has ln T linear in ln P (s = cp ln T - R ln P, closed form), so
// every curve point must satisfy T = T1 (P/P1)^m with m fixed by the ends,
// and s never falls along it (adiabatic: S_gen >= 0 on every part).
TEST(SolverClosedForm, AdiabaticCurveIsThePolytropicEfficiencyLine) {
    auto r = solveText(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "500 K", "P": "1 atm" })",
                                   R"({ "id": "c", "kind": "compress", "to": { "P": "5 atm" }, "path": "adiabatic", "efficiency": 0.7 })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto& st = r.steps[0];
    ASSERT_EQ(st.segments.size(), 1u);
    const auto& curve = st.segments[0].curve;
    ASSERT_GE(curve.size(), 10u);
    const double T1 = st.start.T, P1 = st.start.P;
    const double m = std::log(st.end.T / T1) / std::log(st.end.P / P1);
    for (std::size_t k = 0; k < curve.size(); ++k) {
        expectRel(curve[k].T, T1 * std::pow(curve[k].P / P1, m), 1e-9, "polytropic-efficiency line");
        if (k > 0) {
            EXPECT_GT(curve[k].P, curve[k - 1].P) << k;
            EXPECT_GE(curve[k].s, curve[k - 1].s - 1e-9) << k;
        }
    }
    EXPECT_DOUBLE_EQ(curve.front().T, st.start.T);
    EXPECT_DOUBLE_EQ(curve.back().T, st.end.T);
}

// The same path law for water on IAPWS-IF97: a feed pump (liquid) and a
// turbine expanding into the wet region. Entropy never falls along either.
TEST(SolverLaws, AdiabaticCurvesNeverLowerEntropy) {
    auto p = parse(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "45 degC", "P": "1.2 bar" })",
                               R"({ "id": "pump", "kind": "compress", "to": { "P": "40 bar" }, "path": "adiabatic", "efficiency": 0.6 },
                                  { "id": "boiler", "kind": "heat", "to": { "T": "420 degC" } },
                                  { "id": "turbine", "kind": "expand", "to": { "P": "0.1 bar" }, "path": "adiabatic", "efficiency": 0.8 })",
                               "reference", R"("water")"));
    auto r = solve(p);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    for (std::size_t i : {0u, 2u}) {
        const auto& st = r.steps[i];
        ASSERT_EQ(st.segments.size(), 1u) << st.id;
        const auto& curve = st.segments[0].curve;
        ASSERT_GE(curve.size(), 10u) << st.id;
        EXPECT_DOUBLE_EQ(curve.front().s, st.start.s) << st.id;
        EXPECT_DOUBLE_EQ(curve.back().s, st.end.s) << st.id;
        EXPECT_GT(st.end.s, st.start.s) << st.id;
        for (std::size_t k = 1; k < curve.size(); ++k) EXPECT_GE(curve[k].s, curve[k - 1].s - 1e-9) << st.id << " " << k;
    }
    ASSERT_TRUE(r.steps[2].end.quality.has_value()) << "the turbine should end wet at 0.1 bar";
}

// Closed rigid vessel of ideal gas: Q = m cv ΔT, P2 = P1 T2/T1, W = 0.
TEST(SolverClosedForm, ConstantVolumeHeatingOfGas) {
    const double R = R_universal / 0.030, cv = 1500.0 - R;
    auto r = solveText(projectText("closed", R"({ "mass": "2 kg" })", R"({ "T": "400 K", "P": "1 atm" })",
                                   R"({ "id": "v", "kind": "heat", "to": { "T": "600 K" }, "at": "constant-volume" })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    expectRel(r.steps[0].Q, 2 * cv * 200.0, 1e-9, "Q = m cv dT");
    expectRel(r.steps[0].end.P, 101325.0 * 600.0 / 400.0, 1e-9, "P2 = P1 T2/T1");
    EXPECT_EQ(r.steps[0].W, 0.0);
}

// Path independence: a closed cycle of steps returns ΔH = ΔS = 0; and
// heat-then-cool by the same duty returns to the start.
TEST(SolverLaws, CycleReturnsToStart) {
    auto r = solveText(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "300 K", "P": "1 atm" })",
                                   R"({ "id": "a", "kind": "heat", "to": { "T": "420 K" } },
                                      { "id": "b", "kind": "compress", "to": { "P": "3 atm" }, "path": "isentropic" },
                                      { "id": "c", "kind": "expand", "to": { "P": "1 atm" }, "path": "isentropic" },
                                      { "id": "d", "kind": "cool", "to": { "T": "300 K" } })"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    EXPECT_NEAR(r.totals.dH, 0.0, 1e-6);
    EXPECT_NEAR(r.totals.dS, 0.0, 1e-9);
    auto s = solveText(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "300 K", "P": "1 atm" })",
                                   R"({ "id": "a", "kind": "heat", "to": { "duty": "900 kW" } },
                                      { "id": "b", "kind": "cool", "to": { "duty": "900 kW" } })"));
    ASSERT_TRUE(s.ok()) << s.firstError()->text();
    EXPECT_NEAR(s.steps[1].end.T, 300.0, 1e-9);
    EXPECT_NEAR(s.steps[1].end.s, s.start.s, 1e-9);
}

// Randomly generated valid sequences: the laws hold on every computed step.
TEST(SolverLaws, RandomSequences) {
    std::mt19937 rng(20261201);
    std::uniform_real_distribution<double> u(0, 1);
    int computed = 0;
    for (int trial = 0; trial < 60; ++trial) {
        std::string steps;
        for (int k = 0; k < 12; ++k) {
            if (k) steps += ",";
            const std::string id = "\"s" + std::to_string(k) + "\"";
            const int kind = int(u(rng) * 7);
            char buf[256];
            switch (kind) {
                case 0: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "heat", "to": { "duty": "%.3f kW" } })", id.c_str(), 50 + 900 * u(rng)); break;
                case 1: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "cool", "to": { "duty": "%.3f kW" } })", id.c_str(), 50 + 900 * u(rng)); break;
                case 2: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "compress", "to": { "ratio": %.3f }, "path": "adiabatic", "efficiency": %.3f })", id.c_str(), 1.1 + 2 * u(rng), 0.5 + 0.5 * u(rng)); break;
                case 3: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "expand", "to": { "ratio": %.3f }, "path": "adiabatic", "efficiency": %.3f })", id.c_str(), 1.1 + 2 * u(rng), 0.5 + 0.5 * u(rng)); break;
                case 4: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "expand", "to": { "ratio": %.3f }, "path": "isentropic" })", id.c_str(), 1.1 + u(rng)); break;
                case 5: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "compress", "to": { "ratio": %.3f }, "path": "isothermal" })", id.c_str(), 1.1 + u(rng)); break;
                default: std::snprintf(buf, sizeof buf, R"({ "id": %s, "kind": "expand", "to": { "ratio": %.3f }, "path": "polytropic", "n": %.3f })", id.c_str(), 1.1 + u(rng), 1.1 + 0.3 * u(rng)); break;
            }
            steps += buf;
        }
        auto p = parse(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "500 K", "P": "5 atm" })", steps));
        auto r = solve(p);
        checkLaws(p, r);
        for (const auto& s : r.steps) computed += s.computed;
    }
    EXPECT_GT(computed, 300) << "most random steps should be computable";
}

// Every sample project computes and obeys the laws.
TEST(SolverLaws, SampleProjects) {
    for (const char* name : {"melt-tank", "nitrogen-warmup", "compressor-aftercooler", "solvent-recovery", "boiler-feed"}) {
        const std::string path = heatchain::testing::samplePath(name);
        auto p = loadProject(path);
        ASSERT_TRUE(p.ok()) << name << ": " << p.error().text();
        auto r = solve(*p);
        ASSERT_TRUE(r.ok()) << name << ": " << r.firstError()->text();
        checkLaws(*p, r);
    }
}

// Impossible specifications are errors that name the step.
TEST(SolverErrors, ImpossibleSpecificationsNameTheStep) {
    struct Case { const char* step; const char* needle; };
    const Case cases[] = {
        {R"({ "id": "bad-heat", "kind": "heat", "to": { "T": "280 K" } })", "would cool"},
        {R"({ "id": "bad-cool", "kind": "cool", "to": { "T": "320 K" } })", "would heat"},
        {R"({ "id": "bad-comp", "kind": "compress", "to": { "P": "0.5 atm" }, "path": "isentropic" })", "lower the pressure"},
        {R"({ "id": "bad-thr", "kind": "throttle", "to": { "P": "2 atm" } })", "raise the pressure"},
        {R"({ "id": "bad-src", "kind": "heat", "to": { "T": "330 K" }, "source": { "T": "320 K" } })", "cold to hot"},
        {R"({ "id": "bad-sink", "kind": "cool", "to": { "T": "290 K" }, "sink": { "T": "295 K" } })", "cold to hot"},
        {R"({ "id": "bad-melt", "kind": "melt" })", "nothing to melt"},
    };
    for (const auto& c : cases) {
        auto r = solveText(projectText("steady-flow", R"({ "massFlow": "1 kg/s" })", R"({ "T": "300 K", "P": "1 atm" })", c.step));
        const Error* e = r.firstError();
        ASSERT_NE(e, nullptr) << c.step;
        EXPECT_NE(e->text().find("step \""), std::string::npos) << e->text();
        EXPECT_NE(e->text().find(c.needle), std::string::npos) << e->text();
    }
}
