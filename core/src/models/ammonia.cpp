// Ammonia's reference model on the Tillner-Roth, Harms-Watzenberg & Baehr
// (1993) Helmholtz equation (models/ammonia_helmholtz.*). The equation is
// explicit in (T, rho); every (T, P) state needs a density root, found by a
// bracketed Newton on the reduced pressure. Saturation is equal pressure and
// equal Gibbs energy of the two densities. Everything the model needs is set
// up in the factory; afterwards the object is immutable (thread-safe const
// calls).
#include "heatchain/models/ammonia.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <optional>
#include <string>

#include "models/ammonia_helmholtz.hpp"

namespace heatchain {

namespace {

namespace eq = detail::nh3;

std::string num(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    return buf;
}

constexpr std::string_view kName = "Tillner-Roth et al. (1993) ammonia equation";
constexpr std::string_view kSrcLiquid = "Tillner-Roth et al. (1993), liquid";
constexpr std::string_view kSrcVapor = "Tillner-Roth et al. (1993), vapour";
constexpr std::string_view kSrcSuper = "Tillner-Roth et al. (1993), supercritical";
constexpr std::string_view kSrcSolid =
    "Tillner-Roth et al. (1993) liquid at the melting point with a solid from cp(solid) and the enthalpy of fusion";

// Stated range of the equation (Tillner-Roth et al. 1993): triple point to
// 700 K, pressures to 1000 MPa.
constexpr double kTmaxValid = 700.0;
constexpr double kPmaxValid = 1000e6;
// How far the solver may stretch the gas above 700 K (states there carry
// WarnAboveTemperatureRange); the library's ideal-gas cp of ammonia reaches
// 1000 K too, so both fluid models cover the same span.
constexpr double kTmaxSolver = 1000.0;
// Above this distance from the melting anchor pressure the vertical melting
// line is flagged (the real-fluid model uses the same figure).
constexpr double kMeltingFlagPressure = 5e6;
// Largest reduced density searched (delta = 6 is 1350 kg/m3, beyond the
// liquid at 196 K and 1000 MPa).
constexpr double kDeltaMax = 6.0;

// ---------------------------------------------------------------- density roots

enum class Branch { Vapour, Liquid, Single };

// Reduced density delta with reduced pressure J(delta) = pi on one branch,
// by Newton kept inside a bracket [lo, hi]. The branch decides which side a
// point of the unstable region (dJ/ddelta <= 0) belongs to: for the vapour
// root it bounds from above, for the liquid root from below. Bounded; returns
// nullopt when the bracket closes on a spinodal (no root on that branch).
std::optional<double> solveDelta(const eq::TauPowers& tp, double pi, Branch b, double lo, double hi, double start) {
    double d = std::clamp(start, lo, hi);
    if (!(d > lo && d < hi)) d = 0.5 * (lo + hi);
    for (int it = 0; it < 300; ++it) {
        const eq::Residual r = eq::residual(d, tp);
        const double J = eq::reducedPressure(d, r);
        const double dJ = eq::reducedPressureSlope(d, r);
        const double f = J - pi;
        double next;
        if (!(dJ > 0)) {
            if (b == Branch::Liquid) lo = d; else hi = d;
            next = 0.5 * (lo + hi);
        } else {
            if (f == 0) return d;
            if (f < 0) lo = d; else hi = d;
            next = d - f / dJ;
            if (std::abs(next - d) <= 1e-15 * d) return next;
            if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
        }
        if (hi - lo <= 4e-16 * hi) {
            // The bracket closed. It closed on a root only if the pressure
            // matches there; otherwise on a spinodal.
            if (dJ > 0 && std::abs(f) <= 1e-12 * pi) return d;
            return std::nullopt;
        }
        d = next;
    }
    return std::nullopt;
}

// ---------------------------------------------------------------- saturation

struct Sat {
    double P = 0;                 // Pa
    double dl = 0, dv = 0;        // reduced densities
};

// Saturation at tau by Newton on the reduced pressure pi with equal Gibbs
// energies: d(g/RT)/dpi = 1/delta at fixed T, so the difference's slope is
// 1/dv - 1/dl. Each pressure gets the two roots on either side of
// `divider`, a reduced density inside the unstable region. Robust (a missing
// root moves the pressure bracket) but slower than satNewton below; used to
// build the ancillary table and as the fallback.
std::optional<Sat> satByPressure(double T, double divider, double piStart, double dlStart, double dvStart) {
    const double tau = eq::Tc / T;
    const eq::TauPowers tp = eq::tauPowers(tau);
    double lo = 0, hi = std::numeric_limits<double>::infinity();
    double pi = piStart, dl = dlStart, dv = dvStart;
    for (int it = 0; it < 200; ++it) {
        auto v = solveDelta(tp, pi, Branch::Vapour, 0.0, divider, dv);
        auto l = solveDelta(tp, pi, Branch::Liquid, divider, kDeltaMax, dl);
        double next;
        if (!v) {
            hi = pi;  // above the vapour spinodal
            next = std::isfinite(hi) ? 0.5 * (lo + hi) : 0.5 * pi;
        } else if (!l) {
            lo = pi;  // below the liquid spinodal
            next = std::isfinite(hi) ? 0.5 * (lo + hi) : 2.0 * pi;
        } else {
            dv = *v;
            dl = *l;
            const eq::Residual rv = eq::residual(dv, tp), rl = eq::residual(dl, tp);
            const double dg = eq::reducedGibbsDensityPart(dv, std::log(dv), rv) -
                              eq::reducedGibbsDensityPart(dl, std::log(dl), rl);
            if (dg > 0) hi = pi; else lo = pi;
            const double slope = 1.0 / dv - 1.0 / dl;
            next = pi - dg / slope;
            if (std::abs(next - pi) <= 1e-14 * pi) return Sat{next * eq::rhoc * eq::R * T, dl, dv};
            if (!(next > lo && next < hi)) next = std::isfinite(hi) ? 0.5 * (lo + hi) : 2.0 * pi;
        }
        if (std::isfinite(hi) && hi - lo <= 1e-15 * hi) {
            if (v && l) return Sat{pi * eq::rhoc * eq::R * T, dl, dv};
            return std::nullopt;
        }
        pi = next;
    }
    return std::nullopt;
}

// Saturation at T by Newton on the two reduced densities (dl, dv) with
// equal reduced pressures J and equal density parts K of g/RT (the method of
// Akasaka, J. Therm. Sci. Technol. 3 (2008) 442–451). dK/ddelta = J'/delta.
std::optional<Sat> satNewton(double T, double dl, double dv) {
    const double tau = eq::Tc / T;
    const eq::TauPowers tp = eq::tauPowers(tau);
    eq::Residual rl = eq::residual(dl, tp), rv = eq::residual(dv, tp);
    for (int it = 0; it < 40; ++it) {
        const double Jl = eq::reducedPressure(dl, rl), Jv = eq::reducedPressure(dv, rv);
        const double Kl = eq::reducedGibbsDensityPart(dl, std::log(dl), rl);
        const double Kv = eq::reducedGibbsDensityPart(dv, std::log(dv), rv);
        const double Jdl = eq::reducedPressureSlope(dl, rl), Jdv = eq::reducedPressureSlope(dv, rv);
        if (!(Jdl > 0 && Jdv > 0)) return std::nullopt;
        const double F1 = Jv - Jl, F2 = Kv - Kl;
        // Jacobian rows (d/d dl, d/d dv): F1: (-Jdl, Jdv); F2: (-Jdl/dl, Jdv/dv).
        const double det = Jdl * Jdv * (1.0 / dl - 1.0 / dv);
        if (!(std::abs(det) > 0)) return std::nullopt;
        // Solve [-Jdl Jdv; -Jdl/dl Jdv/dv] [x; y] = -[F1; F2].
        const double x = (-F1 * Jdv / dv + F2 * Jdv) / det;
        const double y = (-Jdl * (-F2) - (-Jdl / dl) * (-F1)) / det;
        double lam = 1.0;
        double nl = dl + x, nv = dv + y;
        for (int k = 0; k < 30 && !(nl > nv && nv > 0 && nl < kDeltaMax); ++k) {
            lam *= 0.5;
            nl = dl + lam * x;
            nv = dv + lam * y;
        }
        if (!(nl > nv && nv > 0)) return std::nullopt;
        const bool done = std::abs(nl - dl) <= 1e-13 * dl && std::abs(nv - dv) <= 1e-13 * dv;
        dl = nl;
        dv = nv;
        rl = eq::residual(dl, tp);
        rv = eq::residual(dv, tp);
        if (done) {
            const double J = eq::reducedPressure(dv, rv);
            return Sat{J * eq::rhoc * eq::R * T, dl, dv};
        }
    }
    return std::nullopt;
}

// Ancillary saturation table made here from the equation itself (not a
// published fit): ln P, delta_l and delta_v at nodes uniform in
// x = (1 - T/Tc)^(1/3), which crowds them towards the critical point where
// the densities change fastest, from 185 K up. Linear interpolation gives
// starting guesses good to about 1e-4 (checked in
// tests/core/ammonia_model_test.cpp); every answer is then solved exactly.
struct Ancillary {
    static constexpr int N = 160;
    static constexpr double Tlow = 185.0;
    std::array<double, N> x{}, T{}, lnP{}, dl{}, dv{};
    bool ok = false;

    static double xOf(double T) { return std::cbrt(std::max(0.0, 1.0 - T / eq::Tc)); }

    // Interpolation position for T: index i and weight w between nodes i, i+1.
    // Nodes run from high x (low T) to low x (near Tc).
    void locate(double Tq, int& i, double& w) const {
        const double xq = xOf(Tq);
        const double x0 = x[0], xn = x[N - 1];
        double pos = (x0 - xq) / (x0 - xn) * (N - 1);
        pos = std::clamp(pos, 0.0, double(N - 1) - 1e-9);
        i = int(pos);
        w = pos - i;
    }
    double lnPAt(double Tq) const {
        int i; double w; locate(Tq, i, w);
        return (1 - w) * lnP[i] + w * lnP[i + 1];
    }
    double dlAt(double Tq) const {
        int i; double w; locate(Tq, i, w);
        return (1 - w) * dl[i] + w * dl[i + 1];
    }
    double dvAt(double Tq) const {
        int i; double w; locate(Tq, i, w);
        return std::exp((1 - w) * std::log(dv[i]) + w * std::log(dv[i + 1]));
    }
    // Inverse: temperature where the table's ln P equals lnq (ln P rises with T).
    double TAt(double lnq) const {
        if (lnq <= lnP[0]) return T[0];
        if (lnq >= lnP[N - 1]) return T[N - 1];
        int a = 0, b = N - 1;
        while (b - a > 1) {
            const int m = (a + b) / 2;
            if (lnP[m] <= lnq) a = m; else b = m;
        }
        const double w = (lnq - lnP[a]) / (lnP[b] - lnP[a]);
        return (1 - w) * T[a] + w * T[b];
    }
};

const Ancillary& ancillary() {
    static const Ancillary table = [] {
        Ancillary a;
        const double x0 = Ancillary::xOf(Ancillary::Tlow);
        const double xn = Ancillary::xOf(eq::Tc - 0.01);  // stop short of the merging densities
        // Continuation from the cold end, where the liquid is near delta = 3.2
        // and the vapour nearly ideal; each node starts from the last one and
        // splits its two roots at the previous mean density (inside the
        // unstable region).
        double piPrev = 0, dlPrev = 3.2, dvPrev = 0;
        for (int k = 0; k < Ancillary::N; ++k) {
            const double x = x0 + (xn - x0) * k / (Ancillary::N - 1);
            const double T = eq::Tc * (1.0 - x * x * x);
            const double divider = k == 0 ? 1.0 : 0.5 * (dlPrev + dvPrev);
            double pi0 = piPrev > 0 ? piPrev : 1e-3, dv0 = dvPrev > 0 ? dvPrev : 1e-3;
            auto s = satByPressure(T, divider, pi0, dlPrev, dv0);
            if (!s) return a;  // a.ok stays false; the factory reports it
            a.x[k] = x;
            a.T[k] = T;
            a.lnP[k] = std::log(s->P);
            a.dl[k] = s->dl;
            a.dv[k] = s->dv;
            piPrev = s->P / (eq::rhoc * eq::R * T);
            dlPrev = s->dl;
            dvPrev = s->dv;
        }
        a.ok = true;
        return a;
    }();
    return table;
}

// ---------------------------------------------------------------- the model

// A state found from (T, P) reports the P asked for (the density root
// reproduces it to ~1e-15), so that round trips compare exactly.
State atPressure(State s, double P) {
    s.P = P;
    s.u = s.h - P * s.v;
    return s;
}

// Raw (unshifted) per-kg properties at (T, delta).
struct Fluid {
    double P, h, s, u, v, cp, cv, w;
    double dPdT_rho, dPdrho_T;  // for (dv/dT)_P
};

Fluid fluidAt(double T, double delta) {
    const double tau = eq::Tc / T;
    const eq::Helmholtz f = eq::evaluate(delta, tau);
    const double rho = delta * eq::rhoc;
    const double RT = eq::R * T;
    Fluid o;
    const double num = 1.0 + delta * f.phir_d - delta * tau * f.phir_dt;
    const double den = 1.0 + 2.0 * delta * f.phir_d + delta * delta * f.phir_dd;
    const double tauPhiT = tau * (f.phi0_t + f.phir_t);
    o.P = rho * RT * (1.0 + delta * f.phir_d);
    o.h = RT * (tauPhiT + 1.0 + delta * f.phir_d);
    o.s = eq::R * (tauPhiT - f.phi0 - f.phir);
    o.u = RT * tauPhiT;
    o.v = 1.0 / rho;
    o.cv = -eq::R * tau * tau * (f.phi0_tt + f.phir_tt);
    o.dPdT_rho = rho * eq::R * num;
    o.dPdrho_T = RT * den;
    if (den > 0) {
        o.cp = o.cv + eq::R * num * num / den;
        o.w = std::sqrt(RT * (den + num * num * eq::R / o.cv));
    } else {
        o.cp = o.w = std::numeric_limits<double>::quiet_NaN();
    }
    return o;
}

class AmmoniaModel final : public PropertyModel {
public:
    explicit AmmoniaModel(Substance s) : sub_(std::move(s)) {}
    Status init();

    ModelKind kind() const override { return ModelKind::Reference; }
    std::string_view name() const override { return kName; }
    std::string rangeText() const override;
    const Substance& substance() const override { return sub_; }
    std::string sourceText() const override;

    Result<State> phaseState(Phase phase, double T, double P) const override;
    Result<Phase> stablePhase(double T, double P) const override;
    Result<double> transitionTemperature(Transition t, double P) const override;
    Result<double> transitionPressure(Transition t, double T) const override;

    Result<State> stateP(double P, Property which, double value) const override;
    Result<State> stateTV(double T, double v) const override;
    TransitionsAtPressure transitionsAt(double P) const override;

    std::optional<std::pair<double, double>> criticalPoint() const override { return std::make_pair(eq::Tc, Pc_); }
    std::optional<std::pair<double, double>> triplePoint() const override { return std::make_pair(Ttp_, Ptp_); }

    double minTemperature() const override { return Tmin_; }
    double maxTemperature() const override { return kTmaxSolver; }
    double maxPressure() const override { return kPmaxValid; }

private:
    // Saturation at T (Ttp_ <= T <= Tc): pressure and both reduced densities.
    Result<Sat> saturation(double T) const;
    Result<double> boilingTemperature(double P) const;
    Result<double> sublimationPressure(double T) const;
    Result<double> sublimationTemperature(double P) const;
    // Reduced density of a branch at (T, P); an error naming the branch when
    // it has no root there.
    Result<double> density(Branch b, double T, double P) const;
    // Is P above the vapour pressure at T (T < Tc)? Decided from the
    // ancillary table when clearly away from the line, else exactly.
    Result<bool> aboveSaturation(double T, double P) const;

    State fluidState(double T, double delta, Phase label, std::string_view src, std::uint32_t warn) const;
    std::uint32_t rangeWarnings(double T, double P) const;
    Result<State> solidState(double T, double P) const;
    struct GibbsV {
        double g, v, h;
    };
    std::optional<GibbsV> vapourGibbs(double T, double P) const;
    Result<GibbsV> solidGibbs(double T, double P) const;
    Result<State> solveInPhase(Phase ph, double P, Property which, double value, double Ta, double Tb,
                               const State& sa, const State& sb) const;

    Substance sub_;
    double Pc_ = 0;            // p(Tc, rho_c) of the equation
    double hOff_ = 0, sOff_ = 0;
    bool hasSolid_ = false;
    HeatCapacity cpS_;
    double Tm_ = 0, Pm_ = 0, dhFus_ = 0;
    double Ttp_ = 0, Ptp_ = 0;  // model triple point: (Tm, Psat(Tm)), or the equation's
    double Tmin_ = 0;
    double TlowValid_ = 0;      // lowest temperature without a range flag
};

// ---------------------------------------------------------------- primitives

Result<double> AmmoniaModel::density(Branch b, double T, double P) const {
    const double tau = eq::Tc / T;
    const eq::TauPowers tp = eq::tauPowers(tau);
    const double pi = P / (eq::rhoc * eq::R * T);
    // Second virial coefficient in reduced form: phir_d at delta -> 0 is the
    // sum of n tau^t over the terms with d = 1 (indices 0, 2, 7, 11, 12, 18).
    auto idealStart = [&] {
        const double B = tp.p[0] + tp.p[2] + tp.p[7] + tp.p[11] + tp.p[12] + tp.p[18];
        const double c = 1.0 + B * pi;
        return c > 0.2 ? pi / c : pi;
    };
    std::optional<double> d;
    if (b == Branch::Single || T >= eq::Tc) {
        // One monotonic isotherm. Start from the gas or, at high pressure, from a dense guess.
        const double start = pi < 0.5 ? idealStart() : std::min(3.0, 1.0 + std::log1p(pi));
        d = solveDelta(tp, pi, Branch::Liquid, 0.0, kDeltaMax, start);
    } else {
        const Ancillary& a = ancillary();
        const double dl = a.dlAt(T), dv = a.dvAt(T);
        const double divider = 0.5 * (dl + dv);
        if (b == Branch::Vapour) d = solveDelta(tp, pi, b, 0.0, divider, std::min(idealStart(), 0.999 * divider));
        else d = solveDelta(tp, pi, b, divider, kDeltaMax, dl);
    }
    if (!d)
        return makeError(std::string(b == Branch::Vapour ? "no vapour" : b == Branch::Liquid ? "no liquid" : "no fluid") +
                         " density of ammonia at " + num(T) + " K and " + num(P) + " Pa in the Tillner-Roth equation" +
                         (b == Branch::Vapour ? " (the pressure is beyond the vapour spinodal)"
                          : b == Branch::Liquid ? " (the pressure is below the liquid spinodal)"
                                                : ""));
    return *d;
}

std::uint32_t AmmoniaModel::rangeWarnings(double T, double P) const {
    std::uint32_t w = WarnNone;
    if (T < TlowValid_) w |= WarnBelowTemperatureRange;
    if (T > kTmaxValid) w |= WarnAboveTemperatureRange;
    if (P > kPmaxValid) w |= WarnAbovePressureRange;
    if (P < minPressure()) w |= WarnBelowPressureRange;
    // The equation's uncertainty grows close to the critical point
    // (Tillner-Roth et al. 1993 state larger uncertainties of cp and w there).
    if (std::abs(T / eq::Tc - 1.0) < 0.01 && std::abs(P / Pc_ - 1.0) < 0.1) w |= WarnNearCritical;
    return w;
}

State AmmoniaModel::fluidState(double T, double delta, Phase label, std::string_view src, std::uint32_t warn) const {
    const Fluid f = fluidAt(T, delta);
    State s;
    s.T = T;
    s.P = f.P;
    s.phase = label;
    s.h = f.h + hOff_;
    s.s = f.s + sOff_;
    s.v = f.v;
    s.u = s.h - s.P * s.v;
    s.cp = f.cp;
    s.cv = f.cv;
    s.w = f.w;
    s.source = src;
    s.warnings = warn | rangeWarnings(T, f.P);
    return s;
}

Result<bool> AmmoniaModel::aboveSaturation(double T, double P) const {
    const double lnRatio = std::log(P) - ancillary().lnPAt(T);
    if (lnRatio > 1e-3) return true;
    if (lnRatio < -1e-3) return false;
    auto s = saturation(T);
    if (!s) return s.error();
    return P >= s->P;
}

Result<State> AmmoniaModel::phaseState(Phase phase, double T, double P) const {
    if (!(T > 0) || !(P > 0) || !std::isfinite(T) || !std::isfinite(P))
        return makeError("the ammonia reference model needs finite T > 0 and P > 0 (got T = " + num(T) + " K, P = " +
                         num(P) + " Pa)");
    if (isTwoPhase(phase)) return makeError("phaseState needs a single phase, not " + std::string(phaseId(phase)));
    if (phase == Phase::Solid) return solidState(T, P);
    if (T < 0.5 * TlowValid_ || T > 2.0 * kTmaxSolver)
        return makeError("fluid ammonia at " + num(T) + " K is far outside the Tillner-Roth equation's range (" +
                         num(eq::Ttriple) + "–" + num(kTmaxValid) + " K)");
    if (T >= eq::Tc) {
        // Above Tc the isotherm is monotonic: one fluid, named by the pressure.
        auto d = density(Branch::Single, T, P);
        if (!d) return d.error();
        const bool superc = P >= Pc_;
        return atPressure(fluidState(T, *d, superc ? Phase::Supercritical : Phase::Vapor,
                                     superc ? kSrcSuper : kSrcVapor, WarnNone),
                          P);
    }
    auto above = aboveSaturation(T, P);
    if (!above) return above.error();
    bool liquid = phase == Phase::Liquid;
    if (phase == Phase::Supercritical) liquid = *above;  // below Tc: the stable fluid
    auto d = density(liquid ? Branch::Liquid : Branch::Vapour, T, P);
    if (!d) return d.error();
    std::uint32_t warn = WarnNone;
    if (liquid != *above) warn |= WarnMetastable;  // superheated liquid or subcooled vapour
    if (liquid && hasSolid_ && T < Tm_ * (1 - 1e-12)) warn |= WarnMetastable;  // liquid below its melting point
    // Exactly on the line both ends are stable; only a clear crossing is metastable.
    if ((warn & WarnMetastable) && !(liquid && hasSolid_ && T < Tm_ * (1 - 1e-12))) {
        auto s = saturation(T);
        if (s && std::abs(P / s->P - 1.0) < 1e-9) warn &= ~std::uint32_t(WarnMetastable);
    }
    return atPressure(fluidState(T, *d, liquid ? Phase::Liquid : Phase::Vapor, liquid ? kSrcLiquid : kSrcVapor, warn),
                      P);
}

// ---------------------------------------------------------------- solid
//
// Made exactly as the real-fluid model makes its solid (see
// peng_robinson.cpp, solidState), with this equation's liquid in place of
// the cubic's; the logic is repeated here rather than shared because the
// real-fluid file is not to change:
//   h_s(T,P) = h_l(Tm,P) - dh_fus + int_Tm^T cp_s dT,
//   s_s(T,P) = s_l(Tm,P) - dh_fus/Tm + int_Tm^T cp_s/T dT,
// so g_s(Tm,P) = g_l(Tm,P) at every P (vertical melting line, melting
// exactly reversible), and v_s = v_l(Tm,P) + (T - Tm)(dv_l/dT)_P at Tm.
Result<State> AmmoniaModel::solidState(double T, double P) const {
    if (!hasSolid_)
        return makeError("the library's ammonia has no melting data or solid cp; the reference model has no solid");
    if (!(T > 0) || !(P > 0)) return makeError("solid ammonia needs T > 0 and P > 0");
    auto d = density(Branch::Liquid, Tm_, P);
    if (!d) return d.error();
    const Fluid l = fluidAt(Tm_, *d);
    const double hl = l.h + hOff_, sl = l.s + sOff_;
    const double rho = *d * eq::rhoc;
    const double dvdT = (l.dPdT_rho / l.dPdrho_T) / (rho * rho);
    State s;
    s.T = T;
    s.P = P;
    s.phase = Phase::Solid;
    s.h = hl - dhFus_ + (cpS_.enthalpy(T) - cpS_.enthalpy(Tm_));
    s.s = sl - dhFus_ / Tm_ + (cpS_.entropy(T) - cpS_.entropy(Tm_));
    s.v = l.v + (T - Tm_) * dvdT;
    s.u = s.h - P * s.v;
    s.cp = cpS_.cp(T);
    s.source = kSrcSolid;
    s.warnings = WarnNone;
    if (T < Tmin_) s.warnings |= WarnBelowTemperatureRange;
    if (T > Tm_ * (1 + 1e-12)) s.warnings |= WarnMetastable;
    if (P > kPmaxValid) s.warnings |= WarnAbovePressureRange;
    if (!cpS_.inRange(T)) s.warnings |= WarnCpExtrapolated;
    if (std::abs(P - Pm_) > kMeltingFlagPressure) s.warnings |= WarnMeltingLineApprox;
    return s;
}

std::optional<AmmoniaModel::GibbsV> AmmoniaModel::vapourGibbs(double T, double P) const {
    auto d = density(Branch::Vapour, T, P);
    if (!d) return std::nullopt;
    const Fluid f = fluidAt(T, *d);
    const double h = f.h + hOff_, s = f.s + sOff_;
    return GibbsV{h - T * s, f.v, h};
}

Result<AmmoniaModel::GibbsV> AmmoniaModel::solidGibbs(double T, double P) const {
    auto s = solidState(T, P);
    if (!s) return s.error();
    return GibbsV{s->h - T * s->s, s->v, s->h};
}

Result<Phase> AmmoniaModel::stablePhase(double T, double P) const {
    if (!(T > 0) || !(P > 0) || !std::isfinite(T) || !std::isfinite(P))
        return makeError("the ammonia reference model needs finite T > 0 and P > 0");
    if (hasSolid_ && T <= Tm_) {
        // Below the melting temperature the liquid is never stable: solid or
        // vapour, whichever has the lower Gibbs energy.
        const auto gv = vapourGibbs(T, P);
        if (!gv) return Phase::Solid;
        auto gs = solidGibbs(T, P);
        if (!gs) return gs.error();
        return gs->g <= gv->g ? Phase::Solid : Phase::Vapor;
    }
    if (T >= eq::Tc) return P >= Pc_ ? Phase::Supercritical : Phase::Vapor;
    auto above = aboveSaturation(T, P);
    if (!above) return above.error();
    return *above ? Phase::Liquid : Phase::Vapor;
}

// ---------------------------------------------------------------- lines

Result<Sat> AmmoniaModel::saturation(double T) const {
    if (!(T <= eq::Tc))
        return makeError("no boiling above the critical temperature " + num(eq::Tc) + " K of ammonia (T = " + num(T) +
                         " K)");
    if (T < Ttp_ * (1 - 1e-12))
        return makeError("no liquid–vapour line below the triple-point temperature " + num(Ttp_) +
                         " K of ammonia (T = " + num(T) + " K)");
    // Within 1e-7 Tc of the critical point the two densities merge; the
    // equation's critical state stands for both.
    if (eq::Tc - T < 1e-7 * eq::Tc) return Sat{Pc_, 1.0, 1.0};
    const Ancillary& a = ancillary();
    const double dl = a.dlAt(T), dv = a.dvAt(T);
    if (auto s = satNewton(T, dl, dv)) return *s;
    const double pi0 = std::exp(a.lnPAt(T)) / (eq::rhoc * eq::R * T);
    if (auto s = satByPressure(T, 0.5 * (dl + dv), pi0, dl, dv)) return *s;
    return makeError("the vapour pressure of ammonia at " + num(T) + " K did not converge");
}

Result<double> AmmoniaModel::boilingTemperature(double P) const {
    if (P > Pc_)
        return makeError("no boiling above the critical pressure " + num(Pc_) + " Pa of ammonia (Tc = " + num(eq::Tc) +
                         " K)");
    if (P == Pc_) return eq::Tc;
    if (P < Ptp_ * (1 - 1e-12))
        return makeError("no boiling below the triple-point pressure " + num(Ptp_) + " Pa of ammonia; the solid "
                         "sublimates instead");
    if (P <= Ptp_) return Ttp_;
    double lo = Ttp_, hi = eq::Tc;
    double T = std::clamp(ancillary().TAt(std::log(P)), lo, hi * (1 - 1e-9));
    const double lnP = std::log(P);
    for (int it = 0; it < 100; ++it) {
        auto s = saturation(T);
        if (!s) return s.error();
        const double g = std::log(s->P) - lnP;
        if (g == 0) return T;
        if (g > 0) hi = T; else lo = T;
        // Clapeyron: d ln Psat/dT = (h_v - h_l) / (T (v_v - v_l) Psat).
        const Fluid fl = fluidAt(T, s->dl), fv = fluidAt(T, s->dv);
        const double slope = (fv.h - fl.h) / (T * (fv.v - fl.v) * s->P);
        double next = slope > 0 ? T - g / slope : -1;
        if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
        if (std::abs(next - T) <= 1e-13 * T || hi - lo <= 1e-13 * hi) return next;
        T = next;
    }
    return makeError("the boiling temperature of ammonia at " + num(P) + " Pa did not converge");
}

// Sublimation by equal Gibbs energies of the vapour and the solid: the exact
// integral of Clapeyron's equation along the model's own line.
Result<double> AmmoniaModel::sublimationPressure(double T) const {
    if (!hasSolid_) return makeError("the library's ammonia has no solid data; no sublimation line");
    if (T > Ttp_ * (1 + 1e-12))
        return makeError("no sublimation above the triple-point temperature " + num(Ttp_) + " K of ammonia");
    if (T >= Ttp_) return Ptp_;
    if (!(T > 0)) return makeError("sublimation needs T > 0");
    auto gs0 = solidGibbs(Ttp_, Ptp_);
    if (!gs0) return gs0.error();
    const auto gv0 = vapourGibbs(Ttp_, Ptp_);
    const double dh = gv0 ? gv0->h - gs0->h : dhFus_;
    // Start: Clausius–Clapeyron from the triple point.
    double P = Ptp_ * std::exp(-dh / eq::R * (1.0 / T - 1.0 / Ttp_));
    double lo = 0, hi = Ptp_;
    for (int it = 0; it < 200; ++it) {
        P = std::clamp(P, 1e-300, Ptp_);
        const auto gv = vapourGibbs(T, P);
        double next = -1;
        if (!gv) {
            hi = P;
        } else {
            auto gs = solidGibbs(T, P);
            if (!gs) return gs.error();
            const double f = (gv->g - gs->g) / (eq::R * T);  // > 0: the solid is favoured, P too high
            if (f > 0) hi = P; else lo = P;
            const double step = -f / (P * (gv->v - gs->v) / (eq::R * T));  // Newton in ln P
            if (std::abs(step) < 1e-13) return P;
            next = P * std::exp(std::clamp(step, -5.0, 5.0));
        }
        if (!(next > lo && next < hi)) next = lo > 0 ? std::sqrt(lo * hi) : 1e-3 * hi;
        if (hi - lo < 1e-14 * hi) return P;
        P = next;
    }
    return makeError("the sublimation pressure of ammonia at " + num(T) + " K did not converge");
}

Result<double> AmmoniaModel::sublimationTemperature(double P) const {
    if (!hasSolid_) return makeError("the library's ammonia has no solid data; no sublimation line");
    if (P > Ptp_ * (1 + 1e-12))
        return makeError("no sublimation above the triple-point pressure " + num(Ptp_) + " Pa of ammonia");
    if (P >= Ptp_) return Ttp_;
    auto gs0 = solidGibbs(Ttp_, Ptp_);
    if (!gs0) return gs0.error();
    const auto gv0 = vapourGibbs(Ttp_, Ptp_);
    const double dh0 = gv0 ? gv0->h - gs0->h : dhFus_;
    double T = 1.0 / (1.0 / Ttp_ - eq::R / dh0 * std::log(P / Ptp_));
    double lo = std::max(1.0, 0.05 * Ttp_), hi = Ttp_;
    for (int it = 0; it < 200; ++it) {
        T = std::clamp(T, lo, hi);
        const auto gv = vapourGibbs(T, P);
        double next = -1;
        if (!gv) {
            lo = T;
        } else {
            auto gs = solidGibbs(T, P);
            if (!gs) return gs.error();
            const double f = (gv->g - gs->g) / (eq::R * T);  // falls with T
            if (f > 0) lo = T; else hi = T;
            // d[(g_v - g_s)/(R T)]/dT = -(h_v - h_s)/(R T^2) (Gibbs–Helmholtz).
            const double df = -(gv->h - gs->h) / (eq::R * T * T);
            if (df < 0) {
                next = T - f / df;
                if (std::abs(f / df) < 1e-13 * T) return next;
            }
        }
        if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
        if (hi - lo < 1e-13 * hi) return T;
        T = next;
    }
    return makeError("the sublimation temperature of ammonia at " + num(P) + " Pa did not converge");
}

Result<double> AmmoniaModel::transitionTemperature(Transition t, double P) const {
    if (!(P > 0) || !std::isfinite(P)) return makeError("the ammonia reference model needs a finite P > 0");
    switch (t) {
        case Transition::Boiling: return boilingTemperature(P);
        case Transition::Sublimation: return sublimationTemperature(P);
        case Transition::Melting:
            if (!hasSolid_) return makeError("the library's ammonia has no solid data; no melting line");
            if (P < Ptp_ * (1 - 1e-12))
                return makeError("no melting below the triple-point pressure " + num(Ptp_) +
                                 " Pa of ammonia; the solid sublimates instead");
            return Tm_;
    }
    return makeError("unknown transition");
}

Result<double> AmmoniaModel::transitionPressure(Transition t, double T) const {
    if (!(T > 0) || !std::isfinite(T)) return makeError("the ammonia reference model needs a finite T > 0");
    switch (t) {
        case Transition::Boiling: {
            auto s = saturation(T);
            if (!s) return s.error();
            return s->P;
        }
        case Transition::Sublimation: return sublimationPressure(T);
        case Transition::Melting:
            if (!hasSolid_) return makeError("the library's ammonia has no solid data; no melting line");
            if (std::abs(T - Tm_) > 1e-9 * Tm_)
                return makeError("the model melts ammonia only at " + num(Tm_) +
                                 " K (pressure-independent melting temperature)");
            return Pm_;
    }
    return makeError("unknown transition");
}

TransitionsAtPressure AmmoniaModel::transitionsAt(double P) const {
    TransitionsAtPressure out;
    auto add = [&](Transition k, double T) { out.entries[out.count++] = {k, T}; };
    if (hasSolid_ && P < Ptp_) {
        if (auto T = sublimationTemperature(P)) add(Transition::Sublimation, *T);
        return out;
    }
    if (hasSolid_) add(Transition::Melting, Tm_);
    if (P < Pc_ && P >= Ptp_)
        if (auto T = boilingTemperature(P)) add(Transition::Boiling, *T);
    return out;
}

// ---------------------------------------------------------------- (P, x) and (T, v)

Result<State> AmmoniaModel::solveInPhase(Phase ph, double P, Property which, double value, double Ta, double Tb,
                                         const State& sa, const State& sb) const {
    return solveTemperatureInBracket([&](double T) { return phaseState(ph, T, P); }, which, value, Ta, Tb, sa, sb,
                                     1e-13, 1e-12, "ammonia", P);
}

Result<State> AmmoniaModel::stateP(double P, Property which, double value) const {
    if (!(P > 0) || !std::isfinite(P) || !std::isfinite(value))
        return makeError("the ammonia reference model needs a finite P > 0 and a finite value");
    const TransitionsAtPressure tr = transitionsAt(P);
    // The isobar as single-phase spans and the phase changes between them,
    // in rising temperature; h, s, u rise with T along it, so the first span
    // or change that holds `value` has the answer.
    double Ta = Tmin_;
    Phase phA = tr.count > 0 ? lowerPhase(tr.entries[0].kind) : Phase::Supercritical;
    if (tr.count == 0) {
        auto p = stablePhase(Ta, P);
        if (!p) return p.error();
        phA = *p;
    }
    auto sa = phaseState(phA, Ta, P);
    if (!sa) return sa.error();
    if (propertyOf(*sa, which) > value)
        return makeError("the value lies below the ammonia reference model's range at " + num(P) +
                         " Pa (lowest temperature " + num(Tmin_) + " K)");
    for (int i = 0; i <= tr.count; ++i) {
        const bool last = i == tr.count;
        const double Tb = last ? kTmaxSolver : tr.entries[i].T;
        Phase ph = phA;
        if (last && tr.count > 0) ph = upperPhase(tr.entries[tr.count - 1].kind);
        // Above the critical pressure the liquid turns supercritical smoothly;
        // phaseState(Supercritical) gives the stable fluid at every T.
        if (last && P >= Pc_ && ph != Phase::Solid) ph = Phase::Supercritical;
        auto sb = phaseState(ph, Tb, P);
        if (!sb) return sb.error();
        if (Tb > Ta && propertyOf(*sb, which) >= value) {
            auto s0 = phaseState(ph, Ta, P);
            if (!s0) return s0.error();
            return solveInPhase(ph, P, which, value, Ta, Tb, *s0, *sb);
        }
        if (last) break;
        const Transition k = tr.entries[i].kind;
        auto up = phaseState(upperPhase(k), Tb, P);
        if (!up) return up.error();
        const double lo = propertyOf(*sb, which), hi = propertyOf(*up, which);
        if (value <= hi) {
            if (!(hi > lo))
                return makeError("the " + std::string(transitionLabel(k)) +
                                 " of ammonia does not change this property here; give another one");
            return mix(*sb, *up, k, (value - lo) / (hi - lo));
        }
        Ta = Tb;
        phA = upperPhase(k);
    }
    return makeError("the value lies above the ammonia reference model's range at " + num(P) +
                     " Pa (highest temperature " + num(kTmaxSolver) + " K)");
}

Result<State> AmmoniaModel::stateTV(double T, double v) const {
    if (!(T > 0) || !(v > 0) || !std::isfinite(T) || !std::isfinite(v))
        return makeError("the ammonia reference model needs finite T > 0 and v > 0");
    // Below the model's triple point the vessel holds solid and vapour: the
    // base class finds that from the sublimation line.
    if (hasSolid_ && T < Ttp_) return PropertyModel::stateTV(T, v);
    if (T < 0.5 * TlowValid_ || T > 2.0 * kTmaxSolver)
        return makeError("ammonia at " + num(T) + " K is far outside the Tillner-Roth equation's range");
    // The equation is explicit in (T, rho): only the two-phase test needs a solve.
    const double delta = 1.0 / (v * eq::rhoc);
    if (delta > kDeltaMax)
        return makeError("specific volume " + num(v) + " m3/kg of ammonia is denser than the equation reaches");
    if (T < eq::Tc) {
        auto s = saturation(T);
        if (!s) return s.error();
        if (delta < s->dl && delta > s->dv) {
            const State l = fluidState(T, s->dl, Phase::Liquid, kSrcLiquid, WarnNone);
            const State g = fluidState(T, s->dv, Phase::Vapor, kSrcVapor, WarnNone);
            return mix(l, g, Transition::Boiling, (v - l.v) / (g.v - l.v));
        }
        const bool liquid = delta >= s->dl;
        State st = fluidState(T, delta, liquid ? Phase::Liquid : Phase::Vapor, liquid ? kSrcLiquid : kSrcVapor,
                              WarnNone);
        if (liquid && hasSolid_ && T < Tm_) st.warnings |= WarnMetastable;
        return st;
    }
    State st = fluidState(T, delta, Phase::Vapor, kSrcVapor, WarnNone);
    if (!(st.P > 0)) return makeError("no positive pressure for ammonia at " + num(T) + " K and v = " + num(v));
    if (st.P >= Pc_) {
        st.phase = Phase::Supercritical;
        st.source = kSrcSuper;
    }
    return st;
}

// ---------------------------------------------------------------- text and set-up

std::string AmmoniaModel::rangeText() const {
    return "Tillner-Roth et al. (1993) ammonia equation: " + num(eq::Ttriple) + " K to " + num(kTmaxValid) +
           " K, up to " + num(kPmaxValid / 1e6) + " MPa (gas to " + num(kTmaxSolver) +
           " K with a range warning); solid below " + num(Tm_) +
           " K from the library's solid cp and enthalpy of fusion, melting line taken as vertical";
}

std::string AmmoniaModel::sourceText() const {
    return "R. Tillner-Roth, F. Harms-Watzenberg and H. D. Baehr, \"Eine neue Fundamentalgleichung für Ammoniak\", "
           "DKV-Tagungsbericht 20 (1993) 167–181";
}

Status AmmoniaModel::init() {
    if (!ancillary().ok) return makeError("the ammonia saturation table could not be built from the equation");
    Pc_ = fluidAt(eq::Tc, 1.0).P;
    hasSolid_ = sub_.melting && sub_.cpSolid && sub_.melting->T > 150.0 && sub_.melting->T < eq::Tc;
    if (hasSolid_) {
        Tm_ = sub_.melting->T;
        Pm_ = sub_.melting->P > 0 ? sub_.melting->P : 101325.0;
        dhFus_ = sub_.melting->enthalpy;
        cpS_ = *sub_.cpSolid;
        Ttp_ = Tm_;
        Tmin_ = std::max(cpS_.Tmin(), 0.5 * Tm_);
    } else {
        Ttp_ = eq::Ttriple;
        Tmin_ = eq::Ttriple;
    }
    // The melting anchor lies 0.075 K below the equation's triple point; the
    // equation is used there without a range flag (the difference is within
    // the uncertainty of the melting data).
    TlowValid_ = std::min(eq::Ttriple, Ttp_);
    auto sat = saturation(Ttp_);
    if (!sat) return sat.error();
    Ptp_ = sat->P;
    // Reference state: the liquid at the melting anchor (melting.T,
    // melting.P) has h = 0 and s = 0, as in the real-fluid model; without
    // melting data, the saturated liquid at the normal boiling point.
    double T0 = Tm_, P0 = Pm_;
    if (!hasSolid_) {
        T0 = 239.823;  // normal boiling point of the equation (Tillner-Roth et al. 1993; NH3.Tb)
        auto s0 = saturation(T0);
        if (!s0) return s0.error();
        P0 = s0->P;
    }
    auto d = density(Branch::Liquid, T0, P0);
    if (!d) return d.error();
    const Fluid ref = fluidAt(T0, *d);
    hOff_ = -ref.h;
    sOff_ = -ref.s;
    return Ok{};
}

}  // namespace

Result<std::shared_ptr<const PropertyModel>> makeAmmoniaReferenceModel(const Substance& ammonia) {
    if (ammonia.id != "ammonia" || ammonia.custom)
        return makeError("the Tillner-Roth et al. (1993) equation is for the library's ammonia only, not \"" +
                         (ammonia.id.empty() ? ammonia.name : ammonia.id) + "\"" +
                         (ammonia.custom ? " (a custom substance)" : ""));
    auto model = std::make_shared<AmmoniaModel>(ammonia);
    auto st = model->init();
    if (!st) return st.error();
    return std::shared_ptr<const PropertyModel>(std::move(model));
}

}  // namespace heatchain
