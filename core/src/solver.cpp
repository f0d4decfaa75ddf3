// The sequence solver. Each step is solved from the end state of the one
// before; the energy and entropy bookkeeping of every step is done in one
// place (finishStep) so the laws are written once:
//   closed:      ΔU = Q + W        steady flow:  ΔH = Q + W
//   S_gen = ΔS − Q / T_reservoir   (internally reversible paths without a
//                                   reservoir: S_gen = 0; adiabatic: ΔS)
//   exergy destroyed = T0 · S_gen  (Gouy–Stodola theorem)
//
// Utilities (issue 7). A step's source or sink may name a utility. Its
// temperature profile against the step's duty is: steam and fixed, constant;
// sensible, linear and counter-current (the utility enters where the material
// leaves). The approach temperature is checked at every sampled point of the
// step's T–Q curve and at every segment end: below 0 is an error (heat would
// flow from cold to hot), below the project's minApproach a warning. S_gen
// uses the utility's T (steam, fixed) or its thermodynamic mean temperature
// (sensible), so that Q / T_mean is the utility's own entropy change.
//
// Exergy (issue 7). Dead state: the substance at the surroundings' T0, P0,
// same model. Specific exergy of a state:
//   steady flow:  ψ = (h − h0) − T0 (s − s0)
//   closed:       φ = (u − u0) + P0 (v − v0) − T0 (s − s0)
// Exergy balance of a step (extensive):
//   ΔEx = Ex_Q + W_u − X_destroyed,   X_destroyed = T0 · S_gen
// with Ex_Q = Q (1 − T0 / T_res) the exergy carried in with the heat (for
// heat taken at the material's own temperature, Ex_Q = Q − T0 ΔS), and the
// useful work W_u = W (steady flow) or W + P0 ΔV (closed: the atmosphere does
// −P0 ΔV of the work). Exergy supplied to a step is the sum of the positive
// terms among Ex_Q, W_u and −ΔEx (heat exergy in, work in, exergy the material
// gives up); the rest leaves as product, so the second-law efficiency
//   η_II = 1 − X_destroyed / supplied   lies in [0, 1].
// Heating from a source: supplied = Ex_Q, product ΔEx. Compression:
// supplied = W, product ΔEx (+ heat exergy out). Expansion: supplied = −ΔEx,
// product −W. Throttling: supplied = −ΔEx, η_II = 0. The sequence takes the
// same rule over the whole chain: positive Ex_Q and W of all steps, plus the
// material's exergy drop from the start to the last end state.
#include "heatchain/solver.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "numerics/root.hpp"

namespace heatchain {

namespace {

std::string num(double v, int digits = 4) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*g", digits, v);
    return buf;
}
std::string degC(double T) { return num(T - 273.15, 5) + " °C"; }
std::string bar(double P) { return num(P / 1e5, 5) + " bar"; }

// The context every step calculation needs.
struct Ctx {
    const Project& project;
    const PropertyModel& model;
    double m;       // kg or kg/s
    bool closed;
    double T0;
    int points;     // curve points for this step
};

struct StepError {
    std::string message;
};

std::string stepWhere(const Step& step, std::size_t index) {
    return "step \"" + step.id + "\" (steps[" + std::to_string(index) + "])";
}

bool nearlyEqual(double a, double b, double rel = 1e-9) {
    return std::fabs(a - b) <= rel * std::max({1.0, std::fabs(a), std::fabs(b)});
}

// ---------------------------------------------------------------- isobars

// Phase-change spans on an isobar, in enthalpy: [hLow, hUp] of each line.
struct LineSpan {
    Transition t;
    double T;
    State lower, upper;
};

std::vector<LineSpan> linesOnIsobar(const PropertyModel& model, double P) {
    std::vector<LineSpan> out;
    const auto tr = model.transitionsAt(P);
    for (int i = 0; i < tr.count; ++i) {
        const auto t = tr.entries[i].kind;
        const double T = tr.entries[i].T;
        auto lo = model.phaseState(lowerPhase(t), T, P);
        auto up = model.phaseState(upperPhase(t), T, P);
        if (lo && up) out.push_back({t, T, *lo, *up});
    }
    return out;
}

std::string sensibleLabel(Phase p) {
    return std::string(phaseLabel(p)) + ", sensible";
}

std::string lineLabel(Transition t, bool rising) {
    switch (t) {
        case Transition::Melting: return rising ? "melting" : "freezing";
        case Transition::Boiling: return rising ? "boiling" : "condensing";
        case Transition::Sublimation: return rising ? "sublimation" : "deposition";
    }
    return "phase change";
}

Phase singlePhaseOf(const State& s, bool atHighEnd, const LineSpan* line) {
    if (!isTwoPhase(s.phase)) return s.phase;
    (void)line;
    // A state on a line: the phase on the side the sensible span lies.
    switch (s.phase) {
        case Phase::SolidLiquid: return atHighEnd ? Phase::Solid : Phase::Liquid;
        case Phase::LiquidVapor: return atHighEnd ? Phase::Liquid : Phase::Vapor;
        case Phase::SolidVapor: return atHighEnd ? Phase::Solid : Phase::Vapor;
        default: return s.phase;
    }
}

// Appends sampled points of a constant-pressure path between two states in
// the same single phase (by temperature) or on one line (by fraction).
void sampleIsobarSegment(const Ctx& c, const State& a, const State& b, const LineSpan* line, int n,
                         double Qbase, double hRef, std::vector<CurvePoint>& out) {
    n = std::max(n, 2);
    auto push = [&](const State& s) {
        out.push_back({s.T, s.s, Qbase + c.m * (s.h - hRef), s.P, s.h});
    };
    if (line) {
        for (int k = 0; k < n; ++k) {
            const double f = double(k) / (n - 1);
            State s = a;
            s.h = a.h + f * (b.h - a.h);
            s.s = a.s + f * (b.s - a.s);
            push(s);
        }
        return;
    }
    const bool rising = b.T >= a.T;
    const Phase ph = singlePhaseOf(a, /*atHighEnd=*/!rising, nullptr);
    for (int k = 0; k < n; ++k) {
        const double f = double(k) / (n - 1);
        if (k == 0) { push(a); continue; }
        if (k == n - 1) { push(b); continue; }
        const double T = a.T + f * (b.T - a.T);
        auto s = c.model.phaseState(isTwoPhase(ph) ? b.phase : ph, T, a.P);
        if (s) push(*s);
    }
}

// Builds the segments of a constant-pressure change from `a` to `b` (which
// the caller has already found), splitting at each phase line crossed.
std::vector<SegmentResult> isobarSegments(const Ctx& c, const State& a, const State& b, double Qstart) {
    std::vector<SegmentResult> segs;
    const bool rising = b.h >= a.h;
    const auto lines = linesOnIsobar(c.model, a.P);
    // Breakpoints strictly between a.h and b.h, in path order, each a known state.
    struct Bp { double h; State s; const LineSpan* line; bool enteringLine; };
    std::vector<Bp> bps;
    const double lo = std::min(a.h, b.h), hi = std::max(a.h, b.h);
    const double eps = 1e-9 * std::max(1.0, std::max(std::fabs(lo), std::fabs(hi)));
    for (const auto& L : lines) {
        for (const State* s : {&L.lower, &L.upper}) {
            if (s->h > lo + eps && s->h < hi - eps) {
                State on = *s;
                bool isLower = (s == &L.lower);
                on = PropertyModel::mix(L.lower, L.upper, L.t, isLower ? 0.0 : 1.0);
                bps.push_back({s->h, on, &L, rising ? isLower : !isLower});
            }
        }
    }
    std::sort(bps.begin(), bps.end(), [&](const Bp& x, const Bp& y) { return rising ? x.h < y.h : x.h > y.h; });

    // Which line (if any) holds the span between two enthalpies.
    auto lineHolding = [&](double h1, double h2) -> const LineSpan* {
        const double mid = 0.5 * (h1 + h2);
        for (const auto& L : lines) {
            const double l = std::min(L.lower.h, L.upper.h), u = std::max(L.lower.h, L.upper.h);
            if (mid > l && mid < u) return &L;
        }
        return nullptr;
    };

    std::vector<State> nodes;
    nodes.push_back(a);
    for (auto& bp : bps) nodes.push_back(bp.s);
    nodes.push_back(b);
    const int nSeg = int(nodes.size()) - 1;
    const int per = std::max(2, c.points / std::max(1, nSeg));
    double Qacc = Qstart;
    for (int i = 0; i < nSeg; ++i) {
        const State& s0 = nodes[i];
        const State& s1 = nodes[i + 1];
        SegmentResult seg;
        const LineSpan* L = lineHolding(s0.h, s1.h);
        if (L) {
            seg.label = lineLabel(L->t, rising);
        } else {
            // The single phase of the span: take it from a state strictly inside.
            Phase ph = isTwoPhase(s0.phase) ? singlePhaseOf(s0, !rising, nullptr) : s0.phase;
            if (isTwoPhase(s0.phase) && !isTwoPhase(s1.phase)) ph = s1.phase;
            seg.label = sensibleLabel(ph);
        }
        seg.start = s0;
        seg.end = s1;
        seg.Q = c.m * (s1.h - s0.h);
        if (c.points > 0) sampleIsobarSegment(c, s0, s1, L, per, Qacc, s0.h, seg.curve);
        Qacc += seg.Q;
        segs.push_back(std::move(seg));
    }
    return segs;
}

// End state of an isobaric move to temperature T from `a`: on a phase line
// the state approached from the start side.
Result<State> isobarToT(const PropertyModel& model, const State& a, double T) {
    const double P = a.P;
    for (const auto& L : linesOnIsobar(model, P)) {
        if (nearlyEqual(T, L.T, 1e-10)) {
            const bool fromBelow = a.h < L.lower.h || (a.T < L.T && !isTwoPhase(a.phase));
            return PropertyModel::mix(L.lower, L.upper, L.t, fromBelow ? 0.0 : 1.0);
        }
    }
    return model.stateTP(T, P);
}

// ---------------------------------------------------------------- steps

struct Outcome {
    State end;
    double Q = 0, W = 0;           // extensive
    std::optional<double> reservoirT;
    bool adiabatic = false;
    bool internallyReversibleExchange = false;  // heat exchanged at the material's own temperature
    std::vector<SegmentResult> segments;
    std::vector<std::string> warnings;
};

using StepResultOr = Result<Outcome>;

Error stepError(const Step& step, std::size_t idx, const std::string& msg) {
    return makeError(msg, stepWhere(step, idx));
}

// Heat and cool, and the phase-change kinds, all move along an isobar (or an
// isochore for a closed rigid vessel).
StepResultOr heatOrCool(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
    const bool heating = step.kind == StepKind::Heat;
    const char* verb = heating ? "heat" : "cool";
    const bool constantVolume = step.at && *step.at == HeatingAt::ConstantVolume;
    Outcome o;
    if (constantVolume) {
        if (!c.closed)
            return stepError(step, idx, "constant-volume heating needs a closed system (a rigid vessel); this project is steady-flow");
        const double v = a.v;
        Result<State> end = makeError("");
        if (step.to.T) {
            end = c.model.stateTV(step.to.T->si, v);
        } else if (step.to.duty) {
            const double du = (heating ? 1 : -1) * step.to.duty->si / c.m;
            const double target = a.u + du;
            auto f = [&](double T) {
                auto s = c.model.stateTV(T, v);
                return s ? s->u - target : std::numeric_limits<double>::quiet_NaN();
            };
            const double Tb = heating ? std::min(c.model.maxTemperature(), a.T * 4) : std::max(c.model.minTemperature(), a.T * 0.25);
            auto T = detail::brent(f, a.T, Tb, f(a.T), f(Tb), {1e-13, 1e-10, 200});
            if (!T) return stepError(step, idx, "no temperature within the model's range gives that duty at constant volume");
            end = c.model.stateTV(*T, v);
        } else {
            return stepError(step, idx, std::string(verb) + " at constant volume needs to.T or to.duty");
        }
        if (!end) return stepError(step, idx, end.error().message);
        o.end = *end;
        o.Q = c.m * (o.end.u - a.u);
        o.W = 0;
        SegmentResult seg;
        seg.label = heating ? "constant-volume heating" : "constant-volume cooling";
        seg.start = a;
        seg.end = o.end;
        seg.Q = o.Q;
        if (c.points > 0) {
            const int n = std::max(2, c.points);
            for (int k = 0; k < n; ++k) {
                const double T = a.T + (o.end.T - a.T) * k / (n - 1);
                auto s = (k == 0) ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.stateTV(T, v));
                if (s) seg.curve.push_back({s->T, s->s, Qcum + c.m * (s->u - a.u), s->P, s->h});
            }
        }
        if (o.end.P > a.P * 1.0001)
            o.warnings.push_back("pressure in the closed vessel rises from " + bar(a.P) + " to " + bar(o.end.P));
        o.segments.push_back(std::move(seg));
        return o;
    }

    Result<State> end = makeError("");
    if (step.to.T) {
        end = isobarToT(c.model, a, step.to.T->si);
    } else if (step.to.duty) {
        const double dh = (heating ? 1 : -1) * step.to.duty->si / c.m;
        end = c.model.statePH(a.P, a.h + dh);
    } else if (step.to.quality) {
        end = c.model.stateOnLineP(Transition::Boiling, a.P, step.to.quality->value);
    } else {
        return stepError(step, idx, std::string(verb) + " step needs a target: to.T, to.duty or to.quality");
    }
    if (!end) return stepError(step, idx, end.error().message);
    const double dh = end->h - a.h;
    if (heating && !(dh > 0)) {
        return stepError(step, idx, "heating to " + (step.to.T ? degC(step.to.T->si) : std::string("that target")) +
                                        " would cool the material (it starts at " + degC(a.T) +
                                        "); use a cool step or a higher target");
    }
    if (!heating && !(dh < 0)) {
        return stepError(step, idx, "cooling to " + (step.to.T ? degC(step.to.T->si) : std::string("that target")) +
                                        " would heat the material (it starts at " + degC(a.T) +
                                        "); use a heat step or a lower target");
    }
    o.end = *end;
    o.Q = c.m * dh;
    o.W = c.closed ? -c.m * a.P * (o.end.v - a.v) : 0.0;
    o.segments = isobarSegments(c, a, o.end, Qcum);
    return o;
}

StepResultOr phaseChange(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
    Transition t = Transition::Boiling;
    bool toUpper = true;
    switch (step.kind) {
        case StepKind::Melt: t = Transition::Melting; toUpper = true; break;
        case StepKind::Freeze: t = Transition::Melting; toUpper = false; break;
        case StepKind::Boil: t = Transition::Boiling; toUpper = true; break;
        case StepKind::Condense: t = Transition::Boiling; toUpper = false; break;
        case StepKind::Sublimate: t = Transition::Sublimation; toUpper = true; break;
        case StepKind::Deposit: t = Transition::Sublimation; toUpper = false; break;
        default: break;
    }
    const double f = step.fraction ? step.fraction->value : 1.0;
    const std::string kind(stepKindId(step.kind));
    auto Tline = c.model.transitionTemperature(t, a.P);
    if (!Tline) {
        return stepError(step, idx, "no " + std::string(transitionLabel(t)) + " at " + bar(a.P) + ": " +
                                        Tline.error().message);
    }
    auto end = c.model.stateOnLineP(t, a.P, toUpper ? f : 1.0 - f);
    if (!end) return stepError(step, idx, end.error().message);
    const double dh = end->h - a.h;
    if ((toUpper && !(dh > 0)) || (!toUpper && !(dh < 0))) {
        std::string what = std::string(phaseLabel(a.phase));
        if (a.quality) what += " (quality " + num(*a.quality, 3) + ")";
        if (a.meltFraction) what += " (melt fraction " + num(*a.meltFraction, 3) + ")";
        return stepError(step, idx, "nothing to " + kind + ": the material is " + what + " at " + degC(a.T) +
                                        ", already past the end of this step (" +
                                        std::string(transitionLabel(t)) + " at " + degC(*Tline) + ", " +
                                        bar(a.P) + ")");
    }
    Outcome o;
    o.end = *end;
    o.Q = c.m * dh;
    o.W = c.closed ? -c.m * a.P * (o.end.v - a.v) : 0.0;
    o.segments = isobarSegments(c, a, o.end, Qcum);
    if (o.segments.size() > 1)
        o.warnings.push_back("the step includes sensible " + std::string(toUpper ? "heating" : "cooling") +
                             " to the " + std::string(transitionLabel(t)) + " point (" + degC(*Tline) + ")");
    return o;
}

StepResultOr pressureChange(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
    const bool compress = step.kind == StepKind::Compress;
    const bool throttle = step.kind == StepKind::Throttle;
    double P2 = 0;
    if (step.to.P) {
        P2 = step.to.P->si;
    } else if (step.to.ratio && !throttle) {
        const double r = step.to.ratio->value;
        if (!(r > 1)) return stepError(step, idx, "pressure ratio must be greater than 1, got " + num(r));
        P2 = compress ? a.P * r : a.P / r;
    } else {
        return stepError(step, idx, std::string(stepKindId(step.kind)) +
                                        (throttle ? " step needs to.P" : " step needs to.P or to.ratio"));
    }
    if (compress && !(P2 > a.P))
        return stepError(step, idx, "compressing to " + bar(P2) + " would lower the pressure (it starts at " + bar(a.P) + "); use an expand step");
    if (!compress && !(P2 < a.P))
        return stepError(step, idx, std::string(throttle ? "throttling" : "expanding") + " to " + bar(P2) +
                                        " would raise the pressure (it starts at " + bar(a.P) + ")");
    Outcome o;
    const int n = std::max(2, c.points);
    auto Pk = [&](int k) { return a.P * std::pow(P2 / a.P, double(k) / (n - 1)); };
    SegmentResult seg;
    seg.start = a;

    if (throttle) {
        if (c.closed)
            return stepError(step, idx, "throttling is a flow process; it needs a steady-flow system");
        auto end = c.model.statePH(P2, a.h);
        if (!end) return stepError(step, idx, end.error().message);
        o.end = *end;
        // The state was solved for h = h1; the solver's last-digit residual
        // (1e-15 relative) is not a result and would show as ΔH 7e-15 kW.
        o.end.h = a.h;
        o.adiabatic = true;
        seg.label = "throttling (constant enthalpy)";
        if (c.points > 0)
            for (int k = 0; k < n; ++k) {
                auto s = k == 0 ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.statePH(Pk(k), a.h));
                if (s) seg.curve.push_back({s->T, s->s, Qcum, s->P, s->h});
            }
        const double dT = o.end.T - a.T;
        if (std::fabs(dT) > 1e-3)
            o.warnings.push_back(std::string("Joule–Thomson effect: the temperature ") + (dT < 0 ? "falls" : "rises") +
                                 " by " + num(std::fabs(dT), 3) + " K");
    } else {
        const PathKind path = step.path ? *step.path : (step.efficiency ? PathKind::Adiabatic : PathKind::Isentropic);
        const std::string what = compress ? "compression" : "expansion";
        const Property energy = c.closed ? Property::InternalEnergy : Property::Enthalpy;
        auto E = [&](const State& s) { return c.closed ? s.u : s.h; };
        switch (path) {
            case PathKind::Isentropic:
            case PathKind::Adiabatic: {
                const double eta = path == PathKind::Adiabatic ? (step.efficiency ? step.efficiency->value : 1.0) : 1.0;
                if (!(eta > 0 && eta <= 1))
                    return stepError(step, idx, "isentropic efficiency must be in (0, 1], got " + num(eta));
                auto endAt = [&](double P) -> Result<State> {
                    auto s = c.model.statePS(P, a.s);
                    if (!s || eta == 1.0) return s;
                    const double e = compress ? E(a) + (E(*s) - E(a)) / eta : E(a) - eta * (E(a) - E(*s));
                    return c.model.stateP(P, energy, e);
                };
                auto end = endAt(P2);
                if (!end) return stepError(step, idx, end.error().message);
                o.end = *end;
                o.adiabatic = true;
                seg.label = eta == 1.0 ? "isentropic " + what
                                       : "adiabatic " + what + " (η = " + num(eta, 3) + ")";
                // The drawn path between the ends: entropy generated evenly
                // per logarithmic pressure step, s linear in ln P. That is the
                // path of constant polytropic efficiency for an ideal gas of
                // constant cp, and it never lowers s (adiabatic, S_gen >= 0).
                // One (P, s) inversion per point; the path at eta = 1 is the
                // isentrope itself.
                if (c.points > 0) {
                    const double lnRatio = std::log(P2 / a.P);
                    for (int k = 0; k < n; ++k) {
                        Result<State> s = a;
                        if (k == n - 1) {
                            s = o.end;
                        } else if (k > 0) {
                            const double P = Pk(k);
                            s = c.model.statePS(P, a.s + (o.end.s - a.s) * std::log(P / a.P) / lnRatio);
                        }
                        if (s) seg.curve.push_back({s->T, s->s, Qcum, s->P, s->h});
                    }
                }
                break;
            }
            case PathKind::Isothermal: {
                auto end = c.model.stateTP(a.T, P2);
                if (!end) return stepError(step, idx, end.error().message);
                o.end = *end;
                o.internallyReversibleExchange = true;
                seg.label = "isothermal " + what;
                o.Q = c.m * a.T * (o.end.s - a.s);
                if (c.points > 0)
                    for (int k = 0; k < n; ++k) {
                        auto s = k == 0 ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.stateTP(a.T, Pk(k)));
                        if (s) seg.curve.push_back({s->T, s->s, Qcum + c.m * a.T * (s->s - a.s), s->P, s->h});
                    }
                break;
            }
            case PathKind::Polytropic: {
                if (!step.n) return stepError(step, idx, "a polytropic path needs the exponent n");
                const double nn = step.n->value;
                if (!(nn > 0)) return stepError(step, idx, "polytropic exponent n must be positive, got " + num(nn));
                auto vAt = [&](double P) { return a.v * std::pow(a.P / P, 1.0 / nn); };
                auto end = c.model.stateP(P2, Property::Volume, vAt(P2));
                if (!end) return stepError(step, idx, end.error().message);
                o.end = *end;
                o.internallyReversibleExchange = true;
                seg.label = "polytropic " + what + " (n = " + num(nn, 4) + ")";
                // Work of the internally reversible path P v^n = const.
                auto work = [&](double P, double v) {
                    if (std::fabs(nn - 1.0) < 1e-12) {
                        return c.closed ? -a.P * a.v * std::log(v / a.v) : a.P * a.v * std::log(P / a.P);
                    }
                    return c.closed ? (P * v - a.P * a.v) / (nn - 1.0) : nn / (nn - 1.0) * (P * v - a.P * a.v);
                };
                o.W = c.m * work(P2, o.end.v);
                o.Q = c.m * (E(o.end) - E(a)) - o.W;
                if (c.points > 0)
                    for (int k = 0; k < n; ++k) {
                        const double P = Pk(k);
                        auto s = k == 0 ? Result<State>(a) : (k == n - 1 ? Result<State>(o.end) : c.model.stateP(P, Property::Volume, vAt(P)));
                        if (s) seg.curve.push_back({s->T, s->s, Qcum + c.m * (E(*s) - E(a)) - c.m * work(s->P, s->v), s->P, s->h});
                    }
                break;
            }
        }
        if (o.adiabatic) {
            o.Q = 0;
            o.W = c.m * (E(o.end) - E(a));
        } else if (path == PathKind::Isothermal) {
            o.W = c.m * (E(o.end) - E(a)) - o.Q;
        }
        if (o.end.phase == Phase::LiquidVapor && o.end.quality)
            o.warnings.push_back("discharge is two-phase (quality " + num(*o.end.quality, 3) + ")");
        if (compress && a.phase == Phase::LiquidVapor)
            o.warnings.push_back("compressing a two-phase mixture: liquid in a compressor damages it");
    }
    seg.end = o.end;
    seg.Q = o.Q;
    o.segments.push_back(std::move(seg));
    return o;
}

// Reservoir temperature of a step, checked against the direction of heat.
Result<std::optional<double>> reservoirFor(const Ctx& c, const Step& step, std::size_t idx, const Outcome& o,
                                           const State& a) {
    (void)c;
    const Reservoir* r = nullptr;
    const char* role = nullptr;
    if (step.source) { r = &*step.source; role = "source"; }
    if (step.sink) {
        if (r) return stepError(step, idx, "a step takes a source or a sink, not both");
        r = &*step.sink; role = "sink";
    }
    if (!r) return std::optional<double>{};
    if (!r->T) {
        if (r->utility)
            return stepError(step, idx, "utilities (\"" + *r->utility + "\") are not supported by this version; give the " + role + " a temperature");
        return stepError(step, idx, std::string("the ") + role + " needs a temperature T");
    }
    const double Tr = r->T->si;
    double Tmax = std::max(a.T, o.end.T), Tmin = std::min(a.T, o.end.T);
    for (const auto& seg : o.segments)
        for (const auto& p : seg.curve) { Tmax = std::max(Tmax, p.T); Tmin = std::min(Tmin, p.T); }
    const double tol = 1e-9 * Tr;
    if (o.Q > 0) {
        if (std::string(role) == "sink")
            return stepError(step, idx, "heat flows into the material in this step, so it needs a source, not a sink");
        if (Tr < Tmax - tol)
            return stepError(step, idx, "the source at " + degC(Tr) + " is colder than the material reaches (" + degC(Tmax) +
                                            "): heat cannot flow from cold to hot");
    } else if (o.Q < 0) {
        if (std::string(role) == "source")
            return stepError(step, idx, "heat leaves the material in this step, so it needs a sink, not a source");
        if (Tr > Tmin + tol)
            return stepError(step, idx, "the sink at " + degC(Tr) + " is warmer than the material gets (" + degC(Tmin) +
                                            "): heat cannot flow from cold to hot");
    }
    return std::optional<double>{Tr};
}

// The step's heat exchange against a utility: direction, approach
// temperature along the T–Q curve, and consumption.
Result<StepUtility> serveByUtility(const Ctx& c, const Step& step, std::size_t idx, const Outcome& o,
                                   const std::vector<Result<UtilityProfile>>& profiles, double Qcum) {
    if (step.source && step.sink) return stepError(step, idx, "a step takes a source or a sink, not both");
    const bool asSource = step.source.has_value();
    const Reservoir& r = asSource ? *step.source : *step.sink;
    const char* role = asSource ? "source" : "sink";
    std::size_t ui = 0;
    while (ui < c.project.utilities.size() && c.project.utilities[ui].id != *r.utility) ++ui;
    if (ui >= profiles.size()) return stepError(step, idx, "unknown utility \"" + *r.utility + "\"");
    if (!profiles[ui])
        return stepError(step, idx, "utility \"" + *r.utility + "\": " + profiles[ui].error().message);
    const UtilityProfile& u = *profiles[ui];
    StepUtility su;
    su.id = u.id;
    su.kind = u.kind;
    su.asSource = asSource;
    su.counterCurrent = u.kind == UtilityKind::Sensible;
    su.Tmean = u.Tmean;
    su.duty = std::fabs(o.Q);
    su.mass = su.duty * u.massPerHeat();
    if (u.density) su.volume = su.mass / *u.density;
    if (o.Q > 0 && !asSource)
        return stepError(step, idx, "heat flows into the material in this step, so it needs a source, not a sink");
    if (o.Q < 0 && asSource)
        return stepError(step, idx, "heat leaves the material in this step, so it needs a sink, not a source");
    if (u.kind == UtilityKind::Sensible) {
        if (asSource && u.Tin < u.Tout)
            return stepError(step, idx, "utility \"" + u.id + "\" warms from " + degC(u.Tin) + " to " + degC(u.Tout) +
                                            ", so it can only take heat (a sink), not be a source");
        if (!asSource && u.Tin > u.Tout)
            return stepError(step, idx, "utility \"" + u.id + "\" cools from " + degC(u.Tin) + " to " + degC(u.Tout) +
                                            ", so it can only give heat (a source), not be a sink");
    }
    su.line = {{Qcum, u.temperatureAt(0.0)}, {Qcum + o.Q, u.temperatureAt(1.0)}};
    if (o.Q == 0) {
        su.Tmaterial = o.end.T;
        su.Tutility = u.temperatureAt(0.0);
        su.minApproach = asSource ? su.Tutility - su.Tmaterial : su.Tmaterial - su.Tutility;
        su.position = "end";
        return su;
    }
    // Every segment's ends and every sampled curve point, with the duty
    // exchanged from the step's start.
    bool first = true;
    double segStartQ = 0;
    auto consider = [&](std::size_t seg, const char* pos, double qLocal, double Tm) {
        const double f = std::clamp(qLocal / o.Q, 0.0, 1.0);
        const double Tu = u.temperatureAt(f);
        const double dT = asSource ? Tu - Tm : Tm - Tu;
        if (first || dT < su.minApproach) {
            first = false;
            su.minApproach = dT;
            su.segment = seg;
            su.position = pos;
            su.approachDuty = std::fabs(qLocal);
            su.Tmaterial = Tm;
            su.Tutility = Tu;
        }
    };
    std::size_t bestPoint = 0;  // index of the closest sampled point in its segment's curve
    for (std::size_t k = 0; k < o.segments.size(); ++k) {
        const SegmentResult& g = o.segments[k];
        auto track = [&](const char* pos, double q, double T, std::size_t i) {
            const double before = su.minApproach;
            const bool wasFirst = first;
            consider(k, pos, q, T);
            if (wasFirst || su.minApproach < before) bestPoint = i;
        };
        track("start", segStartQ, g.start.T, 0);
        for (std::size_t i = 1; i + 1 < g.curve.size(); ++i) track("inside", g.curve[i].Q - Qcum, g.curve[i].T, i);
        segStartQ += g.Q;
        track("end", segStartQ, g.end.T, g.curve.empty() ? 0 : g.curve.size() - 1);
    }
    // Between two sampled points of a sensible isobaric segment the material's
    // T(Q) is smooth but not straight (cp varies): search the interval around
    // the closest sampled point with a golden section on T (Q = Q_i + m (h(T) − h_i)
    // along an isobar; (T, P) states are the cheap ones), 20 steps at most
    // (the interval shrinks to 1e-4 of one sample spacing; the approach, flat
    // at its minimum, is then off by far less than 1e-4 K).
    if (su.segment < o.segments.size()) {
        const SegmentResult& g = o.segments[su.segment];
        const auto& cv = g.curve;
        bool isobaric = cv.size() >= 3 && g.start.T != g.end.T;
        for (const auto& pt : cv) isobaric = isobaric && std::fabs(pt.P - g.start.P) <= 1e-12 * g.start.P;
        if (isobaric) {
            const std::size_t lo = bestPoint == 0 ? 0 : bestPoint - 1;
            const std::size_t hi = std::min(bestPoint + 1, cv.size() - 1);
            const CurvePoint& ref = cv[lo];
            auto approachAt = [&](double T, double* Tm, double* q) -> double {
                auto st = c.model.stateTP(T, g.start.P);
                if (!st || isTwoPhase(st->phase)) return std::numeric_limits<double>::infinity();
                *Tm = st->T;
                *q = ref.Q - Qcum + c.m * (st->h - ref.h);
                const double Tu = u.temperatureAt(std::clamp(*q / o.Q, 0.0, 1.0));
                return asSource ? Tu - st->T : st->T - Tu;
            };
            const double gr = 0.5 * (std::sqrt(5.0) - 1.0);
            double a = cv[lo].T, b = cv[hi].T;
            double Tm1 = 0, Tm2 = 0, q1 = 0, q2 = 0;
            double x1 = b - gr * (b - a), x2 = a + gr * (b - a);
            double f1 = approachAt(x1, &Tm1, &q1), f2 = approachAt(x2, &Tm2, &q2);
            for (int it = 0; it < 20 && std::fabs(b - a) > 1e-9; ++it) {
                if (f1 < f2) {
                    b = x2; x2 = x1; f2 = f1; Tm2 = Tm1; q2 = q1;
                    x1 = b - gr * (b - a);
                    f1 = approachAt(x1, &Tm1, &q1);
                } else {
                    a = x1; x1 = x2; f1 = f2; Tm1 = Tm2; q1 = q2;
                    x2 = a + gr * (b - a);
                    f2 = approachAt(x2, &Tm2, &q2);
                }
            }
            const double f = std::min(f1, f2);
            if (f < su.minApproach) {
                const bool one = f1 <= f2;
                su.minApproach = f;
                su.Tmaterial = one ? Tm1 : Tm2;
                su.approachDuty = std::fabs(one ? q1 : q2);
                su.Tutility = u.temperatureAt(std::clamp((one ? q1 : q2) / o.Q, 0.0, 1.0));
                su.position = "inside";
            }
        }
    }
    const double tol = 1e-9 * std::max(u.Tin, u.Tout);
    if (su.minApproach < -tol) {
        const std::string& label = o.segments[su.segment].label;
        return stepError(step, idx, std::string("the ") + role + " \"" + u.id + "\" is " + degC(su.Tutility) +
                                        " where the material is " + degC(su.Tmaterial) + " (" + su.position + " of " +
                                        label + ", after " + num(su.approachDuty / 1e3, 5) +
                                        (c.closed ? " kJ" : " kW") + " of the step's duty): heat cannot flow from cold to hot");
    }
    return su;
}

// Exergy of the steps and the sequence (definitions in the header comment).
void exergyAccounts(const Project& project, const PropertyModel& model, SequenceResult& r) {
    const bool closed = project.system == SystemKind::Closed;
    r.P0 = project.surroundingsP.si;
    auto dead = model.stateTP(r.T0, r.P0);
    if (!dead) {
        r.warnings.push_back("exergy not computed: the dead state (" + degC(r.T0) + ", " + bar(r.P0) +
                             ") is outside the model: " + dead.error().message);
        return;
    }
    r.deadState = *dead;
    r.exergyAvailable = true;
    const State& d = *dead;
    auto ex = [&](const State& s) {
        return closed ? (s.u - d.u) + r.P0 * (s.v - d.v) - r.T0 * (s.s - d.s) : (s.h - d.h) - r.T0 * (s.s - d.s);
    };
    const double m = r.massBasis;
    r.exergyStart = ex(r.start);
    auto& t = r.totals;
    const State* last = nullptr;
    for (auto& s : r.steps) {
        if (!s.computed) continue;
        s.exergyStart = ex(s.start);
        s.exergyEnd = ex(s.end);
        s.dEx = m * (s.exergyEnd - s.exergyStart);
        s.usefulWork = closed ? s.W + r.P0 * m * (s.end.v - s.start.v) : s.W;
        if (s.reservoirT) s.exergyHeat = s.Q * (1.0 - r.T0 / *s.reservoirT);
        else s.exergyHeat = s.Q == 0 ? 0.0 : s.Q - r.T0 * (s.dS - s.Sgen);
        s.exergySupplied = std::max(s.exergyHeat, 0.0) + std::max(s.usefulWork, 0.0) + std::max(-s.dEx, 0.0);
        if (s.exergySupplied > 0)
            s.secondLawEfficiency = std::clamp(1.0 - s.exergyDestroyed / s.exergySupplied, 0.0, 1.0);
        if (s.exergyHeat > 0) t.exergyHeatIn += s.exergyHeat; else t.exergyHeatOut -= s.exergyHeat;
        if (s.usefulWork > 0) t.workIn += s.usefulWork; else t.workOut -= s.usefulWork;
        last = &s.end;
    }
    if (last) t.dEx = m * (ex(*last) - r.exergyStart);
    t.exergySupplied = t.exergyHeatIn + t.workIn + std::max(-t.dEx, 0.0);
    if (t.exergySupplied > 0) t.secondLawEfficiency = std::clamp(1.0 - t.exergyDestroyed / t.exergySupplied, 0.0, 1.0);
    for (auto& s : r.steps)
        if (s.computed && t.exergyDestroyed > 0) s.exergyDestroyedShare = s.exergyDestroyed / t.exergyDestroyed;
}

}  // namespace

double UtilityProfile::massPerHeat() const {
    switch (kind) {
        case UtilityKind::Steam: return latentHeat > 0 ? 1.0 / latentHeat : 0.0;
        case UtilityKind::Sensible: return 1.0 / (cp * std::fabs(Tin - Tout));
        case UtilityKind::Fixed: return 0.0;
    }
    return 0.0;
}

Result<UtilityProfile> resolveUtility(const Utility& u) {
    UtilityProfile p;
    p.id = u.id;
    p.kind = u.kind;
    const std::string where = "utility \"" + u.id + "\"";
    switch (u.kind) {
        case UtilityKind::Steam: {
            if (!u.P) return makeError("a steam utility needs its pressure P", where);
            // The water reference model is built once (building it costs more
            // than a whole solve) and only read afterwards.
            static const Result<std::shared_ptr<const PropertyModel>> model = []() -> Result<std::shared_ptr<const PropertyModel>> {
                const Substance* water = SubstanceLibrary::builtin().find("water");
                if (!water) return makeError("the substance library has no water");
                return makeModel(ModelKind::Reference, *water);
            }();
            if (!model) return makeError(model.error().message, where);
            const double P = u.P->si;
            auto liquid = (*model)->stateOnLineP(Transition::Boiling, P, 0.0);
            auto vapour = (*model)->stateOnLineP(Transition::Boiling, P, 1.0);
            if (!liquid || !vapour)
                return makeError("no condensing steam at " + bar(P) + ": " +
                                     (!liquid ? liquid.error().message : vapour.error().message),
                                 where);
            p.P = P;
            p.Tin = p.Tout = p.Tmean = liquid->T;
            p.latentHeat = vapour->h - liquid->h;
            if (!(p.latentHeat > 0)) return makeError("no latent heat at " + bar(P) + " (at or above the critical point)", where);
            return p;
        }
        case UtilityKind::Sensible: {
            if (!u.Tin || !u.Tout || !u.cp) return makeError("a sensible utility needs in, out and cp", where);
            p.Tin = u.Tin->si;
            p.Tout = u.Tout->si;
            p.cp = u.cp->si;
            if (!(p.Tin > 0 && p.Tout > 0 && p.Tin != p.Tout && p.cp > 0))
                return makeError("in and out must differ and be above absolute zero, cp above zero", where);
            if (u.density) p.density = u.density->si;
            p.Tmean = (p.Tin - p.Tout) / std::log(p.Tin / p.Tout);
            return p;
        }
        case UtilityKind::Fixed:
            if (!u.T || !(u.T->si > 0)) return makeError("a fixed utility needs its temperature T above absolute zero", where);
            p.Tin = p.Tout = p.Tmean = u.T->si;
            return p;
    }
    return makeError("unknown utility kind", where);
}

const Error* SequenceResult::firstError() const {
    if (startError) return &*startError;
    for (const auto& s : steps)
        if (s.error) return &*s.error;
    return nullptr;
}

Result<State> startState(const Project& project, const PropertyModel& model) {
    const auto& st = project.start;
    Result<State> s = makeError("the start state needs T and P, or T or P with quality or meltFraction", "start");
    if (st.T && st.P) {
        s = model.stateTP(st.T->si, st.P->si);
    } else if (st.quality && (st.T || st.P)) {
        s = st.T ? model.stateOnLineT(Transition::Boiling, st.T->si, st.quality->value)
                 : model.stateOnLineP(Transition::Boiling, st.P->si, st.quality->value);
    } else if (st.meltFraction && (st.T || st.P)) {
        s = st.T ? model.stateOnLineT(Transition::Melting, st.T->si, st.meltFraction->value)
                 : model.stateOnLineP(Transition::Melting, st.P->si, st.meltFraction->value);
    }
    if (!s && s.error().where.empty()) return makeError(s.error().message, "start");
    return s;
}

SequenceResult solve(const Project& project, const SolveOptions& options) {
    auto model = makeModel(project.model, project.substance);
    if (!model) {
        SequenceResult r;
        r.system = project.system;
        r.startError = makeError(model.error().message, "model");
        for (const auto& s : project.steps) {
            StepResult sr;
            sr.id = s.id;
            sr.kind = s.kind;
            r.steps.push_back(std::move(sr));
        }
        return r;
    }
    return solve(project, *model, options);
}

SequenceResult solve(const Project& project, const std::shared_ptr<const PropertyModel>& model,
                     const SolveOptions& options) {
    SequenceResult r;
    r.model = model;
    // A cubic on a polar fluid that has its own reference equation: say so
    // once, where the sequence's messages are read.
    if (model->kind() == ModelKind::RealFluid)
        if (auto ref = referenceEquation(model->substance()))
            r.warnings.push_back("real-fluid (Peng–Robinson) is approximate for " + model->substance().name +
                                 ": near saturation its vapour pressures, latent heats and vapour enthalpy changes "
                                 "can be several percent off, superheat enthalpy changes more; model \"reference\" "
                                 "uses " + std::string(*ref));
    r.system = project.system;
    r.massBasis = project.massBasis();
    r.T0 = project.surroundingsT.si;
    r.steps.reserve(project.steps.size());
    for (const auto& s : project.steps) {
        StepResult sr;
        sr.id = s.id;
        sr.kind = s.kind;
        r.steps.push_back(std::move(sr));
    }
    auto start = startState(project, *model);
    if (!start) {
        r.startError = start.error();
        return r;
    }
    r.start = *start;
    const Ctx c{project, *model, r.massBasis, project.system == SystemKind::Closed, r.T0, options.curvePointsPerStep};
    std::vector<Result<UtilityProfile>> profiles;
    profiles.reserve(project.utilities.size());
    for (const Utility& u : project.utilities) profiles.push_back(resolveUtility(u));
    State cur = *start;
    double Qcum = 0;
    for (std::size_t i = 0; i < project.steps.size(); ++i) {
        const Step& step = project.steps[i];
        StepResult& sr = r.steps[i];
        sr.start = cur;
        StepResultOr out = makeError("");
        switch (step.kind) {
            case StepKind::Heat:
            case StepKind::Cool: out = heatOrCool(c, step, i, cur, Qcum); break;
            case StepKind::Melt:
            case StepKind::Freeze:
            case StepKind::Boil:
            case StepKind::Condense:
            case StepKind::Sublimate:
            case StepKind::Deposit: out = phaseChange(c, step, i, cur, Qcum); break;
            case StepKind::Compress:
            case StepKind::Expand:
            case StepKind::Throttle: out = pressureChange(c, step, i, cur, Qcum); break;
        }
        if (!out) {
            sr.error = out.error();
            if (sr.error->where.empty()) sr.error->where = stepWhere(step, i);
            break;
        }
        Outcome& o = *out;
        const Reservoir* named = step.source ? &*step.source : (step.sink ? &*step.sink : nullptr);
        if (named && named->utility && !named->T) {
            auto su = serveByUtility(c, step, i, o, profiles, Qcum);
            if (!su) {
                sr.error = su.error();
                break;
            }
            if (o.Q != 0 && !o.adiabatic) sr.reservoirT = su->Tmean;
            // 1 µK of slack: "38 degC" against "28 degC" is 10 K, not 9.999999999999943 K.
            if (su->minApproach < project.minApproachK() - 1e-6 && o.Q != 0) {
                o.warnings.push_back("approach to " + std::string(su->asSource ? "source" : "sink") + " \"" + su->id +
                                     "\" is " + num(su->minApproach, 3) + " K, below the minimum " +
                                     num(project.minApproachK(), 3) + " K (" + su->position + " of " +
                                     o.segments[su->segment].label + ")");
            }
            sr.utility = std::move(*su);
        } else {
            auto res = reservoirFor(c, step, i, o, cur);
            if (!res) {
                sr.error = res.error();
                break;
            }
            sr.reservoirT = *res;
        }
        sr.end = o.end;
        sr.Q = o.Q;
        sr.W = o.W;
        sr.dH = c.m * (o.end.h - cur.h);
        sr.dU = c.m * (o.end.u - cur.u);
        sr.dS = c.m * (o.end.s - cur.s);
        if (o.adiabatic) {
            sr.Sgen = sr.dS;
        } else if (sr.reservoirT) {
            sr.Sgen = sr.dS - sr.Q / *sr.reservoirT;
        } else {
            // No reservoir named: heat is taken as exchanged at the material's own
            // temperature, so only irreversibility inside the material counts, and
            // an internally reversible path generates none.
            sr.Sgen = 0;
        }
        // Round-off is judged against the entropies themselves as well: an
        // isentropic step has ΔS ≈ 0, and (P, s) inversions return s to about
        // 1e-10 of its value, which would otherwise read as S_gen < 0.
        const double scale = std::fabs(sr.dS) + (sr.reservoirT ? std::fabs(sr.Q / *sr.reservoirT) : 0.0) +
                             c.m * std::max(std::fabs(cur.s), std::fabs(o.end.s));
        if (sr.Sgen < -1e-9 * scale - 1e-12) {
            sr.error = stepError(step, i, "this specification would destroy entropy (S_gen = " + num(sr.Sgen) +
                                              "): heat would have to flow from cold to hot, or an efficiency above 1");
            break;
        }
        if (sr.Sgen < 0) sr.Sgen = 0;  // round-off
        sr.exergyDestroyed = r.T0 * sr.Sgen;
        sr.segments = std::move(o.segments);
        sr.warnings = std::move(o.warnings);
        std::uint32_t flags = o.end.warnings;
        for (const auto& seg : sr.segments) flags |= seg.start.warnings | seg.end.warnings;
        if (flags) sr.warnings.insert(sr.warnings.begin(), describeWarnings(flags));
        sr.computed = true;
        cur = o.end;
        Qcum += sr.Q;
        auto& t = r.totals;
        t.Q += sr.Q;
        t.W += sr.W;
        t.dH += sr.dH;
        t.dU += sr.dU;
        t.dS += sr.dS;
        t.Sgen += sr.Sgen;
        t.exergyDestroyed += sr.exergyDestroyed;
        if (sr.Q > 0) t.heatingDuty += sr.Q; else t.coolingDuty -= sr.Q;
    }
    if (r.start.warnings) r.warnings.push_back("start state: " + describeWarnings(r.start.warnings));
    exergyAccounts(project, *model, r);
    // Totals per utility, in the project's order.
    for (std::size_t k = 0; k < project.utilities.size(); ++k) {
        UtilityTotal ut;
        ut.id = project.utilities[k].id;
        ut.kind = project.utilities[k].kind;
        if (profiles[k]) ut.profile = *profiles[k];
        else ut.error = profiles[k].error();
        if (profiles[k] && profiles[k]->density) ut.volume = 0.0;
        for (const auto& s : r.steps) {
            if (!s.computed || !s.utility || s.utility->id != ut.id) continue;
            ++ut.steps;
            (s.utility->asSource ? ut.heatSupplied : ut.heatAbsorbed) += s.utility->duty;
            ut.mass += s.utility->mass;
            if (ut.volume && s.utility->volume) *ut.volume += *s.utility->volume;
            if (r.exergyAvailable) ut.exergyGivenUp += s.exergyHeat;
        }
        r.utilities.push_back(std::move(ut));
    }
    return r;
}

DomeCurve saturationDome(const PropertyModel& model, int points) {
    DomeCurve d;
    const auto crit = model.criticalPoint();
    const auto trip = model.triplePoint();
    double Tlo = trip ? trip->first : model.minTemperature();
    // Where the vapour pressure is a fraction of a pascal the saturated vapour's
    // entropy runs off toward infinity (−R ln P) and the dome would flatten the
    // whole chart; start it where the vapour pressure reaches 500 Pa (water's
    // triple point, 611.657 Pa, is above that and keeps its full dome).
    if (auto T500 = model.transitionTemperature(Transition::Boiling, 500.0); T500 && *T500 > Tlo) Tlo = *T500;
    // Without a critical point the saturation line has no top, and any cut-off
    // would draw a dome that is not there; such a chart shows the path alone.
    if (!crit) return d;
    const double Thi = crit->first * (1 - 1e-4);
    if (!(Thi > Tlo)) return d;
    points = std::max(points, 4);
    for (int k = 0; k < points; ++k) {
        // Denser toward the top, where the dome closes.
        const double f = 1.0 - (1.0 - double(k) / (points - 1)) * (1.0 - double(k) / (points - 1));
        const double T = Tlo + (Thi - Tlo) * f;
        auto l = model.stateOnLineT(Transition::Boiling, T, 0.0);
        auto v = model.stateOnLineT(Transition::Boiling, T, 1.0);
        if (l && v) {
            d.liquidSide.push_back({T, l->s, 0, l->P, l->h});
            d.vaporSide.push_back({T, v->s, 0, v->P, v->h});
        }
    }
    return d;
}

}  // namespace heatchain
