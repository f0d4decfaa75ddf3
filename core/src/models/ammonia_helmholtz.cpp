// Evaluation of the Tillner-Roth, Harms-Watzenberg & Baehr (1993) ammonia
// equation. Every exponent of tau in the residual part is a multiple of 1/2
// and every exponent of delta an integer, so the powers come from short
// multiplication tables of sqrt(tau) and delta instead of 21 calls to pow.
#include "models/ammonia_helmholtz.hpp"

#include <cmath>

namespace heatchain::detail::nh3 {

namespace {

// Residual part, phir = sum n_i delta^d_i tau^t_i exp(-delta^c_i) (c_i = 0:
// no exponential). Coefficients, exponents: R. Tillner-Roth, F. Harms-
// Watzenberg, H. D. Baehr, "Eine neue Fundamentalgleichung für Ammoniak",
// DKV-Tagungsbericht 20 (1993) 167–181, table of the residual part (21
// terms); transcribed by printing python3-iapws 1.5.2's
// NH3._constants (nr1/d1/t1 and nr2/d2/t2/c2), whose printed figures are the
// paper's; checked live against that library to ~1e-12 in
// tests/reference/ammonia_reference_test.cpp. t is stored as twice its value
// (all t are multiples of 1/2).
struct Term {
    double n;
    int d;
    int t2;  // 2 t
    int c;
};
constexpr Term kTerms[21] = {
    {-1.858814, 1, 3, 0},
    {0.04554431, 2, -1, 0},
    {0.7238548, 1, 1, 0},
    {0.0122947, 4, 2, 0},
    {2.141882e-11, 15, 6, 0},
    {-0.0143002, 3, 0, 1},
    {0.3441324, 3, 6, 1},
    {-0.2873571, 1, 8, 1},
    {2.352589e-05, 8, 8, 1},
    {-0.03497111, 2, 10, 1},
    {0.001831117, 8, 10, 2},
    {0.02397852, 1, 6, 2},
    {-0.04085375, 1, 12, 2},
    {0.2379275, 2, 16, 2},
    {-0.03548972, 3, 16, 2},
    {-0.1823729, 2, 20, 2},
    {0.02281556, 4, 20, 2},
    {-0.006663444, 3, 10, 3},
    {-0.008847486, 1, 15, 3},
    {0.002272635, 2, 30, 3},
    {-0.0005588655, 4, 60, 3},
};
constexpr int kMaxT2 = 60;
constexpr int kMaxD = 15;

// Ideal-gas part, phi0 = ln delta + a1 + a2 tau + a3 ln tau + a4 tau^(1/3)
// + a5 tau^(-3/2) + a6 tau^(-7/4): Tillner-Roth et al. (1993), ideal-gas
// part; transcribed by printing python3-iapws 1.5.2's NH3.Fi0 (ao_log
// [1, -1]: ln delta and -ln tau; ao_pow with pow [0, 1, 1/3, -3/2, -7/4]).
constexpr double a1 = -15.81502, a2 = 4.255726, a3 = -1.0, a4 = 11.47434, a5 = -1.296211, a6 = 0.5706757;

}  // namespace

TauPowers tauPowers(double tau) {
    TauPowers out;
    out.tau = tau;
    // q[k] = sqrt(tau)^k for k = 0..60; the one negative exponent (-1/2) apart.
    double q[kMaxT2 + 1];
    const double r = std::sqrt(tau);
    q[0] = 1.0;
    for (int k = 1; k <= kMaxT2; ++k) q[k] = q[k - 1] * r;
    for (int i = 0; i < 21; ++i) {
        const int k = kTerms[i].t2;
        out.p[i] = kTerms[i].n * (k >= 0 ? q[k] : 1.0 / q[-k]);
    }
    return out;
}

namespace {

// Per term: delta^d exp(-delta^c) and its first two delta derivatives,
// divided by delta^d, so that each is (1, A/delta, B/delta^2) with
//   A = d - c delta^c,  B = A (A - 1) - c^2 delta^c.
struct DeltaParts {
    double dpow[kMaxD + 1];
    double e[4];    // exp(-delta^c), c = 0..3
    double dc[4];   // delta^c
};

DeltaParts deltaParts(double delta) {
    DeltaParts p;
    p.dpow[0] = 1.0;
    for (int k = 1; k <= kMaxD; ++k) p.dpow[k] = p.dpow[k - 1] * delta;
    for (int c = 0; c < 4; ++c) {
        p.dc[c] = p.dpow[c];
        p.e[c] = c == 0 ? 1.0 : std::exp(-p.dpow[c]);
    }
    return p;
}

// One term's delta^d exp(-delta^c) tau^t part (`base`) and its A and B.
struct TermDelta {
    double base, A, B;
};

inline TermDelta termDelta(int i, const DeltaParts& dp, const TauPowers& tp) {
    const Term& t = kTerms[i];
    const double base = tp.p[i] * dp.dpow[t.d] * dp.e[t.c];
    const double cdc = t.c * dp.dc[t.c];
    const double A = t.d - cdc;
    return {base, A, A * (A - 1.0) - t.c * cdc};
}

}  // namespace

Residual residual(double delta, const TauPowers& tp) {
    const DeltaParts dp = deltaParts(delta);
    Residual r;
    double s0 = 0, s1 = 0, s2 = 0;  // sums of phir, delta phir_d, delta^2 phir_dd
    for (int i = 0; i < 21; ++i) {
        const auto [base, A, B] = termDelta(i, dp, tp);
        s0 += base;
        s1 += base * A;
        s2 += base * B;
    }
    r.phir = s0;
    r.phir_d = s1 / delta;
    r.phir_dd = s2 / (delta * delta);
    return r;
}

Helmholtz evaluate(double delta, double tau) {
    const TauPowers tp = tauPowers(tau);
    const DeltaParts dp = deltaParts(delta);
    Helmholtz h;
    double s0 = 0, s1 = 0, s2 = 0, st = 0, stt = 0, sdt = 0;
    for (int i = 0; i < 21; ++i) {
        const double tt = 0.5 * kTerms[i].t2;
        const auto [base, A, B] = termDelta(i, dp, tp);
        s0 += base;
        s1 += base * A;
        s2 += base * B;
        st += base * tt;               // tau phir_t
        stt += base * tt * (tt - 1.0);  // tau^2 phir_tt
        sdt += base * A * tt;          // delta tau phir_dt
    }
    h.phir = s0;
    h.phir_d = s1 / delta;
    h.phir_dd = s2 / (delta * delta);
    h.phir_t = st / tau;
    h.phir_tt = stt / (tau * tau);
    h.phir_dt = sdt / (delta * tau);

    // Ideal part and its tau derivatives.
    const double c3 = std::cbrt(tau);                 // tau^(1/3)
    const double t15 = 1.0 / (tau * std::sqrt(tau));  // tau^(-3/2)
    const double t175 = std::sqrt(std::sqrt(tau)) / (tau * tau);  // tau^(-7/4)
    const double lt = std::log(tau);
    h.phi0 = std::log(delta) + a1 + a2 * tau + a3 * lt + a4 * c3 + a5 * t15 + a6 * t175;
    h.phi0_t = a2 + a3 / tau + (a4 * (1.0 / 3.0) * c3 + a5 * (-1.5) * t15 + a6 * (-1.75) * t175) / tau;
    h.phi0_tt = -a3 / (tau * tau) +
                (a4 * (1.0 / 3.0) * (-2.0 / 3.0) * c3 + a5 * (-1.5) * (-2.5) * t15 + a6 * (-1.75) * (-2.75) * t175) /
                    (tau * tau);
    return h;
}

}  // namespace heatchain::detail::nh3
