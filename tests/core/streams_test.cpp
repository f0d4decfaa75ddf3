// Worksheets of several streams (format version 2): reading, writing back
// byte for byte, errors that name the stream, and version 1 unchanged.
#include <gtest/gtest.h>

#include <fstream>
#include <iterator>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/streams.hpp"

using namespace heatchain;

namespace {

const char* kTwoStreams = R"({
  "format": "heatchain-project",
  "version": 2,
  "meta": {
    "title": "Two lines"
  },
  "display": {
    "units": "SI"
  },
  "atmosphere": "101.325 kPa",
  "minApproach": "10 K",
  "utilities": [
    {
      "id": "lp-steam",
      "kind": "steam",
      "P": "4 bar"
    }
  ],
  "site": "north yard",
  "streams": [
    {
      "id": "feed",
      "name": "water feed",
      "dTminContribution": "5 K",
      "system": "steady-flow",
      "model": "reference",
      "substance": "water",
      "basis": {
        "massFlow": "1.8 t/h"
      },
      "start": {
        "T": "30 degC",
        "P": "2 bar"
      },
      "steps": [
        {
          "id": "h1",
          "kind": "heat",
          "to": {
            "T": "110 degC"
          },
          "source": {
            "utility": "lp-steam"
          }
        }
      ]
    },
    {
      "id": "product",
      "system": "steady-flow",
      "model": "constant-cp",
      "substance": "nitrogen",
      "basis": {
        "massFlow": "0.50 kg/s"
      },
      "start": {
        "T": "150 degC",
        "P": "1 atm"
      },
      "colour": "teal",
      "steps": [
        {
          "id": "c1",
          "kind": "cool",
          "to": {
            "T": "40 degC"
          }
        },
        {
          "id": "c2",
          "kind": "compress",
          "to": {
            "ratio": 1.50
          },
          "path": "adiabatic",
          "efficiency": 0.70
        }
      ]
    }
  ]
}
)";

std::string replaced(std::string text, const std::string& from, const std::string& to) {
    const auto at = text.find(from);
    EXPECT_NE(at, std::string::npos) << from;
    if (at != std::string::npos) text.replace(at, from.size(), to);
    return text;
}

}  // namespace

TEST(Streams, VersionTwoReadsEveryStreamWithTheSharedFields) {
    auto set = parseStreamSet(kTwoStreams, "two.hchain");
    ASSERT_TRUE(set.ok()) << set.error().text();
    ASSERT_EQ(set->streams.size(), 2u);
    EXPECT_EQ(set->version, 2);
    EXPECT_EQ(set->streams[0].id, "feed");
    EXPECT_EQ(*set->streams[0].name, "water feed");
    EXPECT_DOUBLE_EQ(set->streams[0].dTminContribution->si, 5.0);
    EXPECT_EQ(set->streams[1].id, "product");
    for (const Stream& s : set->streams) {
        EXPECT_EQ(s.project.meta.title, "Two lines");
        ASSERT_EQ(s.project.utilityList().size(), 1u);
        EXPECT_DOUBLE_EQ(s.project.minApproachK(), 10.0);
    }
    EXPECT_EQ(set->streams[1].project.steps.size(), 2u);
    EXPECT_EQ(set->streams[1].extra.string("colour"), "teal");
    EXPECT_EQ(set->shared.extra.string("site"), "north yard");
    // 1.8 t/h = 0.5 kg/s (1 t = 1000 kg, 1 h = 3600 s).
    EXPECT_NEAR(set->streams[0].project.basis.amount.si, 0.5, 1e-12);
    const auto results = solveStreams(*set);
    ASSERT_EQ(results.size(), 2u);
    EXPECT_TRUE(results[0].ok());
}

TEST(Streams, VersionTwoIsWrittenBackByteForByte) {
    auto set = parseStreamSet(kTwoStreams);
    ASSERT_TRUE(set.ok()) << set.error().text();
    EXPECT_EQ(writeStreamSet(*set), kTwoStreams);  // numbers as typed ("0.50", "1.50", "0.70")
    auto again = parseStreamSet(writeStreamSet(*set));
    ASSERT_TRUE(again.ok());
    EXPECT_EQ(writeStreamSet(*again), kTwoStreams);
}

TEST(Streams, AOneStreamFileStaysVersionOneByteForByte) {
    const std::string v1 = R"({
  "format": "heatchain-project",
  "version": 1,
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "4.2 t/h" },
  "start": { "T": "48 degC", "P": "1.4 bar" },
  "steps": [ { "id": "a", "kind": "compress", "to": { "P": "14 barg" }, "path": "adiabatic", "efficiency": 0.650 } ]
}
)";
    auto project = parseProject(v1);
    ASSERT_TRUE(project.ok());
    auto set = parseStreamSet(v1);
    ASSERT_TRUE(set.ok());
    ASSERT_EQ(set->streams.size(), 1u);
    EXPECT_EQ(set->version, 1);
    EXPECT_EQ(writeStreamSet(*set), writeProject(*project));
    // A version-2 file whose one stream carries nothing version 1 cannot
    // hold is written as version 1.
    std::string two = kTwoStreams;
    const auto cut = two.find(",\n    {\n      \"id\": \"product\"");
    two = two.substr(0, cut) + "\n  ]\n}\n";
    two = replaced(two, "      \"name\": \"water feed\",\n      \"dTminContribution\": \"5 K\",\n", "");
    auto single = parseStreamSet(two);
    ASSERT_TRUE(single.ok()) << single.error().text();
    const std::string written = writeStreamSet(*single);
    EXPECT_NE(written.find("\"version\": 1"), std::string::npos);
    auto back = parseProject(written);
    ASSERT_TRUE(back.ok()) << back.error().text();
    EXPECT_EQ(back->steps.size(), 1u);
    EXPECT_EQ(back->extra.string("site"), "north yard");
}

TEST(Streams, ACycleTimeIsReadCheckedAndWrittenBack) {
    const std::string withCycle =
        replaced(kTwoStreams, "\"dTminContribution\": \"5 K\",\n", "\"dTminContribution\": \"5 K\",\n      \"cycleTime\": \"8 h\",\n");
    auto set = parseStreamSet(withCycle, "two.hchain");
    ASSERT_TRUE(set.ok()) << set.error().text();
    ASSERT_TRUE(set->streams[0].cycleTime);
    EXPECT_DOUBLE_EQ(set->streams[0].cycleTime->si, 8 * 3600.0);  // 1 h = 3600 s
    EXPECT_FALSE(set->streams[1].cycleTime);
    EXPECT_EQ(writeStreamSet(*set), withCycle);
    // Zero or a wrong dimension: refused, naming the stream.
    for (const char* bad : {"0 h", "8 kg"}) {
        auto refused = parseStreamSet(replaced(withCycle, "\"8 h\"", std::string("\"") + bad + "\""), "two.hchain");
        ASSERT_FALSE(refused.ok()) << bad;
        EXPECT_NE(refused.error().text().find("stream \"feed\", cycleTime"), std::string::npos) << refused.error().text();
        EXPECT_GT(refused.error().line, 0);
    }
}

TEST(Streams, AnEditOfOneStreamsSharedFieldsBecomesEveryStreams) {
    auto set = parseStreamSet(kTwoStreams);
    ASSERT_TRUE(set.ok()) << set.error().text();
    Project edited = set->streams[1].project;
    edited.meta.title = "Two lines, revised";
    edited.displayUnits = UnitSystem::MetricEngineering;
    edited.steps.clear();  // a stream's own fields are not shared
    set->takeShared(edited);
    for (const Stream& s : set->streams) {
        EXPECT_EQ(s.project.meta.title, "Two lines, revised");
        EXPECT_EQ(s.project.displayUnits, UnitSystem::MetricEngineering);
        EXPECT_EQ(s.project.utilityList().size(), 1u);
    }
    EXPECT_EQ(set->streams[1].project.steps.size(), 2u);
    EXPECT_EQ(set->shared.extra.string("site"), "north yard");
    auto back = parseStreamSet(writeStreamSet(*set));
    ASSERT_TRUE(back.ok()) << back.error().text();
    EXPECT_EQ(back->streams[0].project.meta.title, "Two lines, revised");
    EXPECT_EQ(back->streams[1].project.displayUnits, UnitSystem::MetricEngineering);
}

TEST(Streams, BadVersionTwoInputNamesTheStream) {
    // Duplicate ids.
    auto dup = parseStreamSet(replaced(kTwoStreams, "\"id\": \"product\"", "\"id\": \"feed\""), "two.hchain");
    ASSERT_FALSE(dup.ok());
    EXPECT_NE(dup.error().text().find("stream \"feed\""), std::string::npos) << dup.error().text();
    EXPECT_NE(dup.error().message.find("twice"), std::string::npos);
    EXPECT_GT(dup.error().line, 0);
    // No streams.
    const std::string text = kTwoStreams;
    const std::string empty = text.substr(0, text.find("\"streams\": [")) + "\"streams\": []\n}\n";
    auto none = parseStreamSet(empty);
    ASSERT_FALSE(none.ok());
    EXPECT_NE(none.error().message.find("at least one stream"), std::string::npos) << none.error().text();
    // A step error: the stream, the step, and the line:column in this file.
    auto bad = parseStreamSet(replaced(kTwoStreams, "\"T\": \"40 degC\"", "\"T\": \"40 degQ\""), "two.hchain");
    ASSERT_FALSE(bad.ok());
    EXPECT_NE(bad.error().where.find("stream \"product\", step \"c1\""), std::string::npos) << bad.error().text();
    EXPECT_EQ(bad.error().line, 66);  // the line of "40 degQ" in kTwoStreams
    // A missing field of one stream.
    auto noStart = parseStreamSet(replaced(kTwoStreams, "\"start\": {\n        \"T\": \"150 degC\",\n        \"P\": \"1 atm\"\n      },", ""));
    ASSERT_FALSE(noStart.ok());
    EXPECT_NE(noStart.error().text().find("stream \"product\""), std::string::npos) << noStart.error().text();
    // A newer version.
    auto newer = parseStreamSet(replaced(kTwoStreams, "\"version\": 2", "\"version\": 3"));
    ASSERT_FALSE(newer.ok());
    EXPECT_NE(newer.error().message.find("version 3"), std::string::npos) << newer.error().text();
}

TEST(Streams, TheReadmeExampleReads) {
    // The version-2 example in README.md, "Several streams and heat recovery".
    std::ifstream in(std::string(HEATCHAIN_SOURCE_DIR) + "/README.md", std::ios::binary);
    const std::string readme((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    const auto section = readme.find("## Several streams and heat recovery");
    ASSERT_NE(section, std::string::npos);
    const auto open = readme.find("```json\n", section);
    const auto close = readme.find("```", open + 8);
    ASSERT_NE(close, std::string::npos);
    auto set = parseStreamSet(readme.substr(open + 8, close - open - 8), "README.md");
    ASSERT_TRUE(set.ok()) << set.error().text();
    ASSERT_EQ(set->streams.size(), 2u);
    EXPECT_DOUBLE_EQ(set->streams[1].dTminContribution->si, 3.0);
    const auto results = solveStreams(*set);
    for (const auto& r : results) EXPECT_TRUE(r.ok());
}
