#pragma once
// A JSON document's text parsed with what nlohmann/json's parser does not
// check found first (prescanJson): nesting, the number of values, a key
// repeated in one object, a number beyond a double. The project file and a
// substance library text both read through it.
#include <cstddef>
#include <string>
#include <string_view>
#include <variant>

#include "heatchain/json.hpp"

namespace heatchain::detail {

struct JsonTextFault {
    enum class Kind { TooDeep, TooManyValues, NotJson, NumberOutOfRange, DuplicateKey };
    Kind kind;
    std::string message;     // "JSON nested deeper than 64 levels", "not valid JSON: …", …
    std::size_t offset = 0;  // byte offset in the text
};

// The document, or the first fault found, in this order: too deep, too many
// values (both before parsing), not JSON, a number out of range, a repeated
// key (after parsing: the parser would keep only the last, silently).
std::variant<Json, JsonTextFault> parseJsonText(std::string_view text, int maxDepth, std::size_t maxValues);

}  // namespace heatchain::detail
