// From solved streams to the straight pieces the targets work on, the
// project's utilities as levels, and the `recovery` JSON object.
#include <algorithm>
#include <cmath>

#include "heatchain/recovery.hpp"
#include "heatchain/results_json.hpp"

namespace heatchain {

namespace {

// Deepest halving of one sampled interval: 2^12 pieces between two curve
// points is far beyond any curve the solver gives.
constexpr int kMaxDepth = 12;

struct Refiner {
    const PropertyModel& model;
    double tolerance;
    double largestError = 0;

    // Appends the end points of straight pieces from a (exclusive) to b
    // (inclusive), halving where the true temperature at the middle is off
    // the line by more than the tolerance. In steady flow with no work, the
    // heat is m·Δh, so the middle in Q is the middle in h.
    void refine(const CurvePoint& a, const CurvePoint& b, int depth, std::vector<CurvePoint>& out) {
        const double hMid = 0.5 * (a.h + b.h), PMid = 0.5 * (a.P + b.P);
        const double lineT = 0.5 * (a.T + b.T);
        auto mid = model.stateP(PMid, Property::Enthalpy, hMid);
        if (mid) {
            const double error = std::abs(mid->T - lineT);
            if (error > tolerance && depth < kMaxDepth) {
                const CurvePoint m{mid->T, mid->s, 0.5 * (a.Q + b.Q), PMid, hMid};
                refine(a, m, depth + 1, out);
                refine(m, b, depth + 1, out);
                return;
            }
            largestError = std::max(largestError, error);
        }
        out.push_back(b);
    }
};

bool exchangesWithOthers(StepKind k) { return !isPressureChangeKind(k); }

// The solver's points joined into as few straight pieces as keep every
// point within `tolerance` (in T at the point's Q) of its piece: from each
// start, the piece is grown while all points it passes stay close.
std::vector<CurvePoint> joined(const std::vector<CurvePoint>& line, double tolerance) {
    if (line.size() < 3) return line;
    std::vector<CurvePoint> out{line.front()};
    std::size_t a = 0;
    while (a + 1 < line.size()) {
        std::size_t b = a + 1;
        while (b + 1 < line.size()) {
            const std::size_t next = b + 1;
            const double dQ = line[next].Q - line[a].Q;
            bool close = dQ != 0;
            for (std::size_t k = a + 1; close && k < next; ++k) {
                const double onChord = line[a].T + (line[next].T - line[a].T) * (line[k].Q - line[a].Q) / dQ;
                close = std::abs(onChord - line[k].T) <= tolerance;
            }
            if (!close) break;
            b = next;
        }
        out.push_back(line[b]);
        a = b;
    }
    return out;
}

}  // namespace

StreamPieces piecesFromStreams(std::span<const RecoveryStream> streams, double toleranceK) {
    StreamPieces out;
    out.toleranceK = toleranceK;
    for (const RecoveryStream& s : streams) {
        if (!s.project || !s.result) {
            out.excluded.push_back({s.id, "the stream has not been solved"});
            continue;
        }
        // A batch enters at its mean duty over its cycle time: the stream's
        // own, else the sum of its steps' times when they are known.
        const bool batch = s.project->system == SystemKind::Closed;
        const std::optional<double> cycle = s.cycleTime ? s.cycleTime : s.result->totals.cycleTime;
        if (batch && !(cycle && *cycle > 0)) {
            out.excluded.push_back({s.id, "a closed (batch) stream has no steady heat rate to set against the "
                                          "others; it is left out of the targets (give the stream a cycle time, "
                                          "\"cycleTime\", or its steps' heat transfer so their times are known, "
                                          "to enter its duties averaged over the cycle)"});
            continue;
        }
        if (const Error* e = s.result->firstError()) {
            out.excluded.push_back({s.id, "not every step could be computed (" + e->text() + ")"});
            continue;
        }
        if (!s.result->model) {
            out.excluded.push_back({s.id, "the stream has no property model"});
            continue;
        }
        // A batch's heat (J a batch) as a mean duty over its cycle (W).
        const double scale = batch ? 1.0 / *cycle : 1.0;
        if (batch) out.timeAveraged.push_back(s.id);
        Refiner refiner{*s.result->model, toleranceK};
        for (std::size_t i = 0; i < s.result->steps.size() && i < s.project->steps.size(); ++i) {
            const StepResult& step = s.result->steps[i];
            if (!exchangesWithOthers(step.kind)) continue;
            // The solver's points, joined where they lie on one line, then
            // each piece checked at its middle against the model. The join
            // keeps a tenth of the tolerance for the curve between points.
            std::vector<CurvePoint> solved;
            for (const SegmentResult& seg : step.segments) {
                if (seg.curve.empty()) continue;
                if (!solved.empty()) {
                    const CurvePoint& last = solved.back();
                    const CurvePoint& first = seg.curve.front();
                    if (last.Q == first.Q && last.T == first.T) solved.pop_back();
                }
                solved.insert(solved.end(), seg.curve.begin(), seg.curve.end());
            }
            const std::vector<CurvePoint> corners = joined(solved, 0.9 * toleranceK);
            std::vector<CurvePoint> line;
            for (std::size_t k = 0; k < corners.size(); ++k) {
                // A closed step's heat is m·Δh only at constant pressure:
                // its middles are not checked (the joined points stand).
                if (line.empty() || batch)
                    line.push_back(corners[k]);
                else
                    refiner.refine(line.back(), corners[k], 0, line);
            }
            for (std::size_t k = 1; k < line.size(); ++k) {
                const double dQ = (line[k].Q - line[k - 1].Q) * scale;
                if (dQ == 0) continue;
                out.pieces.push_back({s.id, line[k - 1].T, line[k].T, std::abs(dQ), dQ < 0, s.shift});
                (dQ > 0 ? out.hotNow : out.coldNow) += std::abs(dQ);
            }
        }
        out.largestErrorK = std::max(out.largestErrorK, refiner.largestError);
    }
    return out;
}

std::vector<UtilityLevel> utilityLevels(const StreamSet& set) {
    std::vector<UtilityLevel> out;
    const Project& shared = set.shared;
    for (const Utility& u : shared.utilityList()) {
        auto profile = resolveUtility(u, shared.displayUnits, shared.unitContext());
        if (!profile) continue;
        bool asSource = false, asSink = false;
        for (const Stream& stream : set.streams) {
            for (const Step& s : stream.project.steps) {
                if (s.source && s.source->utility == u.id) asSource = true;
                if (s.sink && s.sink->utility == u.id) asSink = true;
            }
        }
        UtilityLevel level;
        level.id = u.id;
        switch (u.kind) {
            case UtilityKind::Steam: level.hot = asSource || !asSink; break;
            case UtilityKind::Sensible: level.hot = profile->Tin > profile->Tout; break;
            case UtilityKind::Fixed:
                level.hot = asSource != asSink ? asSource : profile->Tin > shared.surroundingsOrDefault().T.si;
                break;
        }
        level.T = profile->Tout;
        out.push_back(level);
    }
    return out;
}

Result<Recovery> recoveryTargets(std::span<const RecoveryStream> streams, double dTmin,
                                 std::span<const UtilityLevel> levels, double toleranceK) {
    StreamPieces pieces = piecesFromStreams(streams, toleranceK);
    auto targets = pinchTargets(pieces.pieces, dTmin);
    if (!targets) return targets.error();
    Recovery r;
    r.targets = std::move(*targets);
    r.hotUtilityNow = pieces.hotNow;
    r.coldUtilityNow = pieces.coldNow;
    r.excluded = std::move(pieces.excluded);
    r.toleranceK = pieces.toleranceK;
    r.largestErrorK = pieces.largestErrorK;
    r.timeAveraged = std::move(pieces.timeAveraged);
    r.utilities = placeUtilities(r.targets, levels);
    return r;
}

std::optional<double> Recovery::recoverableHotShare() const {
    if (!(hotUtilityNow > 0)) return std::nullopt;
    return recoverableHot() / hotUtilityNow;
}

namespace {
std::vector<RecoveryStream> recoveryStreamsOf(const StreamSet& set, std::span<const SequenceResult> results) {
    std::vector<RecoveryStream> streams;
    streams.reserve(set.streams.size());
    for (std::size_t i = 0; i < set.streams.size(); ++i) {
        const Stream& s = set.streams[i];
        streams.push_back({s.id, &s.project, i < results.size() ? &results[i] : nullptr,
                           s.dTminContribution ? std::optional<double>(s.dTminContribution->si) : std::nullopt,
                           s.cycleTime ? std::optional<double>(s.cycleTime->si) : std::nullopt});
    }
    return streams;
}
}  // namespace

Result<Recovery> worksheetRecovery(const StreamSet& set, std::span<const SequenceResult> results,
                                   std::optional<double> dTmin) {
    const std::vector<RecoveryStream> streams = recoveryStreamsOf(set, results);
    const std::vector<UtilityLevel> levels = utilityLevels(set);
    return recoveryTargets(streams, dTmin ? *dTmin : set.shared.minApproachK(), levels);
}

Result<std::vector<TargetsAtDTmin>> worksheetDTminSweep(const StreamSet& set, std::span<const SequenceResult> results,
                                                        double from, double to, int count) {
    const std::vector<RecoveryStream> streams = recoveryStreamsOf(set, results);
    const StreamPieces pieces = piecesFromStreams(streams);
    return dTminSweep(pieces.pieces, from, to, count);
}

Json worksheetResultsToJson(const StreamSet& set, const std::vector<SequenceResult>& results,
                            const Result<Recovery>& recovery) {
    const Json rec = recovery ? recoveryToJson(*recovery) : Json(nullptr);
    if (set.streams.size() == 1 && set.version == 1 && !results.empty()) {
        Json j = resultsToJson(set.streams.front().project, results.front());
        j["recovery"] = rec;
        return j;
    }
    Json j = Json::object();
    j["title"] = set.shared.meta.title;
    Json list = Json::array();
    for (std::size_t i = 0; i < set.streams.size() && i < results.size(); ++i) {
        Json one = Json::object();
        one["id"] = set.streams[i].id;
        const Json today = resultsToJson(set.streams[i].project, results[i]);
        for (auto it = today.begin(); it != today.end(); ++it) one[it.key()] = it.value();
        list.push_back(std::move(one));
    }
    j["streams"] = std::move(list);
    j["recovery"] = rec;
    return j;
}

Json recoveryMemberJson(const Project& project, const SequenceResult& result) {
    const StreamSet set = streamSetOf(project);
    // The caller's result itself, not a copy: a long worksheet's curves
    // would otherwise double the memory of `compute --json`.
    const auto recovery = worksheetRecovery(set, std::span<const SequenceResult>(&result, 1));
    return recovery ? recoveryToJson(*recovery) : Json(nullptr);
}

Json resultsWithRecoveryToJson(const Project& project, const SequenceResult& result) {
    Json j = resultsToJson(project, result);
    j["recovery"] = recoveryMemberJson(project, result);
    return j;
}

Json recoveryToJson(const Recovery& r) {
    const Targets& t = r.targets;
    auto curve = [](const std::vector<CompositePoint>& points, const char* tKey) {
        Json list = Json::array();
        for (const CompositePoint& p : points) list.push_back(Json{{"Q_W", p.Q}, {tKey, p.T}});
        return list;
    };
    Json j = Json::object();
    j["dTmin_K"] = t.dTmin;
    j["hotUtilityMin_W"] = t.hotUtilityMin;
    j["coldUtilityMin_W"] = t.coldUtilityMin;
    j["pinchHot_K"] = t.pinchHot;
    j["pinchCold_K"] = t.pinchCold;
    j["hotUtilityNow_W"] = r.hotUtilityNow;
    j["coldUtilityNow_W"] = r.coldUtilityNow;
    j["hotComposite"] = curve(t.hotComposite, "T_K");
    j["coldComposite"] = curve(t.coldComposite, "T_K");
    j["grandComposite"] = curve(t.grandComposite, "Tshifted_K");
    Json excluded = Json::array();
    for (const Excluded& e : r.excluded) excluded.push_back(Json{{"stream", e.stream}, {"reason", e.reason}});
    j["excluded"] = std::move(excluded);
    // Optional additions beyond the fixed keys.
    j["recovered_W"] = t.recovered();
    j["temperatureTolerance_K"] = r.toleranceK;
    Json levels = Json::array();
    for (const UtilityPlacement& u : r.utilities.levels)
        levels.push_back(Json{{"id", u.id}, {"hot", u.hot}, {"T_K", u.T}, {"duty_W", u.duty}});
    j["utilityLevels"] = std::move(levels);
    j["hotUtilityUnmet_W"] = r.utilities.hotUnmet;
    j["timeAveraged"] = r.timeAveraged;
    j["coldUtilityUnmet_W"] = r.utilities.coldUnmet;
    return j;
}

}  // namespace heatchain
