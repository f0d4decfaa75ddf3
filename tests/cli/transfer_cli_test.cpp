// heatchain-cli with heat transfer: the samples' areas and batch times in the
// text ledger and in compute --json (the contract's keys). chart --time needs
// the Qt report library: tests/report/time_chart_test.cpp.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <unistd.h>

#include <nlohmann/json.hpp>

#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;

namespace {

using Run = heatchain::testing::CommandRun;

Run run(const std::string& args) { return heatchain::testing::runCommand(std::string(HEATCHAIN_CLI) + " " + args); }

std::string sample(const std::string& name) { return heatchain::testing::samplePath(name); }

#define EXPECT_CONTAINS(hay, needle) EXPECT_NE(std::string(hay).find(needle), std::string::npos) << (hay)

}  // namespace

TEST(CliTransfer, EvaporatorAreaInTextAndJson) {
    auto text = run("compute " + sample("solvent-recovery"));
    ASSERT_EQ(text.exit, 0) << text.err;
    EXPECT_CONTAINS(text.out, "heat transfer (exchanger area, zone by zone)");
    EXPECT_CONTAINS(text.out, "evaporate:");
    EXPECT_CONTAINS(text.out, "total area");
    auto json = run("compute " + sample("solvent-recovery") + " --json");
    ASSERT_EQ(json.exit, 0) << json.err;
    const auto j = nlohmann::json::parse(json.out);
    double sum = 0;
    for (const auto& s : j["steps"]) {
        ASSERT_TRUE(s.contains("transfer")) << s["id"];
        const auto& t = s["transfer"];
        double zones = 0;
        for (const auto& z : t["zones"]) zones += z["area_m2"].get<double>();
        // The step's area is the sum of its zones'; UA = Σ U A; ΔT_m = |Q| / UA.
        EXPECT_NEAR(t["area_m2"].get<double>(), zones, 1e-9 * zones);
        EXPECT_NEAR(t["meanDeltaT_K"].get<double>(), std::fabs(s["Q"].get<double>()) / t["UA_W_per_K"].get<double>(), 1e-9);
        sum += t["area_m2"].get<double>();
    }
    EXPECT_NEAR(j["totals"]["area_m2"].get<double>(), sum, 1e-9 * sum);
    // Boiling is one zone of its own, with its own U.
    const auto& evap = j["steps"][1]["transfer"]["zones"];
    ASSERT_GE(evap.size(), 1u);
    EXPECT_EQ(evap.back()["label"], "boiling");
    EXPECT_EQ(evap.back()["U_W_per_m2K"], 900.0);
}

// What the evaporator the plant has gives instead of the one the sizing asks
// for: rated, its area is the one given, and since the sizing needs more
// than that for the whole evaporation, the feed leaves part-evaporated; the
// text says where it ends, as compute --json has it.
TEST(CliTransfer, ExistingEvaporatorRated) {
    auto sized = run("compute " + sample("solvent-recovery") + " --json");
    ASSERT_EQ(sized.exit, 0) << sized.err;
    const double needed = nlohmann::json::parse(sized.out)["steps"][1]["transfer"]["area_m2"].get<double>();
    auto json = run("compute " + sample("solvent-recovery-existing") + " --json");
    ASSERT_EQ(json.exit, 0) << json.err;
    const auto j = nlohmann::json::parse(json.out);
    const auto& evap = j["steps"][1];
    EXPECT_NEAR(evap["transfer"]["area_m2"].get<double>(), 6.5, 1e-6);
    ASSERT_GT(needed, 6.5);
    const double x = evap["end"]["quality"].get<double>();
    EXPECT_GT(x, 0.0);
    EXPECT_LT(x, 1.0);
    auto text = run("compute " + sample("solvent-recovery-existing"));
    ASSERT_EQ(text.exit, 0) << text.err;
    char quality[32];
    std::snprintf(quality, sizeof quality, "x = %.3f", x);
    EXPECT_CONTAINS(text.out, "existing-evaporator: rated, the exchanger given reaches");
    EXPECT_CONTAINS(text.out, quality);
}

TEST(CliTransfer, BatchTimesAndCycleTime) {
    for (const char* name : {"melt-tank", "dessert-base-cooldown"}) {
        auto json = run("compute " + sample(name) + " --json");
        ASSERT_EQ(json.exit, 0) << name << json.err;
        const auto j = nlohmann::json::parse(json.out);
        double sum = 0;
        for (const auto& s : j["steps"]) {
            if (!s.contains("duration_s")) continue;
            sum += s["duration_s"].get<double>();
            EXPECT_GE(s["peakDuty_W"].get<double>(), s["meanDuty_W"].get<double>() * (1 - 1e-12)) << s["id"];
            ASSERT_GE(s["profile"].size(), 2u);
            EXPECT_EQ(s["profile"][0]["t_s"], 0.0);
            EXPECT_NEAR(s["profile"].back()["t_s"].get<double>(), s["duration_s"].get<double>(), 1e-6);
        }
        EXPECT_GT(sum, 0) << name;
        EXPECT_NEAR(j["totals"]["cycleTime_s"].get<double>(), sum, 1e-9 * sum) << name;
        auto text = run("compute " + sample(name));
        EXPECT_CONTAINS(text.out, "cycle time");
    }
    // The kettle's first stage runs 40 min by its target.
    auto j = nlohmann::json::parse(run("compute " + sample("dessert-base-cooldown") + " --json").out);
    EXPECT_NEAR(j["steps"][0]["duration_s"].get<double>(), 2400.0, 1e-6);
}
