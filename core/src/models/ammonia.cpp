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
#include "models/ammonia_saturation.hpp"
#include "models/fluid_with_solid.hpp"
#include "models/number_text.hpp"
#include "numerics/root.hpp"

namespace heatchain {

namespace {

using detail::numberText;

namespace eq = detail::nh3;
using eq::Branch;
using eq::kDeltaMax;
using eq::Sat;
using eq::ancillary;
using eq::Ancillary;

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

class AmmoniaModel final : public detail::FluidWithSolidModel {
public:
    explicit AmmoniaModel(Substance s) : sub_(std::move(s)) {}
    Status init();

    ModelKind kind() const override { return ModelKind::Reference; }
    std::string_view name() const override { return kName; }
    std::string rangeText() const override;
    const Substance& substance() const override { return sub_; }
    std::string sourceText() const override;

    Result<State> phaseState(Phase phase, double T, double P) const override;
    Result<State> stateTV(double T, double v) const override;

    double maxTemperature() const override { return kTmaxSolver; }
    double maxPressure() const override { return kPmaxValid; }

private:
    // Saturation at T (Ttp_ <= T <= Tc): pressure and both reduced densities.
    Result<Sat> saturation(double T) const;
    // Reduced density of a branch at (T, P); an error naming the branch when
    // it has no root there.
    Result<double> density(Branch b, double T, double P) const;
    // Is P above the vapour pressure at T (T < Tc)? Decided from the
    // ancillary table when clearly away from the line, else exactly.
    Result<bool> aboveSaturation(double T, double P) const;

    State fluidState(double T, double delta, Phase label, std::string_view src, std::uint32_t warn) const;
    std::uint32_t rangeWarnings(double T, double P) const;

    // The hooks of FluidWithSolidModel.
    Result<MeltingLiquid> meltingLiquid(double P) const override;
    std::optional<GibbsV> vapourGibbs(double T, double P) const override;
    Result<Phase> subcriticalFluidPhase(double T, double P) const override;
    Result<double> boilingTemperature(double P) const override;
    Result<double> boilingPressure(double T) const override;
    std::string_view modelLabel() const override { return "ammonia reference model"; }

    Substance sub_;
    double hOff_ = 0, sOff_ = 0;
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
        d = eq::solveDelta(tp, pi, Branch::Liquid, 0.0, kDeltaMax, start);
    } else {
        const Ancillary& a = ancillary();
        const double dl = a.dlAt(T), dv = a.dvAt(T);
        const double divider = 0.5 * (dl + dv);
        if (b == Branch::Vapour) d = eq::solveDelta(tp, pi, b, 0.0, divider, std::min(idealStart(), 0.999 * divider));
        else d = eq::solveDelta(tp, pi, b, divider, kDeltaMax, dl);
    }
    if (!d)
        return makeError(std::string(b == Branch::Vapour ? "no vapour" : b == Branch::Liquid ? "no liquid" : "no fluid") +
                         " density of ammonia at " + numberText(T) + " K and " + numberText(P) + " Pa in the Tillner-Roth equation" +
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
        return makeError("the ammonia reference model needs finite T > 0 and P > 0 (got T = " + numberText(T) + " K, P = " +
                         numberText(P) + " Pa)");
    if (isTwoPhase(phase)) return makeError("phaseState needs a single phase, not " + std::string(phaseId(phase)));
    if (phase == Phase::Solid) return solidState(T, P);
    if (T < 0.5 * TlowValid_ || T > 2.0 * kTmaxSolver)
        return makeError("fluid ammonia at " + numberText(T) + " K is far outside the Tillner-Roth equation's range (" +
                         numberText(eq::Ttriple) + "–" + numberText(kTmaxValid) + " K)");
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

// The liquid at the melting temperature, which carries the solid
// (fluid_with_solid.hpp).
Result<AmmoniaModel::MeltingLiquid> AmmoniaModel::meltingLiquid(double P) const {
    auto d = density(Branch::Liquid, Tm_, P);
    if (!d) return d.error();
    const Fluid l = fluidAt(Tm_, *d);
    const double rho = *d * eq::rhoc;
    return MeltingLiquid{l.h + hOff_, l.s + sOff_, l.v, (l.dPdT_rho / l.dPdrho_T) / (rho * rho), WarnNone};
}

std::optional<AmmoniaModel::GibbsV> AmmoniaModel::vapourGibbs(double T, double P) const {
    auto d = density(Branch::Vapour, T, P);
    if (!d) return std::nullopt;
    const Fluid f = fluidAt(T, *d);
    const double h = f.h + hOff_, s = f.s + sOff_;
    return GibbsV{h - T * s, f.v, h};
}

Result<Phase> AmmoniaModel::subcriticalFluidPhase(double T, double P) const {
    auto above = aboveSaturation(T, P);
    if (!above) return above.error();
    return *above ? Phase::Liquid : Phase::Vapor;
}

// ---------------------------------------------------------------- lines

Result<Sat> AmmoniaModel::saturation(double T) const {
    if (!(T <= eq::Tc))
        return makeError("no boiling above the critical temperature " + numberText(eq::Tc) + " K of ammonia (T = " + numberText(T) +
                         " K)");
    if (T < Ttp_ * (1 - 1e-12))
        return makeError("no liquid–vapour line below the triple-point temperature " + numberText(Ttp_) +
                         " K of ammonia (T = " + numberText(T) + " K)");
    // Within 1e-7 Tc of the critical point the two densities merge; the
    // equation's critical state stands for both.
    if (eq::Tc - T < 1e-7 * eq::Tc) return Sat{Pc_, 1.0, 1.0};
    const Ancillary& a = ancillary();
    const double dl = a.dlAt(T), dv = a.dvAt(T);
    if (auto s = eq::satNewton(T, dl, dv)) return *s;
    const double pi0 = std::exp(a.lnPAt(T)) / (eq::rhoc * eq::R * T);
    if (auto s = eq::satByPressure(T, 0.5 * (dl + dv), pi0, dl, dv)) return *s;
    return makeError("the vapour pressure of ammonia at " + numberText(T) + " K did not converge");
}

Result<double> AmmoniaModel::boilingTemperature(double P) const {
    if (P > Pc_)
        return makeError("no boiling above the critical pressure " + numberText(Pc_) + " Pa of ammonia (Tc = " + numberText(eq::Tc) +
                         " K)");
    if (P == Pc_) return eq::Tc;
    if (P < Ptp_ * (1 - 1e-12))
        return makeError("no boiling below the triple-point pressure " + numberText(Ptp_) + " Pa of ammonia; the solid "
                         "sublimates instead");
    if (P <= Ptp_) return Ttp_;
    const double lo = Ttp_, hi = eq::Tc;
    const double lnP = std::log(P);
    std::optional<Error> failed;
    auto probe = [&](double T) {
        auto s = saturation(T);
        if (!s) {
            failed = s.error();
            return detail::NewtonProbe{};
        }
        // Clapeyron: d ln Psat/dT = (h_v - h_l) / (T (v_v - v_l) Psat).
        const Fluid fl = fluidAt(T, s->dl), fv = fluidAt(T, s->dv);
        return detail::NewtonProbe{std::log(s->P) - lnP, (fv.h - fl.h) / (T * (fv.v - fl.v) * s->P)};
    };
    const auto T = detail::safeguardedNewton(probe, std::clamp(ancillary().TAt(lnP), lo, hi * (1 - 1e-9)), lo, hi,
                                             /*rising=*/true, {1e-13, 1e-13, 0.0, 100});
    if (failed) return *failed;
    if (!T || !T->converged())
        return makeError("the boiling temperature of ammonia at " + numberText(P) + " Pa did not converge");
    return T->x;
}

Result<double> AmmoniaModel::boilingPressure(double T) const {
    auto s = saturation(T);
    if (!s) return s.error();
    return s->P;
}

// ---------------------------------------------------------------- (T, v)

Result<State> AmmoniaModel::stateTV(double T, double v) const {
    if (!(T > 0) || !(v > 0) || !std::isfinite(T) || !std::isfinite(v))
        return makeError("the ammonia reference model needs finite T > 0 and v > 0");
    // Below the model's triple point the vessel holds solid and vapour: the
    // base class finds that from the sublimation line.
    if (hasSolid_ && T < Ttp_) return PropertyModel::stateTV(T, v);
    if (T < 0.5 * TlowValid_ || T > 2.0 * kTmaxSolver)
        return makeError("ammonia at " + numberText(T) + " K is far outside the Tillner-Roth equation's range");
    // The equation is explicit in (T, rho): only the two-phase test needs a solve.
    const double delta = 1.0 / (v * eq::rhoc);
    if (delta > kDeltaMax)
        return makeError("specific volume " + numberText(v) + " m3/kg of ammonia is denser than the equation reaches");
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
    if (!(st.P > 0)) return makeError("no positive pressure for ammonia at " + numberText(T) + " K and v = " + numberText(v));
    if (st.P >= Pc_) {
        st.phase = Phase::Supercritical;
        st.source = kSrcSuper;
    }
    return st;
}

// ---------------------------------------------------------------- text and set-up

std::string AmmoniaModel::rangeText() const {
    return "Tillner-Roth et al. (1993) ammonia equation: " + numberText(eq::Ttriple) + " K to " + numberText(kTmaxValid) +
           " K, up to " + numberText(kPmaxValid / 1e6) + " MPa (gas to " + numberText(kTmaxSolver) +
           " K with a range warning); solid below " + numberText(Tm_) +
           " K from the library's solid cp and enthalpy of fusion, melting line taken as vertical";
}

std::string AmmoniaModel::sourceText() const {
    return "R. Tillner-Roth, F. Harms-Watzenberg and H. D. Baehr, \"Eine neue Fundamentalgleichung für Ammoniak\", "
           "DKV-Tagungsbericht 20 (1993) 167–181";
}

Status AmmoniaModel::init() {
    if (!ancillary().ok) return makeError("the ammonia saturation table could not be built from the equation");
    Tc_ = eq::Tc;
    Pc_ = fluidAt(eq::Tc, 1.0).P;
    Rs_ = eq::R;
    solidSource_ = kSrcSolid;
    lineTolerance_ = 1e-13;
    spanBracketTolerance_ = 1e-13;
    spanStepTolerance_ = 1e-12;
    hasLowerLimit_ = true;
    hasSolid_ = sub_.melting && sub_.cpSolid && sub_.melting->T > 150.0 && sub_.melting->T < eq::Tc;
    hasMelting_ = hasSolid_;
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
