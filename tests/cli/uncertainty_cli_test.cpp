// `heatchain-cli compute --uncertainty`: the JSON carries exactly the keys of
// the shared design (project-format.md, "Tolerances and uncertainty"), the
// same seed gives the same figures, the text shows ± and the ranked inputs,
// and bad options are usage errors.
#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;

namespace {

heatchain::testing::CommandRun run(const std::string& args) {
    return heatchain::testing::runCommand(std::string(HEATCHAIN_CLI) + " " + args);
}

// The compressor demo with tolerances on the feed temperature, the flow and
// the stage efficiencies.
std::string tolerancedCompressor() {
    std::string text = heatchain::testing::readWholeFile(heatchain::testing::samplePath("compressor-aftercooler"));
    auto swap = [&](const std::string& from, const std::string& to) {
        const auto at = text.find(from);
        if (at != std::string::npos) text.replace(at, from.size(), to);
    };
    swap(R"("T": "25 degC", "P": "0.98 bar")", R"("T": "25 degC ± 1 K", "P": "0.98 bar")");
    swap(R"("0.75 kg/s")", R"("0.75 kg/s ± 1 %")");
    swap(R"("efficiency": 0.8 })", R"("efficiency": "0.8 ± 0.03" })");
    swap(R"("efficiency": 0.8 })", R"("efficiency": "0.8 ± 0.01" })");
    const fs::path p = fs::temp_directory_path() / ("heatchain-unc-" + std::to_string(::getpid()) + ".hchain");
    std::ofstream(p) << text;
    return p.string();
}

}  // namespace

TEST(UncertaintyCli, JsonKeysFollowTheContract) {
    const std::string file = tolerancedCompressor();
    auto r = run("compute " + file + " --json --uncertainty montecarlo --samples 400 --seed 9");
    ASSERT_EQ(r.exit, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out)["uncertainty"];
    std::vector<std::string> keys;
    for (auto it = j.begin(); it != j.end(); ++it) keys.push_back(it.key());
    std::sort(keys.begin(), keys.end());
    EXPECT_EQ(keys, (std::vector<std::string>{"contributions", "method", "outputs", "samples", "seed"}));
    EXPECT_EQ(j["method"], "montecarlo");
    EXPECT_EQ(j["samples"], 400);
    EXPECT_EQ(j["seed"], 9);
    const auto& w = j["outputs"]["steps.stage-1.W"];
    for (const char* k : {"value", "u", "mean", "p025", "p975"}) ASSERT_TRUE(w.contains(k)) << k;
    EXPECT_EQ(w.size(), 5u);
    EXPECT_LT(w["p025"].get<double>(), w["mean"].get<double>());
    EXPECT_LT(w["mean"].get<double>(), w["p975"].get<double>());
    EXPECT_GT(w["u"].get<double>(), 0);
    for (const char* path : {"steps.aftercooler.Q", "steps.stage-2.end.T_K", "steps.intercooler.Sgen",
                             "steps.stage-1.exergyDestroyed", "totals.coolingDuty", "utilities.cw.mass"})
        EXPECT_TRUE(j["outputs"].contains(path)) << path;
    EXPECT_EQ(j["contributions"].size(), 2u);
    EXPECT_TRUE(j["contributions"].contains("output"));
    double shares = 0;
    for (const auto& item : j["contributions"]["items"]) {
        EXPECT_EQ(item.size(), 2u);
        shares += item["share"].get<double>();
    }
    EXPECT_NEAR(shares, 1.0, 1e-9);

    // The same seed, the same figures.
    auto again = run("compute " + file + " --json --uncertainty montecarlo --samples 400 --seed 9");
    EXPECT_EQ(again.out, r.out);

    auto lin = run("compute " + file + " --json --uncertainty linear");
    ASSERT_EQ(lin.exit, 0) << lin.err;
    const auto l = nlohmann::json::parse(lin.out)["uncertainty"];
    EXPECT_TRUE(l["samples"].is_null());
    EXPECT_TRUE(l["seed"].is_null());
    EXPECT_TRUE(l["outputs"]["steps.stage-1.W"]["mean"].is_null());
    EXPECT_TRUE(l["outputs"]["steps.stage-1.W"]["p975"].is_null());
    fs::remove(file);
}

TEST(UncertaintyCli, TextShowsPlusMinusAndTheRankedInputs) {
    const std::string file = tolerancedCompressor();
    // The first stage's work: its efficiency (± 0.03 on 0.8, about 3.8 % of
    // the work) outweighs the flow (1 %) and the feed temperature (1 K in 298 K).
    auto r = run("compute " + file + " --uncertainty --contributions steps.stage-1.W");
    ASSERT_EQ(r.exit, 0) << r.err;
    EXPECT_NE(r.out.find("±"), std::string::npos);
    const auto at = r.out.find("Contributions to the variance of steps.stage-1.W");
    ASSERT_NE(at, std::string::npos) << r.out;
    const auto first = r.out.find("steps.", at + 40);
    EXPECT_EQ(r.out.compare(first, 24, "steps.stage-1.efficiency"), 0) << r.out.substr(at);
    fs::remove(file);
}

TEST(UncertaintyCli, BadOptionsAreUsageErrors) {
    const std::string file = tolerancedCompressor();
    EXPECT_EQ(run("compute " + file + " --uncertainty montecarlo --samples 1").exit, 2);
    EXPECT_EQ(run("compute " + file + " --uncertainty montecarlo --samples x").exit, 2);
    EXPECT_EQ(run("compute " + file + " --samples 100").exit, 2);
    EXPECT_EQ(run("compute " + file + " --csv --uncertainty").exit, 2);
    auto none = run("compute " + heatchain::testing::samplePath("melt-tank") + " --uncertainty");
    EXPECT_EQ(none.exit, 4);
    EXPECT_NE(none.err.find("no input carries a tolerance"), std::string::npos) << none.err;
    fs::remove(file);
}

// Heat transfer in the uncertainty: a tolerance on the melt tank's jacket
// coefficient gives the melt's batch time and the cycle time a spread, in
// the text and in the JSON; the steps whose coefficient is exact keep none.
TEST(UncertaintyCli, JacketCoefficientSpreadsTheBatchTime) {
    std::string text = heatchain::testing::readWholeFile(heatchain::testing::samplePath("melt-tank"));
    const std::string from = R"j("solid-liquid": "95 W/(m2 K)")j";
    const auto at = text.find(from);
    ASSERT_NE(at, std::string::npos);
    text.replace(at, from.size(), R"j("solid-liquid": "95 W/(m2 K) ± 15 %")j");
    const fs::path p = fs::temp_directory_path() / ("heatchain-unc-melt-" + std::to_string(::getpid()) + ".hchain");
    std::ofstream(p) << text;
    auto r = run("compute " + p.string() + " --uncertainty");
    ASSERT_EQ(r.exit, 0) << r.err;
    const auto melt = r.out.find("\n  melt: ", r.out.find("\nUncertainty:"));
    ASSERT_NE(melt, std::string::npos) << r.out;
    EXPECT_NE(r.out.substr(melt, r.out.find('\n', melt + 1) - melt).find("; time "), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("totals: cycle time"), std::string::npos) << r.out;
    auto j = run("compute " + p.string() + " --json --uncertainty");
    ASSERT_EQ(j.exit, 0) << j.err;
    const auto outs = nlohmann::json::parse(j.out)["uncertainty"]["outputs"];
    const auto& t = outs["steps.melt.duration_s"];
    ASSERT_TRUE(t.is_object()) << outs.dump(1);
    // At least the 15 % of U itself: t ∝ 1/(U A ΔT − loss), so the loss only adds.
    EXPECT_GE(t["u"].get<double>(), 0.15 * t["value"].get<double>());
    EXPECT_EQ(outs["steps.warm-solid.duration_s"]["u"].get<double>(), 0.0);
    EXPECT_GE(outs["totals.cycleTime_s"]["u"].get<double>(), t["u"].get<double>() * 0.999);
    fs::remove(p);
}
