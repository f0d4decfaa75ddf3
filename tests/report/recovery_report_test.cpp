// The report of a worksheet of several streams: its heat recovery section
// read back with pdftotext (targets, today's use and the pinch as
// `heatchain-cli targets --json` gives them, the charts' captions, the
// problem table), a part per stream, the caveat of time-averaged batches,
// and no such section in a one-stream report.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>
#include <string>
#include <unistd.h>
#include <vector>

#include <nlohmann/json.hpp>

#include "heatchain/units.hpp"
#include "support/pdf_text.hpp"
#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;
using heatchain::testing::lineStarting;
using heatchain::testing::pdfText;
using heatchain::testing::runCommand;
using heatchain::testing::squeeze;

namespace {

std::string cli(const std::string& args) { return std::string(HEATCHAIN_CLI) + " " + args; }

fs::path scratch(const std::string& name) {
    const fs::path dir = fs::temp_directory_path() / ("heatchain-recovery-report-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    return dir / name;
}

// Numbers of a line (thousands not grouped; the typographic minus as '-').
std::vector<double> numbersIn(std::string line) {
    for (std::size_t at; (at = line.find("\xE2\x88\x92")) != std::string::npos;) line.replace(at, 3, "-");
    std::vector<double> out;
    std::regex num(R"((^|[\s(])(-?\d+(\.\d+)?)(?=[\s,;.]|$))");
    for (auto it = std::sregex_iterator(line.begin(), line.end(), num); it != std::sregex_iterator(); ++it)
        out.push_back(std::stod((*it)[2]));
    return out;
}

// A figure printed with about four significant digits.
void expectShown(double shown, double expected, const std::string& what) {
    EXPECT_NEAR(shown, expected, std::fabs(expected) * 1e-3 + 0.05) << what;
}

const std::string kSample = heatchain::testing::samplePath("ethanol-stripping-heat-recovery");

}  // namespace

TEST(RecoveryReport, SeveralStreamsGetTheirHeatRecoverySection) {
    const fs::path pdf = scratch("streams.pdf");
    auto r = runCommand(cli("report " + kSample + " -o " + pdf.string()));
    ASSERT_EQ(r.exit, 0) << r.err;
    const std::string layout = pdfText(pdf, true);
    const std::string flat = squeeze(layout);
    auto targets = runCommand(cli("targets " + kSample + " --json"));
    ASSERT_EQ(targets.exit, 0) << targets.err;
    const auto t = nlohmann::json::parse(targets.out);
    // The sample shows kW and °C (metric engineering).
    auto kW = [](double W) { return heatchain::toDisplay(W, heatchain::Dimension::Power, heatchain::UnitSystem::MetricEngineering); };
    auto degC = [](double K) {
        return heatchain::toDisplay(K, heatchain::Dimension::Temperature, heatchain::UnitSystem::MetricEngineering);
    };

    EXPECT_NE(flat.find("Heat recovery targets"), std::string::npos);
    // Minimum, today, recoverable: core's numbers in the display units.
    const auto hot = numbersIn(lineStarting(layout, "hot utility"));
    ASSERT_EQ(hot.size(), 3u) << lineStarting(layout, "hot utility");
    expectShown(hot[0], kW(t["hotUtilityMin_W"]), "minimum hot utility");
    expectShown(hot[1], kW(t["hotUtilityNow_W"]), "today's hot utility");
    expectShown(hot[2], kW(t["hotUtilityNow_W"].get<double>() - t["hotUtilityMin_W"].get<double>()), "recoverable");
    const auto cold = numbersIn(lineStarting(layout, "cold utility"));
    ASSERT_EQ(cold.size(), 3u) << lineStarting(layout, "cold utility");
    expectShown(cold[0], kW(t["coldUtilityMin_W"]), "minimum cold utility");
    expectShown(cold[1], kW(t["coldUtilityNow_W"]), "today's cold utility");
    // The pinch, hot and cold side.
    ASSERT_FALSE(t["pinchHot_K"].empty());
    std::smatch m;
    ASSERT_TRUE(std::regex_search(flat, m, std::regex(R"(Pinch: ([0-9.]+) °C on the hot streams, ([0-9.]+) °C on the cold streams)")))
        << flat.substr(flat.find("Heat recovery targets"), 2000);
    expectShown(std::stod(m[1]), degC(t["pinchHot_K"][0]), "pinch, hot side");
    expectShown(std::stod(m[2]), degC(t["pinchCold_K"][0]), "pinch, cold side");
    EXPECT_NE(flat.find("% of today's hot utility"), std::string::npos);
    // The charts and the problem table, and each utility level.
    EXPECT_NE(flat.find("Composite curves: the heat recovered between them shaded"), std::string::npos);
    EXPECT_NE(flat.find("Grand composite curve with the worksheet's utility levels"), std::string::npos);
    EXPECT_NE(flat.find("Minimum hot and cold utility against ΔTmin"), std::string::npos);
    EXPECT_NE(flat.find("Problem table (shifted temperatures)"), std::string::npos);
    for (const auto& level : t["utilityLevels"]) EXPECT_NE(flat.find(level["id"].get<std::string>()), std::string::npos);
    // One part per stream, with its steps.
    auto compute = runCommand(cli("compute " + kSample + " --json"));
    const auto all = nlohmann::json::parse(compute.out);
    for (const auto& s : all["streams"]) {
        EXPECT_NE(flat.find("Stream " + s["id"].get<std::string>()), std::string::npos) << s["id"];
        for (const auto& step : s["steps"]) EXPECT_NE(flat.find(step["id"].get<std::string>()), std::string::npos);
    }
    // No batch here: no time-average caveat.
    EXPECT_EQ(flat.find("time-average view"), std::string::npos);

    // A one-stream worksheet's report has no heat recovery section.
    const fs::path single = scratch("single.pdf");
    ASSERT_EQ(runCommand(cli("report " + heatchain::testing::samplePath("solvent-recovery") + " -o " + single.string())).exit, 0);
    EXPECT_EQ(squeeze(pdfText(single, false)).find("Heat recovery targets"), std::string::npos);
    fs::remove_all(pdf.parent_path());
}

TEST(RecoveryReport, ATimeAveragedBatchCarriesTheCaveat) {
    // The sample with a batch of our own invention added: a kettle of water
    // heated from 20 to 80 °C every 6 h.
    std::ifstream in(kSample);
    std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    const std::string batch = R"({ "id": "kettle", "name": "wash water kettle", "cycleTime": "6 h", "system": "closed",
      "model": "reference", "substance": "water", "basis": { "mass": "4 t" }, "start": { "T": "20 degC", "P": "1 atm" },
      "steps": [ { "id": "warm", "kind": "heat", "to": { "T": "80 degC" }, "source": { "utility": "lp-steam" } } ] },
    )";
    const auto at = text.find("{ \"id\": \"feed\"");
    ASSERT_NE(at, std::string::npos);
    text.insert(at, batch);
    const fs::path project = scratch("with-batch.hchain");
    std::ofstream(project) << text;
    const fs::path pdf = scratch("with-batch.pdf");
    auto r = runCommand(cli("report " + project.string() + " -o " + pdf.string()));
    ASSERT_EQ(r.exit, 0) << r.err;
    const std::string flat = squeeze(pdfText(pdf, false));
    EXPECT_NE(flat.find("Batch streams, time-averaged"), std::string::npos);
    EXPECT_NE(flat.find("kettle enter with each batch's heat averaged over the stream's cycle time"), std::string::npos);
    EXPECT_NE(flat.find("This time-average view overstates what can be recovered between batches"), std::string::npos);
    // The targets say the same, and count the kettle.
    auto targets = runCommand(cli("targets " + project.string()));
    ASSERT_EQ(targets.exit, 0) << targets.err;
    EXPECT_NE(squeeze(targets.out).find("time-average view overstates what can be recovered between batches"),
              std::string::npos)
        << targets.out;
    auto json = runCommand(cli("targets " + project.string() + " --json"));
    const auto t = nlohmann::json::parse(json.out);
    ASSERT_EQ(t["timeAveraged"].size(), 1u);
    EXPECT_EQ(t["timeAveraged"][0], "kettle");
    EXPECT_TRUE(t["excluded"].empty());
    fs::remove_all(pdf.parent_path());
}
