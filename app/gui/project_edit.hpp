#pragma once
// Small, Qt-free helpers for building edits of a Project: a fresh project,
// default steps, unique ids, typed fields parsed by core, and the quick-add
// line ("heat to 180 degC"). Parsing and validation are core's; these only
// assemble the user's words into the Project structure.
#include <optional>
#include <string>
#include <utility>
#include <string_view>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/rules.hpp"
#include "heatchain/solver.hpp"

namespace heatchain::gui {

// The worksheet "New" gives: water, reference model, 1 kg/s steady flow,
// starting at 20 degC and 1 atm, no steps. Built by core's parser.
Result<Project> newProject();

// A step id not used in `project`, from `base` ("heat", "heat-2", …).
std::string uniqueStepId(const Project& project, std::string_view base);

// A sensible new step of `kind` to insert at `index`, starting from the state
// before that position in `result` (or the start state): heat by 20 K,
// compress to twice the pressure, and so on. Units follow the display system.
Step defaultStep(const Project& project, const SequenceResult& result, StepKind kind, int index);
// Temperature and pressure (SI) of the material just before `index`: the end
// of the last computed step before it, else the start state.
std::pair<double, double> stateBefore(const Project& project, const SequenceResult& result, int index);

// `step` placed in the worksheet at `index` (inserted before the step there,
// or in its place when `replace`), held to every rule a saved file is (core's
// resolveProject): the step as the worksheet then holds it, SI values
// worked out again, or what is wrong with it. An edit that passes saves to a
// file that opens again.
Result<Step> placedStep(const Project& project, int index, Step step, bool replace);

// Dimension of a step's duty as typed: energy for a closed batch, power in flow.
Dimension dutyDimension(const Project& project);

// A typed quantity ("6 barg") checked by core's parser.
Result<Quantity> parseTypedQuantity(std::string_view text, Dimension d, const Project& project);
// A typed dimensionless number ("0.72"), kept as the JSON number it was,
// within core's range for its field (rangeOf in rules.hpp, which the file's
// reader applies too); `what` names it in the message.
Result<Number> parseTypedNumber(std::string_view text, BoundedField field, std::string_view what);

// "heat to 180 degC", "cool to 40 degC sink 15 degC", "compress to 6 barg eff 0.72",
// "expand ratio 3 isentropic", "boil", "heat to x 0.4", "heat duty 250 kW".
// "to" names an end value; "by" a change ("heat by 10 K"), which needs the
// temperature where the step starts (`beforeT`, K).
Result<Step> parseQuickAdd(std::string_view line, const Project& project,
                           std::optional<double> beforeT = std::nullopt);

}  // namespace heatchain::gui
