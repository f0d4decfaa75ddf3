// Replays every file of the fuzz seed corpora (tests/fuzz/corpus/<target>/:
// the sample projects, hand-made broken files and every input a fuzzer
// found) through the same bodies the libFuzzer drivers run, so the
// regression inputs are checked in every build, with or without clang.
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "fuzz/fuzz_inputs.hpp"
#include "heatchain/streams.hpp"

namespace {

namespace fs = std::filesystem;

std::vector<fs::path> corpusFiles(const char* target) {
    std::vector<fs::path> files;
    const fs::path dir = fs::path(HEATCHAIN_SOURCE_DIR) / "tests" / "fuzz" / "corpus" / target;
    for (const auto& e : fs::directory_iterator(dir))
        if (e.is_regular_file()) files.push_back(e.path());
    return files;
}

std::string readBytes(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

template <class F>
void replay(const char* target, F&& body, std::size_t minimumFiles) {
    const auto files = corpusFiles(target);
    // The corpus is checked in; an empty folder would make this test vacuous.
    ASSERT_GE(files.size(), minimumFiles) << target;
    for (const auto& f : files) {
        const std::string bytes = readBytes(f);
        const auto broken = body(reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size());
        EXPECT_FALSE(broken.has_value()) << f.filename() << ": " << broken.value_or("");
    }
}

TEST(FuzzCorpus, ProjectFilesLoadOrFailCleanly) {
    replay("project", heatchain::fuzz::projectInput, 20);
}

TEST(FuzzCorpus, QuantitiesParseOrFailCleanly) {
    replay("quantity", heatchain::fuzz::quantityInput, 50);
}

TEST(FuzzCorpus, SubstancesParseOrFailCleanly) {
    replay("substance", heatchain::fuzz::substanceInput, 30);
}

// Every sample project is in the project corpus, and loads (a loader that
// refused everything would pass the replay above).
TEST(FuzzCorpus, SampleProjectsAreSeedsAndLoad) {
    const fs::path samples = fs::path(HEATCHAIN_SOURCE_DIR) / "sample-projects";
    const fs::path corpus = fs::path(HEATCHAIN_SOURCE_DIR) / "tests" / "fuzz" / "corpus" / "project";
    int count = 0;
    for (const auto& e : fs::directory_iterator(samples)) {
        if (e.path().extension() != ".hchain") continue;
        ++count;
        const fs::path seed = corpus / e.path().filename();
        EXPECT_TRUE(fs::exists(seed)) << seed << " is missing from the seed corpus";
        auto p = heatchain::parseStreamSet(readBytes(e.path()), e.path().filename().string());
        EXPECT_TRUE(p.ok()) << e.path().filename() << ": " << (p ? std::string() : p.error().text());
    }
    EXPECT_GE(count, 5);
}

}  // namespace
