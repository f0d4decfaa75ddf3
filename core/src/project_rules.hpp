#pragma once
// The rules a worksheet obeys, written once on the typed project: what each
// kind of step takes, which target it may aim at, which numbers are bounded,
// what must be above zero, which fields need which others, and the references
// between steps and utilities. The file's reader (project_file.cpp,
// project_file_steps.cpp) applies them to what it has read, at the place it
// read it, and resolveProject applies all of them to a worksheet edited in
// code, so an edit is held to exactly the rules a saved file is. What can
// only be wrong in JSON text (a type, a missing key, an unknown word) stays
// with the reader.
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/project.hpp"
#include "json_locations.hpp"

namespace heatchain::detail {

// A rule broken, at the field's path in the file ("steps[2].to.ratio").
struct RuleBreach {
    JsonPath path;
    std::string message;
};
using RuleCheck = std::optional<RuleBreach>;

// ---- What belongs where ----------------------------------------------------

// The fields a step may have, in the file's order.
inline constexpr std::string_view kStepFields[] = {"id",     "kind", "to",   "at",       "fraction",
                                                   "path",   "n",    "efficiency", "source", "sink",
                                                   "note",   "transfer", "duration", "heatLoss"};
// The keys of a step's "to".
inline constexpr std::string_view kTargetFields[] = {"T", "P", "duty", "quality", "ratio", "rated", "time"};
// The zones a per-zone U may name.
inline constexpr std::string_view kZoneKeys[] = {"liquid",   "vapour",       "two-phase",
                                                 "solid",    "solid-liquid", "solid-vapour"};
// The fields a utility may have.
inline constexpr std::string_view kUtilityFields[] = {"id", "kind", "name", "P", "in", "out", "cp", "density", "T", "flow"};

// Whether a step of `kind` takes `field` (one of kStepFields).
bool stepFieldBelongs(StepKind kind, std::string_view field);
// The kinds that take `field`, for the "does not belong" error.
std::string_view stepFieldOwners(std::string_view field);
// The targets ("to" keys) a step of `kind` may aim at; empty when it has none.
std::span<const std::string_view> targetsOf(StepKind kind);
// The kind of utility ("steam", "sensible", "fixed") a utility field is for;
// empty for the fields every utility has.
std::string_view utilityFieldOwner(std::string_view field);

// The path of steps[index].
JsonPath stepPath(long index);

// ---- Rules, each where the reader applies it ---------------------------------

// The fields of a step, as keys in their order (`keys`), against its kind,
// and the keys of its "to" (none when it has no "to"): one target the kind
// may aim at. Before any value is read: a misplaced field is named as such
// even when its value would not read.
RuleCheck checkStepKeys(StepKind kind, std::span<const std::string_view> keys,
                        const std::optional<std::vector<std::string_view>>& toKeys, long index);
// A utility's fields, as keys, against its kind.
RuleCheck checkUtilityKeys(UtilityKind kind, std::span<const std::string_view> keys, long index);
// The same for a step or a utility held in code: the keys its set fields
// would be written as.
RuleCheck checkStepKeys(const Step& s, long index);
RuleCheck checkUtilityKeys(const Utility& u, long index);

RuleCheck checkAtmosphere(const Quantity& atmosphere);        // absolute, not gauge
RuleCheck checkBasis(const Basis& basis, SystemKind system);  // the system's kind, above zero
RuleCheck checkStart(const StartSpec& start);
RuleCheck checkMinApproach(const Quantity& minApproach);
RuleCheck checkUtility(const Utility& u, long index);
// Every utility id used once.
RuleCheck checkUtilityIds(const std::vector<Utility>& utilities);
RuleCheck checkHeatLoss(const HeatLossSpec& h, const JsonPath& path, SystemKind system);
// One step on its own, its values read (its id's uniqueness is checkStepIds').
RuleCheck checkStep(const Step& s, long index, SystemKind system);
// Every step id used once.
RuleCheck checkStepIds(const std::vector<Step>& steps);
// A step's source or sink naming a utility names one of the list, and only it.
RuleCheck checkUtilityReferences(const Project& p);

// ---- Resolving (project_resolve.cpp) -----------------------------------------

// A worksheet edited in code, part by part in the order the file's reader
// meets them: each quantity's SI value worked out again from its text (the
// atmosphere first; gauge pressures are read against it), each number given
// as text ("65 %") read again, the substance found again, and every rule
// above applied. The first rule broken is returned.
RuleCheck resolveProject(Project& p);

// `step "economiser" (steps[1]).to.T` where the step has an id, else the path.
std::string ruleLabel(const JsonPath& path, const Project& p);

}  // namespace heatchain::detail
