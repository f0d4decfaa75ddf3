#pragma once
// Shared arithmetic of the IF97 region files: turning the derivatives of the
// dimensionless Gibbs function into properties (R7-97(2012), Tables 3, 12,
// 39) and a small power table so that no term calls std::pow.
#include <cmath>
#include <cstddef>
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

// x^k for k in [lo, hi] (integers), one multiplication each: x^k =
// x^(k/2) · x^(k − k/2), so no power waits on more than log2(k) products
// before it (a chain x^k = x^(k−1) · x would make the 40th power wait on
// 40 multiplications in turn, which was most of a region's evaluation).
template <int Lo, int Hi>
struct PowTable {
    double p[Hi - Lo + 1];
    explicit PowTable(double x) {
        p[-Lo] = 1.0;
        if constexpr (Hi >= 1) p[1 - Lo] = x;
        for (int k = 2; k <= Hi; ++k) p[k - Lo] = p[k / 2 - Lo] * p[k - k / 2 - Lo];
        if constexpr (Lo < 0) {
            p[-1 - Lo] = 1.0 / x;
            for (int k = 2; k <= -Lo; ++k) p[-k - Lo] = p[-(k / 2) - Lo] * p[-(k - k / 2) - Lo];
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

// The sums over the terms of Σ n x^I y^J from which gamma and its first and
// second derivatives follow: Σ w v with v = n x^I y^J and w = 1, I, I(I−1),
// J, J(J−1), I J. Two interleaved partial sums halve the chain of additions
// each sum waits on.
struct SeriesSums {
    double S = 0, SI = 0, SII = 0, SJ = 0, SJJ = 0, SIJ = 0;
};

template <std::size_t N, class PX, class PY>
SeriesSums seriesSums(const Term (&terms)[N], const PX& px, const PY& py) {
    double a[2][6] = {};
    for (std::size_t i = 0; i < N; ++i) {
        const Term& t = terms[i];
        const double v = t.n * px[t.I] * py[t.J];
        double* s = a[i & 1];
        const double I = t.I, J = t.J;
        s[0] += v;
        s[1] += I * v;
        s[2] += I * (I - 1) * v;
        s[3] += J * v;
        s[4] += J * (J - 1) * v;
        s[5] += I * J * v;
    }
    return {a[0][0] + a[1][0], a[0][1] + a[1][1], a[0][2] + a[1][2],
            a[0][3] + a[1][3], a[0][4] + a[1][4], a[0][5] + a[1][5]};
}

// Only the sums h and s need: Σ v and Σ J v.
template <std::size_t N, class PX, class PY>
void seriesSumsHS(const Term (&terms)[N], const PX& px, const PY& py, double& S, double& SJ) {
    double a0 = 0, a1 = 0, b0 = 0, b1 = 0;
    std::size_t i = 0;
    for (; i + 1 < N; i += 2) {
        const double v0 = terms[i].n * px[terms[i].I] * py[terms[i].J];
        const double v1 = terms[i + 1].n * px[terms[i + 1].I] * py[terms[i + 1].J];
        a0 += v0;
        a1 += v1;
        b0 += terms[i].J * v0;
        b1 += terms[i + 1].J * v1;
    }
    if (i < N) {
        const double v = terms[i].n * px[terms[i].I] * py[terms[i].J];
        a0 += v;
        b0 += terms[i].J * v;
    }
    S = a0 + a1;
    SJ = b0 + b1;
}

}  // namespace heatchain::if97::detail
