// `heatchain-cli diff`: a one-field edit shows exactly that field, and the
// moved duties equal the difference of two separate `compute --json` runs.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>

#include <nlohmann/json.hpp>

#include "support/run_command.hpp"

namespace fs = std::filesystem;
using heatchain::testing::readWholeFile;
using heatchain::testing::runCommand;

namespace {

std::string cli(const std::string& args) { return std::string(HEATCHAIN_CLI) + " " + args; }

fs::path scratch(const std::string& name) {
    const fs::path dir = fs::temp_directory_path() / ("heatchain-diff-test-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    return dir / name;
}

nlohmann::json computeJson(const fs::path& p) {
    return nlohmann::json::parse(runCommand(cli("compute " + p.string() + " --json")).out);
}

}  // namespace

TEST(CliDiff, OneTargetTemperatureChange) {
    const fs::path before = fs::path(HEATCHAIN_SOURCE_DIR) / "sample-projects/boiler-feed.hchain";
    std::string text = readWholeFile(before);
    const std::string from = R"("to": { "T": "190 degC" })", to = R"("to": { "T": "175 degC" })";
    ASSERT_NE(text.find(from), std::string::npos);
    text.replace(text.find(from), from.size(), to);
    const fs::path after = scratch("boiler-feed-b.hchain");
    std::ofstream(after) << text;

    auto r = runCommand(cli("diff " + before.string() + " " + after.string() + " --json"));
    ASSERT_EQ(r.exit, 0) << r.err;
    const auto d = nlohmann::json::parse(r.out);
    EXPECT_TRUE(d["project"].empty());
    ASSERT_EQ(d["steps"].size(), 1u);
    EXPECT_EQ(d["steps"][0]["id"], "economiser");
    EXPECT_EQ(d["steps"][0]["change"], "changed");
    EXPECT_EQ(d["steps"][0]["moved"], false);
    ASSERT_EQ(d["steps"][0]["fields"].size(), 1u);
    EXPECT_EQ(d["steps"][0]["fields"][0]["field"], "to.T");
    EXPECT_EQ(d["steps"][0]["fields"][0]["before"], "190 degC");
    EXPECT_EQ(d["steps"][0]["fields"][0]["after"], "175 degC");

    // The oracle: two separate computes of the two revisions.
    const auto a = computeJson(before), b = computeJson(after);
    ASSERT_EQ(d["results"].size(), a["steps"].size());
    for (std::size_t i = 0; i < a["steps"].size(); ++i) {
        const auto& res = d["results"][i];
        ASSERT_EQ(res["id"], a["steps"][i]["id"]);
        const double qa = a["steps"][i]["Q"], qb = b["steps"][i]["Q"];
        EXPECT_DOUBLE_EQ(res["Q"]["before"].get<double>(), qa);
        EXPECT_DOUBLE_EQ(res["Q"]["after"].get<double>(), qb);
        EXPECT_NEAR(res["Q"]["change"].get<double>(), qb - qa, 1e-9 * std::fabs(qa));
        EXPECT_EQ(res["moved"].get<bool>(), std::fabs(qb - qa) > 1e-9 * std::fabs(qa) ||
                                                a["steps"][i]["W"] != b["steps"][i]["W"] ||
                                                a["steps"][i]["Sgen"] != b["steps"][i]["Sgen"] ||
                                                a["steps"][i]["end"]["T_K"] != b["steps"][i]["end"]["T_K"])
            << res["id"];
    }
    // Economiser heats less, the drum then must heat more: both moved; the
    // pump before them did not.
    EXPECT_LT(d["results"][1]["Q"]["change"].get<double>(), 0);
    EXPECT_GT(d["results"][2]["Q"]["change"].get<double>(), 0);
    EXPECT_FALSE(d["results"][0]["moved"].get<bool>());
    EXPECT_NEAR(d["totals"]["heatingDuty"]["change"].get<double>(),
                b["totals"]["heatingDuty"].get<double>() - a["totals"]["heatingDuty"].get<double>(), 1e-6);

    // The text form names the field as typed.
    auto t = runCommand(cli("diff " + before.string() + " " + after.string()));
    EXPECT_EQ(t.exit, 0);
    EXPECT_NE(t.out.find("to.T: \"190 degC\" -> \"175 degC\""), std::string::npos) << t.out;
}

TEST(CliDiff, IdenticalAndInvalid) {
    const std::string s = std::string(HEATCHAIN_SOURCE_DIR) + "/sample-projects/melt-tank.hchain";
    auto same = runCommand(cli("diff " + s + " " + s + " --json"));
    EXPECT_EQ(same.exit, 0);
    const auto d = nlohmann::json::parse(same.out);
    EXPECT_TRUE(d["identicalInput"].get<bool>());
    for (const auto& r : d["results"]) EXPECT_FALSE(r["moved"].get<bool>());
    const fs::path bad = scratch("bad.hchain");
    std::ofstream(bad) << "{ \"format\": \"heatchain-project\", \"version\": 1, ";
    EXPECT_EQ(runCommand(cli("diff " + s + " " + bad.string())).exit, 3);
    EXPECT_EQ(runCommand(cli("diff " + s)).exit, 2);
}
