// The report's "Published sources of the substance data": rendered by
// heatchain-cli as a user would and read back with poppler's pdftotext. It
// names publications only (no repository paths, no "from memory" notes, no
// software packages), marks in plain words every value the library flags as
// not independently confirmed, and explains the mark once.
#include <gtest/gtest.h>

#include <filesystem>
#include <string>

#include "heatchain/project_file.hpp"
#include "support/pdf_text.hpp"
#include "support/run_command.hpp"
#include "support/samples.hpp"

namespace fs = std::filesystem;
using heatchain::testing::runCommand;

namespace {

std::string squeezedPdfText(const fs::path& pdf) {
    return heatchain::testing::squeeze(heatchain::testing::pdfText(pdf, false));
}

int count(const std::string& text, const std::string& what) {
    int n = 0;
    for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + what.size())) ++n;
    return n;
}

TEST(ReportSources, PublishedSourcesOnlyAndUnconfirmedValuesSaidInPlainWords) {
    const fs::path dir = fs::temp_directory_path() / ("heatchain-report-sources-" + std::to_string(::getpid()));
    fs::create_directories(dir);
    int markedSamples = 0;
    for (const char* name : {"melt-tank", "solvent-recovery", "ammonia-chiller", "boiler-feed"}) {
        const std::string project = heatchain::testing::samplePath(name);
        const fs::path pdf = dir / (std::string(name) + ".pdf");
        const auto r = runCommand(std::string(HEATCHAIN_CLI) + " report " + project + " -o " + pdf.string());
        ASSERT_EQ(r.exit, 0) << name << ": " << r.out;
        const std::string text = squeezedPdfText(pdf);
        // The worksheet's own substance (melt-tank) cites what its author typed.
        const bool custom = std::string(name) == "melt-tank";
        ASSERT_NE(text.find(custom ? "Sources of the substance data, as given in the project file"
                                   : "Published sources of the substance data"),
                  std::string::npos)
            << name;
        for (const char* banned : {"from memory", "tests/", ".cpp", "python3-iapws"})
            EXPECT_EQ(text.find(banned), std::string::npos) << name << " prints \"" << banned << "\"";

        auto p = heatchain::loadProject(project);
        ASSERT_TRUE(p) << name;
        int unconfirmed = 0;
        for (const auto& n : p->substance.sources) unconfirmed += n.confirmed ? 0 : 1;
        // The mark is the table cell's last sentence; the explanation below
        // the table quotes it in lower case once.
        EXPECT_EQ(count(text, "Not independently confirmed."), unconfirmed) << name;
        EXPECT_EQ(count(text, "Values marked \xE2\x80\x9Cnot independently confirmed\xE2\x80\x9D"), unconfirmed > 0 ? 1 : 0)
            << name;
        if (unconfirmed > 0) ++markedSamples;
    }
    // Toluene and ammonia carry flagged values; water carries none.
    EXPECT_EQ(markedSamples, 2);
    fs::remove_all(dir);
}

}  // namespace
