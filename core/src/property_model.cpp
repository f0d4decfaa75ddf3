// The derived state calculations of the PropertyModel base class: every input
// pair other than (T, P) is found from a model's single-phase states and its
// phase-change lines, so each model is written once in its natural variables.
#include "heatchain/property_model.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "numerics/root.hpp"
#include "models/number_text.hpp"

namespace heatchain {

namespace {

using detail::numberText;

const char* propertyName(Property p) {
    switch (p) {
        case Property::Enthalpy: return "specific enthalpy";
        case Property::Entropy: return "specific entropy";
        case Property::InternalEnergy: return "specific internal energy";
        case Property::Volume: return "specific volume";
    }
    return "property";
}

const char* propertyUnit(Property p) {
    switch (p) {
        case Property::Enthalpy:
        case Property::InternalEnergy: return "J/kg";
        case Property::Entropy: return "J/(kg K)";
        case Property::Volume: return "m3/kg";
    }
    return "";
}

}  // namespace

std::string_view modelId(ModelKind k) {
    switch (k) {
        case ModelKind::ConstantCp: return "constant-cp";
        case ModelKind::TemperatureDependentCp: return "temperature-dependent-cp";
        case ModelKind::RealFluid: return "real-fluid";
        case ModelKind::Reference: return "reference";
    }
    return "reference";
}

Result<ModelKind> parseModelKind(std::string_view id) {
    for (ModelKind k : {ModelKind::ConstantCp, ModelKind::TemperatureDependentCp,
                        ModelKind::RealFluid, ModelKind::Reference}) {
        if (modelId(k) == id) return k;
    }
    return makeError("unknown model \"" + std::string(id) +
                     "\"; valid: constant-cp, temperature-dependent-cp, real-fluid, reference");
}

std::string_view transitionLabel(Transition t) {
    switch (t) {
        case Transition::Melting: return "melting";
        case Transition::Boiling: return "boiling";
        case Transition::Sublimation: return "sublimation";
    }
    return "";
}

Phase lowerPhase(Transition t) { return t == Transition::Boiling ? Phase::Liquid : Phase::Solid; }
Phase upperPhase(Transition t) { return t == Transition::Melting ? Phase::Liquid : Phase::Vapor; }
Phase mixturePhase(Transition t) {
    switch (t) {
        case Transition::Melting: return Phase::SolidLiquid;
        case Transition::Boiling: return Phase::LiquidVapor;
        case Transition::Sublimation: return Phase::SolidVapor;
    }
    return Phase::LiquidVapor;
}

Result<State> PropertyModel::solveTemperatureInBracket(const std::function<Result<State>(double)>& at, Property which,
                                                       double value, double Ta, double Tb, const State& sa,
                                                       const State& sb, double bracketTol, double stepTol,
                                                       std::string_view what, double P) {
    const double fa = propertyOf(sa, which) - value, fb = propertyOf(sb, which) - value;
    if (fa == 0) return sa;
    if (fb == 0) return sb;
    // Newton with dh/dT = cp and ds/dT = cp/T, or the secant through the last
    // point where the model gives no slope (u, v), from the secant start.
    double lastT = Ta, lastF = fa;
    std::optional<State> last;
    std::optional<Error> failed;
    auto probe = [&](double T) {
        auto st = at(T);
        if (!st) {
            failed = st.error();
            return detail::NewtonProbe{};
        }
        last = *st;
        const double f = propertyOf(*st, which) - value;
        double slope = std::numeric_limits<double>::quiet_NaN();
        if (which == Property::Enthalpy) slope = st->cp;
        else if (which == Property::Entropy) slope = st->cp / T;
        if (!(slope > 0) || !std::isfinite(slope)) slope = (f - lastF) / (T - lastT);
        lastT = T;
        lastF = f;
        return detail::NewtonProbe{f, slope};
    };
    const auto root = detail::safeguardedNewton(probe, Ta - fa * (Tb - Ta) / (fb - fa), Ta, Tb, /*rising=*/fa < 0,
                                                {stepTol, bracketTol, 0.0, 100});
    if (failed) return *failed;
    if (root && root->converged() && last) {
        if (root->probed) return *last;
        if (root->x > Ta && root->x < Tb)
            if (auto fin = at(root->x)) return fin;
        return *last;
    }
    return makeError("the " + std::string(what) + " state at P = " + numberText(P) + " Pa did not converge");
}

double PropertyModel::propertyOf(const State& s, Property which) {
    switch (which) {
        case Property::Enthalpy: return s.h;
        case Property::Entropy: return s.s;
        case Property::InternalEnergy: return s.u;
        case Property::Volume: return s.v;
    }
    return s.h;
}

State PropertyModel::mix(const State& lower, const State& upper, Transition t, double f) {
    State m = lower;
    const double g = 1.0 - f;
    m.phase = mixturePhase(t);
    m.h = g * lower.h + f * upper.h;
    m.s = g * lower.s + f * upper.s;
    m.u = g * lower.u + f * upper.u;
    m.v = g * lower.v + f * upper.v;
    m.cp = m.cv = m.w = std::numeric_limits<double>::quiet_NaN();
    if (t == Transition::Melting) {
        m.meltFraction = f;
        m.quality.reset();
    } else {
        m.quality = f;
        m.meltFraction.reset();
    }
    m.source = f < 0.5 ? lower.source : upper.source;
    m.warnings = lower.warnings | upper.warnings;
    return m;
}

Result<State> PropertyModel::stateTP(double T, double P) const {
    auto phase = stablePhase(T, P);
    if (!phase) return phase.error();
    return phaseState(*phase, T, P);
}

Result<State> PropertyModel::stateOnLineP(Transition t, double P, double fraction) const {
    if (!(fraction >= 0.0 && fraction <= 1.0))
        return makeError("phase fraction " + numberText(fraction) + " is outside 0–1");
    auto T = transitionTemperature(t, P);
    if (!T) return T.error();
    auto lo = phaseState(lowerPhase(t), *T, P);
    if (!lo) return lo.error();
    auto up = phaseState(upperPhase(t), *T, P);
    if (!up) return up.error();
    return mix(*lo, *up, t, fraction);
}

Result<State> PropertyModel::stateOnLineT(Transition t, double T, double fraction) const {
    if (!(fraction >= 0.0 && fraction <= 1.0))
        return makeError("phase fraction " + numberText(fraction) + " is outside 0–1");
    auto P = transitionPressure(t, T);
    if (!P) return P.error();
    auto lo = phaseState(lowerPhase(t), T, *P);
    if (!lo) return lo.error();
    auto up = phaseState(upperPhase(t), T, *P);
    if (!up) return up.error();
    return mix(*lo, *up, t, fraction);
}

TransitionsAtPressure PropertyModel::transitionsAt(double P) const {
    TransitionsAtPressure out;
    auto add = [&](Transition t) {
        auto T = transitionTemperature(t, P);
        if (T && out.count < 2) out.entries[out.count++] = {t, *T};
    };
    const auto triple = triplePoint();
    if (triple && P < triple->second) {
        add(Transition::Sublimation);
    } else {
        add(Transition::Melting);
        add(Transition::Boiling);
    }
    if (out.count == 2 && out.entries[0].T > out.entries[1].T) std::swap(out.entries[0], out.entries[1]);
    return out;
}

std::optional<std::pair<double, double>> PropertyModel::criticalPoint() const {
    const auto& c = substance().critical;
    if (!c) return std::nullopt;
    return std::make_pair(c->T, c->P);
}

std::optional<std::pair<double, double>> PropertyModel::triplePoint() const {
    const auto& t = substance().triple;
    if (!t) return std::nullopt;
    return std::make_pair(t->T, t->P);
}

Result<std::optional<State>> PropertyModel::solveOnIsobarSpan(const IsobarSpan& span, Property which,
                                                              double value) const {
    using Found = std::optional<State>;
    const double P = span.P;
    // Sample the span at its ends (nudged inside) and solve by Brent.
    const double ea = span.Ta + 1e-9 * std::max(1.0, span.Ta);
    const double eb = span.Tb - 1e-9 * std::max(1.0, span.Tb);
    if (!(eb > ea)) return Found{};
    auto spanPhase = [&](double T) -> std::optional<Phase> {
        auto ph = stablePhase(T, P);
        if (!ph) return std::nullopt;
        return *ph;
    };
    auto evalPhase = [&](Phase ph, double T) -> std::optional<State> {
        auto st = phaseState(ph, T, P);
        if (!st) return std::nullopt;
        return *st;
    };
    auto pa = spanPhase(0.5 * (ea + eb));
    if (!pa) return Found{};
    // For a span without a phase change inside it the phase is fixed, except
    // above the critical pressure where liquid turns supercritical smoothly.
    // When the phase at both ends is the middle's, the span holds one phase
    // and the root search evaluates it directly: asking the model for the
    // stable phase at every iterate re-solves the phase-change line each
    // time (the simple models find it by Newton on g), which was most of the
    // cost of an inversion. Otherwise (liquid turning supercritical) the
    // phase is asked at every temperature.
    const auto phaseA = spanPhase(ea), phaseB = spanPhase(eb);
    const bool onePhase = phaseA && phaseB && *phaseA == *pa && *phaseB == *pa;
    auto stateAt = [&](double T) -> std::optional<State> {
        if (onePhase) return evalPhase(*pa, T);
        auto ph = spanPhase(T);
        return evalPhase(ph ? *ph : *pa, T);
    };
    auto sa = stateAt(ea);
    auto sb = stateAt(eb);
    if (!sa || !sb) return Found{};
    const double fa = propertyOf(*sa, which) - value;
    const double fb = propertyOf(*sb, which) - value;
    if ((fa > 0) == (fb > 0) && fa != 0 && fb != 0) return Found{};
    auto f = [&](double T) {
        auto s = stateAt(T);
        return s ? propertyOf(*s, which) - value : std::numeric_limits<double>::quiet_NaN();
    };
    auto T = detail::brent(f, ea, eb, fa, fb, {1e-13, 1e-10, 200});
    if (!T) return Found{};
    return stateAt(*T);
}

Result<State> PropertyModel::stateP(double P, Property which, double value) const {
    if (!(P > 0) || !std::isfinite(P)) return makeError("pressure must be positive, got " + numberText(P) + " Pa");
    if (!std::isfinite(value)) return makeError(std::string(propertyName(which)) + " is not a finite number");

    // Walk the isobar from the lowest temperature upward: single-phase spans
    // (solved by the model's hook) separated by the phase changes the isobar
    // crosses (the lever rule between their two ends). Along an isobar h, s
    // and u rise with T; v mostly does (the liquid-water density maximum is
    // handled because each span is searched by bracketing, not by slope).
    // h and s also rise across every phase change (the latent heat is
    // positive), so a value above a line's upper end lies above the span
    // below it too, and that span is not searched.
    const bool risesAcrossLines = which == Property::Enthalpy || which == Property::Entropy;
    const auto tr = transitionsAt(P);
    double Tlo = minTemperature();
    for (int i = 0; i <= tr.count; ++i) {
        const double Thi = i < tr.count ? tr.entries[i].T : maxTemperature();
        std::optional<Result<State>> upper;
        if (i < tr.count && risesAcrossLines) {
            upper = phaseState(upperPhase(tr.entries[i].kind), Thi, P);
            if (*upper && value > propertyOf(**upper, which)) {
                Tlo = Thi;
                continue;
            }
        }
        auto st = solveOnIsobarSpan(IsobarSpan{P, Tlo, Thi, i, &tr}, which, value);
        if (!st) return st.error();
        if (*st) return **st;
        if (i == tr.count) break;
        const auto t = tr.entries[i].kind;
        auto lo = phaseState(lowerPhase(t), tr.entries[i].T, P);
        auto up = upper ? *upper : phaseState(upperPhase(t), tr.entries[i].T, P);
        if (lo && up) {
            const double a = propertyOf(*lo, which), b = propertyOf(*up, which);
            const double mn = std::min(a, b), mx = std::max(a, b);
            if (value >= mn && value <= mx && b != a) {
                const double f = std::clamp((value - a) / (b - a), 0.0, 1.0);
                return mix(*lo, *up, t, f);
            }
        }
        Tlo = tr.entries[i].T;
    }
    return makeError("no state of " + substance().name + " at " + numberText(P) + " Pa has " +
                     propertyName(which) + " " + numberText(value) + " " + propertyUnit(which) +
                     " within the " + std::string(name()) + " range (" + rangeText() + ")");
}

Result<State> PropertyModel::stateTV(double T, double v) const {
    if (!(T > 0) || !(v > 0)) return makeError("temperature and specific volume must be positive");
    const double Pmin = minPressure(), Pmax = maxPressure();
    auto vAt = [&](Phase ph, double lnP) -> double {
        auto s = phaseState(ph, T, std::exp(lnP));
        return s ? s->v - v : std::numeric_limits<double>::quiet_NaN();
    };
    auto solveP = [&](Phase ph, double Pa, double Pb) -> std::optional<State> {
        const double a = std::log(Pa), b = std::log(Pb);
        auto f = [&](double x) { return vAt(ph, x); };
        auto x = detail::brent(f, a, b, f(a), f(b), {1e-14, 1e-12, 200});
        if (!x) return std::nullopt;
        auto ph2 = stablePhase(T, std::exp(*x));
        auto st = phaseState(ph2 ? *ph2 : ph, T, std::exp(*x));
        if (!st) return std::nullopt;
        return *st;
    };
    // Below the triple point the vessel holds solid and vapour; between the
    // triple and critical points liquid and vapour share the saturation line.
    const auto trip = triplePoint();
    const Transition line = (trip && T < trip->first) ? Transition::Sublimation : Transition::Boiling;
    auto Psat = transitionPressure(line, T);
    if (Psat) {
        auto lo = phaseState(lowerPhase(line), T, *Psat);
        auto up = phaseState(upperPhase(line), T, *Psat);
        if (lo && up) {
            if (v >= lo->v && v <= up->v) {
                // At the critical point the two ends coincide and the lever
                // rule is 0/0: the state is the single critical state.
                if (!(up->v > lo->v)) return *lo;
                return mix(*lo, *up, line, (v - lo->v) / (up->v - lo->v));
            }
            if (v > up->v) {
                if (auto st = solveP(upperPhase(line), Pmin, *Psat)) return *st;
            } else if (auto st = solveP(lowerPhase(line), *Psat, Pmax)) {
                return *st;
            }
            return makeError("no state of " + substance().name + " at " + numberText(T) + " K has specific volume " +
                             numberText(v) + " m3/kg within the " + std::string(name()) +
                             " model (a condensed phase it treats as incompressible cannot be compressed further)");
        }
    }
    // Supercritical temperature (or no saturation line): one fluid phase.
    for (Phase ph : {Phase::Supercritical, Phase::Vapor, Phase::Liquid}) {
        if (auto st = solveP(ph, Pmin, Pmax)) return *st;
    }
    return makeError("no state of " + substance().name + " at " + numberText(T) + " K has specific volume " + numberText(v) +
                     " m3/kg within the " + std::string(name()) + " range (" + rangeText() + ")");
}

}  // namespace heatchain
