// heatchain-cli with several streams and heat recovery targets: `targets`
// in text, JSON and CSV, `compute --json` carrying "recovery", version-2
// worksheets, and bad version-2 input as invalid input naming the stream.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>
#include <unistd.h>

#include <nlohmann/json.hpp>

#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;

namespace {

using Run = heatchain::testing::CommandRun;

Run run(const std::string& args) { return heatchain::testing::runCommand(std::string(HEATCHAIN_CLI) + " " + args); }

const std::string kSample = heatchain::testing::samplePath("ethanol-stripping-heat-recovery");

#define EXPECT_CONTAINS(hay, needle) EXPECT_NE(std::string(hay).find(needle), std::string::npos) << (hay)

std::string writeTemp(const std::string& name, const std::string& text) {
    const fs::path p = fs::temp_directory_path() / ("heatchain-recovery-" + std::to_string(::getpid()) + "-" + name);
    std::ofstream(p, std::ios::binary) << text;
    return p.string();
}

std::string readFile(const std::string& path) {
    return heatchain::testing::readWholeFile(path);
}

std::string replaced(std::string text, const std::string& from, const std::string& to) {
    const auto at = text.find(from);
    EXPECT_NE(at, std::string::npos) << from;
    if (at != std::string::npos) text.replace(at, from.size(), to);
    return text;
}

// The four-stream example of Linnhoff et al. (1982) / Kemp (2007, ch. 2) as
// a version-2 worksheet: an invented liquid with cp = 1 kJ/(kg K), so N kg/s
// is N kW/K. Published targets at ΔTmin = 10 K (from memory, hand-checked in
// tests/core/recovery_test.cpp): hot 20 kW, cold 60 kW, pinch 90 °C / 80 °C.
std::string fourStreams() {
    const std::string liquid = R"json({ "id": "unit-liquid", "name": "Unit liquid", "molarMass": "0.1 kg/mol",
      "source": "invented test data", "phases": { "liquid": { "cp": "1 kJ/(kg K)" }, "vapor": { "cp": "1 kJ/(kg K)" } },
      "boiling": { "T": "700 K", "P": "1 atm", "enthalpy": "300 kJ/kg" } })json";
    auto stream = [&](const char* id, const char* from, const char* kind, const char* to, const char* flow) {
        return std::string(R"({ "id": ")") + id + R"(", "system": "steady-flow", "model": "constant-cp", "substance": )" +
               liquid + R"(, "basis": { "massFlow": ")" + flow + R"( kg/s" }, "start": { "T": ")" + from +
               R"( degC", "P": "1 atm" }, "steps": [ { "id": "x", "kind": ")" + kind + R"(", "to": { "T": ")" + to +
               R"( degC" } } ] })";
    };
    return R"({ "format": "heatchain-project", "version": 2, "meta": { "title": "four streams" }, "display": { "units": "metric-engineering" }, "minApproach": "10 K",
      "streams": [ )" +
           stream("c1", "20", "heat", "135", "2") + ", " + stream("h2", "170", "cool", "60", "3") + ", " +
           stream("c3", "80", "heat", "140", "4") + ", " + stream("h4", "150", "cool", "30", "1.5") + "] }\n";
}

}  // namespace

TEST(CliRecovery, TargetsOfThePublishedFourStreamExample) {
    const std::string file = writeTemp("four.hchain", fourStreams());
    auto r = run("targets " + file + " --json");
    ASSERT_EQ(r.exit, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_NEAR(j["hotUtilityMin_W"].get<double>(), 20e3, 1e-6);   // Linnhoff et al. 1982 / Kemp 2007 (from memory)
    EXPECT_NEAR(j["coldUtilityMin_W"].get<double>(), 60e3, 1e-6);  // same
    ASSERT_EQ(j["pinchHot_K"].size(), 1u);
    EXPECT_NEAR(j["pinchHot_K"][0].get<double>(), 363.15, 1e-6);   // 90 °C
    EXPECT_NEAR(j["pinchCold_K"][0].get<double>(), 353.15, 1e-6);  // 80 °C
    // The text table says the same, in the worksheet's units.
    auto text = run("targets " + file);
    ASSERT_EQ(text.exit, 0) << text.err;
    EXPECT_CONTAINS(text.out, "20.00 kW");
    EXPECT_CONTAINS(text.out, "60.00 kW");
    EXPECT_CONTAINS(text.out, "90.0 °C hot side, 80.0 °C cold side");
    fs::remove(file);
}

TEST(CliRecovery, SampleTargetsObeyTheLawsAndFollowTheMinimumDifference) {
    double lastHot = -1, lastCold = -1;
    for (const char* dT : {"5 K", "10 K", "20 K", "30"}) {
        auto r = run("targets " + kSample + " --json --dtmin '" + dT + "'");
        ASSERT_EQ(r.exit, 0) << r.err;
        const auto j = nlohmann::json::parse(r.out);
        for (const char* k : {"dTmin_K", "hotUtilityMin_W", "coldUtilityMin_W", "pinchHot_K", "pinchCold_K",
                              "hotUtilityNow_W", "coldUtilityNow_W", "hotComposite", "coldComposite", "grandComposite",
                              "excluded"})
            EXPECT_TRUE(j.contains(k)) << k;
        const double hot = j["hotUtilityMin_W"], cold = j["coldUtilityMin_W"];
        const double hotNow = j["hotUtilityNow_W"], coldNow = j["coldUtilityNow_W"];
        // Law: both sides save the same heat; targets never exceed today's use.
        EXPECT_NEAR(hotNow - hot, coldNow - cold, 1e-6 * hotNow);
        EXPECT_LE(hot, hotNow + 1e-6);
        EXPECT_GE(hot, lastHot - 1e-6);  // a larger ΔTmin never lowers the targets
        EXPECT_GE(cold, lastCold - 1e-6);
        lastHot = hot;
        lastCold = cold;
        // The grand composite ends at the two targets and is zero at the pinch.
        const auto& gcc = j["grandComposite"];
        EXPECT_NEAR(gcc.back()["Q_W"].get<double>(), hot, 1e-6 * hotNow);
        EXPECT_NEAR(gcc.front()["Q_W"].get<double>(), cold, 1e-6 * hotNow);
        ASSERT_EQ(j["pinchHot_K"].size(), 1u) << dT;
        const double pinchShifted = j["pinchHot_K"][0].get<double>() - j["dTmin_K"].get<double>() / 2;
        bool zero = false;
        for (const auto& p : gcc)
            zero = zero || (std::abs(p["Tshifted_K"].get<double>() - pinchShifted) < 1e-9 && std::abs(p["Q_W"].get<double>()) < 1e-3);
        EXPECT_TRUE(zero) << dT;
    }
    auto bad = run("targets " + kSample + " --dtmin hot");
    EXPECT_EQ(bad.exit, 2);
    EXPECT_CONTAINS(bad.err, "--dtmin");
}

TEST(CliRecovery, TextAndCsvOfTheSample) {
    auto r = run("targets " + kSample);
    ASSERT_EQ(r.exit, 0) << r.err;
    EXPECT_CONTAINS(r.out, "hot utility");
    EXPECT_CONTAINS(r.out, "% of today's hot utility");
    EXPECT_CONTAINS(r.out, "lp-steam");
    EXPECT_CONTAINS(r.out, "pinch");
    auto table = run("targets " + kSample + " --problem-table");
    EXPECT_CONTAINS(table.out, "Problem table");
    auto csv = run("targets " + kSample + " --csv");
    ASSERT_EQ(csv.exit, 0) << csv.err;
    EXPECT_EQ(csv.out.rfind("curve,Q_W,T_K\n", 0), 0u);
    EXPECT_CONTAINS(csv.out, "grand composite (shifted),");
    auto help = run("targets --help");
    EXPECT_EQ(help.exit, 0);
    EXPECT_CONTAINS(help.out, "--dtmin");
}

TEST(CliRecovery, ComputeJsonOfSeveralStreamsAndOfOne) {
    auto r = run("compute " + kSample + " --json");
    ASSERT_EQ(r.exit, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["title"], "Ethanol stripping, line 3: heat recovery study");
    ASSERT_EQ(j["streams"].size(), 5u);
    EXPECT_EQ(j["streams"][0]["id"], "feed");
    for (const char* k : {"system", "model", "substance", "units", "start", "steps", "totals"})
        EXPECT_TRUE(j["streams"][2].contains(k)) << k;
    EXPECT_TRUE(j["recovery"].is_object());
    // Today's use is the heating and cooling duties of all the streams.
    double heating = 0, cooling = 0;
    for (const auto& s : j["streams"]) {
        heating += s["totals"]["heatingDuty"].get<double>();
        cooling += s["totals"]["coolingDuty"].get<double>();
    }
    EXPECT_NEAR(j["recovery"]["hotUtilityNow_W"].get<double>(), heating, 1e-6 * heating);
    EXPECT_NEAR(j["recovery"]["coldUtilityNow_W"].get<double>(), cooling, 1e-6 * cooling);

    auto one = run("compute " + heatchain::testing::samplePath("solvent-recovery") + " --json");
    ASSERT_EQ(one.exit, 0) << one.err;
    const auto k = nlohmann::json::parse(one.out);
    EXPECT_TRUE(k.contains("steps"));
    ASSERT_TRUE(k["recovery"].is_object());
    // One stream: its condensing can heat its own feed.
    EXPECT_LT(k["recovery"]["hotUtilityMin_W"].get<double>(), k["recovery"]["hotUtilityNow_W"].get<double>());

    auto text = run("compute " + kSample);
    ASSERT_EQ(text.exit, 0) << text.err;
    EXPECT_CONTAINS(text.out, "== stream \"overhead\" (ethanol overhead vapour)");
    auto csv = run("compute " + kSample + " --csv");
    ASSERT_EQ(csv.exit, 0);
    EXPECT_EQ(csv.out.rfind("stream,", 0), 0u);
    EXPECT_CONTAINS(csv.out, "\"bottoms\",");
    auto check = run("check " + kSample);
    EXPECT_EQ(check.exit, 0) << check.err;
    EXPECT_CONTAINS(check.out, "5 streams");
}

TEST(CliRecovery, BadVersionTwoInputIsInvalidAndNamesTheStream) {
    const std::string text = readFile(kSample);
    const std::string dup = writeTemp("dup.hchain", replaced(text, "\"id\": \"bottoms\"", "\"id\": \"feed\""));
    auto r = run("check " + dup);
    EXPECT_EQ(r.exit, 3);
    EXPECT_CONTAINS(r.err, "stream \"feed\"");
    EXPECT_CONTAINS(r.err, "used twice");

    const std::string none = writeTemp("none.hchain", text.substr(0, text.find("\"streams\": [")) + "\"streams\": [] }\n");
    r = run("compute " + none + " --json");
    EXPECT_EQ(r.exit, 3);
    EXPECT_CONTAINS(r.err, "at least one stream");

    const std::string step = writeTemp("step.hchain", replaced(text, "\"to\": { \"T\": \"35 degC\" }", "\"to\": { \"T\": \"35 degX\" }"));
    r = run("targets " + step);
    EXPECT_EQ(r.exit, 3);
    EXPECT_CONTAINS(r.err, "stream \"bottoms\", step \"cool-to-drain\"");

    const std::string utility = writeTemp("utility.hchain", replaced(text, "\"utility\": \"mp-steam\"", "\"utility\": \"hp-steam\""));
    r = run("compute " + utility);
    EXPECT_EQ(r.exit, 3);
    EXPECT_CONTAINS(r.err, "stream \"dryer-air\", step \"air-heater\"");
    for (const auto& f : {dup, none, step, utility}) fs::remove(f);
}

TEST(CliRecovery, VersionTwoFromStandardInput) {
    auto r = heatchain::testing::runCommand(std::string(HEATCHAIN_CLI) + " targets - --json < '" + kSample + "'");
    ASSERT_EQ(r.exit, 0) << r.err;
    EXPECT_GT(nlohmann::json::parse(r.out)["hotUtilityMin_W"].get<double>(), 0);
}
