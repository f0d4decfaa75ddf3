// Pinch targets: the problem table, composite curves, grand composite curve,
// utility placement and the ΔTmin sweep (definitions in recovery.hpp).
#include "heatchain/recovery.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace heatchain {

namespace {

// Temperatures closer than this are one temperature (K).
constexpr double kSameT = 1e-9;

// A change at one temperature of a cumulative heat walk: pieces starting or
// ending there change the heat-capacity flow rate (W/K); pieces at that one
// temperature add their heat there (W).
struct Event {
    double T = 0;
    double dCP = 0;
    double point = 0;
};

// Merges events at the same temperature; sorted by T, descending or rising.
std::vector<Event> merged(std::vector<Event> events, bool descending) {
    std::sort(events.begin(), events.end(),
              [descending](const Event& a, const Event& b) { return descending ? a.T > b.T : a.T < b.T; });
    std::vector<Event> out;
    out.reserve(events.size());
    for (const Event& e : events) {
        if (!out.empty() && std::abs(out.back().T - e.T) <= kSameT) {
            out.back().dCP += e.dCP;
            out.back().point += e.point;
        } else {
            out.push_back(e);
        }
    }
    return out;
}

// Adds a piece spanning [lo, hi] with heat `duty`, as events that switch its
// heat-capacity flow rate on at `on` and off at `off` (the ends in walking order).
void addPiece(std::vector<Event>& events, double lo, double hi, double duty, bool descending) {
    if (hi - lo <= kSameT) {
        events.push_back({hi, 0, duty});
        return;
    }
    const double cp = duty / (hi - lo);
    events.push_back({descending ? hi : lo, cp, 0});
    events.push_back({descending ? lo : hi, -cp, 0});
}

// One composite curve (all hot or all cold pieces at their real
// temperatures), rising temperature, starting at Q = Qstart.
std::vector<CompositePoint> composite(std::span<const HeatPiece> pieces, bool hot, double Qstart) {
    std::vector<Event> events;
    for (const HeatPiece& p : pieces)
        if (p.hot == hot && p.duty > 0)
            addPiece(events, std::min(p.Tfrom, p.Tto), std::max(p.Tfrom, p.Tto), p.duty, false);
    const std::vector<Event> walk = merged(std::move(events), false);
    std::vector<CompositePoint> out;
    double Q = Qstart, cp = 0;
    for (std::size_t i = 0; i < walk.size(); ++i) {
        if (i > 0) Q += cp * (walk[i].T - walk[i - 1].T);
        out.push_back({Q, walk[i].T});
        if (walk[i].point != 0) {
            Q += walk[i].point;
            out.push_back({Q, walk[i].T});
        }
        cp += walk[i].dCP;
    }
    return out;
}

std::string where(const HeatPiece& p) { return p.stream.empty() ? std::string() : "stream \"" + p.stream + "\""; }

}  // namespace

Result<Targets> pinchTargets(std::span<const HeatPiece> pieces, double dTmin) {
    if (!std::isfinite(dTmin) || dTmin < 0)
        return makeError("the minimum temperature difference must be zero or more", "dTmin");
    Targets t;
    t.dTmin = dTmin;

    // Shifted pieces as events of a walk from the top down: hot pieces give
    // heat (+), cold pieces take it (−).
    std::vector<Event> events;
    events.reserve(2 * pieces.size());
    for (const HeatPiece& p : pieces) {
        if (!std::isfinite(p.duty) || !std::isfinite(p.Tfrom) || !std::isfinite(p.Tto) || p.duty < 0 ||
            p.Tfrom <= 0 || p.Tto <= 0)
            return makeError("a piece of the T–Q line has a temperature or heat that is not a positive finite number",
                             where(p));
        if (p.shift && (!std::isfinite(*p.shift) || *p.shift < 0))
            return makeError("the ΔTmin contribution must be zero or more", where(p));
        if (p.duty == 0) continue;
        const double c = p.shift ? *p.shift : dTmin / 2;
        const double s = p.hot ? -c : c;
        (p.hot ? t.hotDuty : t.coldDuty) += p.duty;
        addPiece(events, std::min(p.Tfrom, p.Tto) + s, std::max(p.Tfrom, p.Tto) + s, p.hot ? p.duty : -p.duty, true);
    }
    const std::vector<Event> walk = merged(std::move(events), true);

    // The cascade with nothing put in at the top; then the largest deficit
    // is the minimum hot utility.
    std::vector<CompositePoint> cascade;  // Q = heat flowing down, T shifted, descending
    cascade.reserve(2 * walk.size());
    double R = 0, cp = 0, lowest = 0;
    for (std::size_t i = 0; i < walk.size(); ++i) {
        if (i > 0) {
            const double surplus = cp * (walk[i - 1].T - walk[i].T);
            R += surplus;
            t.problemTable.push_back({walk[i - 1].T, walk[i].T, surplus, R});
        }
        cascade.push_back({R, walk[i].T});
        lowest = std::min(lowest, R);
        if (walk[i].point != 0) {
            R += walk[i].point;
            t.problemTable.push_back({walk[i].T, walk[i].T, walk[i].point, R});
            cascade.push_back({R, walk[i].T});
            lowest = std::min(lowest, R);
        }
        cp += walk[i].dCP;
    }
    t.hotUtilityMin = -lowest;
    t.coldUtilityMin = cascade.empty() ? 0 : std::max(0.0, R + t.hotUtilityMin);
    for (ProblemTableRow& row : t.problemTable) row.cascadeBelow += t.hotUtilityMin;

    // Pinches: where the cascade reaches zero between its ends (zero at an
    // end is a threshold, not a pinch). Rounding leaves a trace of the size
    // of the duties, hence the relative tolerance.
    const double zero = 1e-9 * std::max(1.0, t.hotDuty + t.coldDuty);
    for (std::size_t i = 1; i + 1 < cascade.size(); ++i) {
        const double q = cascade[i].Q + t.hotUtilityMin;
        if (q > zero) continue;
        if (cascade[i].T <= walk.back().T + kSameT) continue;  // bottom end
        if (cascade[i].T >= walk.front().T - kSameT) continue;  // top end
        if (!t.pinchShifted.empty() && std::abs(t.pinchShifted.back() - cascade[i].T) <= kSameT) continue;
        t.pinchShifted.push_back(cascade[i].T);
        t.pinchHot.push_back(cascade[i].T + dTmin / 2);
        t.pinchCold.push_back(cascade[i].T - dTmin / 2);
    }

    t.grandComposite.reserve(cascade.size());
    for (auto it = cascade.rbegin(); it != cascade.rend(); ++it)
        t.grandComposite.push_back({std::max(0.0, it->Q + t.hotUtilityMin), it->T});
    t.hotComposite = composite(pieces, true, 0);
    t.coldComposite = composite(pieces, false, t.coldUtilityMin);
    return t;
}

bool hotFallsShort(const UtilityPlan& plan, const Targets& targets) {
    return plan.hotUnmet > 1e-9 * std::max(1.0, targets.hotUtilityMin);
}

bool coldFallsShort(const UtilityPlan& plan, const Targets& targets) {
    return plan.coldUnmet > 1e-9 * std::max(1.0, targets.coldUtilityMin);
}

UtilityPlan placeUtilities(const Targets& targets, std::span<const UtilityLevel> levels) {
    UtilityPlan plan;
    // Heat flowing down through each shifted temperature, descending; placing
    // q of hot utility at S moves q from the top to S, so the flow above S
    // falls by q and must stay ≥ 0 (cold utilities: mirror image, from below).
    std::vector<CompositePoint> flow(targets.grandComposite.rbegin(), targets.grandComposite.rend());
    std::vector<std::size_t> hotOrder, coldOrder;
    for (std::size_t i = 0; i < levels.size(); ++i) {
        const UtilityLevel& u = levels[i];
        const double c = u.shift ? *u.shift : targets.dTmin / 2;
        plan.levels.push_back({u.id, u.hot, u.T, u.hot ? u.T - c : u.T + c, 0});
        (u.hot ? hotOrder : coldOrder).push_back(i);
    }
    std::stable_sort(hotOrder.begin(), hotOrder.end(),
                     [&](std::size_t a, std::size_t b) { return plan.levels[a].Tshifted < plan.levels[b].Tshifted; });
    std::stable_sort(coldOrder.begin(), coldOrder.end(),
                     [&](std::size_t a, std::size_t b) { return plan.levels[a].Tshifted > plan.levels[b].Tshifted; });

    // The least flow strictly on one side of S (at S itself, the value met
    // first coming from that side), with `placed` already taken off.
    auto leastBeyond = [&](double S, bool above) {
        double least = std::numeric_limits<double>::infinity();
        bool atS = false;
        const std::size_t n = flow.size();
        for (std::size_t k = 0; k < n; ++k) {
            const CompositePoint& p = flow[above ? k : n - 1 - k];
            const bool beyond = above ? p.T > S + kSameT : p.T < S - kSameT;
            if (beyond) {
                least = std::min(least, p.Q);
                if (k + 1 < n) {  // the next point lies past S: interpolate at S
                    const CompositePoint& q = flow[above ? k + 1 : n - 2 - k];
                    const bool past = above ? q.T < S - kSameT : q.T > S + kSameT;
                    if (past) least = std::min(least, p.Q + (q.Q - p.Q) * (S - p.T) / (q.T - p.T));
                }
            } else if (!atS && std::abs(p.T - S) <= kSameT) {
                least = std::min(least, p.Q);
                atS = true;
            }
        }
        return least;
    };

    // Puts two points at S, the flow just above and just below it (where a
    // level's heat enters or leaves), and returns the index of the lower one.
    // Outside the curve's range the flow is the end value carried on.
    // A hot level's heat enters before heat taken at S itself (the point met
    // first from above), a cold level's leaves after heat given at S.
    auto splitAt = [&](double S, bool hot) -> std::size_t {
        std::size_t k = 0;
        while (k < flow.size() && flow[k].T > S + kSameT) ++k;
        double Q = 0;
        if (k < flow.size() && std::abs(flow[k].T - S) <= kSameT) {
            if (!hot)
                while (k + 1 < flow.size() && std::abs(flow[k + 1].T - S) <= kSameT) ++k;
            Q = flow[k].Q;
            flow.insert(flow.begin() + static_cast<std::ptrdiff_t>(k + 1), {Q, S});
            return k + 1;
        }
        if (k == 0)
            Q = flow.empty() ? 0 : flow.front().Q;
        else if (k == flow.size())
            Q = flow.back().Q;
        else
            Q = flow[k - 1].Q + (flow[k].Q - flow[k - 1].Q) * (S - flow[k - 1].T) / (flow[k].T - flow[k - 1].T);
        flow.insert(flow.begin() + static_cast<std::ptrdiff_t>(k), {{Q, S}, {Q, S}});
        return k + 1;
    };

    // Each level in turn takes what its side still needs, up to what the
    // cascade can pass at its temperature; the heat leaves the flow above a
    // hot level's cut (it enters there) and below a cold level's.
    auto place = [&](const std::vector<std::size_t>& order, double need, bool hot) {
        for (std::size_t i : order) {
            UtilityPlacement& u = plan.levels[i];
            const double q = std::clamp(std::min(need, leastBeyond(u.Tshifted, hot)), 0.0, need);
            u.duty = q;
            need -= q;
            const std::size_t cut = splitAt(u.Tshifted, hot);  // the heat passes between flow[cut - 1] and flow[cut]
            const std::size_t from = hot ? 0 : cut, to = hot ? cut : flow.size();
            for (std::size_t k = from; k < to; ++k) flow[k].Q -= q;
        }
        return need;
    };
    plan.hotUnmet = place(hotOrder, targets.hotUtilityMin, true);
    // Cold levels see the cascade as the hot levels left it.
    plan.coldUnmet = place(coldOrder, targets.coldUtilityMin, false);
    return plan;
}

Result<std::vector<TargetsAtDTmin>> dTminSweep(std::span<const HeatPiece> pieces, double from, double to, int count) {
    if (count < 1 || count > 10000) return makeError("the sweep needs 1 to 10000 points", "count");
    std::vector<TargetsAtDTmin> out;
    out.reserve(static_cast<std::size_t>(count));
    for (int i = 0; i < count; ++i) {
        const double d = count == 1 ? from : from + (to - from) * i / (count - 1);
        auto t = pinchTargets(pieces, d);
        if (!t) return t.error();
        out.push_back({d, t->hotUtilityMin, t->coldUtilityMin});
    }
    return out;
}

}  // namespace heatchain
