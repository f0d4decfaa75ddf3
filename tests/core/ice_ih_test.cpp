// Ice Ih (IAPWS R10-06(2009)) and the melting and sublimation curves (IAPWS
// R14-08(2011)) against the values printed in those releases.
#include <gtest/gtest.h>

#include <cmath>

#include "heatchain/models/ice_ih.hpp"
#include "heatchain/models/if97.hpp"

namespace ice = heatchain::ice;

namespace {
// R10-06 prints 12 significant figures for results of double-precision code;
// 1e-9 relative is far looser than that and far tighter than any error in a
// coefficient could hide behind.
void expectRel(double actual, double expected, const char* what, double rel = 1e-9) {
    EXPECT_NEAR(actual, expected, std::fabs(expected) * rel) << what;
}
}  // namespace

// IAPWS R10-06(2009), Table 6: the Gibbs function, its derivatives and the
// derived properties at three states. Passing it verifies Table 2's
// coefficients as typed in ice_ih.cpp.
TEST(IceIh, R10Table6) {
    struct Row {
        double T, P;
        double g, gP, gT, gPP, gTP, gTT, h, f, u, s, cp, rho;
    };
    const Row rows[] = {
        {273.16, 611.657, 0.611784135, 0.109085812737e-2, 0.122069433940e4, -0.128495941571e-12,
         0.174387964700e-6, -0.767602985875e1, -0.333444253966e6, -0.55446875e-1, -0.333444921197e6,
         -0.122069433940e4, 0.209678431622e4, 0.916709492200e3},
        {273.152519, 101325, 0.10134274069e3, 0.109084388214e-2, 0.122076932550e4, -0.128485364928e-12,
         0.174362219972e-6, -0.767598233365e1, -0.333354873637e6, -0.918701567e1, -0.333465403393e6,
         -0.122076932550e4, 0.209671391024e4, 0.916721463419e3},
        {100, 100e6, -0.222296513088e6, 0.106193389260e-2, 0.261195122589e4, -0.941807981761e-13,
         0.274505162488e-7, -0.866333195517e1, -0.483491635676e6, -0.328489902347e6, -0.589685024936e6,
         -0.261195122589e4, 0.866333195517e3, 0.941678203297e3},
    };
    for (const auto& r : rows) {
        SCOPED_TRACE(r.T);
        const auto G = ice::gibbs(r.T, r.P);
        // g at the triple point is printed to 9 digits only (0.611784135 J/kg).
        expectRel(G.g, r.g, "g", 1e-8);
        expectRel(G.gP, r.gP, "g_p");
        // R10-06 tabulates (dg/dT)_p with its own sign; s = -g_T.
        expectRel(G.gT, r.gT, "g_T");
        expectRel(G.gPP, r.gPP, "g_pp");
        expectRel(G.gTP, r.gTP, "g_Tp");
        expectRel(G.gTT, r.gTT, "g_TT");
        const auto p = ice::props(r.T, r.P);
        expectRel(p.h, r.h, "h");
        // f = g - p v; at the triple point it is printed to 8 digits.
        expectRel(G.g - r.P * G.gP, r.f, "f", 1e-7);
        expectRel(p.u, r.u, "u");
        expectRel(p.s, r.s, "s");
        expectRel(p.cp, r.cp, "cp");
        expectRel(1.0 / p.v, r.rho, "rho");
    }
}

// IAPWS R14-08(2011) check values: ice Ih melting pressure at 260 K is
// 138.268 MPa; sublimation pressure at 230 K is 8.94735 Pa (printed to 6
// significant figures).
TEST(IceCurves, R14CheckValues) {
    EXPECT_NEAR(ice::meltingPressure(260.0) / 1e6, 138.268, 0.0005);
    EXPECT_NEAR(ice::sublimationPressure(230.0), 8.94735, 0.000005);
}

// Both curves start at the triple point (R14-08(2011), eqs. 1 and 6 are
// reduced by it), and their inverses return the temperature.
TEST(IceCurves, MeetAtTriplePointAndInvert) {
    EXPECT_NEAR(ice::meltingPressure(273.16), 611.657, 1e-9);
    EXPECT_NEAR(ice::sublimationPressure(273.16), 611.657, 1e-9);
    for (double T : {251.165, 255.0, 260.0, 270.0, 273.0, 273.16}) {
        EXPECT_NEAR(ice::meltingTemperature(ice::meltingPressure(T)), T, 1e-9) << T;
    }
    for (double T : {50.0, 100.0, 200.0, 250.0, 273.16}) {
        EXPECT_NEAR(ice::sublimationTemperature(ice::sublimationPressure(T)), T, 1e-9) << T;
    }
    EXPECT_TRUE(std::isnan(ice::meltingTemperature(300e6)));
    EXPECT_TRUE(std::isnan(ice::sublimationTemperature(1000.0)));
}

// Laws: Clausius–Clapeyron on the melting line. dp/dT = Δh / (T Δv) with Δh,
// Δv between IF97 liquid (region 1) and R10-06 ice, against the slope of
// R14-08's melting curve. The three are independent IAPWS fits, so they
// agree to the fits' accuracy, not to round-off: 1 % (common practice for
// cross-formulation checks).
TEST(IceCurves, ClapeyronOnMeltingLine) {
    // Only where the melting pressure is inside IF97's 100 MPa range (T ≥ ~264 K).
    for (double T : {267.0, 270.0, 273.0}) {
        const double P = ice::meltingPressure(T);
        const auto liq = heatchain::if97::region1(T, P);
        const auto sol = ice::props(T, P);
        const double slope = (ice::meltingPressure(T + 1e-4) - ice::meltingPressure(T - 1e-4)) / 2e-4;
        const double clapeyron = (liq.h - sol.h) / (T * (liq.v - sol.v));
        EXPECT_NEAR(clapeyron, slope, std::fabs(slope) * 0.01) << T;
        // Equal Gibbs energies on the line: g = h - T s.
        const double gl = liq.h - T * liq.s, gs = sol.h - T * sol.s;
        EXPECT_NEAR(gl, gs, 0.01 * (liq.h - sol.h)) << T;
    }
}
