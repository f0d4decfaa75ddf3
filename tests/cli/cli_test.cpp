// Runs the built heatchain-cli as a user would: every sample computes, the
// JSON follows the contract's fixed keys, bad input gives exit 3 or 4 with a
// message naming what and where, and the input file is never touched.
#include <gtest/gtest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>

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

std::string readFile(const fs::path& p) {
    std::ifstream f(p, std::ios::binary);
    std::stringstream ss;
    ss << f.rdbuf();
    return ss.str();
}

const char* kSamples[] = {"melt-tank", "nitrogen-warmup", "compressor-aftercooler", "solvent-recovery", "boiler-feed",
                          "ammonia-chiller"};

}  // namespace

TEST(Cli, ComputesEverySampleAsATable) {
    for (const char* s : kSamples) {
        auto r = run("compute " + sample(s));
        EXPECT_EQ(r.exit, 0) << s << ": " << r.err;
        EXPECT_NE(r.out.find("heating duty"), std::string::npos) << s;
        EXPECT_NE(r.out.find("licensed practice"), std::string::npos) << "caution shown for " << s;
    }
    // The substance's hazards follow the general caution (library classes).
    auto nh3 = run("compute " + sample("ammonia-chiller"));
    EXPECT_NE(nh3.out.find("Caution - Ammonia: toxic by inhalation"), std::string::npos) << nh3.out;
    const auto boiler = run("compute " + sample("boiler-feed"));
    EXPECT_EQ(boiler.out.find("Caution - Water"), std::string::npos) << "water has no hazard classes";
    // Then what the process reaches, as in the report and the messages panel:
    // steam at 300 °C and 22 barg in the boiler feed train, liquid nitrogen
    // below -150 °C in the warm-up.
    EXPECT_NE(boiler.out.find("Caution - Steam and hot surfaces above about 60 °C"), std::string::npos) << boiler.out;
    EXPECT_NE(boiler.out.find("Caution - High pressure"), std::string::npos) << boiler.out;
    EXPECT_EQ(boiler.out.find("Cryogenic"), std::string::npos) << boiler.out;
    const auto n2 = run("compute " + sample("nitrogen-warmup"));
    EXPECT_NE(n2.out.find("Caution - Cryogenic temperatures"), std::string::npos) << n2.out;
}

TEST(Cli, JsonHasTheContractKeys) {
    for (const char* s : kSamples) {
        auto r = run("compute " + sample(s) + " --json");
        ASSERT_EQ(r.exit, 0) << s << ": " << r.err;
        auto j = nlohmann::json::parse(r.out);
        for (const char* k : {"title", "system", "model", "substance", "units", "start", "steps", "totals"})
            EXPECT_TRUE(j.contains(k)) << s << " lacks " << k;
        for (const char* k : {"T_K", "P_Pa", "phase", "quality", "meltFraction", "h_J_per_kg", "s_J_per_kgK",
                              "u_J_per_kg", "v_m3_per_kg"})
            EXPECT_TRUE(j["start"].contains(k)) << s << " start lacks " << k;
        for (const auto& st : j["steps"]) {
            for (const char* k : {"id", "kind", "start", "end", "Q", "W", "dH", "dU", "dS", "Sgen",
                                  "exergyDestroyed", "segments", "warnings"})
                EXPECT_TRUE(st.contains(k)) << s << " step lacks " << k;
            // Energy balance read back from JSON: steady flow ΔH = Q + W, closed ΔU = Q + W,
            // to 1e-9 of the energy the material carries (m·h).
            const bool flow = j["system"] == "steady-flow";
            const double lhs = flow ? double(st["dH"]) : double(st["dU"]), Q = st["Q"], W = st["W"];
            const double carried = double(j["massBasis"]) *
                                   std::max({std::fabs(double(st["start"]["h_J_per_kg"])),
                                             std::fabs(double(st["end"]["h_J_per_kg"])), 1.0});
            EXPECT_NEAR(lhs, Q + W, 1e-9 * std::max({std::fabs(Q), std::fabs(W), carried})) << s;
        }
        for (const char* k : {"Q", "W", "dH", "dU", "dS", "Sgen", "exergyDestroyed", "heatingDuty", "coolingDuty"})
            EXPECT_TRUE(j["totals"].contains(k)) << s;
    }
}

TEST(Cli, CsvAndOutputFile) {
    const fs::path out = fs::temp_directory_path() / "heatchain-cli-test.csv";
    auto r = run("compute " + sample("boiler-feed") + " --csv -o " + out.string());
    ASSERT_EQ(r.exit, 0) << r.err;
    const std::string csv = readFile(out);
    EXPECT_EQ(csv.rfind("step,kind,segment,", 0), 0u);
    EXPECT_NE(csv.find("Q [W]"), std::string::npos) << "units in the header row";
    EXPECT_NE(csv.find("economiser"), std::string::npos);
    fs::remove(out);
}

TEST(Cli, CheckAndUsage) {
    EXPECT_EQ(run("check " + sample("melt-tank")).exit, 0);
    EXPECT_EQ(run("").exit, 2);
    EXPECT_EQ(run("frobnicate").exit, 2);
    EXPECT_EQ(run("compute").exit, 2);
    EXPECT_EQ(run("compute " + sample("melt-tank") + " --json --csv").exit, 2);
}

TEST(Cli, StateAndSubstances) {
    auto r = run("state water T=180degC P=20bar --json");
    ASSERT_EQ(r.exit, 0) << r.err;
    auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["phase"], "liquid");
    EXPECT_TRUE(j.contains("model"));
    EXPECT_TRUE(j.contains("warnings"));
    // IAPWS-IF97 region 1 at 453.15 K, 2 MPa: python3-iapws IAPWS97(T=453.15, P=2.0).h = 763.6912 kJ/kg.
    EXPECT_NEAR(double(j["h_J_per_kg"]), 763691.17, 0.01);
    auto bad = run("state water T=180degC P=10");
    EXPECT_EQ(bad.exit, 3);
    EXPECT_NE(bad.err.find("P"), std::string::npos);
    EXPECT_EQ(run("state unobtainium T=300K P=1bar").exit, 3);
    auto subs = run("substances --json");
    ASSERT_EQ(subs.exit, 0);
    EXPECT_GE(nlohmann::json::parse(subs.out).size(), 24u);
}

// Bad input: exit 3 (invalid) or 4 (cannot compute), a message that names
// where, and the input file byte-identical afterwards.
TEST(Cli, BadInputLeavesFileUntouched) {
    const fs::path dir = fs::temp_directory_path() / ("heatchain-cli-bad-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    const std::string good = readFile(sample("boiler-feed"));
    struct Case { std::string name, text; int exit; std::string needle; };
    auto replace = [&](std::string s, const std::string& a, const std::string& b) {
        auto pos = s.find(a);
        EXPECT_NE(pos, std::string::npos) << a;
        if (pos != std::string::npos) s.replace(pos, a.size(), b);
        return s;
    };
    const std::vector<Case> cases = {
        {"empty", "", 3, "empty"},
        {"not-json", "this is not json", 3, "line"},
        {"version", replace(good, "\"version\": 1", "\"version\": 7"), 3, "7"},
        {"kind", replace(good, "\"kind\": \"boil\"", "\"kind\": \"simmer\""), 3, "drum"},
        {"unit", replace(good, "\"190 degC\"", "\"190 furlongs\""), 3, "economiser"},
        {"dimension", replace(good, "\"190 degC\"", "\"190 bar\""), 3, "economiser"},
        {"absolute-zero", replace(good, "\"190 degC\"", "\"-300 degC\""), 3, "economiser"},
        {"efficiency", replace(good, "\"efficiency\": 0.6", "\"efficiency\": 1.6"), 3, "feed-pump"},
        {"duplicate", replace(good, "\"id\": \"drum\"", "\"id\": \"economiser\""), 3, "economiser"},
        {"colder", replace(good, "\"T\": \"190 degC\"", "\"T\": \"20 degC\""), 4, "economiser"},
        {"source", replace(good, "\"T\": \"260 degC\"", "\"T\": \"150 degC\""), 4, "economiser"},
        {"throttle-up", replace(good, "\"8 barg\"", "\"40 barg\""), 4, "let-down"},
        {"nan", replace(good, "\"efficiency\": 0.6", "\"efficiency\": NaN"), 3, "line"},
        {"substance", replace(good, "\"substance\": \"water\"", "\"substance\": \"kryptonite\""), 3, "substance"},
        {"utf8", std::string("{\"format\": \"heatchain-project\", \"meta\": {\"title\": \"\xff\xfe\"}}"), 3, "UTF-8"},
        {"deep", std::string(5000, '[') + std::string(5000, ']'), 3, "nest"},
    };
    for (const auto& c : cases) {
        const fs::path f = dir / (c.name + ".hchain");
        { std::ofstream(f, std::ios::binary) << c.text; }
        auto r = run("compute " + f.string());
        EXPECT_EQ(r.exit, c.exit) << c.name << ": " << r.err;
        EXPECT_NE(r.err.find(c.needle), std::string::npos) << c.name << ": " << r.err;
        EXPECT_EQ(readFile(f), c.text) << c.name << ": input file changed";
    }
    fs::remove_all(dir);
}
