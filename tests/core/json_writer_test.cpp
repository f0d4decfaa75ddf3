// The JSON writer behind the project file and `compute --json`: its layout is
// nlohmann/json's dump(2) (the library's own output is the reference here,
// as files written through it must keep their bytes), a number of ours reads
// back to the same double in the fewest digits, strings are escaped as JSON
// (RFC 8259, section 7) requires.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <cstring>
#include <random>
#include <string>

#include "../../core/src/json_writer.hpp"
#include "heatchain/project_file.hpp"

using namespace heatchain;
using detail::JsonWriter;

namespace {

std::string written(const Json& v) {
    std::string out;
    JsonWriter w(out);
    w.value(v);
    return out;
}

std::string numberText(double x) {
    std::string out;
    detail::appendJsonNumber(out, x);
    return out;
}

int significantDigits(const std::string& text) {
    const std::size_t e = text.find_first_of("eE");
    const std::string mantissa = text.substr(0, e);
    std::string digits;
    for (char c : mantissa)
        if (c >= '0' && c <= '9') digits += c;
    const std::size_t first = digits.find_first_not_of('0');
    if (first == std::string::npos) return 0;
    const std::size_t last = digits.find_last_not_of('0');
    return static_cast<int>(last - first + 1);
}

}  // namespace

TEST(JsonWriter, KeptValuesAreLaidOutAsDump2) {
    const Json tree = Json::parse(R"({
        "a": [], "b": {}, "c": [1, -2, 18446744073709551615, 0.19312, 1e300, -0.0, 2.50],
        "d": {"nested": [{"x": null, "y": true, "z": false}, [[], {}]], "s": "tab\there \"q\" \\ / é €"},
        "e": "\u0001\u001f\b\f\n\r", "": "empty key"
    })");
    EXPECT_EQ(written(tree), tree.dump(2));
    EXPECT_EQ(written(Json::array()), "[]");
    EXPECT_EQ(written(Json("x")), "\"x\"");
}

TEST(JsonWriter, WritesIntoADeeperIndentation) {
    std::string out;
    JsonWriter w(out, 2);
    w.beginObject();
    w.key("k").integer(3);
    w.endObject();
    EXPECT_EQ(out, "{\n      \"k\": 3\n    }");
}

// Expected texts worked out by hand: the fewest significant digits that read
// back to the same double (IEEE 754 binary64), placed plain between 1e-4 and
// 15 digits before the point, else with a two-digit or longer exponent.
TEST(JsonWriter, NumbersInTheirShortestForm) {
    EXPECT_EQ(numberText(0.1), "0.1");
    EXPECT_EQ(numberText(2.5), "2.5");
    EXPECT_EQ(numberText(300.0), "300.0");
    EXPECT_EQ(numberText(-0.0), "-0.0");
    EXPECT_EQ(numberText(0.0001), "0.0001");
    EXPECT_EQ(numberText(0.00001), "1e-05");
    EXPECT_EQ(numberText(123456789012345.0), "123456789012345.0");
    EXPECT_EQ(numberText(1e15), "1e+15");
    EXPECT_EQ(numberText(1.5e300), "1.5e+300");
    EXPECT_EQ(numberText(5e-324), "5e-324");  // the smallest subnormal
    EXPECT_EQ(numberText(1.7976931348623157e308), "1.7976931348623157e+308");
    // nlohmann/json's Grisu2 prints 0.19312000000000001 here; five digits read back.
    EXPECT_EQ(numberText(0.19312), "0.19312");
    EXPECT_EQ(std::strtod("0.19312", nullptr), 0.19312);
    EXPECT_EQ(numberText(std::nan("")), "null");
}

// The law behind the form: every double reads back exactly, never in more
// digits than nlohmann/json writes it.
TEST(JsonWriter, EveryNumberReadsBackInNoMoreDigits) {
    std::mt19937_64 rng(20261202);
    for (int i = 0; i < 200000; ++i) {
        const std::uint64_t bits = rng();
        double x = 0;
        std::memcpy(&x, &bits, sizeof x);
        if (!std::isfinite(x)) continue;
        const std::string text = numberText(x);
        ASSERT_EQ(std::strtod(text.c_str(), nullptr), x) << text;
        ASSERT_LE(significantDigits(text), significantDigits(Json(x).dump())) << text;
    }
}

TEST(JsonWriter, StringsEscapedAndNonUtf8Replaced) {
    std::string out;
    detail::appendJsonString(out, std::string("a\"b\\c\x01\x7f/é", 10));
    EXPECT_EQ(out, "\"a\\\"b\\\\c\\u0001\x7f/é\"");
    out.clear();
    // A byte that starts no UTF-8 sequence becomes U+FFFD (EF BF BD in UTF-8).
    detail::appendJsonString(out, "a\xff" "b");
    EXPECT_EQ(out, "\"a\xEF\xBF\xBD" "b\"");
}

// A note that happens to read like the old writer's number placeholders
// leaves every typed number as typed.
TEST(JsonWriter, ProjectKeepsTypedNumbersBesidePlaceholderLikeText) {
    const std::string text = R"({
  "format": "heatchain-project",
  "version": 1,
  "display": {
    "units": "SI"
  },
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": {
    "massFlow": "1 kg/s"
  },
  "start": {
    "T": "20 degC",
    "P": "1 bar"
  },
  "steps": [
    {
      "id": "b",
      "kind": "boil",
      "fraction": 0.50,
      "note": "\u0001hcnum0\u0001"
    }
  ]
}
)";
    auto p = parseProject(text, "t.hchain");
    ASSERT_TRUE(p) << p.error().text();
    EXPECT_EQ(writeProject(*p), text);
}
