// The solid, the phase-change lines and the isobar spans shared by the fluid
// equations of state (fluid_with_solid.hpp says how the solid is made).
#include "models/fluid_with_solid.hpp"

#include "models/number_text.hpp"
#include "numerics/root.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>

namespace heatchain::detail {

std::string FluidWithSolidModel::who() const {
    const Substance& s = substance();
    return s.id.empty() ? s.name : s.id;
}

// ---------------------------------------------------------------- solid

Result<State> FluidWithSolidModel::solidState(double T, double P) const {
    if (!hasMelting_)
        return makeError(who() + " has no melting data in the library; the " + std::string(modelLabel()) +
                         " needs it for a solid");
    if (!hasSolid_)
        return makeError(who() + " has no solid heat capacity (cp.solid) in the library; the " +
                         std::string(modelLabel()) + " needs it for a solid");
    if (!(T > 0) || !(P > 0)) return makeError("a solid needs T > 0 and P > 0");
    auto l = meltingLiquid(P);
    if (!l) return l.error();
    State s;
    s.T = T;
    s.P = P;
    s.phase = Phase::Solid;
    s.h = l->h - dhFus_ + (cpS_.enthalpy(T) - cpS_.enthalpy(Tm_));
    s.s = l->s - dhFus_ / Tm_ + (cpS_.entropy(T) - cpS_.entropy(Tm_));
    s.v = l->v + (T - Tm_) * l->dvdT;
    s.u = s.h - P * s.v;
    s.cp = cpS_.cp(T);
    s.source = solidSource_;
    s.warnings = l->warnings;
    if (T < Tmin_) s.warnings |= WarnBelowTemperatureRange;
    if (T > Tm_ * (1 + 1e-12)) s.warnings |= WarnMetastable;
    if (P > maxPressure()) s.warnings |= WarnAbovePressureRange;
    if (!cpS_.inRange(T)) s.warnings |= WarnCpExtrapolated;
    // Above this distance from the melting anchor pressure the pressure-
    // independent melting temperature is flagged (common practice: melting
    // temperatures move by roughly 0.01–0.3 K/MPa).
    constexpr double kMeltingFlagPressure = 5e6;
    if (std::abs(P - Pm_) > kMeltingFlagPressure) s.warnings |= WarnMeltingLineApprox;
    return s;
}

Result<FluidWithSolidModel::GibbsV> FluidWithSolidModel::solidGibbs(double T, double P) const {
    auto s = solidState(T, P);
    if (!s) return s.error();
    return GibbsV{s->h - T * s->s, s->v, s->h};
}

Result<Phase> FluidWithSolidModel::stablePhase(double T, double P) const {
    if (!(T > 0) || !(P > 0) || !std::isfinite(T) || !std::isfinite(P))
        return makeError("the " + std::string(modelLabel()) + " needs finite T > 0 and P > 0");
    if (hasSolid_ && T <= Tm_) {
        // Below the melting temperature the liquid is never stable: solid or
        // vapour, whichever has the lower Gibbs energy.
        const auto gv = vapourGibbs(T, P);
        if (!gv) return Phase::Solid;
        const auto gs = solidGibbs(T, P);
        if (!gs) return gs.error();
        return gs->g <= gv->g ? Phase::Solid : Phase::Vapor;
    }
    if (T >= Tc_) return P >= Pc_ ? Phase::Supercritical : Phase::Vapor;
    return subcriticalFluidPhase(T, P);
}

// ---------------------------------------------------------------- lines

Result<double> FluidWithSolidModel::sublimationPressure(double T) const {
    if (!hasSolid_)
        return makeError(who() + " has no solid in the " + std::string(modelLabel()) +
                         " (needs melting data and cp.solid)");
    if (T > Ttp_ * (1 + 1e-12))
        return makeError("no sublimation above the triple-point temperature " + numberText(Ttp_) + " K of " + who());
    if (T >= Ttp_) return Ptp_;
    auto gs0 = solidGibbs(Ttp_, Ptp_);
    if (!gs0) return gs0.error();
    const auto gv0 = vapourGibbs(Ttp_, Ptp_);
    const double dh = gv0 ? gv0->h - gs0->h : dhFus_;
    // Start: Clausius–Clapeyron from the triple point with Δh_sub there;
    // then Newton in ln P on (g_v - g_s)/(R T), whose slope is
    // P (v_v - v_s)/(R T), kept inside a shrinking bracket (the vapour root
    // vanishes above the vapour spinodal: too high). The bracket is open
    // below and steps down three decades at a time until a probe bounds it;
    // steps are cut to e^±5.
    const double P0 = Ptp_ * std::exp(-dh / Rs_ * (1.0 / T - 1.0 / Ttp_));
    double lastP = P0;
    std::optional<Error> failed;
    auto probe = [&](double P) {
        lastP = P;
        const auto gv = vapourGibbs(T, P);
        if (!gv) return NewtonProbe::rootBelow();
        const auto gs = solidGibbs(T, P);
        if (!gs) {
            failed = gs.error();
            return NewtonProbe{};
        }
        // f > 0: the solid is favoured, P too high.
        return NewtonProbe{(gv->g - gs->g) / (Rs_ * T), P * (gv->v - gs->v) / (Rs_ * T)};
    };
    const auto x = safeguardedNewton(probe, std::min(P0, Ptp_), 0.0, Ptp_, /*rising=*/true,
                                     {lineTolerance_, 1e-14, 0.0, 200, /*logScale=*/true, 5.0, 1e-3});
    if (failed) return *failed;
    if (!x || !x->converged())
        return makeError("the sublimation pressure of " + who() + " at " + numberText(T) + " K did not converge");
    return lastP;  // the point probed last, where the Newton step was below the tolerance or the bracket closed
}

Result<double> FluidWithSolidModel::sublimationTemperature(double P) const {
    if (!hasSolid_)
        return makeError(who() + " has no solid in the " + std::string(modelLabel()) +
                         " (needs melting data and cp.solid)");
    if (P > Ptp_ * (1 + 1e-12))
        return makeError("no sublimation above the triple-point pressure " + numberText(Ptp_) + " Pa of " + who());
    if (P >= Ptp_) return Ttp_;
    auto gs0 = solidGibbs(Ttp_, Ptp_);
    if (!gs0) return gs0.error();
    const auto gv0 = vapourGibbs(Ttp_, Ptp_);
    const double dh0 = gv0 ? gv0->h - gs0->h : dhFus_;
    std::optional<Error> failed;
    auto probe = [&](double T) {
        const auto gv = vapourGibbs(T, P);
        // No vapour root: too cold for vapour at this P.
        if (!gv) return detail::NewtonProbe::rootAbove();
        const auto gs = solidGibbs(T, P);
        if (!gs) {
            failed = gs.error();
            return detail::NewtonProbe{};
        }
        // f = (g_v - g_s)/(R T) falls with T; its slope is
        // -(h_v - h_s)/(R T^2) (Gibbs–Helmholtz).
        return detail::NewtonProbe{(gv->g - gs->g) / (Rs_ * T), -(gv->h - gs->h) / (Rs_ * T * T)};
    };
    const double T0 = 1.0 / (1.0 / Ttp_ - Rs_ / dh0 * std::log(P / Ptp_));
    const auto T = detail::safeguardedNewton(probe, T0, std::max(1.0, 0.05 * Ttp_), Ttp_, /*rising=*/false,
                                             {lineTolerance_, 1e-13, 0.0, 200});
    if (failed) return *failed;
    if (!T || !T->converged())
        return makeError("the sublimation temperature of " + who() + " at " + numberText(P) + " Pa did not converge");
    return T->x;
}

Result<double> FluidWithSolidModel::transitionTemperature(Transition t, double P) const {
    if (!(P > 0) || !std::isfinite(P)) return makeError("the " + std::string(modelLabel()) + " needs a finite P > 0");
    switch (t) {
        case Transition::Boiling: return boilingTemperature(P);
        case Transition::Sublimation: return sublimationTemperature(P);
        case Transition::Melting:
            if (!hasSolid_)
                return makeError(who() + " has no solid in the " + std::string(modelLabel()) +
                                 " (needs melting data and cp.solid)");
            if (P < Ptp_ * (1 - 1e-12))
                return makeError("no melting below the triple-point pressure " + numberText(Ptp_) + " Pa of " + who() +
                                 "; the solid sublimates instead");
            return Tm_;
    }
    return makeError("unknown transition");
}

Result<double> FluidWithSolidModel::transitionPressure(Transition t, double T) const {
    if (!(T > 0) || !std::isfinite(T)) return makeError("the " + std::string(modelLabel()) + " needs a finite T > 0");
    switch (t) {
        case Transition::Boiling: return boilingPressure(T);
        case Transition::Sublimation: return sublimationPressure(T);
        case Transition::Melting:
            // The model's melting line is vertical at Tm; at Tm the anchor
            // pressure stands for it.
            if (!hasSolid_)
                return makeError(who() + " has no solid in the " + std::string(modelLabel()) +
                                 " (needs melting data and cp.solid)");
            if (std::abs(T - Tm_) > 1e-9 * Tm_)
                return makeError("the model melts " + who() + " only at " + numberText(Tm_) +
                                 " K (pressure-independent melting temperature)");
            return Pm_;
    }
    return makeError("unknown transition");
}

TransitionsAtPressure FluidWithSolidModel::transitionsAt(double P) const {
    TransitionsAtPressure out;
    auto add = [&](Transition k, double T) { out.entries[out.count++] = {k, T}; };
    if (hasSolid_ && P < Ptp_) {
        if (auto T = sublimationTemperature(P)) add(Transition::Sublimation, *T);
        return out;
    }
    if (hasSolid_) add(Transition::Melting, Tm_);
    if (P < Pc_ && (!hasLowerLimit_ || P >= Ptp_))
        if (auto T = boilingTemperature(P)) add(Transition::Boiling, *T);
    return out;
}

// ---------------------------------------------------------------- isobar spans

Result<std::optional<State>> FluidWithSolidModel::solveOnIsobarSpan(const IsobarSpan& span, Property which,
                                                                   double value) const {
    using Found = std::optional<State>;
    const double P = span.P;
    const TransitionsAtPressure& tr = *span.transitions;
    // The span's phase follows from the phase changes around it; properties
    // rise with T along the isobar, so the first span whose upper end
    // reaches `value` holds it.
    Phase ph;
    if (span.first()) {
        if (tr.count > 0) {
            ph = lowerPhase(tr.entries[0].kind);
        } else {
            auto p = stablePhase(span.Ta, P);
            if (!p) return p.error();
            ph = *p;
        }
        if (ph == Phase::Solid && !hasSolid_) ph = Phase::Liquid;
        auto sa = phaseState(ph, span.Ta, P);
        if (!sa) return sa.error();
        if (propertyOf(*sa, which) > value)
            return makeError("the value lies below the " + std::string(modelLabel()) + "'s range at " + numberText(P) +
                             " Pa (lowest temperature " + numberText(span.Ta) + " K)");
    } else {
        ph = upperPhase(tr.entries[span.index - 1].kind);
    }
    auto aboveRange = [&] {
        return makeError("the value lies above the " + std::string(modelLabel()) + "'s range at " + numberText(P) +
                         " Pa (highest temperature " + numberText(span.Tb) + " K)");
    };
    if (!(span.Tb > span.Ta)) {  // an empty span (the lowest temperature above a line)
        if (span.last()) return aboveRange();
        return Found{};
    }
    // Above the critical pressure the liquid turns supercritical smoothly;
    // phaseState(Supercritical) gives the stable fluid at every T.
    if (span.last() && P >= Pc_ && span.Tb >= Tc_ && ph != Phase::Solid) ph = Phase::Supercritical;
    auto sb = phaseState(ph, span.Tb, P);
    if (!sb) return sb.error();
    if (propertyOf(*sb, which) >= value) {
        auto sa = phaseState(ph, span.Ta, P);
        if (!sa) return sa.error();
        auto st = solveTemperatureInBracket([&](double T) { return phaseState(ph, T, P); }, which, value, span.Ta,
                                            span.Tb, *sa, *sb, spanBracketTolerance_, spanStepTolerance_,
                                            modelLabel(), P);
        if (!st) return st.error();
        return Found{*st};
    }
    if (span.last()) return aboveRange();
    return Found{};
}

}  // namespace heatchain::detail
