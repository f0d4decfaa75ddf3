// IF97 region 3 (near-critical): Helmholtz free energy f(rho, T), eq. 28 of
// IAPWS R7-97(2012), and its density root at given (T, P) found on the
// forward equation by the bracketed Newton of numerics/root.hpp (no backward
// v(p,T) equations are used).
#include <algorithm>
#include <array>
#include <cmath>
#include <initializer_list>

#include "models/if97_detail.hpp"
#include "numerics/root.hpp"

namespace heatchain::if97 {
namespace {
using detail::Term;

// IAPWS R7-97(2012), Table 30: n_1 (the ln delta term) and I_i, J_i, n_i,
// i = 2…40, of eq. 28. Verified by Table 33.
constexpr double kN1 = 0.10658070028513e1;
constexpr Term kRegion3[39] = {
    {0, 0, -0.15732845290239e2},  {0, 1, 0.20944396974307e2},   {0, 2, -0.76867707878716e1},
    {0, 7, 0.26185947787954e1},   {0, 10, -0.28080781148620e1}, {0, 12, 0.12053369696517e1},
    {0, 23, -0.84566812812502e-2}, {1, 2, -0.12654315477714e1}, {1, 6, -0.11524407806681e1},
    {1, 15, 0.88521043984318},    {1, 17, -0.64207765181607},   {2, 0, 0.38493460186671},
    {2, 2, -0.85214708824206},    {2, 6, 0.48972281541877e1},   {2, 7, -0.30502617256965e1},
    {2, 22, 0.39420536879154e-1}, {2, 26, 0.12558408424308},    {3, 0, -0.27999329698710},
    {3, 2, 0.13899799569460e1},   {3, 4, -0.20189915023570e1},  {3, 16, -0.82147637173963e-2},
    {3, 26, -0.47596035734923},   {4, 0, 0.43984074473500e-1},  {4, 2, -0.44476435428739},
    {4, 4, 0.90572070719733},     {4, 26, 0.70522450087967},    {5, 1, 0.10770512626332},
    {5, 3, -0.32913623258954},    {5, 26, -0.50871062041158},   {6, 0, -0.22175400873096e-1},
    {6, 2, 0.94260751665092e-1},  {6, 26, 0.16436278447961},    {7, 2, -0.13503372241348e-1},
    {8, 26, -0.14834345352472e-1}, {9, 2, 0.57922953628084e-3}, {9, 26, 0.32308904703711e-2},
    {10, 0, 0.80964802996215e-4}, {10, 1, -0.16557679795037e-3}, {11, 26, -0.44923899061815e-4},
};

// Dimensionless Helmholtz function phi(delta, tau) and derivatives.
struct Phi {
    double f = 0, fd = 0, fdd = 0, ft = 0, ftt = 0, fdt = 0;
};

Phi phi(double delta, double tau) {
    const detail::PowTable<0, 11> pd(delta);
    const detail::PowTable<0, 26> pt(tau);
    const auto [S, SI, SII, SJ, SJJ, SIJ] = detail::seriesSumsLoop(kRegion3, pd, pt);
    Phi p;
    p.f = kN1 * std::log(delta) + S;
    p.fd = kN1 / delta + SI / delta;
    p.fdd = -kN1 / (delta * delta) + SII / (delta * delta);
    p.ft = SJ / tau;
    p.ftt = SJJ / (tau * tau);
    p.fdt = SIJ / (delta * tau);
    return p;
}

// Pressure and its density derivative along one isotherm (eq. 28, Table
// 31). They need only the delta derivatives of phi, so the tau powers are
// made once per isotherm and only the sums SI and SII are formed, term for
// term as phi() forms them (the same numbers to the last bit).
class Isotherm {
public:
    explicit Isotherm(double T) : T_(T), pt_(Tc / T) {}
    void pressureAndSlope(double rho, double& P, double& dPdrho) const {
        const double delta = rho / rhoc;
        const detail::PowTable<0, 11> pd(delta);
        double SI = 0, SII = 0;
        for (const Term& t : kRegion3) {
            const double v = t.n * pd[t.I] * pt_[t.J];
            SI += t.I * v;
            SII += t.I * (t.I - 1) * v;
        }
        const double fd = kN1 / delta + SI / delta;
        const double fdd = -kN1 / (delta * delta) + SII / (delta * delta);
        P = rho * R * T_ * delta * fd;
        dPdrho = R * T_ * (2 * delta * fd + delta * delta * fdd);
    }

private:
    double T_;
    detail::PowTable<0, 26> pt_;
};

}  // namespace

namespace {

// Properties from phi at (rho, T), R7-97(2012) Table 31.
Props propsFromPhi(double rho, double T, const Phi& f) {
    const double delta = rho / rhoc;
    const double tau = Tc / T;
    Props r;
    r.T = T;
    r.v = 1.0 / rho;
    r.P = rho * R * T * delta * f.fd;
    r.u = R * T * tau * f.ft;
    r.s = R * (tau * f.ft - f.f);
    r.h = R * T * (tau * f.ft + delta * f.fd);
    r.cv = -R * tau * tau * f.ftt;
    const double a = delta * f.fd - delta * tau * f.fdt;
    const double b = 2 * delta * f.fd + delta * delta * f.fdd;
    r.cp = R * (-tau * tau * f.ftt + a * a / b);
    const double w2 = R * T * (b - a * a / (tau * tau * f.ftt));
    r.w = w2 > 0 ? std::sqrt(w2) : std::numeric_limits<double>::quiet_NaN();
    return r;
}

}  // namespace

Props region3(double rho, double T) { return propsFromPhi(rho, T, phi(rho / rhoc, Tc / T)); }

bool region3Solve(double P, double value, Given given, double& rho, double& T, Props& out) {
    // Newton in two unknowns (rho, T) on p(rho, T) = P and h or s (rho, T) =
    // value (numerics newton2), with the analytic Jacobian of eq. 28
    // (R7-97(2012), Table 31 derivatives). From the SR3-03 start two or
    // three steps suffice.
    const bool H = given == Given::Enthalpy;
    const double tolP = kRegion3SolveTol * P;
    const double tolX = kRegion3SolveTol * std::max(std::fabs(value), H ? 1e3 : 1.0);
    auto probe = [&](const std::array<double, 2>& x) {
        heatchain::detail::Newton2Probe r;  // NaN residuals: give up
        const double rh = x[0], t = x[1];
        if (!(rh > 0 && t > 0) || !std::isfinite(rh) || !std::isfinite(t)) return r;
        const double delta = rh / rhoc;
        const double tau = Tc / t;
        const Phi f = phi(delta, tau);
        const double p = rh * R * t * delta * f.fd;
        const double v = H ? R * t * (tau * f.ft + delta * f.fd) : R * (tau * f.ft - f.f);
        r.f = {p - P, v - value};
        if (std::fabs(r.f[0]) <= tolP && std::fabs(r.f[1]) <= tolX) {
            out = propsFromPhi(rh, t, f);
            r.done = true;
            return r;
        }
        const double dpdr = R * t * (2 * delta * f.fd + delta * delta * f.fdd);
        const double dpdT = rh * R * (delta * f.fd - delta * tau * f.fdt);
        double dxdr, dxdT;
        if (H) {
            dxdr = R * t / rh * (delta * tau * f.fdt + delta * f.fd + delta * delta * f.fdd);
            dxdT = R * (-tau * tau * f.ftt + delta * f.fd - delta * tau * f.fdt);
        } else {
            dxdr = R / rh * (delta * tau * f.fdt - delta * f.fd);
            dxdT = -R * tau * tau * f.ftt / t;
        }
        r.j = {{{dpdr, dpdT}, {dxdr, dxdT}}};
        return r;
    };
    // Keep a step from leaving the neighbourhood of the start: the backward
    // equations are within a few tenths of a percent.
    auto limit = [](const std::array<double, 2>& x, std::array<double, 2>& dx) {
        const double lim = std::max(std::fabs(dx[0]) / (0.2 * x[0]), std::fabs(dx[1]) / (0.05 * x[1]));
        if (lim > 1) {
            dx[0] /= lim;
            dx[1] /= lim;
        }
        return true;
    };
    const auto x = heatchain::detail::newton2(probe, {rho, T}, limit, {-1, 12});
    if (!x) return false;
    rho = (*x)[0];
    T = (*x)[1];
    return true;
}

bool region3Density(double T, double P, Branch branch, double& rho) {
    // Newton on p(rho) = P from the side where the isotherm bends away from
    // the root (from above on the dense branch, where p(rho) is convex; from
    // below on the dilute branch, where it is concave), so that steps never
    // jump into the two-phase loop. A bisection bracket guards every step.
    const bool dense = branch == Branch::Liquid;
    const Isotherm iso(T);
    // Region 3 ends near 760 kg/m3 (623.15 K, 100 MPa); the polynomial turns
    // over somewhat beyond that, so the dense start is the first density
    // above the root where the isotherm still rises.
    double lo = 1e-3, hi = 0;
    for (double cand : {760.0, 850.0, 950.0}) {
        double p, dp;
        iso.pressureAndSlope(cand, p, dp);
        if (p > P && dp > 0) {
            hi = cand;
            break;
        }
    }
    if (hi == 0) return false;
    const double start = dense ? hi : std::min(P / (R * T), 0.5 * hi);
    // Newton in a bracket (numerics/root.hpp) on p(rho) − P, which rises
    // with rho outside the spinodal loop. Inside the loop (dp/drho ≤ 0) a
    // probe says on which side the root lies: above on the dense branch,
    // below on the dilute one, as it came from there. The bracket the
    // finder keeps is followed here too, so that a bracket closed before the
    // residual is met can be judged at its middle.
    double lastSlope = 0, blo = lo, bhi = hi;
    const double tol = 1e-12 * P;
    auto probe = [&](double x) {
        double p, dp;
        iso.pressureAndSlope(x, p, dp);
        const double f = p - P;
        lastSlope = dp;
        if (std::fabs(f) <= tol) return heatchain::detail::NewtonProbe{f, dp};
        if (dp > 0) {
            if (f > 0) bhi = x; else blo = x;
            return heatchain::detail::NewtonProbe{f, dp};
        }
        if (dense) blo = x; else bhi = x;
        return dense ? heatchain::detail::NewtonProbe::rootAbove() : heatchain::detail::NewtonProbe::rootBelow();
    };
    // The dense start is the bracket's upper end itself (a density where
    // p > P is known); the finder probes only inside its bracket, so that
    // end is passed one representable number higher (the first probe, at
    // the start, then brings it back to the start).
    const double hiOpen = dense ? std::nextafter(hi, 2 * hi) : hi;
    const auto root = heatchain::detail::safeguardedNewton(probe, start, lo, hiOpen, /*rising=*/true, {-1.0, 1e-14, tol, 200});
    if (!root || !root->converged()) return false;
    if (root->end == heatchain::detail::NewtonRoot::End::Bracket) {
        rho = 0.5 * (blo + bhi);
        double p, dp;
        iso.pressureAndSlope(rho, p, dp);
        return dp > 0 && std::fabs(p - P) <= 1e-9 * P;
    }
    if (lastSlope <= 0) return false;  // stopped on the unstable part of the loop
    // Below Tc each branch lies on its own side of the critical density.
    if (T < Tc && (dense ? root->x < rhoc : root->x > rhoc)) return false;
    rho = root->x;
    return true;
}

}  // namespace heatchain::if97
