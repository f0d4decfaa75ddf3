// Utility exchange: a utility's temperature profile, the temperature of a
// plain source or sink checked against the direction of heat, and a step's
// exchange with a named utility (approach temperature along the T–Q curve,
// consumption). Steam and fixed utilities hold one temperature; sensible
// ones run linear and counter-current (the utility enters where the material
// leaves). S_gen uses the utility's T (steam, fixed) or its thermodynamic
// mean temperature (sensible), so that Q / T_mean is the utility's own
// entropy change.
#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "numerics/minimum.hpp"
#include "solver_internal.hpp"

namespace heatchain {

double UtilityProfile::massPerHeat() const {
    switch (kind) {
        case UtilityKind::Steam: return latentHeat > 0 ? 1.0 / latentHeat : 0.0;
        case UtilityKind::Sensible: return Tin != Tout ? 1.0 / (cp * std::fabs(Tin - Tout)) : 0.0;
        case UtilityKind::Fixed: return 0.0;
    }
    return 0.0;
}

Result<UtilityProfile> resolveUtility(const Utility& u, UnitSystem units, const UnitContext& context) {
    auto bar = [&](double P) { return solver_detail::quantityText(P, Dimension::Pressure, units, context); };
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
            if (u.Tin && u.flow && u.cp && !u.Tout) {
                // A flow instead of an outlet: each step's exchange sets its outlet.
                p.Tin = p.Tout = p.Tmean = u.Tin->si;
                p.cp = u.cp->si;
                p.flow = u.flow->si;
                if (!(p.Tin > 0 && p.cp > 0 && *p.flow > 0))
                    return makeError("in must be above absolute zero, cp and flow above zero", where);
                if (u.density) p.density = u.density->si;
                return p;
            }
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

namespace solver_detail {

// Reservoir temperature of a step, checked against the direction of heat.
Result<std::optional<double>> reservoirFor(const Ctx& c, const Step& step, std::size_t idx, const Outcome& o, const State& a) {
    const Reservoir* r = nullptr;
    const char* role = nullptr;
    if (step.source) { r = &*step.source; role = "source"; }
    if (step.sink) {
        if (r) return stepError(step, idx, "a step takes a source or a sink, not both");
        r = &*step.sink; role = "sink";
    }
    if (!r) return std::optional<double>{};
    if (!r->T) return stepError(step, idx, std::string("the ") + role + " needs a temperature T");
    const double Tr = r->T->si;
    double Tmax = std::max(a.T, o.end.T), Tmin = std::min(a.T, o.end.T);
    for (const auto& seg : o.segments)
        for (const auto& p : seg.curve) { Tmax = std::max(Tmax, p.T); Tmin = std::min(Tmin, p.T); }
    const double tol = 1e-9 * Tr;
    if (o.Q > 0) {
        if (std::string(role) == "sink")
            return stepError(step, idx, "heat flows into the material in this step, so it needs a source, not a sink");
        if (Tr < Tmax - tol)
            return stepError(step, idx, "the source at " + c.T(Tr) + " is colder than the material reaches (" + c.T(Tmax) +
                                            "): heat cannot flow from cold to hot");
    } else if (o.Q < 0) {
        if (std::string(role) == "source")
            return stepError(step, idx, "heat leaves the material in this step, so it needs a sink, not a source");
        if (Tr > Tmin + tol)
            return stepError(step, idx, "the sink at " + c.T(Tr) + " is warmer than the material gets (" + c.T(Tmin) +
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
    while (ui < c.project.utilityList().size() && c.project.utilityList()[ui].id != *r.utility) ++ui;
    if (ui >= profiles.size()) return stepError(step, idx, "unknown utility \"" + *r.utility + "\"");
    if (!profiles[ui])
        return stepError(step, idx, "utility \"" + *r.utility + "\": " + profiles[ui].error().message);
    UtilityProfile flowing;
    if (profiles[ui]->flow) {
        // Steady flow: the outlet follows from the step's duty, Q = ṁ c_p (T_in − T_out).
        // A batch: the outlet changes through the step (transfer_solve.cpp,
        // which also sets the temperature S_gen charges the heat at); the
        // material cannot pass the inlet, which is what is checked here.
        flowing = *profiles[ui];
        if (!c.closed) {
            flowing.Tout = flowing.Tin - o.Q / (*flowing.flow * flowing.cp);
            if (!(flowing.Tout > 0))
                return stepError(step, idx, "utility \"" + flowing.id + "\" would leave below absolute zero: its flow is too small for this duty");
            if (flowing.Tout != flowing.Tin)
                flowing.Tmean = (flowing.Tin - flowing.Tout) / std::log(flowing.Tin / flowing.Tout);
        }
    }
    const UtilityProfile& u = profiles[ui]->flow ? flowing : *profiles[ui];
    StepUtility su;
    su.id = u.id;
    su.kind = u.kind;
    su.asSource = asSource;
    su.counterCurrent = u.kind == UtilityKind::Sensible;
    su.Tmean = u.Tmean;
    su.duty = std::fabs(o.Q);
    su.mass = u.flow ? (c.closed ? 0.0 : *u.flow) : su.duty * u.massPerHeat();
    if (u.density) su.volume = su.mass / *u.density;
    if (o.Q > 0 && !asSource)
        return stepError(step, idx, "heat flows into the material in this step, so it needs a source, not a sink");
    if (o.Q < 0 && asSource)
        return stepError(step, idx, "heat leaves the material in this step, so it needs a sink, not a source");
    if (u.kind == UtilityKind::Sensible && !u.flow) {
        if (asSource && u.Tin < u.Tout)
            return stepError(step, idx, "utility \"" + u.id + "\" warms from " + c.T(u.Tin) + " to " + c.T(u.Tout) +
                                            ", so it can only take heat (a sink), not be a source");
        if (!asSource && u.Tin > u.Tout)
            return stepError(step, idx, "utility \"" + u.id + "\" cools from " + c.T(u.Tin) + " to " + c.T(u.Tout) +
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
            const auto best = detail::goldenSection(
                [&](double T) {
                    double Tm = 0, q = 0;
                    return approachAt(T, &Tm, &q);
                },
                cv[lo].T, cv[hi].T, 1e-9, 20);
            if (best.f < su.minApproach) {
                double Tm = 0, q = 0;
                approachAt(best.x, &Tm, &q);
                su.minApproach = best.f;
                su.Tmaterial = Tm;
                su.approachDuty = std::fabs(q);
                su.Tutility = u.temperatureAt(std::clamp(q / o.Q, 0.0, 1.0));
                su.position = "inside";
            }
        }
    }
    const double tol = 1e-9 * std::max(u.Tin, u.Tout);
    if (su.minApproach < -tol) {
        const std::string& label = o.segments[su.segment].label;
        return stepError(step, idx, std::string("the ") + role + " \"" + u.id + "\" is " + c.T(su.Tutility) +
                                        " where the material is " + c.T(su.Tmaterial) + " (" + su.position + " of " +
                                        label + ", after " + c.E(su.approachDuty) +
                                        " of the step's duty): heat cannot flow from cold to hot");
    }
    return su;
}

}  // namespace solver_detail

}  // namespace heatchain
