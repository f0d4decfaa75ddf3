#pragma once
// Sweeps: vary one input of one step (or of the start state) over a
// range and re-solve the sequence at each point. Each point is set as text in
// the project and re-read by the project-file parser, so the same units and
// the same validation apply as in a file; a point that cannot be read or
// computed carries its error (it is reported, never dropped).
#include <optional>
#include <string>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/units.hpp"

namespace heatchain {

struct SweepSpec {
    std::string step;    // a step id, or "start" for the start state
    // The input: for a step "to.T", "to.P", "to.duty", "to.quality",
    // "to.ratio", "efficiency", "fraction", "n", "source.T", "sink.T";
    // for the start "T", "P", "quality", "meltFraction" (or "start.T", ...).
    std::string input;
    std::string from, to;  // quantities as typed ("150 degC"), or plain numbers for dimensionless inputs
    int points = 11;       // ≥ 2; limited to kMaxSweepPoints
    // Output keys (see sweepOutputKeys); empty: the default set.
    std::vector<std::string> outputs;
    unsigned threads = 0;  // points solved at once; 0: every core (the result is the same)
};

inline constexpr int kMaxSweepPoints = 10000;

struct SweepOutput {
    std::string key;    // "total.Q", "step:<id>.T_end", "utility:<id>.mass", ...
    std::string label;  // for people
    Dimension dimension = Dimension::Dimensionless;  // of the SI value
};

struct SweepPoint {
    double x = 0;                               // the input, SI
    std::string text;                           // the input as set in the project
    std::vector<std::optional<double>> values;  // one per output, SI; none where not computed
    std::optional<Error> error;                 // why this point could not be computed
    std::vector<std::string> warnings;          // step and sequence warnings at this point
};

struct SweepResult {
    SweepSpec spec;
    Dimension inputDimension = Dimension::Dimensionless;
    std::vector<SweepOutput> outputs;
    std::vector<SweepPoint> points;
    std::size_t computed() const;
};

// All output keys a sweep of this project can report, in a fixed order:
// totals, then each step's end T and P, Q, W, S_gen, exergy destroyed and
// approach, then each utility's use and duty. The default set is total Q, W,
// S_gen and exergy destroyed, the swept step's end temperature (the last
// step's, for the start) and the use of every steam and sensible utility.
std::vector<SweepOutput> sweepOutputKeys(const Project& project);

// Errors (unknown step, unknown input path, unreadable from/to, too few or
// too many points, unknown output) are returned; errors of single points are
// kept in the points.
Result<SweepResult> sweep(const Project& project, const SweepSpec& spec, const SolveOptions& options = {});

}  // namespace heatchain
