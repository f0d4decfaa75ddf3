#pragma once
// Heat recovery targets (pinch analysis): from the heating and cooling of
// every steady-flow stream, the least hot and cold utility any exchanger
// network could need at a chosen minimum temperature difference, where the
// pinch is, the hot and cold composite curves and the grand composite curve.
//
// Method: the problem table of Linnhoff & Flower (1978), as set out in Kemp,
// "Pinch Analysis and Process Integration", 2nd ed. (2007), ch. 2 and
// appendix 3.9, applied to straight pieces of the solved T–Q curves instead
// of streams of constant heat-capacity flow rate: hot pieces are shifted down
// and cold pieces up by the stream's ΔTmin contribution (half the ΔTmin unless
// the stream gives its own), heat is cascaded from the highest shifted
// temperature down, and the largest deficit is the minimum hot utility.
// A piece at one temperature (boiling or condensing of a pure substance)
// enters as heat at a single shifted temperature.
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/streams.hpp"

namespace heatchain {

// A straight piece of one stream's T–Q line: the material goes from Tfrom to
// Tto while `duty` (W, > 0) flows out of it (hot) or into it (cold).
struct HeatPiece {
    std::string stream;              // stream id, for messages and exclusions
    double Tfrom = 0, Tto = 0;       // K
    double duty = 0;                 // W, > 0
    bool hot = false;                // true: gives heat (is cooled)
    std::optional<double> shift;     // K, the stream's ΔTmin contribution; none: ΔTmin / 2
};

struct CompositePoint {
    double Q = 0;  // W
    double T = 0;  // K (shifted for the grand composite curve)
};

// One row of the problem table: the interval between two shifted
// temperatures (top > bottom; equal for heat exchanged at one temperature).
struct ProblemTableRow {
    double Ttop = 0, Tbottom = 0;  // K, shifted
    double surplus = 0;            // W, heat the interval gives (> 0) or needs (< 0)
    double cascadeBelow = 0;       // W, heat flowing down out of the interval with
                                   // the minimum hot utility put in at the top
};

struct Targets {
    double dTmin = 0;               // K
    double hotUtilityMin = 0;       // W
    double coldUtilityMin = 0;      // W
    std::vector<double> pinchShifted;  // K, shifted temperatures where the cascade is zero
    std::vector<double> pinchHot;      // K, hot-stream temperature at each pinch (+ ΔTmin/2)
    std::vector<double> pinchCold;     // K, cold-stream temperature at each pinch (− ΔTmin/2)
    // Composite curves, rising temperature; the hot one starts at Q = 0, the
    // cold one at Q = coldUtilityMin, so the overlap is the recovered heat.
    std::vector<CompositePoint> hotComposite, coldComposite;
    // Grand composite: heat flowing down through each shifted temperature,
    // rising temperature; its top is hotUtilityMin, its bottom coldUtilityMin.
    std::vector<CompositePoint> grandComposite;
    std::vector<ProblemTableRow> problemTable;
    double hotDuty = 0, coldDuty = 0;  // W, all the heat hot pieces give and cold pieces take
    double recovered() const { return hotDuty - coldUtilityMin; }  // W, exchanged between streams
};

// The problem table and composite curves. Pieces with zero duty are skipped.
// Errors: a non-finite or negative duty or temperature, a negative ΔTmin or
// contribution (the message names the stream).
Result<Targets> pinchTargets(std::span<const HeatPiece> pieces, double dTmin);

// A utility level placed against the grand composite curve.
struct UtilityLevel {
    std::string id;
    bool hot = true;     // supplies heat (steam, hot oil) or takes it (cooling water, brine)
    double T = 0;        // K, the temperature it exchanges at (for a sensible utility, its
                         // outlet: conservative, it cannot serve anything past its outlet)
    std::optional<double> shift;  // K; none: ΔTmin / 2
};

struct UtilityPlacement {
    std::string id;
    bool hot = true;
    double T = 0, Tshifted = 0;  // K
    double duty = 0;             // W this level can take over, cheaper levels first
};

struct UtilityPlan {
    std::vector<UtilityPlacement> levels;  // in the order given
    double hotUnmet = 0;   // W of the minimum hot utility no level is hot enough for
    double coldUnmet = 0;  // W of the minimum cold utility no level is cold enough for
};
// Whether some of the minimum hot (cold) utility is left without a level, by
// more than round-off (1e-9 of the target, or of 1 W): what every view says.
bool hotFallsShort(const UtilityPlan& plan, const Targets& targets);
bool coldFallsShort(const UtilityPlan& plan, const Targets& targets);

// Hot levels are filled from the coldest up (the cheapest first), cold
// levels from the warmest down: each takes as much as the grand composite
// curve allows at its shifted temperature (Kemp 2007, ch. 6, the placement
// of multiple utilities).
UtilityPlan placeUtilities(const Targets& targets, std::span<const UtilityLevel> levels);

struct TargetsAtDTmin {
    double dTmin = 0, hotUtilityMin = 0, coldUtilityMin = 0;  // K, W, W
};
// Targets at `count` ΔTmin values evenly from `from` to `to` (K).
Result<std::vector<TargetsAtDTmin>> dTminSweep(std::span<const HeatPiece> pieces, double from, double to, int count);

// ---- From solved streams ----------------------------------------------------

// A solved stream as the targets see it.
struct RecoveryStream {
    std::string id;
    const Project* project = nullptr;
    const SequenceResult* result = nullptr;
    std::optional<double> shift;  // K, the stream's dTminContribution
    // s, a closed (batch) stream's cycle time: its duties enter averaged over
    // it. None: the sum of its steps' times (totals.cycleTime) when they are
    // known, else the closed stream is left out.
    std::optional<double> cycleTime;
};

struct Excluded {
    std::string stream;
    std::string reason;
};

struct StreamPieces {
    std::vector<HeatPiece> pieces;
    std::vector<Excluded> excluded;
    double hotNow = 0;   // W, heat the included streams take from utilities today
    double coldNow = 0;  // W, heat they give to utilities today
    double toleranceK = 0;
    double largestErrorK = 0;  // the largest temperature error left, at the pieces' middles
    // Closed (batch) streams that entered with their duties averaged over
    // their cycle time (ids).
    std::vector<std::string> timeAveraged;
};

// The default for how far a straight piece may stray from the solved curve.
inline constexpr double kRecoveryToleranceK = 0.05;

// Cuts each heating and cooling step of every steady-flow stream into
// straight pieces: the solver's curve points are joined into as few pieces
// as keep each point within 0.9 · `toleranceK` of its piece, then a piece is
// halved until the true temperature at its middle (from the stream's model
// at the middle enthalpy) is within `toleranceK` of the straight line.
// Compress, expand and throttle steps are left out (their heat is not
// exchanged with other streams). Streams with a step that could not be
// computed are excluded, with the reason. A closed (batch) stream enters
// only with a cycle time (its own, else the sum of its steps' times when
// they are known): each batch's heat over the cycle time, a mean
// duty in W (its pieces are the solver's points joined within the
// tolerance, without the check at the middles, which holds for steady flow
// only); without one it is excluded, with the reason.
StreamPieces piecesFromStreams(std::span<const RecoveryStream> streams, double toleranceK = kRecoveryToleranceK);

// Everything `compute --json` and `targets` report.
struct Recovery {
    Targets targets;
    double hotUtilityNow = 0, coldUtilityNow = 0;  // W
    std::vector<Excluded> excluded;
    double toleranceK = 0, largestErrorK = 0;
    UtilityPlan utilities;  // the project's utilities placed against the grand composite
    // Closed (batch) streams that entered time-averaged. The average
    // overstates what can be recovered between batches: a batch's heating and
    // another's cooling happen at the same moments only if the schedule (or
    // a heat store) makes them.
    std::vector<std::string> timeAveraged;

    // Recoverable: today's utility use minus the target, W (never below
    // zero: today's use has no recovery between the streams at all).
    double recoverableHot() const { return hotUtilityNow - targets.hotUtilityMin; }
    double recoverableCold() const { return coldUtilityNow - targets.coldUtilityMin; }
    // recoverableHot as a fraction of today's hot utility; none when no hot
    // utility is used today.
    std::optional<double> recoverableHotShare() const;
};

// The worksheet's utilities as levels: steam and fixed at their temperature,
// sensible at their outlet; a utility that cannot be resolved is skipped.
// Steam is hot unless steps only give heat to it; a fixed temperature is
// hot when steps use it as a source (or, unused, when it is above the
// surroundings); a sensible utility is hot when it enters hotter than it leaves.
std::vector<UtilityLevel> utilityLevels(const StreamSet& set);

Result<Recovery> recoveryTargets(std::span<const RecoveryStream> streams, double dTmin,
                                 std::span<const UtilityLevel> levels = {},
                                 double toleranceK = kRecoveryToleranceK);

// The targets of a whole worksheet: every stream (with its ΔTmin
// contribution), at `dTmin` or else the worksheet's required minimum
// approach, with the worksheet's utilities placed as levels.
Result<Recovery> worksheetRecovery(const StreamSet& set, std::span<const SequenceResult> results,
                                   std::optional<double> dTmin = std::nullopt);

// The targets of a whole worksheet at `count` ΔTmin values evenly from
// `from` to `to` (K): the curves are cut into pieces once.
Result<std::vector<TargetsAtDTmin>> worksheetDTminSweep(const StreamSet& set, std::span<const SequenceResult> results,
                                                        double from, double to, int count);

// `compute --json` of a worksheet: version 1, today's object plus
// "recovery"; several streams, { "title", "streams": [ today's object per
// stream plus "id" ], "recovery" }. `recovery` null when it could not be
// worked out.
Json worksheetResultsToJson(const StreamSet& set, const std::vector<SequenceResult>& results,
                            const Result<Recovery>& recovery);

// `compute --json` of a one-stream worksheet: resultsToJson plus "recovery".
Json resultsWithRecoveryToJson(const Project& project, const SequenceResult& result);
// That "recovery" member alone (null where the worksheet has none), for
// writeResultsJson.
Json recoveryMemberJson(const Project& project, const SequenceResult& result);

// The fixed-key `recovery` object (project-format.md, "Additions, second round").
Json recoveryToJson(const Recovery& r);

}  // namespace heatchain
