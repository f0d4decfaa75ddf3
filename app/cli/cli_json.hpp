#pragma once
// The machine-readable answers of `heatchain-cli state`, `substances` and
// `sweep` (--json), built in one place so the Python module gives the same
// names and SI units as the command line by construction.
#include <map>
#include <memory>
#include <string>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/property_model.hpp"
#include "heatchain/result.hpp"
#include "heatchain/state.hpp"
#include "heatchain/substance.hpp"
#include "heatchain/sweep.hpp"
#include "heatchain/units.hpp"

namespace heatchain::cli {

// SI unit of a sweep column (the JSON and CSV carry SI numbers).
std::string siLabel(Dimension d);

// `sweep --json`: the spec, the outputs with their units, one entry per point.
Json sweepToJson(const SweepSpec& spec, const SweepResult& r);

// `substances --json`: the built-in library with every source.
Json substancesToJson(const SubstanceLibrary& library);

// `state`: one state of a built-in substance from two properties given as
// NAME=VALUE texts (T and P, P and h, P and s, T and quality, P and quality).
struct StateAnswer {
    const Substance* substance = nullptr;
    std::shared_ptr<const PropertyModel> model;  // kept alive: the state's source text points into it
    State state;
};
enum class StateFailure { Usage, InvalidInput, CannotCompute };
Result<StateAnswer> queryState(const std::string& substanceId, const std::map<std::string, std::string>& properties,
                               ModelKind kind, StateFailure& why);
// `state --json`: the state's fields plus "model", "source" and "warnings".
Json stateAnswerToJson(const StateAnswer& a);

}  // namespace heatchain::cli
