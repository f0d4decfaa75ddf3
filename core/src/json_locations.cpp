#include "json_locations.hpp"

#include <charconv>
#include <cstdint>
#include <unordered_set>

namespace heatchain::detail {
namespace {

bool isJsonSpace(char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r'; }

void appendUtf8(std::string& out, std::uint32_t cp) {
    if (cp < 0x80) {
        out.push_back(static_cast<char>(cp));
    } else if (cp < 0x800) {
        out.push_back(static_cast<char>(0xC0 | (cp >> 6)));
        out.push_back(static_cast<char>(0x80 | (cp & 0x3F)));
    } else if (cp < 0x10000) {
        out.push_back(static_cast<char>(0xE0 | (cp >> 12)));
        out.push_back(static_cast<char>(0x80 | ((cp >> 6) & 0x3F)));
        out.push_back(static_cast<char>(0x80 | (cp & 0x3F)));
    } else {
        out.push_back(static_cast<char>(0xF0 | (cp >> 18)));
        out.push_back(static_cast<char>(0x80 | ((cp >> 12) & 0x3F)));
        out.push_back(static_cast<char>(0x80 | ((cp >> 6) & 0x3F)));
        out.push_back(static_cast<char>(0x80 | (cp & 0x3F)));
    }
}

int hexValue(char c) {
    if (c >= '0' && c <= '9') return c - '0';
    if (c >= 'a' && c <= 'f') return c - 'a' + 10;
    if (c >= 'A' && c <= 'F') return c - 'A' + 10;
    return -1;
}

// Reads the string starting at text[pos] == '"'; returns its decoded value
// and leaves pos after the closing quote (or at the end of the text).
std::string readString(std::string_view text, std::size_t& pos) {
    std::string out;
    ++pos;  // opening quote
    while (pos < text.size()) {
        const char c = text[pos];
        if (c == '"') {
            ++pos;
            return out;
        }
        if (c != '\\') {
            out.push_back(c);
            ++pos;
            continue;
        }
        if (pos + 1 >= text.size()) {
            ++pos;
            break;
        }
        const char e = text[pos + 1];
        pos += 2;
        switch (e) {
            case 'n': out.push_back('\n'); break;
            case 't': out.push_back('\t'); break;
            case 'r': out.push_back('\r'); break;
            case 'b': out.push_back('\b'); break;
            case 'f': out.push_back('\f'); break;
            case 'u': {
                std::uint32_t cp = 0;
                auto read4 = [&](std::uint32_t& v) {
                    if (pos + 4 > text.size()) return false;
                    v = 0;
                    for (int k = 0; k < 4; ++k) {
                        const int h = hexValue(text[pos + static_cast<std::size_t>(k)]);
                        if (h < 0) return false;
                        v = v * 16 + static_cast<std::uint32_t>(h);
                    }
                    pos += 4;
                    return true;
                };
                if (!read4(cp)) break;
                if (cp >= 0xD800 && cp < 0xDC00 && pos + 1 < text.size() && text[pos] == '\\' &&
                    text[pos + 1] == 'u') {
                    const std::size_t save = pos;
                    pos += 2;
                    std::uint32_t low = 0;
                    if (read4(low) && low >= 0xDC00 && low < 0xE000)
                        cp = 0x10000 + ((cp - 0xD800) << 10) + (low - 0xDC00);
                    else
                        pos = save;
                }
                appendUtf8(out, cp);
                break;
            }
            default: out.push_back(e); break;  // \" \\ \/
        }
    }
    return out;
}

struct Frame {
    bool object = false;
    bool expectKey = false;  // objects: the next string is a key
    std::unordered_set<std::string> keys;
};

// Walks the text; calls onValue(path, offset) at the start of every value
// and onKey(path-with-key, offset, duplicate) at every key. Stops when a
// callback returns false. Bounded: every iteration advances pos.
template <class OnValue, class OnKey, class OnNumber>
void walk(std::string_view text, int maxDepth, OnValue onValue, OnKey onKey, OnNumber onNumber,
          std::optional<JsonProblem>* tooDeep) {
    std::vector<Frame> frames;
    JsonPath path;
    std::size_t pos = 0;
    if (text.substr(0, 3) == "\xEF\xBB\xBF") pos = 3;  // byte-order mark
    while (pos < text.size()) {
        const char c = text[pos];
        if (isJsonSpace(c)) {
            ++pos;
            continue;
        }
        const bool keyExpected = !frames.empty() && frames.back().object && frames.back().expectKey;
        if (c == '"' && keyExpected) {
            const std::size_t start = pos;
            std::string key = readString(text, pos);
            const bool duplicate = !frames.back().keys.insert(key).second;
            path.back().key = std::move(key);
            path.back().index = -1;
            frames.back().expectKey = false;
            if (!onKey(path, start, duplicate)) return;
            continue;
        }
        switch (c) {
            case '{':
            case '[': {
                if (!onValue(path, pos)) return;
                if (static_cast<int>(frames.size()) >= maxDepth) {
                    if (tooDeep)
                        *tooDeep = JsonProblem{"nesting deeper than " + std::to_string(maxDepth) + " levels", path, pos};
                    return;
                }
                Frame f;
                f.object = c == '{';
                f.expectKey = f.object;
                frames.push_back(std::move(f));
                path.push_back(c == '{' ? JsonPathElement{"", -1} : JsonPathElement{"", 0});
                ++pos;
                break;
            }
            case '}':
            case ']':
                if (!frames.empty()) {
                    frames.pop_back();
                    path.pop_back();
                }
                ++pos;
                break;
            case ',':
                if (!frames.empty()) {
                    if (frames.back().object)
                        frames.back().expectKey = true;
                    else
                        ++path.back().index;
                }
                ++pos;
                break;
            case ':':
                ++pos;
                break;
            case '"': {
                if (!onValue(path, pos)) return;
                (void)readString(text, pos);
                break;
            }
            default: {
                // A number or a literal: up to the next delimiter.
                const std::size_t start = pos;
                while (pos < text.size() && !isJsonSpace(text[pos]) && text[pos] != ',' && text[pos] != '}' &&
                       text[pos] != ']' && text[pos] != ':' && text[pos] != '"' && text[pos] != '{' &&
                       text[pos] != '[')
                    ++pos;
                if (pos == start) ++pos;  // never stall
                if (!onValue(path, start)) return;
                const std::string_view token = text.substr(start, pos - start);
                if (!token.empty() && (token[0] == '-' || (token[0] >= '0' && token[0] <= '9'))) {
                    double v = 0;
                    const auto r = std::from_chars(token.data(), token.data() + token.size(), v);
                    if (r.ec == std::errc::result_out_of_range && !onNumber(path, start, token)) return;
                }
                break;
            }
        }
    }
}

bool isPlainName(std::string_view key) {
    if (key.empty()) return false;
    for (char c : key) {
        const bool ok = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_' ||
                        c == '-';
        if (!ok) return false;
    }
    return true;
}

}  // namespace

TextPosition positionOfOffset(std::string_view text, std::size_t offset) {
    if (offset > text.size()) offset = text.size();
    TextPosition p;
    for (std::size_t i = 0; i < offset; ++i) {
        const unsigned char c = static_cast<unsigned char>(text[i]);
        if (c == '\n') {
            ++p.line;
            p.column = 1;
        } else if ((c & 0xC0) != 0x80) {  // not a UTF-8 continuation byte
            ++p.column;
        }
    }
    return p;
}

JsonPath pathOf(std::initializer_list<JsonPathElement> elements) { return JsonPath(elements); }

JsonPath child(const JsonPath& parent, std::string key) {
    JsonPath p = parent;
    p.push_back({std::move(key), -1});
    return p;
}

JsonPath child(const JsonPath& parent, long index) {
    JsonPath p = parent;
    p.push_back({"", index});
    return p;
}

std::string formatJsonPath(const JsonPath& path) {
    std::string out;
    for (const JsonPathElement& e : path) {
        // Appended piece by piece: "[" + std::to_string(…) makes GCC 12's
        // -Wrestrict see an overlapping copy in std::string's insert when
        // optimising (a false positive), which breaks Release -Werror builds.
        if (e.index >= 0) {
            out += '[';
            out += std::to_string(e.index);
            out += ']';
        } else if (isPlainName(e.key)) {
            if (!out.empty()) out += '.';
            out += e.key;
        } else {
            out += "[\"";
            out += e.key;
            out += "\"]";
        }
    }
    return out;
}

std::optional<std::size_t> stepIndexOf(const JsonPath& path) {
    if (path.size() >= 2 && path[0].index < 0 && path[0].key == "steps" && path[1].index >= 0)
        return static_cast<std::size_t>(path[1].index);
    return std::nullopt;
}

std::string labelJsonPath(const JsonPath& path, std::string_view stepId) {
    const auto index = stepIndexOf(path);
    if (!index || stepId.empty()) return formatJsonPath(path);
    std::string where = "step ";
    where += inQuotes(stepId);
    where += " (steps[";
    where += std::to_string(*index);
    where += "])";
    const std::string tail = formatJsonPath(JsonPath(path.begin() + 2, path.end()));
    if (!tail.empty()) {
        if (tail.front() != '[') where += '.';
        where += tail;
    }
    return where;
}

PrescanResult prescanJson(std::string_view text, int maxDepth, std::size_t maxValues) {
    PrescanResult r;
    std::size_t values = 0;
    walk(
        text, maxDepth,
        [&](const JsonPath& path, std::size_t offset) {
            if (++values <= maxValues) return true;
            r.tooManyValues = JsonProblem{"more than " + std::to_string(maxValues) + " JSON values", path, offset};
            return false;
        },
        [&](const JsonPath& path, std::size_t offset, bool duplicate) {
            if (duplicate && !r.duplicateKey)
                r.duplicateKey = JsonProblem{"the key \"" + path.back().key + "\" appears twice in one object", path,
                                             offset};
            return true;
        },
        [&](const JsonPath& path, std::size_t offset, std::string_view token) {
            if (!r.numberOutOfRange)
                r.numberOutOfRange =
                    JsonProblem{"the number " + std::string(token.substr(0, 40)) + " is beyond the range of a double",
                                path, offset};
            return true;
        },
        &r.tooDeep);
    return r;
}

std::unordered_map<std::string, std::size_t> numberOffsets(std::string_view text) {
    std::unordered_map<std::string, std::size_t> out;
    walk(
        text, 100000,
        [&](const JsonPath& path, std::size_t offset) {
            const char c = text[offset];
            if (c == '-' || (c >= '0' && c <= '9')) out.emplace(formatJsonPath(path), offset);
            return true;
        },
        [](const JsonPath&, std::size_t, bool) { return true; },
        [](const JsonPath&, std::size_t, std::string_view) { return true; }, nullptr);
    return out;
}

std::size_t locateJsonValue(std::string_view text, const JsonPath& target) {
    std::size_t best = 0;
    std::size_t bestLength = 0;
    bool exact = false;
    auto matchesPrefix = [&](const JsonPath& path) {
        if (path.size() > target.size()) return false;
        for (std::size_t i = 0; i < path.size(); ++i) {
            const JsonPathElement& a = path[i];
            const JsonPathElement& b = target[i];
            if (a.index != b.index) return false;
            if (a.index < 0 && a.key != b.key) return false;
        }
        return true;
    };
    walk(
        text, 100000,
        [&](const JsonPath& path, std::size_t offset) {
            if (matchesPrefix(path) && (path.size() > bestLength || (path.empty() && bestLength == 0))) {
                best = offset;
                bestLength = path.size();
                if (path.size() == target.size()) {
                    exact = true;
                    return false;
                }
            }
            return true;
        },
        [](const JsonPath&, std::size_t, bool) { return true; },
        [](const JsonPath&, std::size_t, std::string_view) { return true; }, nullptr);
    (void)exact;
    return best;
}

}  // namespace heatchain::detail
