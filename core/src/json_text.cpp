// See json_text.hpp.
#include "json_text.hpp"

#include <utility>

#include "json_locations.hpp"

namespace heatchain::detail {

namespace {

// "[json.exception.parse_error.101] parse error at line 2, column 10: syntax
// error ..." → "syntax error ..." (the position is given separately).
// The parser quotes the bytes it last read, which may be anything (a UTF-16
// byte-order mark, binary data): every byte outside printable ASCII is shown
// as \xHH so a message never carries raw bytes to a terminal or a dialog.
std::string parserReason(std::string_view what) {
    std::string_view reason = what;
    const std::size_t at = what.find("column ");
    const std::size_t colon = at == std::string_view::npos ? std::string_view::npos : what.find(": ", at);
    if (colon != std::string_view::npos) {
        reason = what.substr(colon + 2);
    } else {
        const std::size_t bracket = what.find("] ");
        if (bracket != std::string_view::npos) reason = what.substr(bracket + 2);
    }
    static constexpr char kHex[] = "0123456789ABCDEF";
    std::string out;
    out.reserve(reason.size());
    for (const char c : reason) {
        const auto byte = static_cast<unsigned char>(c);
        if (byte >= 0x20 && byte < 0x7F) {
            out += c;
        } else {
            out += "\\x";
            out += kHex[byte >> 4];
            out += kHex[byte & 0xF];
        }
    }
    return out;
}

}  // namespace

std::variant<Json, JsonTextFault> parseJsonText(std::string_view text, int maxDepth, std::size_t maxValues) {
    using Kind = JsonTextFault::Kind;
    const PrescanResult pre = prescanJson(text, maxDepth, maxValues);
    if (pre.tooDeep)
        return JsonTextFault{Kind::TooDeep, "JSON nested deeper than " + std::to_string(maxDepth) + " levels",
                             pre.tooDeep->offset};
    if (pre.tooManyValues) return JsonTextFault{Kind::TooManyValues, pre.tooManyValues->message, pre.tooManyValues->offset};
    Json root;
    try {
        root = Json::parse(text.begin(), text.end());
    } catch (const Json::parse_error& e) {
        return JsonTextFault{Kind::NotJson, "not valid JSON: " + parserReason(e.what()), e.byte > 0 ? e.byte - 1 : 0};
    } catch (const Json::out_of_range&) {
        if (pre.numberOutOfRange)
            return JsonTextFault{Kind::NumberOutOfRange, pre.numberOutOfRange->message, pre.numberOutOfRange->offset};
        return JsonTextFault{Kind::NumberOutOfRange, "a number is beyond the range of a double", 0};
    }
    if (pre.duplicateKey)
        return JsonTextFault{Kind::DuplicateKey,
                             pre.duplicateKey->message + " (at " + formatJsonPath(pre.duplicateKey->path) +
                                 "); each key may appear once",
                             pre.duplicateKey->offset};
    return root;
}

}  // namespace heatchain::detail
