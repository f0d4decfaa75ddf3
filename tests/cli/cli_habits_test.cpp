// Habits of a command-line tool: a project read from standard input with
// "-", results written to standard output with "-o -", --help for every verb,
// --version, and the documented exit statuses (0, 2 usage, 3 invalid input,
// 4 cannot compute) whichever way the project arrives.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <string>
#include <unistd.h>

#include "heatchain/version.hpp"
#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;

namespace {

using heatchain::testing::CommandRun;
using heatchain::testing::readWholeFile;
using heatchain::testing::runCommand;
using heatchain::testing::samplePath;

CommandRun cli(const std::string& args) { return runCommand(std::string(HEATCHAIN_CLI) + " " + args); }

// Runs the CLI with `input` on standard input (through a scratch file).
CommandRun cliWithInput(const std::string& args, const std::string& input) {
    static int n = 0;
    const fs::path in = fs::temp_directory_path() /
                        ("heatchain-habits-" + std::to_string(::getpid()) + "-" + std::to_string(++n) + ".in");
    std::ofstream(in, std::ios::binary) << input;
    auto r = runCommand(std::string(HEATCHAIN_CLI) + " " + args + " < " + in.string());
    fs::remove(in);
    return r;
}

std::string replaceOnce(std::string s, const std::string& what, const std::string& with) {
    const auto at = s.find(what);
    EXPECT_NE(at, std::string::npos) << "the sample no longer contains " << what;
    if (at != std::string::npos) s.replace(at, what.size(), with);
    return s;
}

}  // namespace

TEST(CliHabits, ProjectFromStandardInputGivesTheSameResults) {
    for (const char* format : {"", " --json", " --csv"}) {
        const std::string file = samplePath("boiler-feed");
        const auto fromFile = cli("compute " + file + format);
        const auto fromStdin = cliWithInput(std::string("compute -") + format, readWholeFile(file));
        ASSERT_EQ(fromFile.exit, 0) << fromFile.err;
        EXPECT_EQ(fromStdin.exit, 0) << fromStdin.err;
        EXPECT_EQ(fromStdin.out, fromFile.out) << "format" << format;
    }
    const auto check = cliWithInput("check -", readWholeFile(samplePath("melt-tank")));
    EXPECT_EQ(check.exit, 0) << check.err;
    EXPECT_NE(check.out.find("valid"), std::string::npos) << check.out;
}

TEST(CliHabits, DashOutputIsStandardOutput) {
    const std::string file = samplePath("solvent-recovery");
    const auto plain = cli("compute " + file + " --json");
    const auto dash = cli("compute " + file + " --json -o -");
    ASSERT_EQ(plain.exit, 0) << plain.err;
    EXPECT_EQ(dash.exit, 0) << dash.err;
    EXPECT_EQ(dash.out, plain.out);
    EXPECT_FALSE(fs::exists("-")) << "-o - must not create a file named -";
    // Standard input to standard output, in one pipe.
    const auto both = cliWithInput("compute - --csv -o -", readWholeFile(file));
    EXPECT_EQ(both.exit, 0) << both.err;
    EXPECT_EQ(both.out, cli("compute " + file + " --csv").out);
    const auto sweep = cli("sweep " + file + " --step superheat --input to.T --from '115 degC' --to '135 degC'"
                           " --points 3 --csv -o -");
    EXPECT_EQ(sweep.exit, 0) << sweep.err;
    EXPECT_EQ(sweep.out.rfind("to.T [K],", 0), 0u) << sweep.out;
}

TEST(CliHabits, EveryVerbHasHelp) {
    for (const char* verb : {"compute", "check", "report", "chart", "diff", "state", "substances", "sweep"}) {
        for (const char* flag : {"--help", "-h"}) {
            const auto r = cli(std::string(verb) + " " + flag);
            EXPECT_EQ(r.exit, 0) << verb << " " << flag << ": " << r.err;
            EXPECT_EQ(r.out.rfind("usage:\n", 0), 0u) << verb;
            EXPECT_NE(r.out.find(std::string("heatchain-cli ") + verb), std::string::npos) << verb << ": " << r.out;
            EXPECT_TRUE(r.err.empty()) << verb << ": " << r.err;
        }
    }
    // --help wins over arguments that would be a usage error.
    EXPECT_EQ(cli("sweep --points many --help").exit, 0);
    const auto all = cli("--help");
    EXPECT_EQ(all.exit, 0);
    EXPECT_NE(all.out.find("exit status"), std::string::npos);
}

TEST(CliHabits, VersionComesFromTheBuild) {
    const auto r = cli("--version");
    EXPECT_EQ(r.exit, 0);
    EXPECT_EQ(r.out, std::string("heatchain-cli ") + HEATCHAIN_VERSION_STRING + "\n");
}

TEST(CliHabits, ExitStatusesHoldForStandardInput) {
    // 3: malformed JSON names <stdin> and the line:column.
    const auto broken = cliWithInput("compute -", "{\n  \"format\": \"heatchain-project\",\n  \"version\": 1,\n  oops\n}\n");
    EXPECT_EQ(broken.exit, 3);
    EXPECT_NE(broken.err.find("<stdin>"), std::string::npos) << broken.err;
    EXPECT_NE(broken.err.find("<stdin> (line 4, column 3)"), std::string::npos) << broken.err;
    EXPECT_TRUE(broken.out.empty());
    // 3: a bad quantity names its step and JSON path.
    const std::string melt = readWholeFile(samplePath("melt-tank"));
    const auto badUnit = cliWithInput("check -", replaceOnce(melt, "\"to\": { \"T\": \"78 degC\" }",
                                                             "\"to\": { \"T\": \"78 furlongs\" }"));
    EXPECT_EQ(badUnit.exit, 3);
    EXPECT_NE(badUnit.err.find("<stdin>: step \"to-pouring\" (steps[2]).to.T"), std::string::npos) << badUnit.err;
    // 4: a step that asks to heat the wax to below where it already is.
    const auto cannot = cliWithInput("compute - --json", replaceOnce(melt, "\"to\": { \"T\": \"78 degC\" }",
                                                                     "\"to\": { \"T\": \"30 degC\" }"));
    EXPECT_EQ(cannot.exit, 4) << cannot.err;
    EXPECT_NE(cannot.err.find("<stdin>: step \"to-pouring\" (steps[2])"), std::string::npos) << cannot.err;
    // 2: usage errors stay usage errors.
    EXPECT_EQ(cli("compute - --frobnicate").exit, 2);
    EXPECT_EQ(cli("compute - extra").exit, 2);
}
