// writeResultsJson streams what resultsToJson builds as a tree: the same
// bytes (the `compute --json` contract does not change with how it is
// written), for every one-stream demo worksheet, a failing step, a closed
// system and extra members appended after the results.
#include <gtest/gtest.h>

#include <filesystem>
#include <sstream>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/recovery.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain/solver.hpp"
#include "support/samples.hpp"

using namespace heatchain;

namespace {

void expectSameText(const Project& p) {
    const SequenceResult r = solve(p);
    Json more = Json::object();
    more["recovery"] = recoveryMemberJson(p, r);
    more["extra"] = Json{{"a", Json::array()}, {"b", Json::object()}, {"c", "line\nbreak"}};
    Json tree = resultsWithRecoveryToJson(p, r);
    tree["extra"] = more["extra"];
    std::ostringstream streamed;
    writeResultsJson(streamed, p, r, more);
    EXPECT_EQ(streamed.str(), tree.dump(2)) << p.meta.title;
}

}  // namespace

TEST(ResultsJson, StreamedEqualsTheTreeForEveryDemo) {
    int seen = 0;
    for (const auto& e : std::filesystem::directory_iterator(std::string(HEATCHAIN_SOURCE_DIR) + "/sample-projects")) {
        if (e.path().extension() != ".hchain") continue;
        auto p = loadProject(e.path());
        if (!p) continue;  // a several-stream worksheet: not this writer's
        expectSameText(*p);
        ++seen;
    }
    EXPECT_GE(seen, 6);
}

TEST(ResultsJson, StreamedEqualsTheTreeWithAFailingStepAndNoSteps) {
    const std::string head = R"({ "format": "heatchain-project", "version": 1, "system": "closed", "model": "reference",
        "substance": "water", "basis": { "mass": "2 kg" }, "start": { "T": "20 degC", "P": "1 atm" }, "steps": )";
    auto failing = parseProject(head + R"([ { "id": "warm", "kind": "heat", "to": { "T": "60 degC" } },
        { "id": "squeeze", "kind": "compress", "to": { "P": "0.5 bar" } },
        { "id": "after", "kind": "cool", "to": { "T": "30 degC" } } ] })");
    ASSERT_TRUE(failing.ok()) << failing.error().text();
    ASSERT_NE(solve(*failing).firstError(), nullptr);
    expectSameText(*failing);
    auto empty = parseProject(head + "[] }");
    ASSERT_TRUE(empty.ok()) << empty.error().text();
    expectSameText(*empty);
}
