// Laws the Peng–Robinson real-fluid model must obey whatever its data:
// equal fugacities at saturation, Clapeyron, reversibility of isentropic
// paths and phase changes, throttling at constant h, vanishing departures at
// low pressure, the cubic's triple root at the critical point.
#include "heatchain/models/peng_robinson.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

#include "heatchain/constants.hpp"
#include "support/ammonia_substance.hpp"

namespace heatchain {
namespace {

using testing::ammoniaForTests;

std::shared_ptr<const PropertyModel> model(const Substance& s) {
    auto m = makePengRobinsonModel(s);
    EXPECT_TRUE(m.ok()) << (m.ok() ? "" : m.error().text());
    return m.ok() ? *m : nullptr;
}

double gibbs(const State& s) { return s.h - s.T * s.s; }

TEST(PengRobinson, NamesItself) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    EXPECT_EQ(m->kind(), ModelKind::RealFluid);
    EXPECT_EQ(m->name(), "Peng–Robinson (1978)");
    EXPECT_NE(m->sourceText().find("Peng"), std::string::npos);
}

TEST(PengRobinson, MissingDataIsNamed) {
    Substance s = ammoniaForTests();
    s.id = "ethanol";
    s.critical.reset();
    auto m = makePengRobinsonModel(s);
    ASSERT_FALSE(m.ok());
    EXPECT_EQ(m.error().message, "ethanol has no critical point in the library; the real-fluid model needs it");
    Substance t = ammoniaForTests();
    t.cpVapor.reset();
    auto m2 = makePengRobinsonModel(t);
    ASSERT_FALSE(m2.ok());
    EXPECT_NE(m2.error().message.find("ideal-gas heat capacity"), std::string::npos);
}

// Peng & Robinson (1976), Ind. Eng. Chem. Fundam. 15, p. 60: at the critical
// point the cubic has a triple root, Zc = 0.307 (0.3074 to four places).
TEST(PengRobinson, CriticalPointIsATripleRootAtZ03074) {
    Substance s = ammoniaForTests();
    auto m = model(s);
    ASSERT_TRUE(m);
    const double Tc = s.critical->T, Pc = s.critical->P;
    for (Phase ph : {Phase::Liquid, Phase::Vapor}) {
        auto st = m->phaseState(ph, Tc, Pc);
        ASSERT_TRUE(st.ok());
        const double Z = Pc * st->v * s.molarMass / (kGasConstant * Tc);
        EXPECT_NEAR(Z, 0.3074, 1e-4) << phaseId(ph);
        EXPECT_TRUE(st->warnings & WarnNearCritical);
    }
    auto cp = m->criticalPoint();
    ASSERT_TRUE(cp);
    EXPECT_EQ(cp->first, Tc);
}

TEST(PengRobinson, FugacitiesAreEqualAtSaturation) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    const double Rs = kGasConstant / 17.03026e-3;
    for (double T : {200.0, 240.0, 300.0, 360.0, 400.0, 405.0}) {
        auto P = m->transitionPressure(Transition::Boiling, T);
        ASSERT_TRUE(P.ok()) << P.error().text();
        auto l = m->phaseState(Phase::Liquid, T, *P);
        auto v = m->phaseState(Phase::Vapor, T, *P);
        ASSERT_TRUE(l.ok() && v.ok());
        // ln(f_L/f_V) = (g_L - g_V)/(R T) for a pure fluid.
        EXPECT_NEAR((gibbs(*l) - gibbs(*v)) / (Rs * T), 0.0, 1e-9) << T;
        EXPECT_LT(l->v, v->v) << T;
        // And the inverse call lands on the same temperature.
        auto Tb = m->transitionTemperature(Transition::Boiling, *P);
        ASSERT_TRUE(Tb.ok());
        EXPECT_NEAR(*Tb, T, 1e-7 * T);
    }
}

TEST(PengRobinson, ClapeyronHoldsOnTheModelsOwnLine) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    for (double T : {210.0, 263.15, 313.15, 380.0}) {
        const double dT = 1e-3;
        auto P1 = m->transitionPressure(Transition::Boiling, T - dT);
        auto P2 = m->transitionPressure(Transition::Boiling, T + dT);
        auto P = m->transitionPressure(Transition::Boiling, T);
        ASSERT_TRUE(P1.ok() && P2.ok() && P.ok());
        auto l = m->phaseState(Phase::Liquid, T, *P);
        auto v = m->phaseState(Phase::Vapor, T, *P);
        const double numeric = (*P2 - *P1) / (2 * dT);
        const double clapeyron = (v->h - l->h) / (T * (v->v - l->v));
        EXPECT_NEAR(numeric / clapeyron, 1.0, 1e-6) << T;
        // Δs = Δh/T on the line (a reversible phase change has S_gen = 0).
        EXPECT_NEAR((v->s - l->s) * T / (v->h - l->h), 1.0, 1e-9) << T;
    }
}

TEST(PengRobinson, DeparturesVanishAtLowPressure) {
    Substance s = ammoniaForTests();
    auto m = model(s);
    ASSERT_TRUE(m);
    const double Rs = kGasConstant / s.molarMass;
    for (double T : {250.0, 300.0, 500.0}) {
        auto a = m->phaseState(Phase::Vapor, T, 1.0);
        auto b = m->phaseState(Phase::Vapor, T, 1e-2);
        ASSERT_TRUE(a.ok() && b.ok());
        // Ideal gas: h independent of P, s - s' = -R ln(P/P'), Pv = R T.
        EXPECT_NEAR(a->h - b->h, 0.0, 1e-3 * Rs * T * 1e-2);
        EXPECT_NEAR(a->s - b->s, -Rs * std::log(100.0), 1e-6 * Rs);
        EXPECT_NEAR(a->P * a->v / (Rs * T), 1.0, 1e-5);
        // cp tends to the ideal-gas cp, cv to cp - R.
        EXPECT_NEAR(a->cp, s.cpVapor->cp(T), 1e-4 * a->cp);
        EXPECT_NEAR(a->cp - a->cv, Rs, 1e-4 * Rs);
    }
}

// cp reported by the model is the slope of its own h(T) at constant P.
TEST(PengRobinson, HeatCapacityMatchesEnthalpySlope) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    struct Pt { Phase ph; double T, P; };
    for (Pt p : {Pt{Phase::Liquid, 250.0, 1e6}, Pt{Phase::Vapor, 350.0, 1e6}, Pt{Phase::Supercritical, 450.0, 15e6}}) {
        const double dT = 1e-3;
        auto a = m->phaseState(p.ph, p.T - dT, p.P);
        auto b = m->phaseState(p.ph, p.T + dT, p.P);
        auto c = m->phaseState(p.ph, p.T, p.P);
        ASSERT_TRUE(a.ok() && b.ok() && c.ok());
        EXPECT_NEAR((b->h - a->h) / (2 * dT), c->cp, 1e-5 * c->cp);
        EXPECT_NEAR((b->s - a->s) / (2 * dT), c->cp / p.T, 1e-5 * c->cp / p.T);
        EXPECT_GT(c->w, 0.0);
    }
}

TEST(PengRobinson, IsentropicCompressionThenExpansionReturns) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    auto P1 = m->transitionPressure(Transition::Boiling, 263.15);
    ASSERT_TRUE(P1.ok());
    auto start = m->stateOnLineP(Transition::Boiling, *P1, 1.0);
    ASSERT_TRUE(start.ok()) << start.error().text();
    auto up = m->statePS(5 * *P1, start->s);
    ASSERT_TRUE(up.ok()) << up.error().text();
    EXPECT_EQ(up->phase, Phase::Vapor);
    EXPECT_GT(up->T, 263.15);
    EXPECT_NEAR(up->s, start->s, 1e-9 * std::abs(start->s) + 1e-9);
    auto back = m->statePS(*P1, up->s);
    ASSERT_TRUE(back.ok());
    EXPECT_NEAR(back->h, start->h, 1e-6 * std::abs(start->h) + 1e-3);
    EXPECT_NEAR(back->T, 263.15, 1e-6);
    EXPECT_NEAR(*back->quality, 1.0, 1e-6);
}

TEST(PengRobinson, ThrottlingConservesEnthalpyAndGeneratesEntropy) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    auto Pc = m->transitionPressure(Transition::Boiling, 313.15);
    auto Pe = m->transitionPressure(Transition::Boiling, 263.15);
    ASSERT_TRUE(Pc.ok() && Pe.ok());
    auto liq = m->stateOnLineP(Transition::Boiling, *Pc, 0.0);
    ASSERT_TRUE(liq.ok());
    auto out = m->statePH(*Pe, liq->h);
    ASSERT_TRUE(out.ok()) << out.error().text();
    EXPECT_EQ(out->phase, Phase::LiquidVapor);
    EXPECT_NEAR(out->h, liq->h, 1e-6 * std::abs(liq->h) + 1e-6);
    EXPECT_NEAR(out->T, 263.15, 1e-6);
    EXPECT_GT(*out->quality, 0.0);
    EXPECT_LT(*out->quality, 1.0);
    EXPECT_GT(out->s - liq->s, 0.0);  // adiabatic, irreversible: S_gen = Δs > 0
}

TEST(PengRobinson, InverseCallsReturnTheForwardState) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    struct Pt { double T, P; };
    for (Pt p : {Pt{230.0, 1e6}, Pt{300.0, 2e5}, Pt{450.0, 20e6}, Pt{150.0, 101325.0}, Pt{180.0, 100.0}}) {
        auto f = m->stateTP(p.T, p.P);
        ASSERT_TRUE(f.ok()) << f.error().text();
        for (Property w : {Property::Enthalpy, Property::Entropy, Property::InternalEnergy, Property::Volume}) {
            const double val = w == Property::Enthalpy ? f->h : w == Property::Entropy ? f->s
                             : w == Property::InternalEnergy ? f->u : f->v;
            auto b = m->stateP(p.P, w, val);
            ASSERT_TRUE(b.ok()) << b.error().text();
            EXPECT_NEAR(b->T, p.T, 1e-6 * p.T) << p.T << " " << p.P << " " << int(w);
            EXPECT_EQ(b->phase, f->phase);
        }
    }
}

TEST(PengRobinson, PhasesAreNamed) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    EXPECT_EQ(*m->stablePhase(450.0, 20e6), Phase::Supercritical);  // T > Tc, P > Pc
    EXPECT_EQ(*m->stablePhase(450.0, 5e6), Phase::Vapor);
    EXPECT_EQ(*m->stablePhase(300.0, 20e6), Phase::Liquid);
    EXPECT_EQ(*m->stablePhase(300.0, 1e5), Phase::Vapor);
    EXPECT_EQ(*m->stablePhase(230.0, 1e5), Phase::Liquid);
    EXPECT_EQ(*m->stablePhase(150.0, 1e5), Phase::Solid);
    EXPECT_EQ(*m->stablePhase(190.0, 100.0), Phase::Vapor);
    // Asking for a liquid where the cubic has only a vapour root: the
    // fallback is taken and flagged.
    auto st = m->phaseState(Phase::Liquid, 400.0, 1e4);
    ASSERT_TRUE(st.ok());
    EXPECT_TRUE(st->warnings & WarnCubicFallback);
    EXPECT_EQ(st->phase, Phase::Vapor);
    // A superheated liquid is still a root, but metastable.
    auto meta = m->phaseState(Phase::Liquid, 250.0, 1e4);
    ASSERT_TRUE(meta.ok());
    EXPECT_TRUE(meta->warnings & WarnMetastable);
}

TEST(PengRobinson, NoBoilingAboveTheCriticalPoint) {
    auto m = model(ammoniaForTests());
    ASSERT_TRUE(m);
    auto P = m->transitionPressure(Transition::Boiling, 420.0);
    ASSERT_FALSE(P.ok());
    EXPECT_NE(P.error().message.find("Tc = 405.4"), std::string::npos) << P.error().message;
    auto T = m->transitionTemperature(Transition::Boiling, 12e6);
    ASSERT_FALSE(T.ok());
    EXPECT_NE(T.error().message.find("critical"), std::string::npos);
    auto below = m->transitionPressure(Transition::Boiling, 150.0);
    EXPECT_FALSE(below.ok());
}

// Melting and sublimation are reversible on the model's own lines: Δs = Δh/T,
// and the Gibbs energies of the two ends agree.
TEST(PengRobinson, SolidLinesAreReversible) {
    Substance sub = ammoniaForTests();
    auto m = model(sub);
    ASSERT_TRUE(m);
    const double Tm = sub.melting->T;
    // The reference state: liquid at the melting anchor has h = 0, s = 0.
    auto ref = m->phaseState(Phase::Liquid, Tm, sub.melting->P);
    ASSERT_TRUE(ref.ok());
    EXPECT_NEAR(ref->h, 0.0, 1e-6);
    EXPECT_NEAR(ref->s, 0.0, 1e-9);
    for (double P : {101325.0, 1e6, 20e6}) {
        auto a = m->stateOnLineP(Transition::Melting, P, 0.0);
        auto b = m->stateOnLineP(Transition::Melting, P, 1.0);
        ASSERT_TRUE(a.ok() && b.ok()) << (a.ok() ? b.error().text() : a.error().text());
        EXPECT_EQ(a->T, Tm);
        EXPECT_NEAR((b->s - a->s) * Tm / (b->h - a->h), 1.0, 1e-9) << P;
        if (P == 101325.0) {
            EXPECT_NEAR(b->h - a->h, sub.melting->enthalpy, 1e-6 * sub.melting->enthalpy);
        }
        EXPECT_EQ(bool(a->warnings & WarnMeltingLineApprox), P > 10e6) << P;
    }
    auto tp = m->triplePoint();
    ASSERT_TRUE(tp);
    for (double T : {150.0, 180.0, 195.0}) {
        auto P = m->transitionPressure(Transition::Sublimation, T);
        ASSERT_TRUE(P.ok()) << P.error().text();
        EXPECT_LT(*P, tp->second);
        auto s = m->phaseState(Phase::Solid, T, *P);
        auto v = m->phaseState(Phase::Vapor, T, *P);
        ASSERT_TRUE(s.ok() && v.ok());
        EXPECT_NEAR((v->s - s->s) * T / (v->h - s->h), 1.0, 1e-9) << T;
        auto Tback = m->transitionTemperature(Transition::Sublimation, *P);
        ASSERT_TRUE(Tback.ok());
        EXPECT_NEAR(*Tback, T, 1e-7 * T);
        // Clapeyron on the sublimation line.
        auto P2 = m->transitionPressure(Transition::Sublimation, T + 1e-3);
        auto P1 = m->transitionPressure(Transition::Sublimation, T - 1e-3);
        EXPECT_NEAR((*P2 - *P1) / 2e-3 / ((v->h - s->h) / (T * (v->v - s->v))), 1.0, 1e-5) << T;
    }
    // Sublimation meets boiling at the model's triple point.
    auto Psub = m->transitionPressure(Transition::Sublimation, tp->first);
    auto Psat = m->transitionPressure(Transition::Boiling, tp->first);
    ASSERT_TRUE(Psub.ok() && Psat.ok());
    EXPECT_NEAR(*Psub / *Psat, 1.0, 1e-9);
}

// Péneloux et al. (1982): a constant volume shift moves v by -c and h by -P c,
// and leaves entropy and the saturation line unchanged.
TEST(PengRobinson, VolumeShiftIsThermodynamicallyConsistent) {
    Substance plain = ammoniaForTests(false);
    Substance shifted = plain;
    const double c = 3e-6;  // m3/mol; illustrative size, the law holds for any c
    shifted.pengRobinson = PengRobinsonData{};
    shifted.pengRobinson->volumeShift = c;
    auto a = model(plain);
    auto b = model(shifted);
    ASSERT_TRUE(a && b);
    const double M = plain.molarMass;
    auto Pa = a->transitionPressure(Transition::Boiling, 300.0);
    auto Pb = b->transitionPressure(Transition::Boiling, 300.0);
    ASSERT_TRUE(Pa.ok() && Pb.ok());
    EXPECT_NEAR(*Pa / *Pb, 1.0, 1e-10);
    // Reference states differ by a constant; compare differences.
    auto a1 = a->phaseState(Phase::Liquid, 300.0, 5e6), a2 = a->phaseState(Phase::Liquid, 300.0, 1e6);
    auto b1 = b->phaseState(Phase::Liquid, 300.0, 5e6), b2 = b->phaseState(Phase::Liquid, 300.0, 1e6);
    EXPECT_NEAR(b1->v, a1->v - c / M, 1e-12);
    EXPECT_NEAR((b1->h - b2->h) - (a1->h - a2->h), -(5e6 - 1e6) * c / M, 1e-6);
    EXPECT_NEAR((b1->s - b2->s) - (a1->s - a2->s), 0.0, 1e-9);
}

TEST(PengRobinson, TwuAlphaKeepsTheLaws) {
    Substance s = ammoniaForTests(false);
    s.pengRobinson = PengRobinsonData{};
    // Illustrative L, M, N of the size Twu et al. (1991) fit for polar fluids.
    s.pengRobinson->twuL = 0.3;
    s.pengRobinson->twuM = 0.87;
    s.pengRobinson->twuN = 2.0;
    auto m = model(s);
    ASSERT_TRUE(m);
    const double T = 300.0;
    auto P = m->transitionPressure(Transition::Boiling, T);
    ASSERT_TRUE(P.ok());
    auto l = m->phaseState(Phase::Liquid, T, *P);
    auto v = m->phaseState(Phase::Vapor, T, *P);
    EXPECT_NEAR((v->s - l->s) * T / (v->h - l->h), 1.0, 1e-9);
    auto a = m->phaseState(Phase::Vapor, T - 1e-3, 1e5), b = m->phaseState(Phase::Vapor, T + 1e-3, 1e5),
         c = m->phaseState(Phase::Vapor, T, 1e5);
    EXPECT_NEAR((b->h - a->h) / 2e-3, c->cp, 1e-5 * c->cp);
}

// Pitzer's definition: ω = -log10(Psat/Pc) - 1 at Tr = 0.7. PR's kappa is
// fitted to reproduce it, so the model's own Psat should give back ω.
TEST(PengRobinson, AcentricFactorIsReproducedForAmmonia) {
    Substance s = ammoniaForTests();
    auto m = model(s);
    ASSERT_TRUE(m);
    auto P = m->transitionPressure(Transition::Boiling, 0.7 * s.critical->T);
    ASSERT_TRUE(P.ok());
    const double omega = -std::log10(*P / s.critical->P) - 1.0;
    EXPECT_NEAR(omega, s.critical->acentricFactor, 0.01);
}

// Every library substance with critical constants: ω at Tr = 0.7 and the
// normal boiling point. PR is a nonpolar-fluid model; Tb within 2 % is the
// expectation (Poling et al., 5th ed., ch. 4, on cubic-EOS vapour pressures,
// from memory); the list is printed for review.
TEST(PengRobinson, LibrarySubstancesReproduceOmegaAndNormalBoilingPoint) {
    int checked = 0;
    for (const Substance& s : SubstanceLibrary::builtin().all()) {
        if (!s.critical || !s.cpVapor || !(s.molarMass > 0)) continue;
        auto m = makePengRobinsonModel(s);
        ASSERT_TRUE(m.ok()) << s.id << ": " << m.error().text();
        const double Tr7 = 0.7 * s.critical->T;
        auto tp = (*m)->triplePoint();
        if (!tp || Tr7 > tp->first) {
            auto P = (*m)->transitionPressure(Transition::Boiling, Tr7);
            ASSERT_TRUE(P.ok()) << s.id << ": " << P.error().text();
            const double omega = -std::log10(*P / s.critical->P) - 1.0;
            std::printf("%-20s omega library %.4f  PR %.4f\n", s.id.c_str(), s.critical->acentricFactor, omega);
            // Quantum fluids (helium, hydrogen) sit outside PR's corresponding-
            // states basis: looser bound, reported (helium misses by 0.024).
            const bool quantum = s.id == "helium" || s.id == "hydrogen";
            EXPECT_NEAR(omega, s.critical->acentricFactor, quantum ? 0.05 : 0.02) << s.id;
        }
        if (s.boiling && std::abs(s.boiling->P - kStandardAtmosphere) < 1.0 && s.boiling->T < s.critical->T) {
            auto Tb = (*m)->transitionTemperature(Transition::Boiling, kStandardAtmosphere);
            if (!Tb.ok()) {
                ADD_FAILURE() << s.id << ": " << Tb.error().text();
                continue;
            }
            std::printf("%-20s Tb library %.2f K  PR %.2f K (%+.2f %%)\n", s.id.c_str(), s.boiling->T, *Tb,
                        100.0 * (*Tb / s.boiling->T - 1.0));
            EXPECT_NEAR(*Tb / s.boiling->T, 1.0, 0.02) << s.id;
        }
        ++checked;
    }
    if (checked == 0) GTEST_SKIP() << "the substance library has no substance with critical constants yet";
}

}  // namespace
}  // namespace heatchain
