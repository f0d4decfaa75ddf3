// Uncertainty propagation: first order against the GUM's analytic
// combination (JCGM 100:2008, 5.1.2, eq. 10), Monte Carlo against first order
// where first order holds and where it does not (JCGM 101:2008, 5.7 and 9),
// repeatability, and the contributions' sum.
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/uncertainty.hpp"

using namespace heatchain;

namespace {

// Invented test fluids with constant heat capacities (test data, not real
// materials): under the constant-cp model Q = m·cp·ΔT and ΔS = m·cp·ln(T2/T1)
// hold exactly for a sensible step at constant pressure.
const char* kLiquid = R"json({
  "id": "test-liquid", "name": "Test liquid", "molarMass": "0.030 kg/mol", "source": "invented test data",
  "phases": { "liquid": { "cp": "4.0 kJ/(kg K)" }, "vapor": { "cp": "1.5 kJ/(kg K)" } },
  "boiling": { "T": "450 K", "P": "1 atm", "enthalpy": "1200 kJ/kg" },
  "uncertainty": { "h": "1 %", "cp": "1 %", "source": "invented test statement" }
})json";

std::string project(const std::string& substance, const std::string& basis, const std::string& start,
                    const std::string& steps, bool models, const std::string& model = "constant-cp") {
    return std::string(R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow", "model": ")") +
           model + R"(", "substance": )" + substance + R"(, "basis": { "massFlow": ")" + basis +
           R"(" }, "surroundings": { "T": "298.15 K", "P": "1 atm" }, "start": )" + start + R"(, "steps": [)" +
           steps + "]" + (models ? R"(, "uncertainty": { "models": true })" : "") + " }";
}

Project load(const std::string& text) {
    auto p = parseProject(text);
    EXPECT_TRUE(p.ok()) << p.error().text();
    return p.ok() ? *p : Project{};
}

UncertaintyResult run(const Project& p, UncertaintyOptions o) {
    auto r = propagateUncertainty(p, o);
    EXPECT_TRUE(r.ok()) << r.error().text();
    return r.ok() ? *r : UncertaintyResult{};
}

const UncertainOutput& out(const UncertaintyResult& r, const std::string& path) {
    static const UncertainOutput none;
    const auto* o = r.find(path);
    EXPECT_NE(o, nullptr) << path;
    return o ? *o : none;
}

// m = 2 kg/s ± 0.02, cp = 4000 J/(kg K) ± 1 % (the substance's stated model
// uncertainty), T1 = 293.15 K ± 0.5 K, T2 = 353.15 K ± 0.8 K.
Project qProject() {
    return load(project(kLiquid, "2 kg/s ± 0.02 kg/s", R"({ "T": "20 degC ± 0.5 K", "P": "3 bar" })",
                        R"({ "id": "warm", "kind": "heat", "to": { "T": "80 degC ± 0.8 K" } })", true));
}

}  // namespace

TEST(Uncertainty, FirstOrderEqualsTheAnalyticGumCombination) {
    const Project p = qProject();
    const auto r = run(p, {});
    ASSERT_EQ(r.inputs.size(), 4u);
    const double m = 2, cp = 4000, dT = 60;
    // JCGM 100:2008, eq. (10): u²(Q) = Σ (∂Q/∂x_i)² u²(x_i) for Q = m cp (T2 − T1).
    const double uQ = std::sqrt(std::pow(cp * dT * 0.02, 2) + std::pow(m * dT * cp * 0.01, 2) +
                                std::pow(m * cp * 0.5, 2) + std::pow(m * cp * 0.8, 2));
    const auto& Q = out(r, "steps.warm.Q");
    EXPECT_NEAR(Q.value, m * cp * dT, 1e-9 * m * cp * dT);
    EXPECT_NEAR(Q.u, uQ, 1e-9 * uQ);
    EXPECT_NEAR(out(r, "totals.heatingDuty").u, uQ, 1e-9 * uQ);
    EXPECT_FALSE(Q.mean);
    // The end temperature carries T2's tolerance alone.
    EXPECT_NEAR(out(r, "steps.warm.end.T_K").u, 0.8, 1e-9);
}

TEST(Uncertainty, ContributionsAddUpToTheVariance) {
    const Project p = qProject();
    const auto r = run(p, {});
    const double u = out(r, "totals.heatingDuty").u;
    double sum = 0, shares = 0;
    ASSERT_EQ(r.contributions.size(), 4u);
    for (std::size_t i = 0; i < r.contributions.size(); ++i) {
        sum += r.contributions[i].variance;
        shares += r.contributions[i].share;
        if (i > 0) {
            EXPECT_GE(r.contributions[i - 1].variance, r.contributions[i].variance);
        }
    }
    EXPECT_NEAR(sum, u * u, 1e-12 * u * u);
    EXPECT_NEAR(shares, 1.0, 1e-12);
    // Largest: T2 (m cp 0.8 K = 6400 W), then m and the model (4800 W each), then T1 (4000 W).
    EXPECT_EQ(r.contributions.front().input, "steps.warm.to.T");
    EXPECT_EQ(r.contributions.back().input, "start.T");
}

namespace {
// ΔS = m cp ln(T2/T1) of a vapour heated at constant pressure.
const char* kGas = R"json({
  "id": "test-gas", "name": "Test gas", "molarMass": "0.030 kg/mol", "source": "invented test data",
  "phases": { "vapor": { "cp": "1.0 kJ/(kg K)" } }
})json";

Project dsProject(const std::string& T1) {
    return load(project(kGas, "1 kg/s", R"({ "T": ")" + T1 + R"(", "P": "1 bar" })",
                        R"({ "id": "warm", "kind": "heat", "to": { "T": "1000 K ± 5 K" } })", false));
}
}  // namespace

TEST(Uncertainty, MonteCarloAgreesWithFirstOrderForSmallTolerances) {
    const Project p = dsProject("300 K ± 1 K");
    UncertaintyOptions o;
    const auto lin = run(p, o);
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 20000;
    o.seed = 7;
    const auto mc = run(p, o);
    EXPECT_EQ(mc.samplesUsed, 20000);
    const double s = 1000 * std::log(1000.0 / 300.0);
    const auto& a = out(lin, "totals.dS");
    const auto& b = out(mc, "totals.dS");
    EXPECT_NEAR(a.value, s, 1e-9 * s);
    // By hand, first order: u² = (m cp u(T2)/T2)² + (m cp u(T1)/T1)². The
    // central difference with a step of u(T) differs from the derivative of
    // ln T by a relative (u/T)²/3 (Taylor series), here below 1e-5.
    const double u = std::hypot(1000 * 5 / 1000.0, 1000 * 1 / 300.0);
    EXPECT_NEAR(a.u, u, 2e-5 * u);
    // Sampling error of a standard deviation from N draws: about u/√(2N)
    // (JCGM 101:2008, 7.9 gives the adaptive form); allow four of them.
    EXPECT_NEAR(b.u, a.u, 4 * a.u / std::sqrt(2.0 * 20000));
    EXPECT_NEAR(*b.mean, a.value, 4 * a.u / std::sqrt(20000.0));
    // Nearly symmetric: the 95 % interval is about ±1.96 u.
    EXPECT_NEAR(*b.p975 - *b.p025, 2 * 1.96 * a.u, 0.05 * a.u * 4);
}

TEST(Uncertainty, MonteCarloShowsTheAsymmetryFirstOrderMisses) {
    // T1 = 300 K ± 60 K: ln(1/T1) is convex, so the distribution of ΔS has a
    // long upper tail and its mean lies above the value at the mean input
    // (by m cp σ²/(2 T1²) ≈ 20 J/(K s) to second order); first order gives a
    // symmetric interval around the value (JCGM 101:2008, 9.3 makes the same
    // point for a nonlinear model).
    const Project p = dsProject("300 K ± 60 K");
    UncertaintyOptions o;
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 20000;
    o.seed = 11;
    const auto mc = run(p, o);
    const auto& b = out(mc, "totals.dS");
    const double upper = *b.p975 - b.value, lower = b.value - *b.p025;
    EXPECT_GT(upper, 1.3 * lower) << "upper " << upper << " lower " << lower;
    EXPECT_GT(*b.mean - b.value, 10.0);
    EXPECT_LT(*b.mean - b.value, 30.0);
}

namespace {
Project steamProject(const std::string& T2) {
    return load(project(R"("water")", "1 kg/s ± 1 %", R"({ "T": "20 degC ± 0.5 K", "P": "10 bar" })",
                        R"({ "id": "raise", "kind": "heat", "to": { "T": ")" + T2 + R"(" } })", false, "reference"));
}
}  // namespace

TEST(Uncertainty, SteamMonteCarloAgreesWhereFirstOrderHolds) {
    // IAPWS-IF97: heating water at 10 bar from 20 °C to superheated steam.
    const Project p = steamProject("250 degC ± 2 K");
    UncertaintyOptions o;
    const auto lin = run(p, o);
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 4000;
    o.seed = 3;
    const auto mc = run(p, o);
    const auto& a = out(lin, "steps.raise.Q");
    const auto& b = out(mc, "steps.raise.Q");
    EXPECT_NEAR(b.u, a.u, 4 * a.u / std::sqrt(2.0 * 4000));
    EXPECT_NEAR(*b.mean, a.value, 4 * a.u / std::sqrt(4000.0));
}

TEST(Uncertainty, SteamNearSaturationIsAsymmetric) {
    // 183 °C ± 3 K at 10 bar: saturation is at 179.88 °C (IAPWS-IF97 eq. 31,
    // e.g. the NIST Chemistry WebBook's water table at 1 MPa: 453.03 K). About
    // one draw in seven ends below it, as liquid, without the latent heat
    // (about 2 MJ/kg): a long lower tail that first order cannot have.
    const Project p = steamProject("183 degC ± 3 K");
    UncertaintyOptions o;
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 4000;
    o.seed = 5;
    const auto mc = run(p, o);
    const auto& b = out(mc, "steps.raise.Q");
    const double upper = *b.p975 - b.value, lower = b.value - *b.p025;
    EXPECT_GT(lower, 10 * upper) << "upper " << upper << " lower " << lower;
    EXPECT_GT(lower, 1.0e6);  // a good part of the latent heat, W for 1 kg/s
}

TEST(Uncertainty, SameSeedSameResultOnAnyNumberOfThreads) {
    const Project p = dsProject("300 K ± 5 K");
    UncertaintyOptions o;
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 500;
    o.seed = 42;
    o.threads = 1;
    const auto a = run(p, o);
    o.threads = 2;
    const auto b = run(p, o);
    o.threads = 5;
    const auto c = run(p, o);
    ASSERT_EQ(a.outputs.size(), b.outputs.size());
    for (std::size_t j = 0; j < a.outputs.size(); ++j) {
        EXPECT_EQ(*a.outputs[j].mean, *b.outputs[j].mean) << a.outputs[j].path;
        EXPECT_EQ(a.outputs[j].u, b.outputs[j].u) << a.outputs[j].path;
        EXPECT_EQ(*a.outputs[j].p025, *c.outputs[j].p025) << a.outputs[j].path;
        EXPECT_EQ(*a.outputs[j].p975, *c.outputs[j].p975) << a.outputs[j].path;
    }
    o.seed = 43;
    const auto d = run(p, o);
    EXPECT_NE(*a.find("totals.dS")->mean, *d.find("totals.dS")->mean);
}

TEST(Uncertainty, RectangularTolerancesUseTheirStandardUncertainty) {
    const Project p = dsProject("300 K ± 3 K rect");
    const auto r = run(p, {});
    ASSERT_EQ(r.inputs.size(), 2u);
    EXPECT_EQ(r.inputs[0].distribution, Distribution::Rectangular);
    EXPECT_NEAR(r.inputs[0].u, 3 / std::sqrt(3.0), 1e-15);  // JCGM 100:2008, 4.3.7
    // Uniform draws stay inside ±a: the Monte Carlo interval of T1's part
    // alone cannot exceed it.
}

TEST(Uncertainty, ErrorsAreValues) {
    auto none = propagateUncertainty(load(project(kGas, "1 kg/s", R"({ "T": "300 K", "P": "1 bar" })",
                                                  R"({ "id": "warm", "kind": "heat", "to": { "T": "400 K" } })",
                                                  false)));
    ASSERT_FALSE(none.ok());
    EXPECT_NE(none.error().message.find("no input carries a tolerance"), std::string::npos);

    UncertaintyOptions o;
    o.method = UncertaintyMethod::MonteCarlo;
    o.samples = 1;
    auto few = propagateUncertainty(dsProject("300 K ± 1 K"), o);
    ASSERT_FALSE(few.ok());
    EXPECT_EQ(few.error().where, "--samples");

    o = {};
    o.contributionsOf = "totals.nothing";
    auto unknown = propagateUncertainty(dsProject("300 K ± 1 K"), o);
    ASSERT_FALSE(unknown.ok());
    EXPECT_NE(unknown.error().message.find("totals.heatingDuty"), std::string::npos);

    std::string text = project(kGas, "1 kg/s", R"({ "T": "300 K ± 1 K", "P": "1 bar" })",
                               R"({ "id": "warm", "kind": "heat", "to": { "T": "400 K" } })", false);
    text.insert(text.rfind('}'), R"(, "uncertainty": { "models": "yes" })");
    auto bad = propagateUncertainty(load(text));
    ASSERT_FALSE(bad.ok());
    EXPECT_EQ(bad.error().where, "uncertainty.models");
}

TEST(Uncertainty, ModelUncertaintiesHaveSources) {
    for (const char* model : {"constant-cp", "temperature-dependent-cp", "real-fluid", "reference"}) {
        auto p = parseProject(project(R"("water")", "1 kg/s", R"({ "T": "20 degC", "P": "1 bar" })",
                                      R"({ "id": "w", "kind": "heat", "to": { "T": "60 degC" } })", true, model));
        if (!p) continue;  // not every model has water's data
        auto m = statedModelUncertainty(*p);
        ASSERT_TRUE(m.ok()) << m.error().text();
        EXPECT_GT(m->h, 0) << model;
        EXPECT_GT(m->cp, 0) << model;
        EXPECT_FALSE(m->source.empty()) << model;
    }
}

// The charts' bands: the cumulative duty at a step's end carries the
// correlation of the steps before it (a start-temperature error that raises
// the first step's duty lowers nothing after a fixed target: u(Q1 + Q2) =
// m·cp·u(T0), not the root-sum-square of the steps' own u), and the specific
// entropy at the start and at each end follows s = s_ref + cp·ln(T/T_ref)
// (constant cp, constant pressure): u(s) = cp·u(T)/T (JCGM 100:2008, eq. 10).
TEST(Uncertainty, BandOutputsCarryTheCorrelationBetweenSteps) {
    const Project p = load(project(kLiquid, "2 kg/s", R"({ "T": "20 degC ± 0.5 K", "P": "3 bar" })",
                                   R"({ "id": "warm", "kind": "heat", "to": { "T": "50 degC" } },
                                      { "id": "hot", "kind": "heat", "to": { "T": "80 degC ± 0.8 K" } })",
                                   false));
    const auto r = run(p, {});
    const double m = 2, cp = 4000;
    EXPECT_NEAR(out(r, "steps.warm.Qcumulative").u, m * cp * 0.5, 1e-9 * m * cp);
    // Q1 + Q2 = m·cp·(T2 − T0): both tolerances, and the intermediate
    // target's none.
    const double uCum = m * cp * std::hypot(0.5, 0.8);
    EXPECT_NEAR(out(r, "steps.hot.Qcumulative").u, uCum, 1e-9 * uCum);
    EXPECT_NEAR(out(r, "steps.hot.Qcumulative").value, m * cp * 60, 1e-9 * m * cp * 60);
    // The sensitivity is the central difference at ± u (uncertainty.hpp), so
    // the expected u is cp·(ln(T + u) − ln(T − u))/2, which is cp·u/T to
    // within u²/(3T²) ≈ 2e-6.
    auto centred = [cp](double T, double u) { return cp * (std::log(T + u) - std::log(T - u)) / 2; };
    EXPECT_NEAR(out(r, "start.s_J_per_kgK").u, centred(293.15, 0.5), 1e-9);
    EXPECT_NEAR(out(r, "start.s_J_per_kgK").u, cp * 0.5 / 293.15, 2e-6 * cp * 0.5 / 293.15);
    EXPECT_NEAR(out(r, "steps.warm.end.s_J_per_kgK").u, 0.0, 1e-9);
    EXPECT_NEAR(out(r, "steps.hot.end.s_J_per_kgK").u, centred(353.15, 0.8), 1e-9);
}

// Heat transfer results carry their uncertainty too. A batch of 1000 kg
// (cp 4.0 kJ/(kg K), test data) heated 300 → 340 K by a source at 380 K
// through U·A = 400 W/(m2 K) ± 1 % × 5 m2 takes t = (m c_p / UA)
// ln((Ts − T1)/(Ts − T2)) (Kern, Process Heat Transfer, 1950, ch. 18), so
// ∂t/∂U = −t/U and the model's 1 % in c_p moves t by 1 % as well: u(t) =
// t·√(0.01² + 0.01²) (JCGM 100:2008, eq. 10). The hold after it lasts
// 30 min ± 1 min as typed: the model does not move a duration that is an
// input, so the cycle time has u² = u²(t) + (60 s)².
TEST(Uncertainty, BatchTimeAndCycleTime) {
    const std::string text = std::string(R"({ "format": "heatchain-project", "version": 1, "system": "closed",
        "model": "constant-cp", "substance": )") + kLiquid + R"(, "basis": { "mass": "1000 kg" },
        "surroundings": { "T": "298.15 K", "P": "1 atm" }, "start": { "T": "300 K", "P": "1 atm" },
        "steps": [ { "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                     "transfer": { "U": "400 W/(m2 K) ± 1 %", "area": "5 m2" } },
                   { "id": "keep", "kind": "hold", "duration": "30 min ± 1 min" } ],
        "uncertainty": { "models": true } })";
    const auto r = run(load(text), {});
    const double t = 1000.0 * 4000.0 / 2000.0 * std::log(80.0 / 40.0);
    const double ut = t * std::sqrt(2.0) * 0.01;
    const auto& d = out(r, "steps.h.duration_s");
    EXPECT_NEAR(d.value, t, 1e-6 * t);
    // Central differences over ± u of 1/U differ from the derivative by u²: 1e-4.
    EXPECT_NEAR(d.u, ut, 2e-4 * ut);
    const auto& hold = out(r, "steps.keep.duration_s");
    EXPECT_NEAR(hold.value, 1800.0, 1e-9);
    EXPECT_NEAR(hold.u, 60.0, 1e-6);
    const auto& cycle = out(r, "totals.cycleTime_s");
    EXPECT_NEAR(cycle.value, t + 1800.0, 1e-6 * t);
    const double uc = std::sqrt(ut * ut + 60.0 * 60.0);
    EXPECT_NEAR(cycle.u, uc, 2e-4 * uc);
}

// A steady flow of 2 kg/s heated 300 → 340 K by a source at 380 K needs
// A = Q / (U · LMTD), LMTD = (80 − 40) / ln 2 (Incropera & DeWitt,
// Fundamentals of Heat and Mass Transfer, 6th ed., eq. 11.15): with U ± 1 %
// and the model's 1 % in Q, u(A) = A·√(0.01² + 0.01²).
TEST(Uncertainty, ExchangerArea) {
    const auto r = run(load(project(kLiquid, "2 kg/s", R"({ "T": "300 K", "P": "1 atm" })",
                                    R"({ "id": "h", "kind": "heat", "to": { "T": "340 K" }, "source": { "T": "380 K" },
                                         "transfer": { "U": "400 W/(m2 K) ± 1 %" } })",
                                    true)),
                       {});
    const double Q = 2.0 * 4000.0 * 40.0, A = Q / (400.0 * 40.0 / std::log(2.0));
    const double uA = A * std::sqrt(2.0) * 0.01;
    const auto& a = out(r, "steps.h.area_m2");
    EXPECT_NEAR(a.value, A, 1e-9 * A);
    EXPECT_NEAR(a.u, uA, 2e-4 * uA);
    EXPECT_NEAR(out(r, "totals.area_m2").u, uA, 2e-4 * uA);
}
