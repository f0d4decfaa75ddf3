// heatchain-cli chart --composite and --grand-composite: SVG read back with
// Python's xml.etree (drawn lines, the pinch and the utility levels named),
// PNG by its signature, and usage errors.
#include <gtest/gtest.h>

#include <filesystem>
#include <string>
#include <unistd.h>

#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;
using heatchain::testing::readWholeFile;
using heatchain::testing::runCommand;

namespace {

std::string cli(const std::string& args) { return std::string(HEATCHAIN_CLI) + " " + args; }

fs::path scratch(const std::string& name) {
    const fs::path dir = fs::temp_directory_path() / ("heatchain-recovery-charts-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    return dir / name;
}

const std::string kSample = heatchain::testing::samplePath("ethanol-stripping-heat-recovery");

// The SVG's text and whether it draws more than a few lines.
std::string svgSummary(const fs::path& svg) {
    auto py = runCommand(std::string(HEATCHAIN_PYTHON) +
                         " -c \"import sys, xml.etree.ElementTree as E; r = E.parse(sys.argv[1]).getroot(); "
                         "print(r.tag, sum(1 for e in r.iter() if e.tag.endswith('path') or e.tag.endswith('polyline')) > 10); "
                         "print(' '.join((e.text or '') for e in r.iter() if e.tag.endswith('text')))\" " +
                         svg.string());
    return py.out;
}

}  // namespace

TEST(RecoveryCharts, CompositeAndGrandCompositeAsSvgAndPng) {
    const fs::path composite = scratch("composite.svg"), grand = scratch("grand.svg"), png = scratch("composite.png");
    auto r = runCommand(cli("chart " + kSample + " --composite -o " + composite.string()));
    ASSERT_EQ(r.exit, 0) << r.err;
    std::string summary = svgSummary(composite);
    EXPECT_EQ(summary.rfind("{http://www.w3.org/2000/svg}svg True\n", 0), 0u) << summary;
    EXPECT_NE(summary.find("pinch"), std::string::npos) << summary;
    EXPECT_NE(summary.find("Composite curves"), std::string::npos) << summary;

    r = runCommand(cli("chart " + kSample + " --grand-composite --dtmin '20 K' -o " + grand.string()));
    ASSERT_EQ(r.exit, 0) << r.err;
    summary = svgSummary(grand);
    EXPECT_NE(summary.find("lp-steam"), std::string::npos) << summary;
    EXPECT_NE(summary.find("mp-steam"), std::string::npos) << summary;
    EXPECT_NE(summary.find("Tmin 20.00 K"), std::string::npos) << summary;

    r = runCommand(cli("chart " + kSample + " --composite -o " + png.string()));
    ASSERT_EQ(r.exit, 0) << r.err;
    const std::string bytes = readWholeFile(png);
    ASSERT_GT(bytes.size(), 24u);
    EXPECT_EQ(bytes.substr(0, 8), std::string("\x89PNG\r\n\x1a\n", 8));  // ISO/IEC 15948, 5.2

    EXPECT_EQ(runCommand(cli("chart " + kSample + " --composite --grand-composite -o " + scratch("x.svg").string())).exit, 2);
    EXPECT_EQ(runCommand(cli("chart " + kSample + " --composite -o " + scratch("x.gif").string())).exit, 2);
    EXPECT_EQ(runCommand(cli("chart " + kSample + " --composite --dtmin warm -o " + scratch("y.svg").string())).exit, 2);
    fs::remove_all(composite.parent_path());
}
