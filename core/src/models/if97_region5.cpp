// IF97 region 5 (high-temperature steam, 1073.15–2273.15 K, ≤ 50 MPa):
// Gibbs free energy, eq. 32 of IAPWS R7-97(2012) (the 2007 revision extended
// it to 50 MPa).
#include <cmath>

#include "models/if97_detail.hpp"

namespace heatchain::if97 {
namespace {
using detail::Term;

// IAPWS R7-97(2012), Table 37: J°_i, n°_i of the ideal-gas part, eq. 33.
// Verified by Table 42.
constexpr Term kIdeal[6] = {
    {0, 0, -0.13179983674201e2}, {0, 1, 0.68540841634434e1},  {0, -3, -0.24805148933466e-1},
    {0, -2, 0.36901534980333},   {0, -1, -0.31161318213925e1}, {0, 2, -0.32961626538917},
};

// IAPWS R7-97(2012), Table 38: I_i, J_i, n_i of the residual part, eq. 34.
// Verified by Table 42.
constexpr Term kResidual[6] = {
    {1, 1, 0.15736404855259e-2},  {1, 2, 0.90153761673944e-3}, {1, 3, -0.50270077677648e-2},
    {2, 3, 0.22440037409485e-5},  {2, 9, -0.41163275453471e-5}, {3, 7, 0.37919454822955e-7},
};

// Reducing quantities of eq. 32: p* = 1 MPa, T* = 1000 K.
constexpr double kPstar = 1e6;
constexpr double kTstar = 1000.0;
}  // namespace

Props region5(double T, double P) {
    const double pi = P / kPstar;
    const double tau = kTstar / T;
    const detail::PowTable<-5, 9> pt(tau);
    const detail::PowTable<0, 3> pp(pi);
    detail::Gamma G;
    double g0 = std::log(pi), g0t = 0, g0tt = 0;
    for (const Term& t : kIdeal) {
        g0 += t.n * pt[t.J];
        g0t += t.n * t.J * pt[t.J - 1];
        g0tt += t.n * t.J * (t.J - 1) * pt[t.J - 2];
    }
    const auto [S, SI, SII, SJ, SJJ, SIJ] = detail::seriesSumsLoop(kResidual, pp, pt);
    G.g = g0 + S;
    G.gp = (1.0 + SI) / pi;
    G.gpp = (-1.0 + SII) / (pi * pi);
    G.gt = g0t + SJ / tau;
    G.gtt = g0tt + SJJ / (tau * tau);
    G.gpt = SIJ / (pi * tau);
    return detail::propsFromGamma(T, P, pi, tau, G);
}

}  // namespace heatchain::if97
