// Unknown fields are kept in their order and written back where they were;
// an edit of one keeps its place, a new one goes last.
#include <gtest/gtest.h>

#include <string>

#include "heatchain/project_file.hpp"

using namespace heatchain;

namespace {

const std::string kHead = R"({
  "format": "heatchain-project",
  "version": 1,
  "display": {
    "units": "SI",
    "pressure": "absolute",
    "digits": 4
  },)";
const std::string kTail = R"(
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
  "steps": []
}
)";

std::string replaced(std::string text, const std::string& from, const std::string& to) {
    const auto at = text.find(from);
    if (at != std::string::npos) text.replace(at, from.size(), to);
    return text;
}

}  // namespace

TEST(UnknownFields, KeptInOrderAndEditedInPlace) {
    auto p = parseProject(kHead + kTail);
    ASSERT_TRUE(p) << p.error().text();
    UnknownFields& display = p->displayExtra;
    EXPECT_EQ(display.size(), 2u);
    EXPECT_EQ(display.string("pressure"), "absolute");
    EXPECT_EQ(display.json("digits"), "4");
    EXPECT_FALSE(display.string("digits"));  // a number, not a string
    EXPECT_FALSE(display.json("colour"));

    const UnknownFields before = display;
    display.setString("pressure", "gauge");
    EXPECT_FALSE(display == before);
    EXPECT_EQ(before.string("pressure"), "absolute");  // a copy is not changed by an edit of another
    EXPECT_EQ(writeProject(*p), replaced(kHead, "\"absolute\"", "\"gauge\"") + kTail);

    display.setString("theme", "dark");
    EXPECT_EQ(writeProject(*p),
              replaced(replaced(kHead, "\"absolute\"", "\"gauge\""), "\"digits\": 4", "\"digits\": 4,\n    \"theme\": \"dark\"") +
                  kTail);

    display.erase("theme");
    display.erase("digits");
    display.erase("pressure");
    EXPECT_TRUE(display.empty());
    EXPECT_TRUE(display == UnknownFields{});
    EXPECT_EQ(writeProject(*p), replaced(kHead, ",\n    \"pressure\": \"absolute\",\n    \"digits\": 4", "") + kTail);
}
