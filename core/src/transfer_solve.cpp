// Heat transfer inside the sequence solver: the area or batch time of a
// computed step (from its curve and its utility, transfer.cpp), the hold
// step, and the end states that follow from an exchanger ("to": rated) or a
// time ("to": time), found by solving the step for the duty whose area or
// time is the one given.
#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "heatchain/transfer.hpp"
#include "numerics/root.hpp"
#include "solver_internal.hpp"

namespace heatchain::solver_detail {

namespace {

const UtilityProfile* profileOf(const Ctx& c, const Reservoir& r, const std::vector<Result<UtilityProfile>>& profiles) {
    if (!r.utility) return nullptr;
    for (std::size_t k = 0; k < c.project.utilityList().size() && k < profiles.size(); ++k)
        if (c.project.utilityList()[k].id == *r.utility && profiles[k]) return &*profiles[k];
    return nullptr;
}

const Reservoir* reservoirOf(const Step& step) {
    return step.source ? &*step.source : (step.sink ? &*step.sink : nullptr);
}

// How the step's utility or reservoir looks to the exchange.
Result<TransferSide> sideOf(const Ctx& c, const Step& step, std::size_t idx, const std::optional<StepUtility>& su,
                            const std::vector<Result<UtilityProfile>>& profiles) {
    TransferSide side;
    const Reservoir* r = reservoirOf(step);
    if (!r) return stepError(step, idx, "heat transfer needs the step's source or sink (a utility or a temperature)");
    if (r->T) {
        side.T = r->T->si;
        return side;
    }
    const UtilityProfile* u = profileOf(c, *r, profiles);
    if (!u || !su) return stepError(step, idx, "heat transfer needs the utility \"" + r->utility.value_or("") + "\"");
    if (u->kind != UtilityKind::Sensible) {
        side.T = u->Tin;
        return side;
    }
    if (c.closed) {
        if (!u->flow)
            return stepError(step, idx, "a batch's time against the sensible utility \"" + u->id +
                                            "\" needs its flow through the jacket or coil: give the utility "
                                            "\"flow\" instead of \"out\"");
        side.constantTemperature = false;
        side.T = u->Tin;
        side.flowCp = *u->flow * u->cp;
        return side;
    }
    if (su->line.size() < 2) return stepError(step, idx, "the utility's line is missing");
    side.linear = true;
    side.Q0 = su->line.front().Q;
    side.T0 = su->line.front().T;
    side.Q1 = su->line.back().Q;
    side.T1 = su->line.back().T;
    return side;
}

// A batch step past this many time constants ends on the tail of its
// approach: the driving difference left is e^(−30) ≈ 1e-13 of the first.
constexpr double kTailTimeConstants = 30.0;

double lossUAOf(const Ctx& c, const Step& step) {
    if (!c.closed) return 0.0;
    if (step.heatLoss) return step.heatLoss->UA.si;
    return c.project.heatLoss ? c.project.heatLoss->UA.si : 0.0;
}

}  // namespace

Result<Outcome> holdStep(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum) {
    if (!c.closed) return stepError(step, idx, "a hold step belongs to a closed system (a batch)");
    return staysAt(a, Qcum, "holding", true);
}

Status applyTransfer(const Ctx& c, const Step& step, std::size_t idx, StepResult& sr,
                     const std::vector<Result<UtilityProfile>>& profiles) {
    const std::string where = stepWhere(step, idx);
    const double lossUA = lossUAOf(c, step);
    if (step.kind == StepKind::Hold) {
        double Tu = sr.start.T;
        if (const Reservoir* r = reservoirOf(step)) {
            if (r->T) Tu = r->T->si;
            else if (const UtilityProfile* u = profileOf(c, *r, profiles)) Tu = u->Tin;
        }
        sr.batch = holdBatch(step.duration ? step.duration->si : 0.0, sr.start.T, lossUA, c.T0, Tu);
        if (lossUA > 0 && !reservoirOf(step))
            sr.notes.push_back("nothing named makes up the heat lost to the surroundings (" + c.E(sr.batch->utilityHeat) +
                               "); name the source that keeps the batch at its temperature");
        return Ok{};
    }
    if (!step.transfer) return Ok{};
    const HeatTransferSpec& spec = *step.transfer;
    auto side = sideOf(c, step, idx, sr.utility, profiles);
    if (!side) return side.error();
    if (c.closed) {
        if (!spec.UA && !spec.area)
            return stepError(step, idx, "a batch's time needs the jacket or coil's transfer.area (or transfer.UA)");
        StepTransfer tv;
        auto b = batchTime(spec, sr, *side, lossUA, c.T0, where, &tv);
        if (!b) return b.error();
        sr.batch = std::move(*b);
        sr.transfer = std::move(tv);
        if (sr.utility && side->flowCp > 0) {
            // A flowing utility's use is its flow over the step's time.
            const UtilityProfile* u = profileOf(c, *reservoirOf(step), profiles);
            sr.utility->mass = *u->flow * sr.batch->duration;
            if (u->density) sr.utility->volume = sr.utility->mass / *u->density;
            // Its outlet follows the batch, so it is no reservoir at its inlet
            // temperature: it gives its heat at the mean temperature its own
            // entropy change sets, T = Q_utility / −ΔS_utility, and then
            // S_gen = ΔS − Q/T is ΔS + ΔS_utility when nothing is lost to the
            // surroundings (what the loss itself generates lies outside the
            // step, as for every batch step).
            if (sr.reservoirT && sr.batch->utilityEntropy != 0 && sr.batch->utilityHeat != 0) {
                sr.utility->Tmean = -sr.batch->utilityHeat / sr.batch->utilityEntropy;
                sr.reservoirT = sr.utility->Tmean;
            }
        }
        // A timed step that asks for longer than the tail can be told apart
        // from the settled state ends where its duty can no longer grow.
        const bool timedPastTail = step.to.time && sr.batch->duration < step.to.time->si * (1 - 1e-6);
        if (timedPastTail) {
            // The rest of the time asked for the batch stays settled, the
            // utility making up what the surroundings take.
            StepBatch& b = *sr.batch;
            const BatchPoint last = b.profile.back();
            const double extra = step.to.time->si - b.duration;
            const double loss = last.Qdot;  // the net rate is nil there: the utility's rate is the loss
            b.duration += extra;
            b.utilityHeat += loss * extra;
            b.heatLost += loss * extra;
            b.meanDuty = std::fabs(b.utilityHeat) / b.duration;
            b.profile.push_back({b.duration, last.T, last.Qdot, last.Tutility});
            if (sr.utility && side->flowCp > 0) {
                const UtilityProfile* u = profileOf(c, *reservoirOf(step), profiles);
                sr.utility->mass = *u->flow * b.duration;
            }
        }
        if (sr.batch->timeConstants > kTailTimeConstants || timedPastTail) {
            sr.warnings.push_back(
                "step \"" + step.id + "\" runs for " +
                (sr.batch->timeConstants > kTailTimeConstants ? num(sr.batch->timeConstants, 3) : "more than " + num(kTailTimeConstants, 2)) +
                " time constants of its jacket or coil: it ends on the tail of its approach, where the batch "
                "hardly moves, so the time (or a timed step's end state) is decided by that tail; check the end "
                "temperature or the time asked for, the utility's temperature, the UA "
                "and the heat loss");
        }
        return Ok{};
    }
    auto t = sizeStep(spec, sr, *side, where);
    if (!t) return t.error();
    sr.transfer = std::move(*t);
    // An exchanger already given (and not rated): does it do the duty?
    const double given = spec.UA ? spec.UA->si : (spec.area ? spec.area->si : 0.0);
    const double needed = spec.UA ? sr.transfer->UA : sr.transfer->area.value_or(0.0);
    if (given > 0 && !step.to.rated && needed > given * (1 + 1e-9)) {
        sr.warnings.push_back("the exchanger given is too small for this duty: it needs " +
                              (spec.UA ? quantityText(needed, Dimension::ThermalConductance, c.project.displayUnits, {}, 4)
                                       : quantityText(needed, Dimension::Area, c.project.displayUnits, {}, 4)) +
                              ", the step gives " + (spec.UA ? spec.UA->text : spec.area->text));
    }
    return Ok{};
}

Result<std::optional<Step>> resolveTransferTarget(const Ctx& c, const Step& step, std::size_t idx, const State& a,
                                                  double Qcum, const std::vector<Result<UtilityProfile>>& profiles) {
    if (!step.to.rated && !step.to.time) return std::optional<Step>{};
    const bool heating = step.kind == StepKind::Heat;
    if (!heating && step.kind != StepKind::Cool)
        return stepError(step, idx, "a rated or timed end state belongs to a heat or cool step");
    const Reservoir* r = reservoirOf(step);
    if (!r || !step.transfer) return stepError(step, idx, "a rated or timed step needs transfer and a source or sink");
    // The utility's hottest (heating) or coldest (cooling) temperature: the
    // material cannot pass it.
    double Tlimit = 0;
    if (r->T) {
        Tlimit = r->T->si;
    } else if (const UtilityProfile* u = profileOf(c, *r, profiles)) {
        Tlimit = u->kind == UtilityKind::Sensible && !u->flow ? (heating ? std::max(u->Tin, u->Tout) : std::min(u->Tin, u->Tout))
                                                              : u->Tin;
    } else {
        return stepError(step, idx, "the utility \"" + r->utility.value_or("") + "\" cannot be used");
    }
    const bool constantVolume = step.at && *step.at == HeatingAt::ConstantVolume;
    auto limitState = constantVolume ? c.model.stateTV(Tlimit, a.v) : c.model.stateTP(Tlimit, a.P);
    if (!limitState) return stepError(step, idx, limitState.error().message);
    const double Qmax = c.m * std::fabs(constantVolume ? limitState->u - a.u : limitState->h - a.h);
    const bool reachable = heating ? Tlimit > a.T : Tlimit < a.T;
    if (!reachable || !(Qmax > 0))
        return stepError(step, idx, std::string("the ") + (heating ? "source" : "sink") + " at " + c.T(Tlimit) +
                                        " cannot " + (heating ? "heat" : "cool") + " the material, which starts at " +
                                        c.T(a.T));
    const double target = step.to.time ? step.to.time->si
                                       : (step.transfer->UA ? step.transfer->UA->si : step.transfer->area->si);
    Step trial = step;
    trial.to = StepTarget{};
    // Kept, though the duty below is what is solved: applyTransfer reads them
    // (a rated step's area is not "too small"; a timed step's tail).
    trial.to.rated = step.to.rated;
    trial.to.time = step.to.time;
    // Area (or UA) or time after a duty; +inf where the duty cannot be reached.
    auto measure = [&](double duty) -> double {
        trial.to.duty = Quantity{"", duty};
        auto o = heatOrCool(c, trial, idx, a, Qcum);
        if (!o) return std::numeric_limits<double>::infinity();
        StepResult sr;
        sr.Q = o->Q;
        sr.start = a;
        sr.end = o->end;
        sr.segments = std::move(o->segments);
        if (r->utility) {
            auto su = serveByUtility(c, trial, idx, *o, profiles, Qcum);
            if (!su) return std::numeric_limits<double>::infinity();
            sr.utility = std::move(*su);
        }
        auto side = sideOf(c, trial, idx, sr.utility, profiles);
        if (!side) return std::numeric_limits<double>::infinity();
        if (c.closed) {
            auto b = batchTime(*trial.transfer, sr, *side, lossUAOf(c, trial), c.T0, {});
            return b ? b->duration : std::numeric_limits<double>::infinity();
        }
        auto t = sizeStep(*trial.transfer, sr, *side, {});
        if (!t) return std::numeric_limits<double>::infinity();
        return trial.transfer->UA ? t->UA : t->area.value_or(0.0);
    };
    // The area and the time grow with the duty without bound toward the
    // limit: bisect on the duty.
    const auto [lo, hi] = detail::bisect([&](double Q) { return measure(Q) < target; }, 0.0, Qmax, 1e-13 * Qmax, 200);
    const double duty = 0.5 * (lo + hi);
    if (hi >= Qmax * (1 - 1e-12) && measure(hi) < target)
        return stepError(step, idx, std::string(step.to.time ? "in " + step.to.time->text : "with the area given") +
                                        " the material would reach the " + (heating ? "source's " : "sink's ") +
                                        c.T(Tlimit) + "; nothing further can be " + (heating ? "put in" : "taken out"));
    trial.to.duty = Quantity{"", duty};
    return std::optional<Step>{std::move(trial)};
}

}  // namespace heatchain::solver_detail
