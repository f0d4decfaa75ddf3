#pragma once
// Review aid: what changed between two revisions of a project, and how the
// results moved. Fields are compared as the user typed them (the stable
// writer's text), so "180 degC" → "185 degC" reads as written; results are
// compared in SI.
#include <optional>
#include <string>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain {

// One field that differs: a dotted path ("to.T", "meta.revision",
// "basis.massFlow") and its text before and after; an absent side is empty
// with `present*` false.
struct FieldChange {
    std::string field;
    std::string before, after;
    bool presentBefore = true, presentAfter = true;
};

struct StepChange {
    enum class Kind { Added, Removed, Changed, Moved };
    std::string id;
    Kind kind = Kind::Changed;
    // 1-based positions in each revision; 0 where the step is absent.
    int positionBefore = 0, positionAfter = 0;
    // Moved: the step's order relative to the other kept steps changed. A
    // moved step may also be changed (both flags are then reported).
    bool moved = false;
    std::vector<FieldChange> fields;  // Changed (and Moved with edits)
};

// A number before and after; absent when that revision has no value (step
// missing or not computed).
struct Shift {
    std::optional<double> before, after;
    std::optional<double> delta() const {
        if (before && after) return *after - *before;
        return std::nullopt;
    }
    bool changed(double relTol = 1e-9, double absTol = 1e-12) const;
};

struct StepResultShift {
    std::string id;
    Shift Q, W, Sgen, endT;  // extensive in W or J (W/K or J/K), end T in K
};

struct TotalsShift {
    Shift Q, W, Sgen, exergyDestroyed, heatingDuty, coolingDuty;
};

struct ProjectDiff {
    std::vector<FieldChange> project;  // everything outside "steps"
    std::vector<StepChange> steps;     // only steps that differ, in the "after" order, removed ones last
    std::vector<StepResultShift> results;  // every step present in either revision, after order then removed
    TotalsShift totals;
    bool resultsCompared = false;      // both revisions were solved

    bool identicalInput() const { return project.empty() && steps.empty(); }
};

// Compares the inputs of two revisions.
ProjectDiff diffProjects(const Project& before, const Project& after);
// Compares inputs and the solved results of both revisions.
ProjectDiff diffProjects(const Project& before, const SequenceResult& resultBefore,
                         const Project& after, const SequenceResult& resultAfter);

// Machine-readable form (SI numbers, as `compute --json`).
Json projectDiffToJson(const ProjectDiff& diff, const Project& after);
// For people: fields as typed, results in the display units of `after`.
std::string projectDiffText(const ProjectDiff& diff, const Project& after);

}  // namespace heatchain
