#pragma once
// Where things are in JSON text. nlohmann/json gives values but not their
// positions; error messages need "line:column", so this small scanner walks
// the text once more. It is iterative (an explicit stack, no recursion),
// every loop advances through the text, and it tolerates malformed input
// (nlohmann/json reports the syntax errors; this only locates).
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

namespace heatchain::detail {

struct TextPosition {
    int line = 1;    // 1-based
    int column = 1;  // 1-based, in characters (UTF-8 code points)
};

// Position of a byte offset (clamped to the text).
TextPosition positionOfOffset(std::string_view text, std::size_t offset);

// One step of a path: an object key, or an array index (index >= 0).
struct JsonPathElement {
    std::string key;
    long index = -1;
};
using JsonPath = std::vector<JsonPathElement>;

JsonPath pathOf(std::initializer_list<JsonPathElement> elements);
JsonPath child(const JsonPath& parent, std::string key);
JsonPath child(const JsonPath& parent, long index);
// "steps[2].to.T"; keys that are not plain names are written ["like this"].
std::string formatJsonPath(const JsonPath& path);
// "like this", for names in messages.
inline std::string inQuotes(std::string_view s) { return "\"" + std::string(s) + "\""; }
// How an error names where it is: `step "economiser" (steps[1]).to.T` when
// the path is inside a step whose id is known (`stepId`, the id of
// steps[path[1]]), else formatJsonPath. The reader and resolveProject both
// label through it.
std::string labelJsonPath(const JsonPath& path, std::string_view stepId);
// Whether the path is inside steps[i], and i.
std::optional<std::size_t> stepIndexOf(const JsonPath& path);

// What nlohmann/json's parser does not check, found before it runs: nesting
// deeper than maxDepth (refused before any recursive code sees it), a key
// repeated within one object (the parser would keep only the last), a number
// beyond the range of a double (the parser throws without a position).
struct JsonProblem {
    std::string message;
    JsonPath path;
    std::size_t offset = 0;
};
// Also more values (of any kind) than maxValues: a parsed value costs tens
// of bytes however short its text, so a broken or hostile file of 64 MiB of
// "0," would otherwise take gigabytes; the walk stops there.
struct PrescanResult {
    std::optional<JsonProblem> tooDeep;
    std::optional<JsonProblem> duplicateKey;
    std::optional<JsonProblem> numberOutOfRange;
    std::optional<JsonProblem> tooManyValues;
};
PrescanResult prescanJson(std::string_view text, int maxDepth, std::size_t maxValues);

// Byte offset of every number value in the text, keyed by formatJsonPath of
// its path: one walk for a whole file (locateJsonValue walks per call).
std::unordered_map<std::string, std::size_t> numberOffsets(std::string_view text);

// Byte offset of the value at `path`, or of its deepest ancestor present in
// the text (the whole document's start when nothing matches).
std::size_t locateJsonValue(std::string_view text, const JsonPath& path);

}  // namespace heatchain::detail
