// heatchain-cli chart --time (needs the Qt report library, so it lives with
// the report tests): an SVG with the batch's steps named, and --time with
// another chart kind is a usage error.
#include <gtest/gtest.h>

#include <filesystem>
#include <string>
#include <unistd.h>

#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;
using heatchain::testing::readWholeFile;
using heatchain::testing::runCommand;

TEST(TimeChart, BatchSequenceAsSvg) {
    const fs::path dir = fs::temp_directory_path() / ("hc-time-chart-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    const fs::path svg = dir / "time.svg";
    const std::string cli = std::string(HEATCHAIN_CLI) + " chart " + heatchain::testing::samplePath("melt-tank");
    auto r = runCommand(cli + " --time -o " + svg.string());
    ASSERT_EQ(r.exit, 0) << r.err;
    const std::string text = readWholeFile(svg);
    EXPECT_NE(text.find("<svg"), std::string::npos);
    EXPECT_NE(text.find("warm-solid"), std::string::npos);
    EXPECT_EQ(runCommand(cli + " --time --tq -o " + svg.string()).exit, 2);
    fs::remove_all(dir);
}
