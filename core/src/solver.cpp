// The sequence solver's driver: walks the steps from the start state, hands
// each to its kind's file (solver_isobaric.cpp, solver_pressure.cpp), serves
// it from its source, sink or utility (solver_utility.cpp), and does the
// energy and entropy bookkeeping of every step here, so the laws are written
// once:
//   closed:      ΔU = Q + W        steady flow:  ΔH = Q + W
//   S_gen = ΔS − Q / T_reservoir   (internally reversible paths without a
//                                   reservoir: S_gen = 0; adiabatic: ΔS)
//   exergy destroyed = T0 · S_gen  (Gouy–Stodola theorem)
// Exergy of the sequence: solver_exergy.cpp.
#include "heatchain/solver.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

#include "heatchain/rules.hpp"
#include "solver_internal.hpp"

namespace heatchain {

namespace solver_detail {

std::string num(double v, int digits) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*g", digits, v);
    return buf;
}
std::string quantityText(double si, Dimension d, UnitSystem units, const UnitContext& context, int digits) {
    return num(toDisplay(si, d, units, context), digits) + " " + unitLabel(displayUnit(d, units));
}

std::string Ctx::T(double K) const {
    return quantityText(K, Dimension::Temperature, project.displayUnits, project.unitContext());
}
std::string Ctx::dT(double K, int digits) const {
    return quantityText(K, Dimension::TemperatureDifference, project.displayUnits, project.unitContext(), digits);
}
std::string Ctx::P(double Pa) const {
    return quantityText(Pa, Dimension::Pressure, project.displayUnits, project.unitContext());
}
std::string Ctx::E(double v) const {
    return quantityText(v, closed ? Dimension::Energy : Dimension::Power, project.displayUnits, project.unitContext());
}

Outcome staysAt(const State& a, double Qcum, const std::string& label, bool withCurve) {
    Outcome o;
    o.end = a;
    SegmentResult seg;
    seg.label = label;
    seg.start = a;
    seg.end = a;
    if (withCurve) seg.curve.assign(2, CurvePoint{a.T, a.s, Qcum, a.P, a.h});
    o.segments.push_back(std::move(seg));
    return o;
}

Outcome nullStep(const Ctx& c, const State& a, double Qcum, const std::string& what) {
    Outcome o = staysAt(a, Qcum, "no change", c.points > 0);
    o.warnings.push_back(what + ": the step changes nothing");
    return o;
}

std::string stepWhere(const Step& step, std::size_t index) {
    return "step \"" + step.id + "\" (steps[" + std::to_string(index) + "])";
}

Error stepError(const Step& step, std::size_t idx, const std::string& msg) {
    return makeError(msg, stepWhere(step, idx));
}

}  // namespace solver_detail

using namespace solver_detail;

namespace {

void appendMessages(std::vector<Message>& out, MessageLevel level, const std::vector<std::string>& texts) {
    for (const auto& t : texts) out.push_back({level, t});
}

}  // namespace

std::vector<Message> StepResult::messages() const {
    std::vector<Message> out;
    if (error) out.push_back({MessageLevel::Error, error->text()});
    appendMessages(out, MessageLevel::Warning, warnings);
    appendMessages(out, MessageLevel::Note, notes);
    return out;
}

std::vector<Message> SequenceResult::messages() const {
    std::vector<Message> out;
    if (startError) out.push_back({MessageLevel::Error, startError->text()});
    appendMessages(out, MessageLevel::Warning, warnings);
    appendMessages(out, MessageLevel::Note, notes);
    return out;
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
        r.totals.complete = false;
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
    r.T0 = project.surroundingsOrDefault().T.si;
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
        r.totals.complete = false;
        return r;
    }
    r.start = *start;
    const Ctx plain{project, *model, r.massBasis, project.system == SystemKind::Closed, r.T0, options.curvePointsPerStep};
    // Heat transfer reads the step's curve: such steps are always sampled.
    const Ctx ct{project, *model, r.massBasis, plain.closed, r.T0, std::max(options.curvePointsPerStep, 16)};
    std::vector<Result<UtilityProfile>> profiles;
    profiles.reserve(project.utilityList().size());
    for (const Utility& u : project.utilityList())
        profiles.push_back(resolveUtility(u, project.displayUnits, project.unitContext()));
    State cur = *start;
    double Qcum = 0;
    for (std::size_t i = 0; i < project.steps.size(); ++i) {
        StepResult& sr = r.steps[i];
        sr.start = cur;
        // A rated or timed end state: the same step with the duty that reaches it.
        auto resolved = resolveTransferTarget(ct, project.steps[i], i, cur, Qcum, profiles);
        if (!resolved) {
            sr.error = resolved.error();
            break;
        }
        const Step& step = *resolved ? **resolved : project.steps[i];
        const Ctx& c = step.transfer || step.kind == StepKind::Hold ? ct : plain;
        Result<Outcome> out = makeError("");
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
            case StepKind::Hold: out = holdStep(c, step, i, cur, Qcum); break;
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
            if (approachBelowRequired(su->minApproach, project.minApproachK(), o.Q, true)) {
                o.warnings.push_back("approach to " + std::string(su->asSource ? "source" : "sink") + " \"" + su->id +
                                     "\" is " + c.dT(su->minApproach, 3) + ", below the minimum " +
                                     c.dT(project.minApproachK(), 3) + " (" + su->position + " of " +
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
        sr.segments = std::move(o.segments);
        sr.warnings = std::move(o.warnings);
        sr.notes = std::move(o.notes);
        // A step answers for the states it reaches, not for the one it
        // inherits: the start's flags were said by the step before it (or as
        // the sequence's start state). Each segment starts where the one
        // before it ended, so the ends cover every state the step passes.
        std::uint32_t flags = o.end.warnings;
        for (const auto& seg : sr.segments) flags |= seg.end.warnings;
        if (flags) sr.warnings.insert(sr.warnings.begin(), describeWarnings(flags));
        if (auto st = applyTransfer(c, step, i, sr, profiles); !st) {
            sr.error = st.error();
            break;
        }
        // S_gen after the heat transfer: a batch's flowing utility gives its heat
        // at the mean temperature its own entropy change sets (applyTransfer).
        if (o.adiabatic) {
            sr.Sgen = sr.dS;
        } else if (sr.reservoirT) {
            sr.Sgen = sr.dS - sr.Q / *sr.reservoirT;
        } else {
            // No reservoir named: heat is taken as exchanged at the material's own
            // temperature, so only irreversibility inside the material counts, and
            // an internally reversible path generates none. For heat and
            // cool steps and phase changes that is a gap in the worksheet,
            // not a result: nothing is charged for the heat.
            sr.Sgen = 0;
            if (sr.Q != 0 && !isPressureChangeKind(step.kind)) sr.exergyNotCharged = "no source given";
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
        // A batch's steps share one jacket or coil: only sized (steady-flow) areas add up.
        if (sr.transfer && sr.transfer->area && !c.closed) t.area = t.area.value_or(0.0) + *sr.transfer->area;
        if (sr.batch) t.cycleTime = t.cycleTime.value_or(0.0) + sr.batch->duration;
    }
    if (r.start.warnings) r.warnings.push_back("start state: " + describeWarnings(r.start.warnings));
    r.totals.complete = std::all_of(r.steps.begin(), r.steps.end(), [](const StepResult& s) { return s.computed; });
    exergyAccounts(project, *model, r);
    // Totals per utility, in the project's order.
    for (std::size_t k = 0; k < project.utilityList().size(); ++k) {
        UtilityTotal ut;
        ut.id = project.utilityList()[k].id;
        ut.kind = project.utilityList()[k].kind;
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
