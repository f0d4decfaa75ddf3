#pragma once
// The sequence solver: walks the steps from the start state and gives, for
// each step and each of its segments, the end state and the energy and
// entropy bookkeeping. Conventions (ARCHITECTURE.md): Q > 0 is heat into the
// material, W > 0 is work done on it; closed: ΔU = Q + W; steady flow:
// ΔH = Q + W. Entropy generation S_gen = ΔS − Q / T_source(sink); exergy
// destroyed = T0 · S_gen (Gouy–Stodola).
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/property_model.hpp"
#include "heatchain/result.hpp"
#include "heatchain/state.hpp"

namespace heatchain {

// One sampled point of a process path, for the T–s and T–Q charts.
struct CurvePoint {
    double T;  // K
    double s;  // J/(kg K)
    double Q;  // cumulative heat into the material from the start of the sequence (W or J)
    double P;  // Pa
    double h;  // J/kg
};

struct SegmentResult {
    std::string label;  // "liquid, sensible", "boiling", "vapour, sensible", "compression", ...
    State start, end;
    double Q = 0;       // extensive (W or J)
    std::vector<CurvePoint> curve;
};

struct StepResult {
    std::string id;
    StepKind kind = StepKind::Heat;
    bool computed = false;          // false when the step or one before it failed
    std::optional<Error> error;     // why this step could not be computed
    State start, end;
    // Extensive: W and W/K for steady flow, J and J/K for a closed system.
    double Q = 0, W = 0, dH = 0, dU = 0, dS = 0, Sgen = 0, exergyDestroyed = 0;
    std::optional<double> reservoirT;  // the source or sink temperature used, K
    std::vector<SegmentResult> segments;
    std::vector<std::string> warnings;
};

struct Totals {
    double Q = 0, W = 0, dH = 0, dU = 0, dS = 0, Sgen = 0, exergyDestroyed = 0;
    double heatingDuty = 0;  // sum of positive Q
    double coolingDuty = 0;  // sum of |negative Q|
};

struct SequenceResult {
    std::shared_ptr<const PropertyModel> model;
    SystemKind system = SystemKind::SteadyFlow;
    double massBasis = 0;            // kg or kg/s
    double T0 = 298.15;              // surroundings temperature, K
    std::optional<Error> startError;  // the start state could not be computed
    State start;
    std::vector<StepResult> steps;
    Totals totals;
    std::vector<std::string> warnings;  // sequence-wide (e.g. model range notes)

    // The first error of the sequence (start or a step), if any.
    const Error* firstError() const;
    bool ok() const { return firstError() == nullptr; }
};

struct SolveOptions {
    int curvePointsPerStep = 64;  // 0: no curves
};

// Solves the whole sequence. Never throws; a step that cannot be computed
// carries its error, and the steps after it are marked not computed.
SequenceResult solve(const Project& project, const SolveOptions& options = {});
// Same, with a model already built (the GUI keeps it between edits).
SequenceResult solve(const Project& project, std::shared_ptr<const PropertyModel> model,
                     const SolveOptions& options = {});

// Resolves the start state of a project with its model.
Result<State> startState(const Project& project, const PropertyModel& model);

// The saturation (and, where the model has it, melting/sublimation) lines in
// T–s coordinates for the chart: points from the triple point (or lowest
// temperature) to the critical point.
struct DomeCurve {
    std::vector<CurvePoint> liquidSide;  // saturated liquid, rising T
    std::vector<CurvePoint> vaporSide;   // saturated vapour, rising T
};
DomeCurve saturationDome(const PropertyModel& model, int points = 80);

}  // namespace heatchain
