#pragma once
// How sure a result is: the tolerances typed on a project's inputs (and, when
// the project asks, each property model's stated uncertainty) carried through
// the solver to every step's Q, W, end temperature, S_gen, exergy destroyed,
// utility use and the totals.
//
// First order (JCGM 100:2008 "GUM", 5.1.2, the law of propagation of
// uncertainty for independent inputs): u²(y) = Σ c_i² u²(x_i), with each
// sensitivity c_i from re-solving the sequence at x_i ± u(x_i) (a central
// difference with the step equal to the standard uncertainty; one-sided where
// x_i ± u(x_i) leaves the input's valid range).
//
// Monte Carlo (JCGM 101:2008, 7): N draws of all inputs from their
// distributions, one solve per draw, on every core. Each draw has its own
// random stream derived from the seed and the draw's index, so the result is
// the same for any number of threads. The coverage interval is the
// probabilistically symmetric 95 % interval of JCGM 101:2008, 7.7.
//
// Output and input paths follow the shared design project-format.md
// ("Tolerances and uncertainty").
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/tolerance.hpp"
#include "heatchain/units.hpp"

namespace heatchain {

enum class UncertaintyMethod { Linear, MonteCarlo };
std::string_view uncertaintyMethodId(UncertaintyMethod m);  // "linear", "montecarlo"
Result<UncertaintyMethod> parseUncertaintyMethod(std::string_view id);

// One input that carries an uncertainty.
struct UncertainInput {
    std::string path;          // "start.T", "steps.<id>.efficiency", "basis.massFlow", "model.<substance>"
    std::string text;          // as typed, or the model's statement
    Dimension dimension = Dimension::Dimensionless;  // of the value (a model's is a relative one)
    double value = 0;          // SI (for a model: 0, the relative error's nominal value)
    double u = 0;              // standard uncertainty, SI (for a model: relative)
    Distribution distribution = Distribution::Normal;
    bool model = false;        // a property model's stated uncertainty in enthalpy differences
    std::string source;        // for a model: where its figure comes from
};

struct UncertainOutput {
    std::string path;          // "steps.<id>.Q", "totals.heatingDuty", "utilities.<id>.mass", ...
    Dimension dimension = Dimension::Dimensionless;
    double value = 0;          // the nominal result, SI
    double u = 0;              // standard uncertainty, SI
    std::optional<double> mean, p025, p975;  // Monte Carlo only
};

struct Contribution {
    std::string input;
    double sensitivity = 0;    // c_i, output SI per input SI
    double variance = 0;       // (c_i u_i)²
    double share = 0;          // of the output's first-order variance, 0–1
};

struct UncertaintyOptions {
    UncertaintyMethod method = UncertaintyMethod::Linear;
    int samples = 10000;       // Monte Carlo draws, 2 … kMaxUncertaintySamples
    std::uint64_t seed = 1;
    unsigned threads = 0;      // 0: every core
    // The output whose variance is split among the inputs; empty: the total
    // heating duty (the cooling duty, then the work, when it has no variance).
    std::string contributionsOf;
};

inline constexpr int kMaxUncertaintySamples = 1000000;

struct UncertaintyResult {
    UncertaintyMethod method = UncertaintyMethod::Linear;
    int samples = 0;           // Monte Carlo draws asked for (0 for linear)
    int samplesUsed = 0;       // draws whose sequence computed
    std::uint64_t seed = 0;
    std::vector<UncertainInput> inputs;
    std::vector<UncertainOutput> outputs;
    std::string contributionsOf;
    std::vector<Contribution> contributions;  // ranked, largest first (first order)
    std::vector<std::string> notes;           // e.g. draws dropped outside an input's valid range
    const UncertainOutput* find(std::string_view path) const;
};

// A property model's stated relative standard uncertainty in enthalpy
// differences (and so in duties and work) and in cp, with its source
// (uncertainty_models.cpp). A custom substance may state its own:
// "uncertainty": { "h": "1 %", "cp": "2 %", "source": "..." }.
struct ModelUncertainty {
    std::string model;   // "IAPWS-IF97", "Peng-Robinson", ...
    double h = 0;        // relative standard uncertainty of enthalpy differences
    double cp = 0;       // relative standard uncertainty of cp
    std::string source;
};
Result<ModelUncertainty> statedModelUncertainty(const Project& project);

// Whether the project asks for the models' stated uncertainties
// ("uncertainty": { "models": true }); an ill-formed block is an error.
Result<bool> modelUncertaintyOn(const Project& project);

// Every input of the project that carries a tolerance, in file order, plus the
// model's when switched on. Errors name the field.
Result<std::vector<UncertainInput>> uncertainInputs(const Project& project);

// Propagates the inputs' uncertainties. An error when the nominal sequence
// cannot be computed, when no input carries an uncertainty, or when an
// option is out of range.
Result<UncertaintyResult> propagateUncertainty(const Project& project, const UncertaintyOptions& options = {});

// The "uncertainty" object of `compute --json` (project-format.md).
Json uncertaintyJson(const UncertaintyResult& result);

// Runs fn(0) … fn(n − 1) on up to `threads` threads (0: every core); each
// index exactly once. fn must only write to what index i owns.
void parallelFor(std::size_t n, unsigned threads, const std::function<void(std::size_t)>& fn);

}  // namespace heatchain
