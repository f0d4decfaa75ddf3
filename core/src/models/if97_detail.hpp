#pragma once
// Shared arithmetic of the IF97 region files: turning the derivatives of the
// dimensionless Gibbs function into properties (R7-97(2012), Tables 3, 12,
// 39) and a small power table so that no term calls std::pow.
#include <cmath>
#include <limits>

#include "heatchain/models/if97.hpp"

namespace heatchain::if97::detail {

// Dimensionless Gibbs function gamma(pi, tau) and its derivatives.
struct Gamma {
    double g = 0, gp = 0, gpp = 0, gt = 0, gtt = 0, gpt = 0;
};

// Properties from gamma, with pi = P/P*, tau = T*/T (Table 3 of R7-97).
inline Props propsFromGamma(double T, double P, double pi, double tau, const Gamma& G) {
    Props r;
    r.T = T;
    r.P = P;
    const double RT = R * T;
    r.v = pi * G.gp * RT / P;
    r.h = RT * tau * G.gt;
    r.u = RT * (tau * G.gt - pi * G.gp);
    r.s = R * (tau * G.gt - G.g);
    r.cp = -R * tau * tau * G.gtt;
    const double a = G.gp - tau * G.gpt;
    r.cv = R * (-tau * tau * G.gtt + a * a / G.gpp);
    const double w2 = RT * G.gp * G.gp / (a * a / (tau * tau * G.gtt) - G.gpp);
    r.w = w2 > 0 ? std::sqrt(w2) : std::numeric_limits<double>::quiet_NaN();
    return r;
}

// x^k for k in [lo, hi] (integers), filled by repeated multiplication.
template <int Lo, int Hi>
struct PowTable {
    double p[Hi - Lo + 1];
    explicit PowTable(double x) {
        p[-Lo] = 1.0;
        for (int k = 1; k <= Hi; ++k) p[k - Lo] = p[k - 1 - Lo] * x;
        if constexpr (Lo < 0) {
            const double inv = 1.0 / x;
            for (int k = -1; k >= Lo; --k) p[k - Lo] = p[k + 1 - Lo] * inv;
        }
    }
    double operator[](int k) const { return p[k - Lo]; }
};

// One polynomial term n x^I y^J of a double series.
struct Term {
    int I;
    int J;
    double n;
};

}  // namespace heatchain::if97::detail
