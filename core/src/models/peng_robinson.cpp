// Peng–Robinson real-fluid model. Molar quantities inside the equation-of-
// state helpers, per-kilogram values in every State. Everything the model
// needs is computed once in the factory; afterwards the object is immutable,
// so const calls may run from several threads at once.
#include "heatchain/models/peng_robinson.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <optional>
#include <string>
#include <vector>

#include "heatchain/constants.hpp"
#include "numerics/cubic.hpp"
#include "models/fluid_with_solid.hpp"
#include "models/number_text.hpp"
#include "numerics/root.hpp"

namespace heatchain {

namespace {

using detail::numberText;

constexpr double kR = kGasConstant;
constexpr double kSqrt2 = std::numbers::sqrt2;
// Peng & Robinson (1976), eqs. (9)–(10): a_c = Ωa R²Tc²/Pc, b = Ωb R Tc/Pc,
// with Ωa ≈ 0.45724 and Ωb ≈ 0.07780. They are computed here to full double
// precision from their definition (the cubic in Z is (Z - Zc)^3 at Tc, Pc)
// because the printed 8-digit values perturb the triple root by ~1e-9, which
// moves the critical roots by ~(1e-9)^(1/3) ~ 1e-3.
struct CriticalOmegas {
    double a, b;
};
const CriticalOmegas& criticalOmegas() {
    static const CriticalOmegas k = [] {
        // Matching Z^3 - (1-B) Z^2 + (A - 3B^2 - 2B) Z - (AB - B^2 - B^3) with
        // (Z - Zc)^3: Zc = (1-B)/3, A = 3Zc^2 + 3B^2 + 2B = (1 + 4B + 10B^2)/3,
        // and AB - B^2 - B^3 = Zc^3 leaves 64 B^3 + 6 B^2 + 12 B - 1 = 0,
        // whose one real root is B.
        const double B = detail::solveCubic(6.0 / 64.0, 12.0 / 64.0, -1.0 / 64.0).z[0];
        const double Zc = (1.0 - B) / 3.0;
        return CriticalOmegas{3.0 * Zc * Zc + 3.0 * B * B + 2.0 * B, B};
    }();
    return k;
}
// Reference pressure of the ideal-gas entropy; any value works because the
// entropy offset absorbs it.
constexpr double kP0 = 1e5;

constexpr std::string_view kName = "Peng–Robinson (1978)";
constexpr std::string_view kSrcLiquid = "Peng–Robinson (1978), liquid root";
constexpr std::string_view kSrcVapor = "Peng–Robinson (1978), vapour root";
constexpr std::string_view kSrcSuper = "Peng–Robinson (1978), supercritical root";
constexpr std::string_view kSrcSolid = "Peng–Robinson (1978) with a solid from cp(solid) and the enthalpy of fusion";

struct AlphaTerm {
    double a;    // a(T) = a_c alpha(T), J m3/mol2
    double da;   // da/dT
    double d2a;  // d2a/dT2
};

// One admissible root of the cubic evaluated into residual properties
// (molar, relative to the ideal gas at the same T and P).
struct RootEval {
    double Z = 0;
    double vm = 0;     // molar volume before translation, m3/mol
    double hRes = 0;   // J/mol
    double sRes = 0;   // J/(mol K)
    double lnPhi = 0;  // ln fugacity coefficient
    double cvRes = 0;  // J/(mol K)
    double dPdT = 0;   // (dP/dT)_v, Pa/K
    double dPdv = 0;   // (dP/dv)_T, Pa mol/m3
};

struct Roots {
    double liquid = 0;  // smallest admissible Z
    double vapor = 0;   // largest admissible Z
    bool two = false;   // liquid and vapour are distinct roots
    bool single = false;
    bool singleIsLiquidLike = false;  // for a single root: left of the inflection
    double A = 0, B = 0;
};

class PengRobinsonModel final : public detail::FluidWithSolidModel {
public:
    explicit PengRobinsonModel(Substance s) : sub_(std::move(s)) {}

    // The factory's second step; returns an error when the substance data
    // cannot make a working model (for instance no liquid at the anchor).
    Status init();

    ModelKind kind() const override { return ModelKind::RealFluid; }
    std::string_view name() const override { return kName; }
    std::string rangeText() const override;
    const Substance& substance() const override { return sub_; }
    std::string sourceText() const override;

    Result<State> phaseState(Phase phase, double T, double P) const override;

    double maxTemperature() const override { return Tmax_; }
    double maxPressure() const override { return 10.0 * Pc_; }

private:
    struct Saturation {
        double P = 0;
        RootEval liquid, vapor;
    };

    AlphaTerm alpha(double T) const;
    Roots roots(double T, double P, const AlphaTerm& al) const;
    RootEval evalRoot(double T, double P, double Z, const AlphaTerm& al, bool full) const;
    State fluidState(double T, double P, const RootEval& r, Phase label, std::string_view src,
                     std::uint32_t warnings) const;
    std::uint32_t rangeWarnings(double T, double P) const;

    // Saturation pressure at T with both ends; pStart is an optional guess.
    Result<Saturation> saturation(double T, double pStart = 0) const;

    // The hooks of FluidWithSolidModel.
    Result<MeltingLiquid> meltingLiquid(double P) const override;
    std::optional<GibbsV> vapourGibbs(double T, double P) const override;
    Result<Phase> subcriticalFluidPhase(double T, double P) const override;
    Result<double> boilingTemperature(double P) const override;
    Result<double> boilingPressure(double T) const override;
    std::string_view modelLabel() const override { return "real-fluid model"; }

    Substance sub_;
    HeatCapacity cp0_;
    double M_ = 0, omega_ = 0;
    double ac_ = 0, b_ = 0, kappa_ = 0;
    bool twu_ = false;
    double twuL_ = 0, twuM_ = 0, twuN_ = 0;
    double shift_ = 0;  // Péneloux c, m3/mol
    double hOff_ = 0, sOff_ = 0;
    double Tmax_ = 0;
};

// ---------------------------------------------------------------- EOS core

AlphaTerm PengRobinsonModel::alpha(double T) const {
    if (twu_) {
        // Twu et al. (1991): alpha = Tr^(N(M-1)) exp(L (1 - Tr^(N M))).
        const double Tr = T / Tc_;
        const double nm = twuN_ * twuM_;
        const double trnm = std::pow(Tr, nm);
        const double lnA = twuN_ * (twuM_ - 1.0) * std::log(Tr) + twuL_ * (1.0 - trnm);
        const double al = std::exp(lnA);
        const double g = (twuN_ * (twuM_ - 1.0) - twuL_ * nm * trnm) / T;            // d ln(alpha)/dT
        const double dg = (-twuN_ * (twuM_ - 1.0) - twuL_ * nm * (nm - 1.0) * trnm) / (T * T);
        return {ac_ * al, ac_ * al * g, ac_ * al * (g * g + dg)};
    }
    // Peng–Robinson (1976) eq. (12): alpha = [1 + kappa (1 - sqrt(Tr))]^2.
    const double sT = std::sqrt(T);
    const double sTc = std::sqrt(Tc_);
    const double m = 1.0 + kappa_ * (1.0 - sT / sTc);
    const double dm = -kappa_ / (2.0 * sT * sTc);
    const double d2m = kappa_ / (4.0 * sTc * T * sT);
    return {ac_ * m * m, ac_ * 2.0 * m * dm, ac_ * 2.0 * (dm * dm + m * d2m)};
}

Roots PengRobinsonModel::roots(double T, double P, const AlphaTerm& al) const {
    Roots r;
    const double RT = kR * T;
    r.A = al.a * P / (RT * RT);
    r.B = b_ * P / RT;
    const double A = r.A, B = r.B;
    // Peng & Robinson (1976) eq. (5): Z^3 - (1-B) Z^2 + (A - 3B^2 - 2B) Z - (AB - B^2 - B^3) = 0.
    const detail::CubicRoots c = detail::solveCubic(-(1.0 - B), A - 3.0 * B * B - 2.0 * B, -(A * B - B * B - B * B * B));
    // Admissible roots have v > b, i.e. Z > B.
    double lo = std::numeric_limits<double>::infinity(), hi = -lo;
    int n = 0;
    for (int i = 0; i < c.count; ++i) {
        if (c.z[i] > B) {
            lo = std::min(lo, c.z[i]);
            hi = std::max(hi, c.z[i]);
            ++n;
        }
    }
    if (n == 0) {  // cannot happen for P > 0 (the cubic is negative at Z = B); guard anyway
        lo = hi = std::max(c.z[c.count - 1], B * (1 + 1e-12));
        n = 1;
    }
    r.liquid = lo;
    r.vapor = hi;
    r.two = (n >= 2) && (hi - lo > 1e-12 * hi);
    r.single = !r.two;
    // A lone real root lies left of the complex pair's real part exactly when
    // it is below the inflection point (1 - B)/3 of the cubic.
    r.singleIsLiquidLike = r.single && lo < (1.0 - B) / 3.0;
    return r;
}

RootEval PengRobinsonModel::evalRoot(double T, double P, double Z, const AlphaTerm& al, bool full) const {
    RootEval e;
    const double RT = kR * T;
    const double B = b_ * P / RT;
    const double A = al.a * P / (RT * RT);
    e.Z = Z;
    e.vm = Z * RT / P;
    // L = ln[(Z + (1+√2)B) / (Z + (1-√2)B)], the integral of the attractive term.
    const double L = std::log((Z + (1.0 + kSqrt2) * B) / (Z + (1.0 - kSqrt2) * B));
    const double lnZB = std::log(Z - B);
    // Peng & Robinson (1976) eq. (15) for the fugacity coefficient.
    e.lnPhi = Z - 1.0 - lnZB - A / (2.0 * kSqrt2 * B) * L;
    // Departures at fixed (T, P) from the residual Helmholtz energy
    // A_res(T,v) = RT ln(v/(v-b)) - a/(2√2 b) L:
    //   h_res = RT(Z-1) + (T a' - a)/(2√2 b) L,   s_res = R ln(Z-B) + a'/(2√2 b) L.
    const double k = L / (2.0 * kSqrt2 * b_);
    e.hRes = RT * (Z - 1.0) + (T * al.da - al.a) * k;
    e.sRes = kR * lnZB + al.da * k;
    if (full) {
        const double v = e.vm;
        const double den = v * v + 2.0 * b_ * v - b_ * b_;
        e.cvRes = T * al.d2a * k;
        e.dPdT = kR / (v - b_) - al.da / den;
        e.dPdv = -RT / ((v - b_) * (v - b_)) + al.a * (2.0 * v + 2.0 * b_) / (den * den);
    }
    return e;
}

std::uint32_t PengRobinsonModel::rangeWarnings(double T, double P) const {
    std::uint32_t w = WarnNone;
    if (T < Tmin_) w |= WarnBelowTemperatureRange;
    if (T > Tmax_) w |= WarnAboveTemperatureRange;
    if (P > maxPressure()) w |= WarnAbovePressureRange;
    if (P < minPressure()) w |= WarnBelowPressureRange;
    // Cubic equations are least accurate around the critical point (common practice).
    if (std::abs(T / Tc_ - 1.0) < 0.03 && std::abs(P / Pc_ - 1.0) < 0.3) w |= WarnNearCritical;
    return w;
}

State PengRobinsonModel::fluidState(double T, double P, const RootEval& r, Phase label, std::string_view src,
                                    std::uint32_t warnings) const {
    State s;
    s.T = T;
    s.P = P;
    s.phase = label;
    // Péneloux translation: v = v_PR - c. With c constant, g shifts by -P c,
    // so h shifts by -P c while s and u are unchanged, and both phases'
    // fugacities shift alike: the saturation line does not move.
    const double vm = r.vm - shift_;
    s.v = vm / M_;
    s.h = cp0_.enthalpy(T) + (r.hRes - P * shift_) / M_ + hOff_;
    s.s = cp0_.entropy(T) - kR / M_ * std::log(P / kP0) + r.sRes / M_ + sOff_;
    s.u = s.h - P * s.v;
    const double cp0m = cp0_.cp(T) * M_;
    const double cv = cp0m - kR + r.cvRes;
    if (r.dPdv < 0) {
        const double cp = cv - T * r.dPdT * r.dPdT / r.dPdv;
        s.cp = cp / M_;
        s.cv = cv / M_;
        // w^2 = -(v^2/M) (cp/cv) (dP/dv)_T with the untranslated molar volume.
        s.w = std::sqrt(-(r.vm * r.vm / M_) * (cp / cv) * r.dPdv);
    }
    s.source = src;
    s.warnings = warnings | rangeWarnings(T, P);
    if (!cp0_.inRange(T)) s.warnings |= WarnCpExtrapolated;
    return s;
}

// ---------------------------------------------------------------- phases

Result<State> PengRobinsonModel::phaseState(Phase phase, double T, double P) const {
    if (!(T > 0) || !(P > 0) || !std::isfinite(T) || !std::isfinite(P))
        return makeError("the real-fluid model needs T > 0 and P > 0 (got T = " + numberText(T) +
                         " K, P = " + numberText(P) + " Pa)");
    if (isTwoPhase(phase))
        return makeError("phaseState needs a single phase, not " + std::string(phaseId(phase)));
    if (phase == Phase::Solid) return solidState(T, P);

    const AlphaTerm al = alpha(T);
    const Roots r = roots(T, P, al);
    std::uint32_t warn = WarnNone;
    if (T >= Tc_) {
        // Above Tc the isotherm is monotonic: one root, no liquid/vapour distinction.
        const RootEval e = evalRoot(T, P, r.vapor, al, true);
        const bool superc = P >= Pc_;
        if (phase == Phase::Liquid && !superc) warn |= WarnCubicFallback;
        return fluidState(T, P, e, superc ? Phase::Supercritical : Phase::Vapor, superc ? kSrcSuper : kSrcVapor, warn);
    }
    bool wantLiquid = phase == Phase::Liquid;
    if (phase == Phase::Supercritical) {  // below Tc: take the stable root
        wantLiquid = r.two ? false : r.singleIsLiquidLike;
        if (r.two) {
            const RootEval l = evalRoot(T, P, r.liquid, al, false);
            const RootEval v = evalRoot(T, P, r.vapor, al, false);
            wantLiquid = l.lnPhi <= v.lnPhi;
        }
    }
    double Z;
    Phase label;
    if (r.two) {
        Z = wantLiquid ? r.liquid : r.vapor;
        label = wantLiquid ? Phase::Liquid : Phase::Vapor;
        const double Zo = wantLiquid ? r.vapor : r.liquid;
        const RootEval e = evalRoot(T, P, Z, al, true);
        const RootEval o = evalRoot(T, P, Zo, al, false);
        if (e.lnPhi > o.lnPhi + 1e-9) warn |= WarnMetastable;
        return fluidState(T, P, e, label, wantLiquid ? kSrcLiquid : kSrcVapor, warn);
    }
    Z = r.liquid;
    const bool liquidLike = r.singleIsLiquidLike || P >= Pc_;
    label = liquidLike ? Phase::Liquid : Phase::Vapor;
    if (liquidLike != wantLiquid && phase != Phase::Supercritical) warn |= WarnCubicFallback;
    const RootEval e = evalRoot(T, P, Z, al, true);
    return fluidState(T, P, e, label, liquidLike ? kSrcLiquid : kSrcVapor, warn);
}

std::optional<PengRobinsonModel::GibbsV> PengRobinsonModel::vapourGibbs(double T, double P) const {
    const AlphaTerm al = alpha(T);
    const Roots r = roots(T, P, al);
    if (r.single && r.singleIsLiquidLike && T < Tc_) return std::nullopt;
    const RootEval e = evalRoot(T, P, r.vapor, al, false);
    const double h = cp0_.enthalpy(T) + (e.hRes - P * shift_) / M_ + hOff_;
    const double s = cp0_.entropy(T) - kR / M_ * std::log(P / kP0) + e.sRes / M_ + sOff_;
    return GibbsV{h - T * s, (e.vm - shift_) / M_, h};
}

// The liquid root at the melting temperature, which carries the solid
// (fluid_with_solid.hpp).
Result<PengRobinsonModel::MeltingLiquid> PengRobinsonModel::meltingLiquid(double P) const {
    const AlphaTerm al = alpha(Tm_);
    const Roots r = roots(Tm_, P, al);
    std::uint32_t warn = WarnNone;
    if (r.single && !r.singleIsLiquidLike) warn |= WarnCubicFallback;
    const RootEval e = evalRoot(Tm_, P, r.liquid, al, true);
    MeltingLiquid l{};
    l.h = cp0_.enthalpy(Tm_) + (e.hRes - P * shift_) / M_ + hOff_;
    l.s = cp0_.entropy(Tm_) - kR / M_ * std::log(P / kP0) + e.sRes / M_ + sOff_;
    l.v = (e.vm - shift_) / M_;
    l.dvdT = -(e.dPdT / e.dPdv) / M_;  // (∂v/∂T)_P per kg
    l.warnings = warn;
    return l;
}

Result<Phase> PengRobinsonModel::subcriticalFluidPhase(double T, double P) const {
    const AlphaTerm al = alpha(T);
    const Roots r = roots(T, P, al);
    if (r.two) {
        const RootEval l = evalRoot(T, P, r.liquid, al, false);
        const RootEval v = evalRoot(T, P, r.vapor, al, false);
        return l.lnPhi <= v.lnPhi ? Phase::Liquid : Phase::Vapor;
    }
    return (r.singleIsLiquidLike || P >= Pc_) ? Phase::Liquid : Phase::Vapor;
}

// ---------------------------------------------------------------- lines

Result<PengRobinsonModel::Saturation> PengRobinsonModel::saturation(double T, double pStart) const {
    if (T > Tc_)
        return makeError("no boiling above the critical temperature Tc = " + numberText(Tc_) + " K of " + who() +
                         " (T = " + numberText(T) + " K)");
    if (hasLowerLimit_ && T < Ttp_ * (1 - 1e-12))
        return makeError("no liquid–vapour line below the triple-point temperature " + numberText(Ttp_) + " K of " +
                         who() + " (T = " + numberText(T) + " K)");
    const AlphaTerm al = alpha(T);
    Saturation out;
    if (Tc_ - T < 1e-7 * Tc_) {  // the two roots merge; the critical point of PR is (Tc, Pc) by construction
        const Roots r = roots(T, Pc_, al);
        out.P = Pc_;
        out.liquid = evalRoot(T, Pc_, r.liquid, al, true);
        out.vapor = evalRoot(T, Pc_, r.vapor, al, true);
        return out;
    }
    // Start: Wilson's correlation (ln Pr = 5.373 (1 + ω)(1 - 1/Tr)), from memory.
    double P = pStart > 0 ? pStart : Pc_ * std::exp(5.373 * (1.0 + omega_) * (1.0 - Tc_ / T));
    P = std::min(P, Pc_ * 0.999999);
    // Equal fugacities: Newton in ln P on f = lnφ_L - lnφ_V, which falls with
    // P, with df/dlnP = Z_L - Z_V exactly. One root only: vapour-like means P
    // is below the liquid spinodal (too low), liquid-like above the vapour
    // spinodal (too high). The bracket is open below (P > 0) and steps down a
    // decade at a time until a probe bounds it; steps are cut to e^±2.
    Roots last{};
    double lastP = P;
    auto probe = [&](double p) {
        lastP = p;
        last = roots(T, p, al);
        if (!last.two)
            return last.singleIsLiquidLike ? detail::NewtonProbe::rootBelow() : detail::NewtonProbe::rootAbove();
        const RootEval l = evalRoot(T, p, last.liquid, al, false);
        const RootEval v = evalRoot(T, p, last.vapor, al, false);
        return detail::NewtonProbe{l.lnPhi - v.lnPhi, l.Z - v.Z};
    };
    const auto x = detail::safeguardedNewton(probe, P, 0.0, Pc_, /*rising=*/false,
                                             {1e-12, 1e-14, 0.0, 200, /*logScale=*/true, 2.0, 0.1});
    if (!x || !x->converged())
        return makeError("the saturation pressure of " + who() + " at " + numberText(T) + " K did not converge");
    // The point probed last: the saturation (its Newton step was below the
    // tolerance), or where the bracket collapsed onto a merged-root region.
    out.P = lastP;
    out.liquid = evalRoot(T, lastP, last.liquid, al, true);
    out.vapor = evalRoot(T, lastP, last.vapor, al, true);
    return out;
}

Result<double> PengRobinsonModel::boilingTemperature(double P) const {
    if (P > Pc_)
        return makeError("no boiling above the critical pressure Pc = " + numberText(Pc_) + " Pa of " + who() +
                         " (Tc = " + numberText(Tc_) + " K)");
    if (P == Pc_) return Tc_;
    if (hasLowerLimit_ && P < Ptp_)
        return makeError("no boiling below the triple-point pressure " + numberText(Ptp_) + " Pa of " + who() +
                         "; the solid sublimates instead");
    const double lo = hasLowerLimit_ ? Ttp_ : 0.2 * Tc_, hi = Tc_;
    // Start: Wilson's correlation inverted.
    const double T0 = std::clamp(Tc_ / (1.0 - std::log(P / Pc_) / (5.373 * (1.0 + omega_))), lo, hi * (1 - 1e-9));
    double pGuess = P;  // each saturation starts from the last one's pressure
    std::optional<Error> failed;
    auto probe = [&](double T) {
        auto sat = saturation(T, pGuess);
        if (!sat) {
            failed = sat.error();
            return detail::NewtonProbe{};
        }
        pGuess = sat->P;
        // Clapeyron: dlnPsat/dT = Δh/(R T^2 ΔZ).
        const double dZ = sat->vapor.Z - sat->liquid.Z;
        const double slope = (sat->vapor.hRes - sat->liquid.hRes) / (kR * T * T * dZ);
        return detail::NewtonProbe{std::log(sat->P / P), dZ > 0 ? slope : std::numeric_limits<double>::quiet_NaN()};
    };
    const auto T = detail::safeguardedNewton(probe, T0, lo, hi, /*rising=*/true, {1e-12, 0.0, 1e-12, 100});
    if (failed) return *failed;
    if (!T || !T->converged())
        return makeError("the boiling temperature of " + who() + " at " + numberText(P) + " Pa did not converge");
    return T->x;
}

Result<double> PengRobinsonModel::boilingPressure(double T) const {
    auto s = saturation(T);
    if (!s) return s.error();
    return s->P;
}

// ---------------------------------------------------------------- text

std::string PengRobinsonModel::rangeText() const {
    auto g = numberText;
    return "Peng–Robinson real fluid for " + (sub_.name.empty() ? who() : sub_.name) + ": " + g(Tmin_) +
           " K to " + g(Tmax_) + " K, up to " + g(maxPressure() / 1e6) +
           " MPa; least accurate near the critical point and for liquid densities "
           "(few percent) unless a volume shift is given";
}

std::string PengRobinsonModel::sourceText() const {
    std::string s =
        "D.-Y. Peng and D. B. Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59–64; "
        "D. B. Robinson and D.-Y. Peng, GPA Research Report RR-28 (1978)";
    if (twu_) s += "; C. H. Twu et al., Fluid Phase Equilib. 69 (1991) 33–50 (alpha function)";
    if (shift_ != 0) s += "; A. Péneloux, E. Rauzy and R. Fréze, Fluid Phase Equilib. 8 (1982) 7–23 (volume translation)";
    return s;
}

// ---------------------------------------------------------------- set-up

Status PengRobinsonModel::init() {
    const CriticalPoint& c = *sub_.critical;
    Tc_ = c.T;
    Pc_ = c.P;
    omega_ = c.acentricFactor;
    M_ = sub_.molarMass;
    Rs_ = kR / M_;
    solidSource_ = kSrcSolid;
    lineTolerance_ = 1e-12;
    spanBracketTolerance_ = 1e-12;
    spanStepTolerance_ = 1e-11;
    cp0_ = *sub_.cpVapor;
    ac_ = criticalOmegas().a * kR * kR * Tc_ * Tc_ / Pc_;
    b_ = criticalOmegas().b * kR * Tc_ / Pc_;
    // kappa: Peng & Robinson (1976) eq. (13) for ω ≤ 0.491; Robinson & Peng
    // (1978) polynomial above (coefficients from memory).
    const double w = omega_;
    kappa_ = w <= 0.491 ? 0.37464 + 1.54226 * w - 0.26992 * w * w
                        : 0.379642 + 1.48503 * w - 0.164423 * w * w + 0.016666 * w * w * w;
    if (sub_.pengRobinson) {
        const auto& pr = *sub_.pengRobinson;
        if (pr.twuL && pr.twuM && pr.twuN) {
            twu_ = true;
            twuL_ = *pr.twuL;
            twuM_ = *pr.twuM;
            twuN_ = *pr.twuN;
        }
        if (pr.volumeShift) shift_ = *pr.volumeShift;
    }

    hasMelting_ = sub_.melting.has_value() && sub_.melting->T > 0 && sub_.melting->T < Tc_;
    hasSolid_ = hasMelting_ && sub_.cpSolid.has_value();
    if (hasMelting_) {
        Tm_ = sub_.melting->T;
        Pm_ = sub_.melting->P > 0 ? sub_.melting->P : 101325.0;
        dhFus_ = sub_.melting->enthalpy;
        if (hasSolid_) cpS_ = *sub_.cpSolid;
        hasLowerLimit_ = true;
        Ttp_ = Tm_;
    } else if (sub_.triple && sub_.triple->T > 0 && sub_.triple->T < Tc_) {
        hasLowerLimit_ = true;
        Ttp_ = sub_.triple->T;
    }
    Tmin_ = hasSolid_ ? std::max(cpS_.Tmin(), 0.5 * Tm_) : (hasLowerLimit_ ? Ttp_ : 0.3 * Tc_);
    Tmax_ = std::isfinite(cp0_.Tmax()) ? std::max(cp0_.Tmax(), Tc_ * 1.05) : 3.0 * Tc_;
    if (hasLowerLimit_) {
        auto s = saturation(Ttp_);
        if (!s) return s.error();
        Ptp_ = s->P;
    }

    // Reference state: liquid at the melting anchor, else the saturated
    // liquid at the normal boiling temperature, else at the triple point,
    // else at 0.7 Tc; h = 0 and s = 0 there.
    double T0, P0;
    if (hasMelting_) {
        T0 = Tm_;
        P0 = Pm_;
    } else {
        T0 = (sub_.boiling && sub_.boiling->T > 0 && sub_.boiling->T < Tc_) ? sub_.boiling->T
             : hasLowerLimit_                                                 ? Ttp_
                                                                              : 0.7 * Tc_;
        auto s = saturation(T0);
        if (!s) return s.error();
        P0 = s->P;
    }
    auto ref = phaseState(Phase::Liquid, T0, P0);
    if (!ref) return ref.error();
    if (ref->warnings & WarnCubicFallback)
        return makeError("the Peng–Robinson cubic of " + who() + " has no liquid root at the reference point " +
                         numberText(T0) + " K");
    hOff_ = -ref->h;
    sOff_ = -ref->s;
    return Ok{};
}

}  // namespace

Result<std::shared_ptr<const PropertyModel>> makePengRobinsonModel(const Substance& substance) {
    const std::string who = substance.id.empty() ? substance.name : substance.id;
    if (!substance.critical)
        return makeError(who + " has no critical point in the library; the real-fluid model needs it");
    if (!(substance.critical->T > 0) || !(substance.critical->P > 0))
        return makeError(who + " has a critical point without a positive temperature and pressure; the real-fluid model needs both");
    if (!(substance.molarMass > 0))
        return makeError(who + " has no molar mass in the library; the real-fluid model needs it");
    if (!substance.cpVapor)
        return makeError(who + " has no ideal-gas heat capacity (cp.vapor) in the library; the real-fluid model needs it");
    if (substance.pengRobinson && (substance.pengRobinson->twuL || substance.pengRobinson->twuM ||
                                   substance.pengRobinson->twuN) &&
        !(substance.pengRobinson->twuL && substance.pengRobinson->twuM && substance.pengRobinson->twuN))
        return makeError(who + " gives only some of the Twu alpha parameters L, M, N; the real-fluid model needs all three or none");
    auto model = std::make_shared<PengRobinsonModel>(substance);
    auto st = model->init();
    if (!st) return st.error();
    return std::shared_ptr<const PropertyModel>(std::move(model));
}

}  // namespace heatchain
