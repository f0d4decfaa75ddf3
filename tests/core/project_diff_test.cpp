// The review aid: steps added, removed, moved and changed field by field,
// project-level changes, and the results that moved. The projects are small
// worksheets of our own; the expected changes follow from the edits made.
#include "heatchain/project_diff.hpp"

#include <gtest/gtest.h>

#include <string>

#include "heatchain/project_file.hpp"

namespace heatchain {
namespace {

std::string worksheet(const std::string& revision, const std::string& steps) {
    return R"({
  "format": "heatchain-project", "version": 1,
  "meta": { "title": "Diff test", "author": "test", "revision": ")" + revision + R"(",
            "created": "2026-12-01T00:00:00Z", "modified": "2026-12-01T00:00:00Z", "notes": "" },
  "display": { "units": "SI" }, "system": "steady-flow", "model": "reference",
  "substance": "water", "basis": { "massFlow": "1 kg/s" },
  "start": { "T": "20 degC", "P": "5 bar" },
  "steps": [ )" + steps + R"( ] })";
}

const std::string kA = R"({ "id": "a", "kind": "heat", "to": { "T": "60 degC" } })";
const std::string kB = R"({ "id": "b", "kind": "heat", "to": { "T": "90 degC" }, "source": { "T": "120 degC" } })";
const std::string kC = R"({ "id": "c", "kind": "cool", "to": { "T": "40 degC" } })";
const std::string kD = R"({ "id": "d", "kind": "cool", "to": { "T": "30 degC" } })";

Project parse(const std::string& text) {
    auto p = parseProject(text, "test");
    EXPECT_TRUE(p.ok()) << (p.ok() ? "" : p.error().text());
    return p.ok() ? *p : Project{};
}

TEST(ProjectDiff, IdenticalRevisionsHaveNoChanges) {
    const Project p = parse(worksheet("A", kA + "," + kB));
    const auto d = diffProjects(p, solve(p), p, solve(p));
    EXPECT_TRUE(d.identicalInput());
    ASSERT_EQ(d.results.size(), 2u);
    for (const auto& r : d.results) EXPECT_FALSE(r.Q.changed() || r.W.changed() || r.Sgen.changed() || r.endT.changed());
}

TEST(ProjectDiff, FieldChangesAsTyped) {
    const std::string b2 = R"({ "id": "b", "kind": "heat", "to": { "T": "95 degC" }, "note": "new" })";
    const auto d = diffProjects(parse(worksheet("A", kA + "," + kB)), parse(worksheet("B", kA + "," + b2)));
    ASSERT_EQ(d.project.size(), 1u);
    EXPECT_EQ(d.project[0].field, "meta.revision");
    EXPECT_EQ(d.project[0].before, "A");
    EXPECT_EQ(d.project[0].after, "B");
    ASSERT_EQ(d.steps.size(), 1u);
    const StepChange& c = d.steps[0];
    EXPECT_EQ(c.id, "b");
    EXPECT_EQ(c.kind, StepChange::Kind::Changed);
    EXPECT_FALSE(c.moved);
    // to.T changed, note added, source removed.
    ASSERT_EQ(c.fields.size(), 3u);
    EXPECT_EQ(c.fields[0].field, "to.T");
    EXPECT_EQ(c.fields[0].before, "90 degC");
    EXPECT_EQ(c.fields[0].after, "95 degC");
    EXPECT_EQ(c.fields[1].field, "note");
    EXPECT_FALSE(c.fields[1].presentBefore);
    EXPECT_EQ(c.fields[2].field, "source.T");
    EXPECT_FALSE(c.fields[2].presentAfter);
}

TEST(ProjectDiff, AddedRemovedAndMoved) {
    // Before a, b, c, d; after: d moved to the front, b removed, e added.
    const std::string kE = R"({ "id": "e", "kind": "heat", "to": { "T": "50 degC" } })";
    const auto d = diffProjects(parse(worksheet("A", kA + "," + kB + "," + kC + "," + kD)),
                                parse(worksheet("A", kD + "," + kA + "," + kC + "," + kE)));
    ASSERT_EQ(d.steps.size(), 3u);
    EXPECT_EQ(d.steps[0].id, "d");
    EXPECT_EQ(d.steps[0].kind, StepChange::Kind::Moved);
    EXPECT_EQ(d.steps[0].positionBefore, 4);
    EXPECT_EQ(d.steps[0].positionAfter, 1);
    EXPECT_EQ(d.steps[1].id, "e");
    EXPECT_EQ(d.steps[1].kind, StepChange::Kind::Added);
    EXPECT_EQ(d.steps[1].positionAfter, 4);
    EXPECT_EQ(d.steps[2].id, "b");
    EXPECT_EQ(d.steps[2].kind, StepChange::Kind::Removed);
    EXPECT_EQ(d.steps[2].positionBefore, 2);
}

TEST(ProjectDiff, ResultsFollowTwoSeparateSolves) {
    const std::string b2 = R"({ "id": "b", "kind": "heat", "to": { "T": "80 degC" }, "source": { "T": "120 degC" } })";
    const Project pa = parse(worksheet("A", kA + "," + kB + "," + kC)), pb = parse(worksheet("A", kA + "," + b2 + "," + kC));
    const auto ra = solve(pa), rb = solve(pb);
    ASSERT_TRUE(ra.ok());
    ASSERT_TRUE(rb.ok());
    const auto d = diffProjects(pa, ra, pb, rb);
    ASSERT_EQ(d.results.size(), 3u);
    EXPECT_FALSE(d.results[0].Q.changed());
    for (int i : {1, 2}) {
        EXPECT_TRUE(d.results[std::size_t(i)].Q.changed());
        EXPECT_DOUBLE_EQ(*d.results[std::size_t(i)].Q.delta(), rb.steps[std::size_t(i)].Q - ra.steps[std::size_t(i)].Q);
    }
    // Same end state of the sequence (c cools to 40 °C either way): the net
    // duty is a difference of state functions and does not move (ΔH = Q + W, W = 0).
    EXPECT_NEAR(*d.totals.Q.delta(), 0.0, 1e-6 * ra.totals.heatingDuty);
    EXPECT_LT(*d.totals.heatingDuty.delta(), 0);
    EXPECT_NEAR(*d.totals.heatingDuty.delta(), *d.totals.coolingDuty.delta(), 1e-6 * ra.totals.heatingDuty);
    const Json j = projectDiffToJson(d, pb);
    EXPECT_EQ(j["units"]["Q"], "W");
    EXPECT_DOUBLE_EQ(j["results"][1]["Q"]["change"].get<double>(), *d.results[1].Q.delta());
}

}  // namespace
}  // namespace heatchain
