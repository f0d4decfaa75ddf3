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
#include "heatchain/transfer.hpp"

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

// ---- Utilities ------------------------------------------------------------
// A utility's temperature profile, resolved from its definition.
struct UtilityProfile {
    std::string id;
    UtilityKind kind = UtilityKind::Fixed;
    double Tin = 0, Tout = 0;   // K; equal for steam and fixed
    // The temperature the utility exchanges heat at, for S_gen and exergy:
    // steam and fixed: T; sensible: the thermodynamic mean temperature
    // (T_in − T_out) / ln(T_in / T_out), at which Q / T_mean is exactly the
    // entropy change of a constant-cp stream between T_in and T_out.
    double Tmean = 0;
    double P = 0;               // Pa, steam
    double latentHeat = 0;      // J/kg, steam (h_g − h_f at P, IAPWS-IF97)
    double cp = 0;              // J/(kg K), sensible
    std::optional<double> flow; // kg/s, sensible with a flow instead of an outlet (Tout = Tin until a step sets it)
    std::optional<double> density;  // kg/m3, sensible
    // kg of utility per J of heat: 1/latent (steam), 1/(cp |T_in − T_out|)
    // (sensible), 0 (fixed: no stream to count).
    double massPerHeat() const;
    // Utility temperature where a fraction f ∈ [0, 1] of the step's duty has
    // been exchanged, counted from the step's start. Sensible utilities run
    // counter-current: the utility enters (T_in) where the material leaves.
    double temperatureAt(double f) const { return Tout + (Tin - Tout) * f; }
};
// Messages quote temperatures and pressures in `units`.
Result<UtilityProfile> resolveUtility(const Utility& u, UnitSystem units = UnitSystem::MetricEngineering,
                                      const UnitContext& context = {});

struct UtilityLinePoint {
    double Q;  // cumulative heat into the material from the sequence start, as CurvePoint::Q
    double T;  // K, utility temperature
};

// How a step served by a utility exchanges heat with it.
struct StepUtility {
    std::string id;
    UtilityKind kind = UtilityKind::Fixed;
    bool asSource = true;        // source (heats the material) or sink (cools it)
    bool counterCurrent = false; // sensible utilities
    // K, the temperature the utility gives or takes its heat at, used for
    // S_gen and exergy: the entropic mean (T_in − T_out)/ln(T_in/T_out) of a
    // sensible one (so −Q/Tmean is its own entropy change); for a batch's
    // flowing utility, its heat over its entropy change along the step.
    double Tmean = 0;
    double duty = 0;             // |Q|, W or J
    double mass = 0;             // utility used: kg/s (steady flow) or kg (closed); 0 for fixed
    std::optional<double> volume;  // m3/s or m3, sensible with density
    // Smallest approach temperature (utility − material when heating,
    // material − utility when cooling), and where it is.
    double minApproach = 0;      // K
    std::size_t segment = 0;     // index into StepResult::segments
    std::string position;        // "start", "end" or "inside" of that segment
    double approachDuty = 0;     // |heat| exchanged from the step's start to that point, W or J
    double Tmaterial = 0, Tutility = 0;  // K at that point
    std::vector<UtilityLinePoint> line;  // the utility's T–Q line over the step (for the chart)
};

// Totals per utility over the sequence, in the project's utility order.
struct UtilityTotal {
    std::string id;
    UtilityKind kind = UtilityKind::Fixed;
    int steps = 0;                  // steps served
    double heatSupplied = 0;        // heat given to the material (as a source), W or J
    double heatAbsorbed = 0;        // heat taken from the material (as a sink), W or J
    double mass = 0;                // kg/s or kg
    std::optional<double> volume;   // m3/s or m3
    double exergyGivenUp = 0;       // Σ Q (1 − T0/T_mean), Q into the material; W or J
    std::optional<UtilityProfile> profile;  // the resolved profile
    std::optional<Error> error;             // why it could not be resolved
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
    // Messages of the step by level (see MessageLevel); its error, if any, is
    // `error`. messages() lists all three, most serious first.
    std::vector<std::string> warnings;
    std::vector<std::string> notes;
    std::vector<Message> messages() const;
    std::optional<StepUtility> utility;  // when the source or sink names a utility

    // Exergy (definitions in solver_exergy.cpp): specific exergy of the start and end
    // states relative to the dead state (J/kg); extensive change, exergy
    // carried in with the heat, the exergy supplied to the step and the
    // second-law efficiency 1 − destroyed / supplied (none when nothing is
    // supplied). Valid when SequenceResult::exergyAvailable.
    double exergyStart = 0, exergyEnd = 0;
    double dEx = 0, exergyHeat = 0, usefulWork = 0, exergySupplied = 0;
    std::optional<double> secondLawEfficiency;
    double exergyDestroyedShare = 0;  // of the sequence total, 0–1 (bar chart)
    // Heat exchanged with no source, sink or utility named: nothing is charged
    // for the heat, so the step has no exergy-destroyed figure and no η_II
    // (exergyDestroyed and Sgen stay 0, secondLawEfficiency empty); this says
    // why ("no source given"), and the sequence's exergy figures leave the
    // step out.
    std::optional<std::string> exergyNotCharged;

    // Heat transfer (transfer.hpp): the area a steady-flow step needs, or
    // the surface a batch step has; and a batch step's time and duty profile.
    std::optional<StepTransfer> transfer;
    std::optional<StepBatch> batch;
};

struct Totals {
    double Q = 0, W = 0, dH = 0, dU = 0, dS = 0, Sgen = 0, exergyDestroyed = 0;
    double heatingDuty = 0;  // sum of positive Q
    double coolingDuty = 0;  // sum of |negative Q|
    // Exergy of the sequence as one process (start state to last end state).
    double dEx = 0, exergyHeatIn = 0, exergyHeatOut = 0, workIn = 0, workOut = 0, exergySupplied = 0;
    std::optional<double> secondLawEfficiency;  // none while a step fails
    // False when any step was not computed; the sums above then add only
    // the computed steps.
    bool complete = true;
    // m2, the sizes of the steady-flow steps with a transfer added up (each
    // step its own exchanger); a batch's steps share one jacket or coil, so
    // their surface is not added up and this stays empty for a closed system.
    std::optional<double> area;
    std::optional<double> cycleTime;  // s, closed systems: over the steps with a time
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
    // Sequence-wide messages by level (a model's limits, steps left out of
    // the exergy figures); messages() lists the start error, then these.
    std::vector<std::string> warnings;
    std::vector<std::string> notes;
    std::vector<Message> messages() const;
    std::vector<UtilityTotal> utilities;  // one per project utility
    // Exergy needs the dead state: the substance at the surroundings' T and P,
    // same model. When it cannot be computed, exergy fields stay 0.
    bool exergyAvailable = false;
    std::optional<State> deadState;
    double P0 = 101325.0;
    double exergyStart = 0;            // J/kg, of the start state

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
SequenceResult solve(const Project& project, const std::shared_ptr<const PropertyModel>& model,
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
