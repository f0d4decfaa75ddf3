// Somewhat over 600 lines on purpose: the (P, h) and (P, s) inversion of
// IF97 (the direct region paths, and the hook that solves one span of the
// base class's isobar walk in pieces at the boundaries of regions 1 to 5,
// or in ice) depends on the region boundaries and backward equations that
// only this model has; the equations themselves live in if97_*.cpp and
// ice_ih.cpp.
//
// The reference model of water. IF97 regions by (T, P) for the fluid, ice Ih
// below the melting and sublimation curves, region 4 on the boiling line.
// (P, h) and (P, s) start from IF97's backward equations (R7-97 for regions
// 1 and 2, SR3-03(2014) for region 3) and are refined with Newton steps on
// the forward equations, so the state found reproduces the given h or s to
// 5e-10 relative (direct path) or ~1e-13 (walk along the isobar, used near
// phase lines and region boundaries, for mixtures, region 5 and ice).
#include "heatchain/models/water_model.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <optional>
#include <string>

#include "heatchain/models/ice_ih.hpp"
#include "heatchain/models/if97.hpp"
#include "models/number_text.hpp"
#include "numerics/root.hpp"

namespace heatchain {
namespace {

using detail::numberText;

namespace w = if97;

constexpr std::string_view kSrc1 = "IAPWS-IF97 region 1";
constexpr std::string_view kSrc2 = "IAPWS-IF97 region 2";
constexpr std::string_view kSrc2m = "IAPWS-IF97 region 2 (metastable vapour, eq. 18)";
constexpr std::string_view kSrc3 = "IAPWS-IF97 region 3";
constexpr std::string_view kSrc5 = "IAPWS-IF97 region 5";
constexpr std::string_view kSrc4 = "IAPWS-IF97 region 4 (saturation)";
constexpr std::string_view kSrcIce = "IAPWS R10-06 ice Ih";
constexpr std::string_view kSrcMelt = "IAPWS R14-08 melting curve (ice Ih, IAPWS-IF97 region 1)";
constexpr std::string_view kSrcSubl = "IAPWS R14-08 sublimation curve (ice Ih, IAPWS-IF97 region 2)";

// Relative slack when comparing a pressure with a phase line, so that a state
// computed on the line (Tsat(P), P) is never called metastable by round-off.
constexpr double kLineSlack = 1e-9;

// How far the fluid equations are used outside IF97's stated range (with a
// warning flag); beyond this a state is an error, not a number.
constexpr double kFluidTmin = 200.0;   // supercooled liquid / cold vapour
constexpr double kFluidTmax = 2500.0;
constexpr double kFluidPmax = ice::kMaxPressure;  // the liquid side of the ice Ih melting line
constexpr double kMetastableVapourPmax = 10e6;    // R7-97(2012), Sec. 6.2: eq. 18 for p ≤ 10 MPa
constexpr double kIceTmaxMetastable = 300.0;      // superheated ice, flagged

// IF97 and ice Ih give the same set of properties in their own structs.
template <class Props>
State toState(const Props& p, Phase phase, std::string_view src) {
    State s;
    s.T = p.T;
    s.P = p.P;
    s.phase = phase;
    s.h = p.h;
    s.s = p.s;
    s.u = p.u;
    s.v = p.v;
    s.cp = p.cp;
    s.cv = p.cv;
    s.w = p.w;
    s.source = src;
    return s;
}

State fromIf97(const w::Props& p, Phase phase, std::string_view src) { return toState(p, phase, src); }
State fromIce(const ice::Props& p) { return toState(p, Phase::Solid, kSrcIce); }

// IF97's range flags for a fluid state (R7-97(2012), Sec. 4).
std::uint32_t fluidRangeFlags(double T, double P) {
    std::uint32_t f = WarnNone;
    if (T < w::Tmin) f |= WarnBelowTemperatureRange;
    if (T > w::Tmax) f |= WarnAboveTemperatureRange;
    if (P > (T > w::T25 ? w::Pmax5 : w::Pmax)) f |= WarnAbovePressureRange;
    return f;
}

// A fluid State with its range flags and, in region 3 near the critical
// point, the near-critical flag (R7-97(2012), Sec. 7: least accurate there).
State labelledFluid(const w::Props& p, Phase ph, std::string_view src, double T, double P, std::uint32_t extra);

// The equilibrium fluid phase label at (T, P).
Phase fluidPhase(double T, double P) {
    if (T >= w::Tc) return P >= w::Pc ? Phase::Supercritical : Phase::Vapor;
    if (P > w::Pc) return Phase::Liquid;
    return P >= w::saturationPressure(T) ? Phase::Liquid : Phase::Vapor;
}

State labelledFluid(const w::Props& p, Phase ph, std::string_view src, double T, double P, std::uint32_t extra) {
    State s = fromIf97(p, ph, src);
    s.warnings = fluidRangeFlags(T, P) | extra;
    if (src == kSrc3 && std::fabs(T / w::Tc - 1) < 0.01 && std::fabs(P / w::Pc - 1) < 0.1)
        s.warnings |= WarnNearCritical;
    return s;
}

// ---- Direct (P, h) / (P, s) inside one IF97 region --------------------------------
// The backward equation of the region gives T within tens of mK; Newton
// steps on the region's forward equation with (dh/dT)_p = cp and
// (ds/dT)_p = cp/T then reach kDirectTol in one to three evaluations. The
// result is accepted only when it lies inside the region (checked on the
// forward boundaries); otherwise the general walk along the isobar decides.

// Stop when h or s is reproduced to this relative tolerance (forward and
// backward agree to 1e-9, the model's promise; see water_model_test.cpp).
constexpr double kDirectTol = 5e-10;

// The first probe, at the backward equation's temperature, is almost never
// the answer (tens of mK off): it forms only h, s and cp (`first`, the same
// values as `eval`), and the full state is formed where the residual may
// already be within the tolerance, so one full evaluation usually ends it.
template <class First, class Eval>
bool newtonOnIsobar(First first, Eval eval, bool H, double value, double T, w::Props& out) {
    const double tol = kDirectTol * std::max(std::fabs(value), H ? 1e3 : 1.0);
    bool atStart = true;
    auto probe = [&](double t) {
        if (atStart) {
            atStart = false;
            const w::HSCp c = first(t);
            const double f = (H ? c.h : c.s) - value;
            if (!(std::fabs(f) <= tol)) return detail::NewtonProbe{f, H ? c.cp : c.cp / t};
        }
        out = eval(t);
        return detail::NewtonProbe{(H ? out.h : out.s) - value, H ? out.cp : out.cp / t};
    };
    // Converged on the residual: `out` holds the state probed last.
    return detail::newtonPolish(probe, T, {tol, -1, 8}).has_value();
}

std::optional<State> directRegion1(double P, bool H, double value, double T0) {
    w::Props p;
    if (!newtonOnIsobar([P](double T) { return w::region1HSCp(T, P); }, [P](double T) { return w::region1(T, P); }, H,
                        value, T0, p))
        return std::nullopt;
    // Compressed liquid of region 1 (above the triple-point temperature,
    // so never supercooled): T ≤ 623.15 K and P above ps(T).
    if (!(p.T >= w::Tt && p.T <= w::T13) || P < w::saturationPressure(p.T) * (1 + kLineSlack)) return std::nullopt;
    // Above ps(T) below the critical temperature: liquid, as fluidPhase says.
    return labelledFluid(p, Phase::Liquid, kSrc1, p.T, P, WarnNone);
}

std::optional<State> directRegion2(double P, bool H, double value, double T0) {
    w::Props p;
    if (!newtonOnIsobar([P](double T) { return w::region2HSCp(T, P); }, [P](double T) { return w::region2(T, P); }, H,
                        value, T0, p))
        return std::nullopt;
    const double T = p.T;
    if (!(T >= w::Tt && T <= w::T25)) return std::nullopt;
    if (T <= w::T13) {
        if (P > w::saturationPressure(T) * (1 - kLineSlack)) return std::nullopt;
        return labelledFluid(p, Phase::Vapor, kSrc2, T, P, WarnNone);
    }
    if (T <= w::T23max && P > w::b23Pressure(T)) return std::nullopt;
    return labelledFluid(p, fluidPhase(T, P), kSrc2, T, P, WarnNone);
}

std::optional<State> directRegion3(double P, bool H, double value, double T) {
    // Below the critical pressure, leave the neighbourhood of the two-phase
    // dome (p_3sat(h) or p_3sat(s), SR3-03 eqs. 10–11) to the general walk.
    // Eqs. 10–11 hold between the saturated liquid and vapour at 623.15 K;
    // outside that span of h or s an isobar in region 3 meets no dome.
    if (P < w::Pc) {
        static const w::Props liq = w::region1(w::T13, w::saturationPressureAt623());
        static const w::Props vap = w::region2(w::T13, w::saturationPressureAt623());
        const double lo = H ? liq.h : liq.s, hi = H ? vap.h : vap.s;
        if (value >= lo && value <= hi) {
            const double psat = H ? w::region3SaturationPressure_h(value) : w::region3SaturationPressure_s(value);
            if (!(P > psat * 1.002)) return std::nullopt;
        }
    }
    double v = H ? w::region3v_ph(P, value) : w::region3v_ps(P, value);
    if (!(v > 0) || !(T > 0)) return std::nullopt;
    double rho = 1.0 / v;
    w::Props p;
    if (!w::region3Solve(P, value, H ? w::Given::Enthalpy : w::Given::Entropy, rho, T, p)) return std::nullopt;
    if (!(T >= w::T13 && T <= w::T23max) || P < w::b23Pressure(T)) return std::nullopt;
    if (T < w::Tc && P < w::Pc) {
        // A stable state lies on its own side of the dome: liquid below
        // Tsat(P) (dense), vapour above it (dilute).
        const bool liquidSide = T < w::saturationTemperature(P);
        if (liquidSide != (rho > w::rhoc)) return std::nullopt;
    }
    p.P = P;
    return labelledFluid(p, fluidPhase(T, P), kSrc3, T, P, WarnNone);
}

// The region a (P, h) or (P, s) state is tried in first, from the backward
// temperatures of regions 1 and 2 against the region boundaries; empty
// when the state is near a boundary or outside regions 1–3.
std::optional<State> directState(double P, bool H, double value) {
    if (!(P >= w::Pt && P <= w::Pmax)) return std::nullopt;
    // Each backward equation is extrapolated wildly outside its region, so a
    // seed counts only when it falls inside the region it belongs to, with a
    // margin for the backward equations' inconsistency (≤ 25 mK, R7-97(2012)
    // Sec. 5; SR3-03(2014)).
    constexpr double margin = 0.5;  // K
    const double T1 = H ? w::region1T_ph(P, value) : w::region1T_ps(P, value);
    const double p623 = w::saturationPressureAt623();
    const double T1max = P <= p623 ? w::saturationTemperature(P) : w::T13;
    if (T1 > w::Tt + margin && T1 < T1max - margin) return directRegion1(P, H, value, T1);
    if (P <= p623) {
        const double T2 = H ? w::region2T_ph(P, value) : w::region2T_ps(P, value);
        if (T2 > T1max + margin && T2 < w::T25 - margin) return directRegion2(P, H, value, T2);
        return std::nullopt;
    }
    const double Tb = w::b23Temperature(P);
    const double T3 = H ? w::region3T_ph(P, value) : w::region3T_ps(P, value);
    if (T3 > w::T13 + margin && T3 < Tb - margin) return directRegion3(P, H, value, T3);
    const double T2 = H ? w::region2T_ph(P, value) : w::region2T_ps(P, value);
    if (T2 > Tb + margin && T2 < w::T25 - margin) return directRegion2(P, H, value, T2);
    return std::nullopt;
}

class WaterReferenceModel final : public PropertyModel {
public:
    explicit WaterReferenceModel(Substance s) : substance_(std::move(s)) {}

    ModelKind kind() const override { return ModelKind::Reference; }
    std::string_view name() const override { return "IAPWS-IF97 + ice Ih (IAPWS R10-06)"; }
    std::string rangeText() const override {
        return "fluid 273.15–1073.15 K at up to 100 MPa and 1073.15–2273.15 K at up to 50 MPa "
               "(IAPWS-IF97; outside with a warning down to 200 K and up to 2500 K and 210 MPa); "
               "ice Ih up to 273.16 K and 210 MPa; melting line 251.165–273.16 K "
               "(611.657 Pa–208.566 MPa); sublimation line 50–273.16 K";
    }
    std::string sourceText() const override {
        return "IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the "
               "Thermodynamic Properties of Water and Steam; IAPWS R10-06(2009), Revised Release on the "
               "Equation of State 2006 for H2O Ice Ih; IAPWS R14-08(2011), Revised Release on the "
               "Pressure along the Melting and Sublimation Curves of Ordinary Water Substance";
    }
    const Substance& substance() const override { return substance_; }

    std::optional<std::pair<double, double>> criticalPoint() const override {
        return std::make_pair(w::Tc, w::Pc);  // R7-97(2012), eqs. 2 and 3
    }
    std::optional<std::pair<double, double>> triplePoint() const override {
        return std::make_pair(w::Tt, w::Pt);  // R7-97(2012), Sec. 2.2
    }
    double minTemperature() const override { return ice::kSublTmin; }
    double maxTemperature() const override { return w::Tmax; }
    double maxPressure() const override { return w::Pmax; }

    Result<State> phaseState(Phase phase, double T, double P) const override;
    Result<Phase> stablePhase(double T, double P) const override;
    Result<double> transitionTemperature(Transition t, double P) const override;
    Result<double> transitionPressure(Transition t, double T) const override;
    Result<State> stateTP(double T, double P) const override;
    Result<State> stateOnLineP(Transition t, double P, double fraction) const override;
    Result<State> stateOnLineT(Transition t, double T, double fraction) const override;
    Result<State> stateP(double P, Property which, double value) const override;
    TransitionsAtPressure transitionsAt(double P) const override;

protected:
    Result<std::optional<State>> solveOnIsobarSpan(const IsobarSpan& span, Property which,
                                                   double value) const override;

private:
    Result<State> fluidState(Phase requested, double T, double P) const;
    Result<State> iceState(double T, double P) const;
    Result<std::optional<State>> fluidOnIsobar(const IsobarSpan& span, Property which, double value) const;
    static std::string_view lineSource(Transition t) {
        return t == Transition::Boiling ? kSrc4 : (t == Transition::Melting ? kSrcMelt : kSrcSubl);
    }

    Substance substance_;
};

// ---- (T, P) ----------------------------------------------------------------

Result<State> WaterReferenceModel::iceState(double T, double P) const {
    if (!(T > 0) || !(P > 0)) return makeError("ice Ih needs a positive temperature and pressure");
    if (P > ice::kMaxPressure)
        return makeError("ice Ih (IAPWS R10-06) is defined up to 210 MPa; got " + numberText(P / 1e6) + " MPa");
    if (T > kIceTmaxMetastable)
        return makeError("ice Ih above " + numberText(kIceTmaxMetastable) + " K is not modelled (got " + numberText(T) + " K)");
    State s = fromIce(ice::props(T, P));
    if (T > w::Tt) s.warnings |= WarnAboveTemperatureRange | WarnMetastable;
    else if (T < ice::kSublTmin) s.warnings |= WarnBelowTemperatureRange;
    if (T <= w::Tt && T >= ice::kSublTmin) {
        const bool belowSubl = P < ice::sublimationPressure(T) * (1 - kLineSlack);
        const bool aboveMelt = T >= ice::kMeltTmin && P > ice::meltingPressure(T) * (1 + kLineSlack);
        if (belowSubl || aboveMelt) s.warnings |= WarnMetastable;
    }
    return s;
}

Result<State> WaterReferenceModel::fluidState(Phase requested, double T, double P) const {
    if (!(P > 0) || !std::isfinite(P) || !std::isfinite(T))
        return makeError("water needs a finite positive pressure, got " + numberText(P) + " Pa");
    if (T < kFluidTmin || T > kFluidTmax || P > kFluidPmax)
        return makeError("(" + numberText(T) + " K, " + numberText(P) + " Pa) is outside what IAPWS-IF97 can be stretched to (" +
                         numberText(kFluidTmin) + "–" + numberText(kFluidTmax) + " K, up to " + numberText(kFluidPmax / 1e6) + " MPa)");
    const std::uint32_t flags = fluidRangeFlags(T, P);
    const Phase eq = fluidPhase(T, P);
    auto done = [&](const w::Props& p, Phase ph, std::string_view src, std::uint32_t extra = WarnNone) {
        return labelledFluid(p, ph, src, T, P, flags | extra);
    };

    // High-temperature steam: region 5 (no phase question there).
    if (T > w::T25) return done(w::region5(T, P), eq, kSrc5);

    const bool wantLiquid = requested == Phase::Liquid;
    const bool wantVapor = requested == Phase::Vapor;

    if (T <= w::T13) {
        const double ps = w::saturationPressure(std::max(T, w::Tmin));
        if (wantVapor && P > ps * (1 + kLineSlack)) {
            // Subcooled (metastable) vapour: eq. 18 up to 10 MPa only.
            if (P > kMetastableVapourPmax || T < w::Tmin)
                return makeError("vapour at " + numberText(T) + " K and " + numberText(P / 1e6) +
                                 " MPa is beyond IF97's metastable-vapour equation (eq. 18, up to 10 MPa)");
            return done(w::region2Metastable(T, P), Phase::Vapor, kSrc2m, WarnMetastable);
        }
        if (wantLiquid && P < ps * (1 - kLineSlack))
            return done(w::region1(T, P), Phase::Liquid, kSrc1, WarnMetastable);  // superheated liquid
        if (wantVapor || (!wantLiquid && eq == Phase::Vapor)) {
            std::uint32_t extra = WarnNone;
            // Below the triple point vapour is stable only under the sublimation pressure.
            if (T < w::Tt && T >= ice::kSublTmin && P > ice::sublimationPressure(T) * (1 + kLineSlack))
                extra |= WarnMetastable;
            return done(w::region2(T, P), Phase::Vapor, kSrc2, extra);
        }
        // Liquid below the melting temperature is supercooled: between the
        // melting and sublimation lines, and everywhere below the lowest
        // temperature of the melting curve.
        const bool supercooled = T < ice::kMeltTmin ||
                                 (T < w::Tt && P < ice::meltingPressure(T) * (1 - kLineSlack) &&
                                  P >= ice::sublimationPressure(T) * (1 - kLineSlack));
        const std::uint32_t extra = supercooled ? WarnMetastable : WarnNone;
        return done(w::region1(T, P), eq == Phase::Vapor ? Phase::Liquid : eq, kSrc1, extra);
    }

    // 623.15 K < T ≤ 1073.15 K: region 2 below B23, region 3 above.
    if (T > w::T23max || P <= w::b23Pressure(T)) {
        if (wantLiquid && T < w::Tc)
            return makeError("liquid at " + numberText(T) + " K and " + numberText(P / 1e6) +
                             " MPa lies in IF97 region 2, which has no liquid branch");
        return done(w::region2(T, P), eq, kSrc2);
    }
    double rho = 0;
    if (T >= w::Tc) {
        if (!w::region3Density(T, P, P >= w::Pc ? w::Branch::Liquid : w::Branch::Vapor, rho))
            return makeError("no IF97 region 3 density at " + numberText(T) + " K, " + numberText(P / 1e6) + " MPa");
        return done(w::region3(rho, T), eq, kSrc3);
    }
    const Phase ph = wantLiquid ? Phase::Liquid : (wantVapor ? Phase::Vapor : eq);
    // Metastable only when clearly across the boiling line: liquid below or
    // vapour above the saturation pressure (region 4, eq. 30), with the same
    // slack as below 623.15 K, so both ends of a saturated state are stable.
    const double ps = w::saturationPressure(T);
    const bool meta = (ph == Phase::Liquid && P < ps * (1 - kLineSlack)) ||
                      (ph == Phase::Vapor && P > ps * (1 + kLineSlack));
    if (!w::region3Density(T, P, ph == Phase::Liquid ? w::Branch::Liquid : w::Branch::Vapor, rho))
        return makeError(std::string(phaseLabel(ph)) + " at " + numberText(T) + " K and " + numberText(P / 1e6) +
                         " MPa is past the IF97 region 3 spinodal: no such metastable state");
    return done(w::region3(rho, T), ph, kSrc3, meta ? WarnMetastable : WarnNone);
}

Result<State> WaterReferenceModel::phaseState(Phase phase, double T, double P) const {
    if (phase == Phase::Solid) return iceState(T, P);
    if (isTwoPhase(phase))
        return makeError("phaseState needs a single phase; " + std::string(phaseLabel(phase)) +
                         " states come from the phase lines");
    return fluidState(phase, T, P);
}

Result<Phase> WaterReferenceModel::stablePhase(double T, double P) const {
    if (!(T > 0) || !(P > 0)) return makeError("temperature and pressure must be positive");
    if (T < w::Tt) {
        if (T < ice::kSublTmin)
            return makeError("below " + numberText(ice::kSublTmin) + " K the sublimation curve (IAPWS R14-08) is not defined");
        if (P < ice::sublimationPressure(T)) return Phase::Vapor;
        if (T >= ice::kMeltTmin) return P > ice::meltingPressure(T) ? Phase::Liquid : Phase::Solid;
        if (P > ice::meltingPressureMax())
            return makeError("at " + numberText(T) + " K and " + numberText(P / 1e6) +
                             " MPa water is a high-pressure ice, which is not modelled (only ice Ih)");
        return Phase::Solid;
    }
    return fluidPhase(T, P);
}

Result<State> WaterReferenceModel::stateTP(double T, double P) const {
    auto ph = stablePhase(T, P);
    if (!ph) return ph.error();
    return phaseState(*ph, T, P);
}

// ---- Phase lines --------------------------------------------------------------

Result<double> WaterReferenceModel::transitionTemperature(Transition t, double P) const {
    switch (t) {
        case Transition::Boiling:
            if (!(P >= w::Pt * (1 - kLineSlack) && P <= w::Pc))
                return makeError("water boils only between the triple point (611.657 Pa) and the critical point "
                                 "(22.064 MPa); got " + numberText(P) + " Pa");
            return std::max(w::saturationTemperature(std::max(P, w::Pt)), w::Tt);
        case Transition::Melting: {
            const double T = ice::meltingTemperature(P);
            if (!std::isfinite(T))
                return makeError("the ice Ih melting curve (IAPWS R14-08) spans 251.165–273.16 K, from the triple "
                                 "point 611.657 Pa to " + numberText(ice::meltingPressureMax() / 1e6) + " MPa; got " +
                                 numberText(P) + " Pa");
            return T;
        }
        case Transition::Sublimation: {
            const double T = ice::sublimationTemperature(P);
            if (!std::isfinite(T))
                return makeError("the sublimation curve (IAPWS R14-08) spans 50–273.16 K, up to the triple point "
                                 "611.657 Pa; got " + numberText(P) + " Pa");
            return T;
        }
    }
    return makeError("unknown transition");
}

Result<double> WaterReferenceModel::transitionPressure(Transition t, double T) const {
    switch (t) {
        case Transition::Boiling:
            if (!(T >= w::Tt && T <= w::Tc))
                return makeError("water boils only between 273.16 K and the critical temperature 647.096 K; got " +
                                 numberText(T) + " K");
            return w::saturationPressure(T);
        case Transition::Melting:
            if (!(T >= ice::kMeltTmin && T <= w::Tt))
                return makeError("the ice Ih melting curve (IAPWS R14-08) spans 251.165–273.16 K; got " + numberText(T) + " K");
            return ice::meltingPressure(T);
        case Transition::Sublimation:
            if (!(T >= ice::kSublTmin && T <= w::Tt))
                return makeError("the sublimation curve (IAPWS R14-08) spans 50–273.16 K; got " + numberText(T) + " K");
            return ice::sublimationPressure(T);
    }
    return makeError("unknown transition");
}

Result<State> WaterReferenceModel::stateOnLineP(Transition t, double P, double fraction) const {
    auto s = PropertyModel::stateOnLineP(t, P, fraction);
    if (s) s->source = lineSource(t);
    return s;
}

Result<State> WaterReferenceModel::stateOnLineT(Transition t, double T, double fraction) const {
    auto s = PropertyModel::stateOnLineT(t, T, fraction);
    if (s) s->source = lineSource(t);
    return s;
}

TransitionsAtPressure WaterReferenceModel::transitionsAt(double P) const {
    TransitionsAtPressure out;
    if (P < w::Pt) {
        if (auto T = transitionTemperature(Transition::Sublimation, P)) out.entries[out.count++] = {Transition::Sublimation, *T};
        return out;
    }
    if (auto T = transitionTemperature(Transition::Melting, P)) out.entries[out.count++] = {Transition::Melting, *T};
    if (P <= w::Pc)
        if (auto T = transitionTemperature(Transition::Boiling, P)) out.entries[out.count++] = {Transition::Boiling, *T};
    return out;
}

// ---- (P, h) and (P, s) -------------------------------------------------------------

// The isobar walk is the base class's (PropertyModel::stateP: the spans
// between the phase changes of transitionsAt, the lever rule on each
// line); this model's hook solves one span. A fluid span is cut further at
// the IF97 region boundaries it crosses, each piece with its own forward
// equation and, where IF97 has one, a backward-equation start.

// One piece of an isobar's span: T in [a, b], a forward evaluation and an
// optional backward-equation seed.
struct Span {
    double a, b;
    std::function<Result<State>(double)> at;
    std::function<double(double)> seed;  // value -> T, may be empty
};

// At most four pieces in one span (liquid, region 3 liquid; or region 3
// vapour, region 2, region 5; or the four of a supercritical isobar); a
// fixed array keeps the solve allocation-free.
struct SpanList {
    std::array<Span, 4> items;
    std::size_t n = 0;
    void push_back(Span s) { items[n++] = std::move(s); }
    std::size_t size() const { return n; }
    const Span& operator[](std::size_t i) const { return items[i]; }
};

// Solves prop(T) = value on a span where prop rises with T: Newton steps
// with d(h)/dT = cp, d(s)/dT = cp/T, kept inside a shrinking bracket.
Result<State> solveSpan(const Span& sp, Property which, double value, double fa, double fb) {
    double lo = sp.a, hi = sp.b;
    double T = sp.seed ? sp.seed(value) : lo + (hi - lo) * (value - fa) / (fb - fa);
    if (!(T > lo && T < hi)) {
        // No usable start: interpolate between the span ends (the middle when
        // the lower end was not evaluated).
        const double f = std::isfinite(fa) ? std::clamp((value - fa) / (fb - fa), 0.0, 1.0) : 0.5;
        T = lo + (hi - lo) * f;
    }
    const double tol = 1e-13 * std::max(std::fabs(value), which == Property::Entropy ? 1.0 : 1e3);
    std::optional<State> last;
    std::optional<Error> failed;
    auto probe = [&](double t) {
        auto s = sp.at(t);
        if (!s) {
            failed = s.error();
            return detail::NewtonProbe{};
        }
        last = *s;
        const bool H = which == Property::Enthalpy;
        return detail::NewtonProbe{(H ? s->h : s->s) - value, H ? s->cp : s->cp / t};
    };
    // Converged when h or s is reproduced to `tol`, the bracket has closed,
    // or Newton stands still; after 60 steps the last state is the answer.
    const auto root = detail::safeguardedNewton(probe, T, lo, hi, /*rising=*/true, {0.0, 1e-14, tol, 60});
    if (failed) return *failed;
    if (!root || !last) return makeError("no convergence");
    if (root->probed) return *last;
    return sp.at(root->x);
}

Result<std::optional<State>> WaterReferenceModel::fluidOnIsobar(const IsobarSpan& span, Property which,
                                                                double value) const {
    using Found = std::optional<State>;
    const double P = span.P;
    const TransitionsAtPressure& tr = *span.transitions;
    auto prop = [which](const State& s) { return which == Property::Enthalpy ? s.h : s.s; };
    const bool H = which == Property::Enthalpy;
    auto liquid = [this, P](double T) { return fluidState(Phase::Liquid, T, P); };
    auto vapour = [this, P](double T) { return fluidState(Phase::Vapor, T, P); };
    auto any = [this, P](double T) { return fluidState(Phase::Supercritical, T, P); };
    std::function<double(double)> seed1 = [P, H](double x) { return H ? w::region1T_ph(P, x) : w::region1T_ps(P, x); };
    std::function<double(double)> seed2 = [P, H](double x) { return H ? w::region2T_ph(P, x) : w::region2T_ps(P, x); };

    // The span's pieces in rising temperature. Above the highest melting
    // pressure the isobar has no phase change and starts at the lowest
    // fluid temperature the model stretches IF97 to.
    const bool afterBoiling = !span.first() && tr.entries[span.index - 1].kind == Transition::Boiling;
    const bool beforeBoiling = !span.last() && tr.entries[span.index].kind == Transition::Boiling;
    const double Tlow = span.first() ? kFluidTmin : span.Ta, top = span.Tb;
    const double p623 = w::saturationPressureAt623();
    const double T23 = std::min(w::b23Temperature(P), w::T23max);
    SpanList spans;
    if (P < w::Pt) {  // vapour above the sublimation line
        spans.push_back({Tlow, w::T25, vapour, seed2});
        spans.push_back({w::T25, top, any, {}});
    } else if (beforeBoiling) {
        if (P <= p623) {
            spans.push_back({Tlow, top, liquid, seed1});
        } else {
            spans.push_back({Tlow, w::T13, liquid, seed1});
            spans.push_back({w::T13, top, liquid, {}});
        }
    } else if (afterBoiling) {
        if (P > p623) spans.push_back({Tlow, T23, vapour, {}});
        spans.push_back({P > p623 ? w::b23Temperature(P) : Tlow, w::T25, vapour, seed2});
        if (P <= w::Pmax5) spans.push_back({w::T25, top, any, {}});
    } else {  // above the critical pressure
        spans.push_back({Tlow, w::T13, any, seed1});
        spans.push_back({w::T13, T23, any, {}});
        spans.push_back({T23, w::T25, any, seed2});
        if (P <= w::Pmax5) spans.push_back({w::T25, top, any, {}});
    }
    // The first piece above the ice is the isobar's lowest fluid state.
    const bool lowestFluid = !afterBoiling;
    for (std::size_t i = 0; i < spans.size(); ++i) {
        const Span& sp = spans[i];
        if (!(sp.b > sp.a)) continue;
        auto sb = sp.at(sp.b);
        if (!sb) return sb.error();
        const double fb = prop(*sb);
        if (value > fb) continue;
        // The lower end is only needed below the lowest fluid state or when
        // the piece has no backward equation to start from.
        double fa = std::numeric_limits<double>::quiet_NaN();
        if ((i == 0 && lowestFluid) || !sp.seed) {
            auto sa = sp.at(sp.a);
            if (!sa) return sa.error();
            fa = prop(*sa);
            if (value < fa && i == 0 && lowestFluid) return Found{};  // below the lowest fluid state
        }
        auto st = solveSpan(sp, which, value, fa, fb);
        if (!st) return st.error();
        return Found{*st};
    }
    return Found{};
}

Result<std::optional<State>> WaterReferenceModel::solveOnIsobarSpan(const IsobarSpan& span, Property which,
                                                                   double value) const {
    if (which != Property::Enthalpy && which != Property::Entropy)
        return PropertyModel::solveOnIsobarSpan(span, which, value);
    using Found = std::optional<State>;
    const double P = span.P;
    const TransitionsAtPressure& tr = *span.transitions;
    if (!span.first() || tr.count == 0) {
        // Below the sublimation line at 50 K there is no line, but no fluid either.
        if (span.first() && P < w::Pt) return transitionTemperature(Transition::Sublimation, P).error();
        return fluidOnIsobar(span, which, value);
    }
    // Ice below the melting or sublimation line: h and s rise with T.
    auto prop = [which](const State& s) { return which == Property::Enthalpy ? s.h : s.s; };
    auto solid = iceState(span.Tb, P);
    if (!solid) return solid.error();
    if (value >= prop(*solid)) return Found{};  // on the line or above it
    Span sp{span.Ta, span.Tb, [this, P](double T) { return iceState(T, P); }, {}};
    auto cold = iceState(sp.a, P);
    if (!cold) return cold.error();
    if (value < prop(*cold))
        return makeError("no state of water at " + numberText(P) + " Pa has this " +
                         (which == Property::Enthalpy ? "enthalpy" : "entropy") + ": it is below ice Ih at " +
                         numberText(sp.a) + " K");
    auto st = solveSpan(sp, which, value, prop(*cold), prop(*solid));
    if (!st) return st.error();
    return Found{*st};
}

Result<State> WaterReferenceModel::stateP(double P, Property which, double value) const {
    if (which == Property::Enthalpy || which == Property::Entropy) {
        if (!(P > 0) || !std::isfinite(P)) return makeError("pressure must be positive, got " + numberText(P) + " Pa");
        if (!std::isfinite(value)) return makeError("the specific enthalpy or entropy is not a finite number");
        if (P > kFluidPmax)
            return makeError("pressure " + numberText(P / 1e6) + " MPa is above the model's range (" + rangeText() + ")");
        // Fast path: a state clearly inside region 1, 2 or 3.
        if (auto d = directState(P, which == Property::Enthalpy, value)) return *d;
    }
    // Otherwise the base class walks the isobar (solveOnIsobarSpan above);
    // a state on a phase line is labelled with the line's equation.
    auto s = PropertyModel::stateP(P, which, value);
    if (s && isTwoPhase(s->phase))
        s->source = lineSource(s->phase == Phase::LiquidVapor   ? Transition::Boiling
                               : s->phase == Phase::SolidLiquid ? Transition::Melting
                                                                : Transition::Sublimation);
    return s;
}

}  // namespace

Result<std::shared_ptr<const PropertyModel>> makeWaterReferenceModel(const Substance& water) {
    if (water.id != "water" || water.custom)
        return makeError("the IAPWS-IF97 reference model is for water only, not \"" + water.id + "\"");
    return std::shared_ptr<const PropertyModel>(std::make_shared<WaterReferenceModel>(water));
}

}  // namespace heatchain
