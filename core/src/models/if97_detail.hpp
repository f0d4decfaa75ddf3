#pragma once
// Shared arithmetic of the IF97 region files: turning the derivatives of the
// dimensionless Gibbs function into properties (R7-97(2012), Tables 3, 12,
// 39) and a small power table so that no term calls std::pow.
#include <cmath>
#include <cstddef>
#include <iterator>
#include <utility>
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
// x^(k/2) · x^(k − k/2), so no power waits on more than about log2(k)
// products before it (a chain x^k = x^(k−1) · x would make the 41st power
// wait on 41 multiplications in turn). Unrolled at compile time.
template <int Lo, int Hi>
struct PowTable {
    double p[Hi - Lo + 1];
    explicit PowTable(double x) {
        p[-Lo] = 1.0;
        if constexpr (Hi >= 1) {
            p[1 - Lo] = x;
            fillUp(std::make_index_sequence<(Hi >= 2 ? Hi - 1 : 0)>{});
        }
        if constexpr (Lo < 0) {
            p[-1 - Lo] = 1.0 / x;
            fillDown(std::make_index_sequence<(-Lo >= 2 ? -Lo - 1 : 0)>{});
        }
    }
    double operator[](int k) const { return p[k - Lo]; }

private:
    template <std::size_t... K>
    void fillUp(std::index_sequence<K...>) {
        ((p[int(K) + 2 - Lo] = p[(int(K) + 2) / 2 - Lo] * p[(int(K) + 2) - (int(K) + 2) / 2 - Lo]), ...);
    }
    template <std::size_t... K>
    void fillDown(std::index_sequence<K...>) {
        ((p[-(int(K) + 2) - Lo] = p[-((int(K) + 2) / 2) - Lo] * p[-((int(K) + 2) - (int(K) + 2) / 2) - Lo]), ...);
    }
};

// One polynomial term n x^I y^J of a double series.
struct Term {
    int I;
    int J;
    double n;
};

// Σ n x^I y^J over a table (the backward equations), with power tables
// spanning the exponents: [LoI, HiI] for x, [LoJ, HiJ] for y. Unrolled at
// compile time in the table's order (the same sum as a plain loop's to the
// last bit), so that the powers no term uses are never formed.
template <const auto& Terms, class PX, class PY, std::size_t... K>
inline double seriesOf(const PX& px, const PY& py, std::index_sequence<K...>) {
    double sum = 0;
    ((sum += Terms[K].n * px[Terms[K].I] * py[Terms[K].J]), ...);
    return sum;
}

template <const auto& Terms, int LoI, int HiI, int LoJ, int HiJ>
double series(double x, double y) {
    const PowTable<LoI, HiI> px(x);
    const PowTable<LoJ, HiJ> py(y);
    return seriesOf<Terms>(px, py, std::make_index_sequence<std::size(Terms)>{});
}

// The sums over the terms of Σ n x^I y^J from which gamma and its first and
// second derivatives follow: Σ w v with v = n x^I y^J and w = 1, I, I(I−1),
// J, J(J−1), I J. Unrolled at compile time over a constexpr table, in the
// table's order (so each sum is the same as a plain loop's to the last
// bit), with the weights folded in and the terms whose weight is zero left
// out (adding ±0 changes no sum).
struct SeriesSums {
    double S = 0, SI = 0, SII = 0, SJ = 0, SJJ = 0, SIJ = 0;
};

template <int I, int J, class PX, class PY>
inline void addTerm(double n, const PX& px, const PY& py, SeriesSums& m) {
    const double v = n * px[I] * py[J];
    m.S += v;
    if constexpr (I != 0) m.SI += I * v;
    if constexpr (I != 0 && I != 1) m.SII += I * (I - 1) * v;
    if constexpr (J != 0) m.SJ += J * v;
    if constexpr (J != 0 && J != 1) m.SJJ += J * (J - 1) * v;
    if constexpr (I != 0 && J != 0) m.SIJ += I * J * v;
}

template <const auto& Terms, class PX, class PY, std::size_t... K>
inline SeriesSums seriesSumsOf(const PX& px, const PY& py, std::index_sequence<K...>) {
    SeriesSums m;
    (addTerm<Terms[K].I, Terms[K].J>(Terms[K].n, px, py, m), ...);
    return m;
}

template <const auto& Terms, class PX, class PY>
inline SeriesSums seriesSums(const PX& px, const PY& py) {
    return seriesSumsOf<Terms>(px, py, std::make_index_sequence<std::size(Terms)>{});
}

// The same sums by a plain loop over the table, for the tables where the
// loop runs faster than the unrolled form (region 3) or is as fast (region 5).
template <class Terms, class PX, class PY>
inline SeriesSums seriesSumsLoop(const Terms& terms, const PX& px, const PY& py) {
    SeriesSums m;
    for (const Term& t : terms) {
        const double v = t.n * px[t.I] * py[t.J];
        m.S += v;
        m.SI += t.I * v;
        m.SII += t.I * (t.I - 1) * v;
        m.SJ += t.J * v;
        m.SJJ += t.J * (t.J - 1) * v;
        m.SIJ += t.I * t.J * v;
    }
    return m;
}

// Only the sums h, s and cp need: Σ v, Σ J v and Σ J(J−1) v, term for term
// as addTerm forms them (the same values).
template <int I, int J, class PX, class PY>
inline void addTermHSCp(double n, const PX& px, const PY& py, SeriesSums& m) {
    const double v = n * px[I] * py[J];
    m.S += v;
    if constexpr (J != 0) m.SJ += J * v;
    if constexpr (J != 0 && J != 1) m.SJJ += J * (J - 1) * v;
}

template <const auto& Terms, class PX, class PY, std::size_t... K>
inline SeriesSums seriesSumsHSCpOf(const PX& px, const PY& py, std::index_sequence<K...>) {
    SeriesSums m;
    (addTermHSCp<Terms[K].I, Terms[K].J>(Terms[K].n, px, py, m), ...);
    return m;
}

template <const auto& Terms, class PX, class PY>
inline SeriesSums seriesSumsHSCp(const PX& px, const PY& py) {
    return seriesSumsHSCpOf<Terms>(px, py, std::make_index_sequence<std::size(Terms)>{});
}

// h, s and cp from gamma, written as propsFromGamma writes them.
inline HSCp hsCpFromGamma(double T, double tau, const Gamma& G) {
    const double RT = R * T;
    return {RT * tau * G.gt, R * (tau * G.gt - G.g), -R * tau * tau * G.gtt};
}

// Only the sums h and s need: Σ v and Σ J v, the same values as above.
template <int J, class PX, class PY>
inline void addTermHS(double n, double xI, const PY& py, double& S, double& SJ) {
    const double v = n * xI * py[J];
    S += v;
    if constexpr (J != 0) SJ += J * v;
}

template <const auto& Terms, class PX, class PY, std::size_t... K>
inline void seriesSumsHSOf(const PX& px, const PY& py, double& S, double& SJ, std::index_sequence<K...>) {
    S = 0;
    SJ = 0;
    (addTermHS<Terms[K].J, PX>(Terms[K].n, px[Terms[K].I], py, S, SJ), ...);
}

template <const auto& Terms, class PX, class PY>
inline void seriesSumsHS(const PX& px, const PY& py, double& S, double& SJ) {
    seriesSumsHSOf<Terms>(px, py, S, SJ, std::make_index_sequence<std::size(Terms)>{});
}

}  // namespace heatchain::if97::detail
