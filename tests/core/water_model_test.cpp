// The reference model of water (IAPWS-IF97 + ice Ih): phases, sources,
// range flags, phase lines, and the (P,h) / (P,s) inversions. Check values
// come from IAPWS R7-97(2012) and R14-08(2011) as cited; the rest are laws.
#include <gtest/gtest.h>

#include <cmath>

#include "heatchain/models/ice_ih.hpp"
#include "heatchain/models/if97.hpp"
#include "heatchain/models/water_model.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"

using namespace heatchain;

namespace {

std::shared_ptr<const PropertyModel> water() {
    Substance s;
    s.id = "water";
    s.name = "Water";
    s.formula = "H2O";
    s.molarMass = 0.018015268;  // kg/mol, IAPWS R6-95(2018) (from memory)
    auto m = makeWaterReferenceModel(s);
    EXPECT_TRUE(m.ok());
    return m.value();
}

}  // namespace

TEST(WaterModel, IdentifiesItself) {
    auto m = water();
    EXPECT_EQ(m->kind(), ModelKind::Reference);
    EXPECT_EQ(m->name(), "IAPWS-IF97 + ice Ih (IAPWS R10-06)");
    EXPECT_NE(m->sourceText().find("IAPWS R7-97(2012)"), std::string::npos);
    EXPECT_NE(m->sourceText().find("IAPWS R10-06(2009)"), std::string::npos);
    EXPECT_NE(m->sourceText().find("IAPWS R14-08(2011)"), std::string::npos);
    Substance other;
    other.id = "nitrogen";
    EXPECT_FALSE(makeWaterReferenceModel(other).ok());
}

// Each (T, P) lands in the IF97 region of Fig. 1 and says so; the values are
// those of the verification tables (R7-97(2012), Tables 5, 15, 33, 42).
TEST(WaterModel, StateTPNamesRegion) {
    auto m = water();
    struct Case {
        double T, P;
        const char* source;
        Phase phase;
        double h;  // J/kg, from the table cited
    };
    const Case cases[] = {
        {300, 3e6, "IAPWS-IF97 region 1", Phase::Liquid, 115.331273e3},           // Table 5
        {700, 30e6, "IAPWS-IF97 region 2", Phase::Supercritical, 2631.49474e3},    // Table 15
        {300, 3500, "IAPWS-IF97 region 2", Phase::Vapor, 2549.91145e3},            // Table 15, 0.0035 MPa
        {1500, 30e6, "IAPWS-IF97 region 5", Phase::Supercritical, 5167.23514e3},   // Table 42
    };
    for (const auto& c : cases) {
        auto s = m->stateTP(c.T, c.P);
        ASSERT_TRUE(s.ok()) << s.error().text();
        EXPECT_EQ(s->source, c.source);
        EXPECT_EQ(s->phase, c.phase);
        EXPECT_NEAR(s->h, c.h, 1e-8 * c.h);
        EXPECT_EQ(s->warnings, WarnNone);
    }
    // Table 33 state (650 K, 25.5837018 MPa, rho = 500 kg/m3) in region 3.
    auto r3 = m->stateTP(650, 25.5837018e6);
    ASSERT_TRUE(r3.ok());
    EXPECT_EQ(r3->source, "IAPWS-IF97 region 3");
    EXPECT_NEAR(1.0 / r3->v, 500.0, 500.0 * 1e-7);
    EXPECT_NEAR(r3->h, 1863.43019e3, 1863.43019e3 * 1e-7);
}

TEST(WaterModel, IceBelowMeltingLine) {
    auto m = water();
    auto s = m->stateTP(263.15, 101325);
    ASSERT_TRUE(s.ok());
    EXPECT_EQ(s->phase, Phase::Solid);
    EXPECT_EQ(s->source, "IAPWS R10-06 ice Ih");
    EXPECT_EQ(s->warnings, WarnNone);
    // Vapour below the sublimation pressure.
    auto v = m->stateTP(250, 10.0);
    ASSERT_TRUE(v.ok());
    EXPECT_EQ(v->phase, Phase::Vapor);
    EXPECT_TRUE(v->warnings & WarnBelowTemperatureRange);  // IF97 region 2 starts at 273.15 K
}

TEST(WaterModel, OutsideRangeIsFlaggedOrRefused) {
    auto m = water();
    auto hot = m->stateTP(2400, 1e6);
    ASSERT_TRUE(hot.ok());
    EXPECT_TRUE(hot->warnings & WarnAboveTemperatureRange);
    auto dense = m->stateTP(400, 150e6);
    ASSERT_TRUE(dense.ok());
    EXPECT_TRUE(dense->warnings & WarnAbovePressureRange);
    auto r5high = m->stateTP(1500, 60e6);
    ASSERT_TRUE(r5high.ok());
    EXPECT_TRUE(r5high->warnings & WarnAbovePressureRange);  // region 5 ends at 50 MPa
    EXPECT_FALSE(m->stateTP(3000, 1e6).ok());
    EXPECT_FALSE(m->stateTP(400, 300e6).ok());
    EXPECT_FALSE(m->stateTP(240, 250e6).ok());  // high-pressure ices are not modelled
}

TEST(WaterModel, MetastablePhases) {
    auto m = water();
    // Subcooled vapour at 1 MPa, 450 K (saturation is 453.04 K): eq. 18,
    // the state of R7-97(2012) Table 18.
    auto v = m->phaseState(Phase::Vapor, 450, 1e6);
    ASSERT_TRUE(v.ok());
    EXPECT_TRUE(v->warnings & WarnMetastable);
    EXPECT_EQ(v->source, "IAPWS-IF97 region 2 (metastable vapour, eq. 18)");
    EXPECT_NEAR(v->h, 2768.81115e3, 2768.81115e3 * 1e-8);  // Table 18
    // Beyond 10 MPa eq. 18 does not extend.
    EXPECT_FALSE(m->phaseState(Phase::Vapor, 500, 20e6).ok());
    // Superheated liquid and superheated / supercooled states are flagged.
    auto l = m->phaseState(Phase::Liquid, 380, 101325);
    ASSERT_TRUE(l.ok());
    EXPECT_TRUE(l->warnings & WarnMetastable);
    auto ice = m->phaseState(Phase::Solid, 274, 101325);
    ASSERT_TRUE(ice.ok());
    EXPECT_TRUE(ice->warnings & WarnMetastable);
    auto cold = m->phaseState(Phase::Liquid, 263.15, 101325);
    ASSERT_TRUE(cold.ok());
    EXPECT_TRUE(cold->warnings & WarnMetastable);
    // On the line itself neither end is metastable.
    const double Ts = if97::saturationTemperature(1e6);
    EXPECT_EQ(m->phaseState(Phase::Vapor, Ts, 1e6)->warnings, WarnNone);
    EXPECT_EQ(m->phaseState(Phase::Liquid, Ts, 1e6)->warnings, WarnNone);
}

// Phase lines: R7-97(2012) Table 36 (boiling) and R14-08(2011) check values.
TEST(WaterModel, TransitionLines) {
    auto m = water();
    EXPECT_NEAR(*m->transitionTemperature(Transition::Boiling, 0.1e6), 372.755919, 1e-6);  // Table 36
    EXPECT_NEAR(*m->transitionPressure(Transition::Boiling, 500), 2.63889776e6, 0.01);     // Table 35
    EXPECT_NEAR(*m->transitionPressure(Transition::Melting, 260) / 1e6, 138.268, 5e-4);    // R14-08
    EXPECT_NEAR(*m->transitionPressure(Transition::Sublimation, 230), 8.94735, 5e-6);      // R14-08
    EXPECT_NEAR(*m->transitionTemperature(Transition::Melting, 138.268e6), 260.0, 1e-3);
    EXPECT_FALSE(m->transitionTemperature(Transition::Boiling, 30e6).ok());   // above Pc
    EXPECT_FALSE(m->transitionTemperature(Transition::Boiling, 100.0).ok());  // below triple point
    auto e = m->transitionTemperature(Transition::Melting, 300e6);
    ASSERT_FALSE(e.ok());
    EXPECT_NE(e.error().message.find("251.165"), std::string::npos);
    EXPECT_FALSE(m->transitionPressure(Transition::Melting, 240).ok());
    EXPECT_FALSE(m->transitionTemperature(Transition::Sublimation, 1000).ok());
    auto tr = m->transitionsAt(101325);
    ASSERT_EQ(tr.count, 2);
    EXPECT_EQ(tr.entries[0].kind, Transition::Melting);
    EXPECT_EQ(tr.entries[1].kind, Transition::Boiling);
    auto tr2 = m->transitionsAt(100);
    ASSERT_EQ(tr2.count, 1);
    EXPECT_EQ(tr2.entries[0].kind, Transition::Sublimation);
}

// Laws on the phase lines: ΔS = ΔH / T for boiling, melting and sublimation
// (equal Gibbs energies), and the Clapeyron slope of IF97's own saturation
// line (eq. 30) against Δh/(T Δv) from regions 1 and 2.
TEST(WaterModel, PhaseChangeLaws) {
    auto m = water();
    for (double P : {1e3, 0.1e6, 1e6, 10e6}) {
        auto L = m->stateOnLineP(Transition::Boiling, P, 0.0);
        auto V = m->stateOnLineP(Transition::Boiling, P, 1.0);
        ASSERT_TRUE(L.ok() && V.ok());
        EXPECT_EQ(L->source, "IAPWS-IF97 region 4 (saturation)");
        // IF97's regions 1, 2 and 4 are separate fits; R7-97 states their
        // consistency on the line in terms of g to ~1e-5 relative, so the
        // Gibbs energies agree to that level.
        const double T = L->T;
        EXPECT_NEAR(V->s - L->s, (V->h - L->h) / T, 2e-4 * (V->s - L->s)) << P;
        const double dpdT = (if97::saturationPressure(T + 1e-3) - if97::saturationPressure(T - 1e-3)) / 2e-3;
        EXPECT_NEAR((V->h - L->h) / (T * (V->v - L->v)), dpdT, 2e-4 * dpdT) << P;
        auto half = m->stateOnLineP(Transition::Boiling, P, 0.5);
        EXPECT_EQ(half->phase, Phase::LiquidVapor);
        EXPECT_NEAR(half->h, 0.5 * (L->h + V->h), 1e-9 * std::fabs(V->h));
    }
    auto S = m->stateOnLineP(Transition::Melting, 101325, 0.0);
    auto Lq = m->stateOnLineP(Transition::Melting, 101325, 1.0);
    ASSERT_TRUE(S.ok() && Lq.ok());
    // Enthalpy of fusion at 1 atm from two IAPWS formulations on one
    // reference: 333.4 kJ/kg (common practice value, ± 0.3 kJ/kg).
    EXPECT_NEAR(Lq->h - S->h, 333.4e3, 0.3e3);
    EXPECT_NEAR(Lq->s - S->s, (Lq->h - S->h) / S->T, 1e-3 * (Lq->s - S->s));
}

// (P,h) and (P,s): the state found reproduces the given property to 1e-9
// relative (forward–backward agreement), in every region and across lines.
TEST(WaterModel, StatePHAndPSInvertStateTP) {
    auto m = water();
    const double cases[][2] = {{300, 3e6},   {500, 3e6},   {300, 80e6},  {700, 30e6},  {400, 1e4},
                               {650, 25.5837018e6}, {750, 78.3e6}, {1500, 30e6}, {2000, 1e6},
                               {263.15, 101325}, {200, 10}, {640, 21e6}, {660, 21e6}, {280, 50e6}};
    for (const auto& c : cases) {
        auto s = m->stateTP(c[0], c[1]);
        ASSERT_TRUE(s.ok()) << c[0] << " " << c[1];
        auto ph = m->statePH(c[1], s->h);
        ASSERT_TRUE(ph.ok()) << ph.error().text();
        EXPECT_NEAR(ph->T, c[0], 1e-7 * c[0]) << c[0] << " K " << c[1] << " Pa";
        EXPECT_NEAR(ph->h, s->h, 1e-9 * std::max(std::fabs(s->h), 1e3));
        EXPECT_NEAR(ph->s, s->s, 1e-7 * std::max(std::fabs(s->s), 1.0));
        EXPECT_EQ(ph->source, s->source);
        auto ps = m->statePS(c[1], s->s);
        ASSERT_TRUE(ps.ok()) << ps.error().text();
        EXPECT_NEAR(ps->T, c[0], 1e-7 * c[0]) << c[0] << " K " << c[1] << " Pa";
        EXPECT_NEAR(ps->s, s->s, 1e-9 * std::max(std::fabs(s->s), 1.0));
    }
}

TEST(WaterModel, StatePHFindsMixtures) {
    auto m = water();
    // Wet steam at 1 MPa, quality 0.3.
    auto wet = m->stateOnLineP(Transition::Boiling, 1e6, 0.3);
    auto back = m->statePH(1e6, wet->h);
    ASSERT_TRUE(back.ok());
    EXPECT_EQ(back->phase, Phase::LiquidVapor);
    EXPECT_NEAR(*back->quality, 0.3, 1e-12);
    EXPECT_EQ(back->source, "IAPWS-IF97 region 4 (saturation)");
    auto backS = m->statePS(1e6, wet->s);
    EXPECT_NEAR(*backS->quality, 0.3, 1e-12);
    // Half-melted ice at 1 atm.
    auto slush = m->stateOnLineP(Transition::Melting, 101325, 0.5);
    auto b2 = m->statePH(101325, slush->h);
    ASSERT_TRUE(b2.ok());
    EXPECT_EQ(b2->phase, Phase::SolidLiquid);
    EXPECT_NEAR(*b2->meltFraction, 0.5, 1e-12);
    // Frost: ice and vapour at 100 Pa.
    auto frost = m->stateOnLineP(Transition::Sublimation, 100, 0.25);
    ASSERT_TRUE(frost.ok());
    auto b3 = m->statePS(100, frost->s);
    ASSERT_TRUE(b3.ok());
    EXPECT_EQ(b3->phase, Phase::SolidVapor);
    EXPECT_NEAR(*b3->quality, 0.25, 1e-12);
    // Beyond the range: an error naming it.
    auto bad = m->statePH(1e5, 1e8);
    EXPECT_FALSE(bad.ok());
}

// Law (path independence of the inversion) inside region 3, where (P,h) and
// (P,s) take the direct (rho, T) Newton path from the SR3-03(2014) backward
// start: on both sides of the dome above 623.15 K, mixtures go to region 4
// with the quality they were made with, and single-phase states just off
// the saturation lines come back to their (T, P) state.
TEST(WaterModel, Region3InversionAroundTheDome) {
    auto m = water();
    for (double P : {17e6, 19e6, 21e6, 22e6}) {
        for (double x : {0.05, 0.5, 0.95}) {
            auto wet = m->stateOnLineP(Transition::Boiling, P, x);
            ASSERT_TRUE(wet.ok());
            auto bh = m->statePH(P, wet->h);
            auto bs = m->statePS(P, wet->s);
            ASSERT_TRUE(bh.ok() && bs.ok()) << P;
            EXPECT_EQ(bh->phase, Phase::LiquidVapor) << P << " " << x;
            EXPECT_NEAR(*bh->quality, x, 1e-9) << P;
            EXPECT_NEAR(*bs->quality, x, 1e-9) << P;
        }
        auto Ts = m->transitionTemperature(Transition::Boiling, P);
        ASSERT_TRUE(Ts.ok());
        for (double dT : {-3.0, -0.3, 0.3, 3.0, 30.0}) {
            const double T = *Ts + dT;
            if (T <= 623.15) continue;
            auto s = m->stateTP(T, P);
            ASSERT_TRUE(s.ok());
            auto bh = m->statePH(P, s->h);
            auto bs = m->statePS(P, s->s);
            ASSERT_TRUE(bh.ok() && bs.ok()) << P << " " << T;
            EXPECT_NEAR(bh->T, T, 1e-7 * T) << P << " Pa " << T << " K";
            EXPECT_NEAR(bs->T, T, 1e-7 * T) << P << " Pa " << T << " K";
            EXPECT_NEAR(bh->v, s->v, 1e-7 * s->v);
            EXPECT_EQ(bh->phase, s->phase);
            EXPECT_EQ(bh->source, s->source);
        }
    }
    // Supercritical pressures: across region 3 from 623.15 K to B23.
    for (double P : {25e6, 50e6, 100e6}) {
        for (double T : {623.5, 640.0, 647.0, 660.0, 700.0, 760.0, 800.0}) {
            auto s = m->stateTP(T, P);
            ASSERT_TRUE(s.ok());
            auto bh = m->statePH(P, s->h);
            auto bs = m->statePS(P, s->s);
            ASSERT_TRUE(bh.ok() && bs.ok());
            EXPECT_NEAR(bh->T, T, 1e-7 * T) << P << " Pa " << T << " K";
            EXPECT_NEAR(bs->T, T, 1e-7 * T) << P << " Pa " << T << " K";
            EXPECT_EQ(bh->source, s->source);
        }
    }
}

// Saturated states above 16.5292 MPa (623.15 K, where the boiling line
// enters IF97 region 3; R7-97(2012) Sec. 4) are equilibrium states: neither
// the liquid nor the vapour end is metastable. Just off the line, the
// wrong phase still is.
TEST(WaterModel, SaturatedStatesInRegion3AreNotMetastable) {
    auto m = water();
    for (double P : {17e6, 20e6, 22e6}) {
        for (double x : {0.0, 0.5, 1.0}) {
            auto s = m->stateOnLineP(Transition::Boiling, P, x);
            ASSERT_TRUE(s.ok()) << P;
            EXPECT_GT(s->T, if97::T13);
            EXPECT_FALSE(s->warnings & WarnMetastable) << P << " Pa, x = " << x;
        }
        const double Ts = if97::saturationTemperature(P);
        auto superheatedLiquid = m->phaseState(Phase::Liquid, Ts + 0.2, P);
        if (superheatedLiquid) {
            EXPECT_TRUE(superheatedLiquid->warnings & WarnMetastable) << P;
        }
        auto subcooledVapour = m->phaseState(Phase::Vapor, Ts - 0.2, P);
        if (subcooledVapour) {
            EXPECT_TRUE(subcooledVapour->warnings & WarnMetastable) << P;
        }
    }
}

// Liquid water on the melting line (one atmosphere: 273.152519 K, IAPWS
// R14-08(2011) melting curve of ice Ih) is in equilibrium with ice, not
// supercooled; 0.1 K colder it is.
TEST(WaterModel, LiquidOnTheMeltingLineIsNotMetastable) {
    auto m = water();
    auto Tm = m->transitionTemperature(Transition::Melting, 101325);
    ASSERT_TRUE(Tm.ok());
    EXPECT_NEAR(*Tm, 273.152519, 2e-6);
    auto melted = m->stateOnLineP(Transition::Melting, 101325, 1.0);
    ASSERT_TRUE(melted.ok());
    EXPECT_FALSE(melted->warnings & WarnMetastable) << describeWarnings(melted->warnings);
    auto half = m->stateOnLineP(Transition::Melting, 101325, 0.5);
    ASSERT_TRUE(half.ok());
    EXPECT_FALSE(half->warnings & WarnMetastable);
    for (double P : {611.657 * 2, 1e6, 50e6, 150e6}) {
        auto T = m->transitionTemperature(Transition::Melting, P);
        ASSERT_TRUE(T.ok());
        auto l = m->phaseState(Phase::Liquid, *T, P);
        ASSERT_TRUE(l.ok());
        EXPECT_FALSE(l->warnings & WarnMetastable) << P;
    }
    auto colder = m->phaseState(Phase::Liquid, *Tm - 0.1, 101325);
    ASSERT_TRUE(colder.ok());
    EXPECT_TRUE(colder->warnings & WarnMetastable);
}

// Ice melted at one atmosphere and the water then warmed: neither the melt
// step nor the heating after it calls any state metastable (the melted
// liquid sits on the IAPWS R14-08 melting line, in equilibrium with ice).
TEST(WaterModel, MeltThenHeatCarriesNoMetastableFlag) {
    const std::string text = R"({ "format": "heatchain-project", "version": 1, "meta": { "title": "t" },
  "system": "closed", "model": "reference", "substance": "water", "basis": { "mass": "1 kg" },
  "start": { "T": "-5 degC", "P": "1 atm" }, "steps": [
    { "id": "warm-ice", "kind": "heat", "to": { "T": "0 degC" } },
    { "id": "melt", "kind": "melt" },
    { "id": "warm", "kind": "heat", "to": { "T": "20 degC" } } ] })";
    auto p = parseProject(text, "melt.hchain");
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_EQ(r.steps.size(), 3u);
    for (const auto& s : r.steps) {
        ASSERT_TRUE(s.computed) << s.id << ": " << (s.error ? s.error->text() : "");
        EXPECT_FALSE(s.end.warnings & WarnMetastable) << s.id;
        for (const auto& w : s.warnings) EXPECT_EQ(w.find("metastable"), std::string::npos) << s.id << ": " << w;
    }
}
