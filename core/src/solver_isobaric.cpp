// Isobaric steps: heat and cool (along an isobar, or an isochore in a closed
// rigid vessel) and the phase-change kinds, split into segments at every
// phase line crossed.
#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <string>

#include "numerics/root.hpp"
#include "solver_internal.hpp"

namespace heatchain::solver_detail {

namespace {

bool nearlyEqual(double a, double b, double rel = 1e-9) {
    return std::fabs(a - b) <= rel * std::max({1.0, std::fabs(a), std::fabs(b)});
}

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

Phase singlePhaseOf(const State& s, bool atHighEnd) {
    if (!isTwoPhase(s.phase)) return s.phase;
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
    const Phase ph = singlePhaseOf(a, /*atHighEnd=*/!rising);
    for (int k = 0; k < n; ++k) {
        const double f = double(k) / (n - 1);
        if (k == 0) { push(a); continue; }
        if (k == n - 1) { push(b); continue; }
        const double T = a.T + f * (b.T - a.T);
        auto s = c.model.phaseState(isTwoPhase(ph) ? b.phase : ph, T, a.P);
        if (s) push(*s);
    }
}

// A stretch of a step spent on a phase line.
struct OnLine {
    Transition t;
    double T;  // K
    double Q;  // extensive, signed
};

// Builds the segments of a constant-pressure change from `a` to `b` (which
// the caller has already found), splitting at each phase line crossed; the
// stretches on a line go to `onLines`.
std::vector<SegmentResult> isobarSegments(const Ctx& c, const State& a, const State& b, double Qstart,
                                          std::vector<OnLine>& onLines) {
    std::vector<SegmentResult> segs;
    const bool rising = b.h >= a.h;
    const auto lines = linesOnIsobar(c.model, a.P);
    // Breakpoints strictly between a.h and b.h, in path order, each a known state.
    struct Bp { double h; State s; };
    std::vector<Bp> bps;
    const double lo = std::min(a.h, b.h), hi = std::max(a.h, b.h);
    const double eps = 1e-9 * std::max(1.0, std::max(std::fabs(lo), std::fabs(hi)));
    for (const auto& L : lines) {
        for (const State* s : {&L.lower, &L.upper}) {
            if (s->h > lo + eps && s->h < hi - eps) {
                const bool isLower = (s == &L.lower);
                const State on = PropertyModel::mix(L.lower, L.upper, L.t, isLower ? 0.0 : 1.0);
                bps.push_back({s->h, on});
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
            onLines.push_back({L->t, L->T, c.m * (s1.h - s0.h)});
        } else {
            // The single phase of the span: take it from a state strictly inside.
            Phase ph = isTwoPhase(s0.phase) ? singlePhaseOf(s0, !rising) : s0.phase;
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

// A step whose enthalpy change is round-off of its start enthalpy.
bool isNull(double dh, double h) { return std::fabs(dh) <= 1e-10 * std::max(1.0, std::fabs(h)); }

// The phase-change step kind of a line, in the direction of travel.
StepKind lineStepKind(Transition t, bool rising) {
    switch (t) {
        case Transition::Melting: return rising ? StepKind::Melt : StepKind::Freeze;
        case Transition::Boiling: return rising ? StepKind::Boil : StepKind::Condense;
        case Transition::Sublimation: return rising ? StepKind::Sublimate : StepKind::Deposit;
    }
    return StepKind::Boil;
}

}  // namespace

Result<Outcome> heatOrCool(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
    const bool heating = step.kind == StepKind::Heat;
    const char* verb = heating ? "heat" : "cool";
    const bool constantVolume = step.at && *step.at == HeatingAt::ConstantVolume;
    Outcome o;
    if (step.to.duty && !(step.to.duty->si >= 0)) {
        // The project's sign rule: a step's duty is the heat it moves, put in
        // by a heat step and taken out by a cool step, written positive.
        return stepError(step, idx, "to.duty is " + step.to.duty->text + ": the duty of a " + verb +
                                        " step is the heat " + (heating ? "put into" : "taken from") +
                                        " the material, written as a positive number; a negative duty would " +
                                        (heating ? "cool" : "heat") + " it (write it positive, or use a " +
                                        (heating ? "cool" : "heat") + " step)");
    }
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
            o.notes.push_back("pressure in the closed vessel rises from " + c.P(a.P) + " to " + c.P(o.end.P));
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
    const std::string target = step.to.T ? c.T(step.to.T->si) : std::string("that target");
    if (isNull(dh, a.h)) {
        return nullStep(c, a, Qcum,
                        step.to.T ? "the target " + target + " is where the material already is"
                                  : (step.to.duty ? "a duty of " + step.to.duty->text
                                                  : "the target quality is where the material already is"));
    }
    if (heating && !(dh > 0)) {
        return stepError(step, idx, "heating to " + target + " would cool the material (it starts at " + c.T(a.T) +
                                        "); use a cool step or a higher target");
    }
    if (!heating && !(dh < 0)) {
        return stepError(step, idx, "cooling to " + target + " would heat the material (it starts at " + c.T(a.T) +
                                        "); use a heat step or a lower target");
    }
    o.end = *end;
    o.Q = c.m * dh;
    o.W = c.closed ? -c.m * a.P * (o.end.v - a.v) : 0.0;
    std::vector<OnLine> onLines;
    o.segments = isobarSegments(c, a, o.end, Qcum, onLines);
    // A heat or cool step crosses a phase line only because its target lies
    // past it; that is seldom meant (a phase-change step says it), so each
    // line crossed is a warning with its share of the duty. A quality target
    // asks for the boiling line itself.
    const std::string did = std::string(heating ? "heating" : "cooling") + " to " + target;
    auto share = [&](double q) { return num(100.0 * q / o.Q, 3) + " % of the step's duty"; };
    if (isTwoPhase(o.end.phase) && !step.to.quality && !onLines.empty()) {
        const OnLine last = onLines.back();
        onLines.pop_back();
        const bool melt = last.t == Transition::Melting;
        const std::optional<double> x = melt ? o.end.meltFraction : o.end.quality;
        o.warnings.push_back(did + " ends part-way through " + lineLabel(last.t, heating) + " (" +
                             (melt ? "liquid fraction " : "quality ") + (x ? num(*x, 3) : std::string("?")) +
                             ", " + share(last.Q) + ")");
    }
    for (const OnLine& L : onLines) {
        if (step.to.quality && L.t == Transition::Boiling) continue;
        o.warnings.push_back(did + " crosses the " + std::string(transitionLabel(L.t)) + " point (" + c.T(L.T) +
                             "): " + share(L.Q) + " is " + lineLabel(L.t, heating) + "; a " +
                             std::string(stepKindId(lineStepKind(L.t, heating))) + " step says so, if that is meant");
    }
    return o;
}

Result<Outcome> phaseChange(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
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
        return stepError(step, idx, "no " + std::string(transitionLabel(t)) + " at " + c.P(a.P) + ": " +
                                        Tline.error().message);
    }
    auto end = c.model.stateOnLineP(t, a.P, toUpper ? f : 1.0 - f);
    if (!end) return stepError(step, idx, end.error().message);
    const double dh = end->h - a.h;
    std::string what = std::string(phaseLabel(a.phase));
    if (a.quality) what += " (quality " + num(*a.quality, 3) + ")";
    if (a.meltFraction) what += " (liquid fraction " + num(*a.meltFraction, 3) + ")";
    if (isNull(dh, a.h))
        return nullStep(c, a, Qcum, "nothing to " + kind + ": the material is already " + what + " at " + c.T(a.T));
    if ((toUpper && !(dh > 0)) || (!toUpper && !(dh < 0))) {
        return stepError(step, idx, "nothing to " + kind + ": the material is " + what + " at " + c.T(a.T) +
                                        ", already past the end of this step (" +
                                        std::string(transitionLabel(t)) + " at " + c.T(*Tline) + ", " +
                                        c.P(a.P) + ")");
    }
    Outcome o;
    o.end = *end;
    o.Q = c.m * dh;
    o.W = c.closed ? -c.m * a.P * (o.end.v - a.v) : 0.0;
    std::vector<OnLine> onLines;
    o.segments = isobarSegments(c, a, o.end, Qcum, onLines);
    if (o.segments.size() > 1)
        o.notes.push_back("the step includes sensible " + std::string(toUpper ? "heating" : "cooling") +
                          " to the " + std::string(transitionLabel(t)) + " point (" + c.T(*Tline) + ")");
    // Another line on the way (a boil step that starts as ice) was not asked for.
    for (const OnLine& L : onLines) {
        if (L.t == t) continue;
        o.warnings.push_back("the step also crosses the " + std::string(transitionLabel(L.t)) + " point (" +
                             c.T(L.T) + "): " + num(100.0 * L.Q / o.Q, 3) + " % of its duty is " +
                             lineLabel(L.t, toUpper));
    }
    return o;
}

}  // namespace heatchain::solver_detail
