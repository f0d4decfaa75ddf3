#pragma once
// What the solver's files share (solver.cpp drives, solver_isobaric.cpp,
// solver_pressure.cpp, solver_utility.cpp and solver_exergy.cpp each solve one
// concern): the context of one step's calculation, what a step kind returns
// before the driver's bookkeeping, and message formatting.
#include <optional>
#include <string>
#include <vector>

#include "heatchain/solver.hpp"

namespace heatchain::solver_detail {

// The context every step calculation needs.
struct Ctx {
    const Project& project;
    const PropertyModel& model;
    double m;       // kg or kg/s
    bool closed;
    double T0;
    int points;     // curve points for this step

    // Values quoted in messages, in the project's display units.
    std::string T(double K) const;        // a temperature
    std::string dT(double K, int digits = 5) const;  // a temperature difference
    std::string P(double Pa) const;       // a pressure
    std::string E(double v) const;        // an energy (closed) or power (steady flow)
};

// What a step kind computes; the driver (solver.cpp) adds ΔH, ΔU, ΔS, S_gen
// and exergy destroyed from it, so those laws are written once.
struct Outcome {
    State end;
    double Q = 0, W = 0;           // extensive
    bool adiabatic = false;
    std::vector<SegmentResult> segments;
    std::vector<std::string> warnings;  // MessageLevel::Warning
    std::vector<std::string> notes;     // MessageLevel::Note
};

// "%.4g"-style number for messages.
std::string num(double v, int digits = 4);
// A value in display units for messages: "80 °C", "12 bar", "176 °F".
std::string quantityText(double si, Dimension d, UnitSystem units, const UnitContext& context, int digits = 5);

// One segment from a to itself, labelled, at the cumulative duty Qcum (with a
// two-point curve when asked): a step during which nothing changes.
Outcome staysAt(const State& a, double Qcum, const std::string& label, bool withCurve);

// A step whose target is where the material already is: it is computed, with
// nothing exchanged and one segment from the start to itself, and `what`
// (e.g. "the target 80 °C is the start temperature") as its warning.
Outcome nullStep(const Ctx& c, const State& a, double Qcum, const std::string& what);

std::string stepWhere(const Step& step, std::size_t index);
Error stepError(const Step& step, std::size_t idx, const std::string& msg);

// solver_isobaric.cpp: heat and cool (constant pressure or, closed, constant
// volume) and the six phase-change kinds.
Result<Outcome> heatOrCool(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum);
Result<Outcome> phaseChange(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum);

// solver_pressure.cpp: compress, expand and throttle.
Result<Outcome> pressureChange(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum);

// solver_utility.cpp: the temperature of a plain source or sink, checked
// against the direction of heat; and the exchange with a named utility.
Result<std::optional<double>> reservoirFor(const Ctx& c, const Step& step, std::size_t idx, const Outcome& o, const State& a);
Result<StepUtility> serveByUtility(const Ctx& c, const Step& step, std::size_t idx, const Outcome& o,
                                   const std::vector<Result<UtilityProfile>>& profiles, double Qcum);

// transfer_solve.cpp: the hold step; the area or batch time of a computed
// step (sr.transfer, sr.batch); and for a rated or timed step, the same step
// with the duty that reaches the given area or time (none otherwise).
Result<Outcome> holdStep(const Ctx& c, const Step& step, std::size_t idx, const State& a, double Qcum);
Status applyTransfer(const Ctx& c, const Step& step, std::size_t idx, StepResult& sr,
                     const std::vector<Result<UtilityProfile>>& profiles);
Result<std::optional<Step>> resolveTransferTarget(const Ctx& c, const Step& step, std::size_t idx, const State& a,
                                                  double Qcum, const std::vector<Result<UtilityProfile>>& profiles);

// solver_exergy.cpp: exergy of every computed step and of the sequence.
void exergyAccounts(const Project& project, const PropertyModel& model, SequenceResult& r);

}  // namespace heatchain::solver_detail
