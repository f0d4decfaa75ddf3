// Ice Ih after IAPWS R10-06(2009) (Gibbs function) and IAPWS R14-08(2011)
// (melting and sublimation curves).
#include "heatchain/models/ice_ih.hpp"

#include <algorithm>
#include <cmath>
#include <complex>
#include <limits>

#include "heatchain/models/if97.hpp"
#include "numerics/root.hpp"

namespace heatchain::ice {
namespace {
using cplx = std::complex<double>;

// IAPWS R10-06(2009), Table 1: triple point and normal pressure used to
// reduce eq. 1.
constexpr double kTt = 273.16;     // K
constexpr double kPt = 611.657;    // Pa
constexpr double kP0 = 101325.0;   // Pa

// IAPWS R10-06(2009), Table 2: coefficients of eq. 1 (the u = s = 0 liquid
// reference). Verified by Table 6.
constexpr double kG0[5] = {-0.632020233335886e6, 0.655022213658955, -0.189369929326131e-7,
                           0.339746123271053e-14, -0.556464869058991e-21};  // J/kg
constexpr double kS0 = -0.332733756492168e4;  // J/(kg K)
const cplx kT1(0.368017112855051e-1, 0.510878114959572e-1);
const cplx kR1(0.447050716285388e2, 0.656876847463481e2);  // J/(kg K)
const cplx kT2(0.337315741065416, 0.335449415919309);
const cplx kR2[3] = {cplx(-0.725974574329220e2, -0.781008427112870e2),
                     cplx(-0.557107698030123e-4, 0.464578634580806e-4),
                     cplx(0.234801409215913e-10, -0.285651142904972e-10)};

// IAPWS R14-08(2011): a_i, b_i of eq. 1 (ice Ih melting pressure) and of
// eq. 6 (sublimation pressure), as printed beside the equations. Verified by
// the release's check values (tests/core/ice_ih_test.cpp).
constexpr double kMeltA[3] = {0.119539337e7, 0.808183159e5, 0.333826860e4};
constexpr double kMeltB[3] = {0.300000e1, 0.257500e2, 0.103750e3};
constexpr double kSubA[3] = {-0.212144006e2, 0.273203819e2, -0.610598130e1};
constexpr double kSubB[3] = {0.333333333e-2, 0.120666667e1, 0.170333333e1};
}  // namespace

Gibbs gibbs(double T, double P) {
    const double tau = T / kTt;
    const double dp = (P - kP0) / kPt;  // pi - pi0
    Gibbs r;
    // g0(p), eq. 2, and its pressure derivatives.
    double g0 = 0, g0p = 0, g0pp = 0, pk = 1;
    for (int k = 0; k < 5; ++k) {
        g0 += kG0[k] * pk;
        if (k >= 1) g0p += kG0[k] * k * (k == 1 ? 1.0 : std::pow(dp, k - 1)) / kPt;
        if (k >= 2) g0pp += kG0[k] * k * (k - 1) * (k == 2 ? 1.0 : std::pow(dp, k - 2)) / (kPt * kPt);
        pk *= dp;
    }
    // r2(p), eq. 3.
    const cplx r2 = kR2[0] + kR2[1] * dp + kR2[2] * dp * dp;
    const cplx r2p = (kR2[1] + 2.0 * kR2[2] * dp) / kPt;
    const cplx r2pp = 2.0 * kR2[2] / (kPt * kPt);

    // The bracket of eq. 1 and its tau derivatives for one (t_k, r_k) pair.
    auto bracket = [tau](cplx t) {
        return (t - tau) * std::log(t - tau) + (t + tau) * std::log(t + tau) -
               2.0 * t * std::log(t) - tau * tau / t;
    };
    auto bracketT = [tau](cplx t) {  // d/dtau
        return -std::log(t - tau) + std::log(t + tau) - 2.0 * tau / t;
    };
    auto bracketTT = [tau](cplx t) {  // d2/dtau2
        return 1.0 / (t - tau) + 1.0 / (t + tau) - 2.0 / t;
    };
    const cplx b1 = bracket(kT1), b2 = bracket(kT2);
    const cplx b1t = bracketT(kT1), b2t = bracketT(kT2);
    const cplx b1tt = bracketTT(kT1), b2tt = bracketTT(kT2);

    r.g = g0 - kS0 * kTt * tau + kTt * std::real(kR1 * b1 + r2 * b2);
    r.gP = g0p + kTt * std::real(r2p * b2);
    r.gT = -kS0 + std::real(kR1 * b1t + r2 * b2t);
    r.gTT = std::real(kR1 * b1tt + r2 * b2tt) / kTt;
    r.gTP = std::real(r2p * b2t);
    r.gPP = g0pp + kTt * std::real(r2pp * b2);
    return r;
}

Props props(double T, double P) {
    const Gibbs G = gibbs(T, P);
    Props p;
    p.T = T;
    p.P = P;
    p.v = G.gP;
    p.s = -G.gT;
    p.h = G.g - T * G.gT;
    p.u = G.g - T * G.gT - P * G.gP;
    p.cp = -T * G.gTT;
    p.cv = -T * G.gTT + T * G.gTP * G.gTP / G.gPP;  // cp - T v alpha^2 / kappa_T
    // w^2 = g_P^2 g_TT / (g_TP^2 - g_TT g_PP) (R10-06(2009), Table 4).
    const double w2 = G.gP * G.gP * G.gTT / (G.gTP * G.gTP - G.gTT * G.gPP);
    p.w = w2 > 0 ? std::sqrt(w2) : std::numeric_limits<double>::quiet_NaN();
    return p;
}

double meltingPressure(double T) {
    const double th = T / kTt;
    double sum = 0;
    for (int i = 0; i < 3; ++i) sum += kMeltA[i] * (1.0 - std::pow(th, kMeltB[i]));
    return kPt * (1.0 + sum);  // eq. 1: p/pt = 1 - sum a_i (1 - theta^b_i)
}

double sublimationPressure(double T) {
    const double th = T / kTt;
    double sum = 0;
    for (int i = 0; i < 3; ++i) sum += kSubA[i] * std::pow(th, kSubB[i]);
    return kPt * std::exp(sum / th);  // eq. 6
}

double meltingPressureMax() {
    static const double p = meltingPressure(kMeltTmin);
    return p;
}

double meltingTemperature(double P) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!(P >= kPt * (1 - 1e-12)) || P > meltingPressureMax() * (1 + 1e-12)) return nan;
    // p(T) falls steeply and smoothly with T; Newton on a bisection bracket,
    // with the slope of eq. 1, dp/dT = -(pt/Tt) sum a_i b_i theta^(b_i - 1).
    auto probe = [P](double T) {
        const double th = T / kTt;
        double sum = 0, slope = 0;
        for (int i = 0; i < 3; ++i) {
            const double pw = std::pow(th, kMeltB[i]);
            sum += kMeltA[i] * (1.0 - pw);
            slope -= kMeltA[i] * kMeltB[i] * pw / th;
        }
        return detail::NewtonProbe{kPt * (1.0 + sum) - P, kPt / kTt * slope};
    };
    const auto T = detail::safeguardedNewton(probe, kTt - (P - kPt) / 13.5e6, kMeltTmin, kTt, /*rising=*/false,
                                             {1e-12, 0.0, 0.0, 100});
    if (!T || !T->converged()) return nan;
    return std::clamp(T->x, kMeltTmin, kTt);
}

double sublimationTemperature(double P) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!(P > 0) || P > kPt * (1 + 1e-12) || P < sublimationPressure(kSublTmin)) return nan;
    // Newton on ln p(T), which is close to linear in 1/T.
    const double lnP = std::log(P);
    auto probe = [lnP](double T) {
        const double h = 1e-6 * T;
        return detail::NewtonProbe{std::log(sublimationPressure(T)) - lnP,
                                   (std::log(sublimationPressure(T + h)) - std::log(sublimationPressure(T - h))) / (2 * h)};
    };
    const auto T = detail::safeguardedNewton(probe, 250.0, kSublTmin, kTt, /*rising=*/true, {1e-12, 0.0, 0.0, 100});
    if (!T || !T->converged()) return nan;
    return std::clamp(T->x, kSublTmin, kTt);
}

}  // namespace heatchain::ice
