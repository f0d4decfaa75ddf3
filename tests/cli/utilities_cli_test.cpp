// heatchain-cli with utilities, exergy and sweeps: the samples show
// their utilities, the JSON and CSV carry the additive keys and columns, an
// unknown utility is invalid input naming the step, and `sweep` reports every
// point in text, JSON and CSV.
#include <gtest/gtest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>

#include <nlohmann/json.hpp>

#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;

namespace {

using Run = heatchain::testing::CommandRun;

Run run(const std::string& args) { return heatchain::testing::runCommand(std::string(HEATCHAIN_CLI) + " " + args); }

std::string sample(const std::string& name) {
    return heatchain::testing::samplePath(name);
}

#define EXPECT_CONTAINS(hay, needle) EXPECT_NE(std::string(hay).find(needle), std::string::npos) << (hay)

}  // namespace

TEST(CliUtilities, LedgerShowsUtilitiesAndExergy) {
    auto r = run("compute " + sample("solvent-recovery"));
    ASSERT_EQ(r.exit, 0) << r.err;
    EXPECT_CONTAINS(r.out, "utilities (minimum approach 10.0 K");
    EXPECT_CONTAINS(r.out, "lp-steam: steam at");
    EXPECT_CONTAINS(r.out, "counter-current");
    EXPECT_CONTAINS(r.out, "exergy (dead state");
    EXPECT_CONTAINS(r.out, "η_II");
}

TEST(CliUtilities, JsonHasAdditiveUtilityAndExergyKeys) {
    auto r = run("compute " + sample("solvent-recovery") + " --json");
    ASSERT_EQ(r.exit, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    // The contract's keys are all still there.
    for (const char* k : {"title", "system", "model", "substance", "units", "start", "steps", "totals"})
        EXPECT_TRUE(j.contains(k)) << k;
    ASSERT_TRUE(j["utilities"].is_array());
    ASSERT_EQ(j["utilities"].size(), 2u);
    EXPECT_EQ(j["utilities"][0]["id"], "lp-steam");
    double steam = 0;
    for (const auto& s : j["steps"]) {
        EXPECT_TRUE(s.contains("exergy"));
        ASSERT_TRUE(s.contains("utility")) << s["id"];
        const auto& u = s["utility"];
        // Use = duty / latent heat for steam, duty / (cp ΔT) for cooling water, read back from the JSON.
        if (u["id"] == "lp-steam") {
            const double L = j["utilities"][0]["latentHeat_J_per_kg"].get<double>();
            EXPECT_NEAR(u["mass"].get<double>(), s["Q"].get<double>() / L, 1e-9 * u["mass"].get<double>());
            steam += u["mass"].get<double>();
        } else {
            EXPECT_NEAR(u["mass"].get<double>(), -s["Q"].get<double>() / (4180.0 * 4.0), 1e-9 * u["mass"].get<double>());
            EXPECT_EQ(u["flow"], "counter-current");
        }
        EXPECT_GE(u["approach"]["minimum_K"].get<double>(), 0.0);
    }
    EXPECT_NEAR(j["utilities"][0]["mass"].get<double>(), steam, 1e-12 * steam);
    EXPECT_TRUE(j["exergy"]["secondLawEfficiency"].is_number());
}

TEST(CliUtilities, CsvHasTheExtraColumnsAtTheEnd) {
    auto r = run("compute " + sample("compressor-aftercooler") + " --csv");
    ASSERT_EQ(r.exit, 0) << r.err;
    std::istringstream in(r.out);
    std::string header, line;
    std::getline(in, header);
    EXPECT_EQ(header.rfind("step,kind,segment,", 0), 0u);
    EXPECT_CONTAINS(header, "exergy destroyed [W],utility,utility use [kg/s]");
    const auto columns = std::count(header.begin(), header.end(), ',');
    while (std::getline(in, line)) {
        if (line.find('"') != std::string::npos) continue;  // quoted labels may hold commas
        EXPECT_EQ(std::count(line.begin(), line.end(), ','), columns) << line;
    }
}

TEST(CliUtilities, UnknownUtilityIsInvalidInputNamingTheStep) {
    const fs::path f = fs::temp_directory_path() / ("heatchain-util-" + std::to_string(::getpid()) + ".hchain");
    std::ifstream in(sample("solvent-recovery"));
    std::stringstream ss;
    ss << in.rdbuf();
    std::string text = ss.str();
    const std::string from = "\"sink\": { \"utility\": \"cw\" } }\n";
    const auto pos = text.find(from);
    ASSERT_NE(pos, std::string::npos);
    text.replace(pos, from.size(), "\"sink\": { \"utility\": \"chilled-water\" } }\n");
    std::ofstream(f) << text;
    auto r = run("compute " + f.string());
    EXPECT_EQ(r.exit, 3);
    EXPECT_CONTAINS(r.err, "step \"subcool\"");
    EXPECT_CONTAINS(r.err, "chilled-water");
    fs::remove(f);
}

TEST(CliUtilities, SweepTextJsonAndCsv) {
    const std::string base = "sweep " + sample("boiler-feed") +
                             " --step superheater --input to.T --from '300 degC' --to '1000 degC' --points 8";
    auto text = run(base);
    ASSERT_EQ(text.exit, 0) << text.err;
    EXPECT_CONTAINS(text.out, "8 points");
    EXPECT_CONTAINS(text.out, "points not computed:");
    auto json = run(base + " --json");
    ASSERT_EQ(json.exit, 0) << json.err;
    const auto j = nlohmann::json::parse(json.out);
    ASSERT_EQ(j["points"].size(), 8u);
    EXPECT_LT(j["computed"].get<int>(), 8);
    EXPECT_TRUE(j["points"][7]["error"].is_string());
    EXPECT_TRUE(j["points"][0]["error"].is_null());
    auto csv = run(base + " --csv");
    ASSERT_EQ(csv.exit, 0);
    EXPECT_EQ(std::count(csv.out.begin(), csv.out.end(), '\n'), 9);  // header + 8 points
    // Usage and input errors.
    EXPECT_EQ(run("sweep " + sample("boiler-feed") + " --step superheater").exit, 2);
    EXPECT_EQ(run("sweep " + sample("boiler-feed") + " --step nowhere --input to.T --from 1degC --to 2degC --points 3").exit, 3);
    EXPECT_EQ(run("sweep " + sample("boiler-feed") + " --step superheater --input to.T --from 1degC --to 2degC --points x").exit, 2);
    // No point computable: exit 4.
    EXPECT_EQ(run("sweep " + sample("boiler-feed") + " --step superheater --input to.T --from '700 degC' --to '800 degC' --points 2").exit, 4);
}
