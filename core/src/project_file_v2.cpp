// Reading and writing worksheets of several streams (format version 2).
//
// Each stream is read by the version-1 reader: its text is assembled from
// the file's own bytes (the shared fields, then the stream's fields, each
// value cut out of the file as written), so numbers keep their typed
// characters and every rule of version 1 applies unchanged. An error from
// that reader is moved back to the file: its line:column is mapped through
// the cut pieces, and its place is prefixed with the stream's id.
// Writing works the same way round: each stream is written by the version-1
// writer and its values are set into the version-2 layout, indented deeper.
#include <algorithm>
#include <array>
#include <cstdint>
#include <fstream>
#include <set>
#include <span>
#include <sstream>

#include "heatchain/project_file.hpp"
#include "heatchain/streams.hpp"
#include "json_locations.hpp"
#include "project_file_parts.hpp"
#include "unknown_fields_json.hpp"

namespace heatchain {

namespace {

constexpr int kMaxDepth = detail::kMaxJsonDepth;  // as the version-1 reader

// Shared fields in the order they are written; then the stream's own.
constexpr std::array<std::string_view, 6> kSharedKeys{"meta", "display", "atmosphere", "surroundings",
                                                      "minApproach", "utilities"};
constexpr std::array<std::string_view, 6> kStreamKeys{"system", "model", "substance", "basis", "start", "steps"};

using detail::inQuotes;
using detail::member;

// The byte just past the JSON value starting at `at` (the text is valid JSON).
std::size_t valueEnd(std::string_view text, std::size_t at) {
    std::size_t i = at;
    if (i >= text.size()) return i;
    auto skipString = [&](std::size_t k) {
        for (++k; k < text.size(); ++k) {
            if (text[k] == '\\')
                ++k;
            else if (text[k] == '"')
                return k + 1;
        }
        return text.size();
    };
    if (text[i] == '"') return skipString(i);
    if (text[i] == '{' || text[i] == '[') {
        int depth = 0;
        while (i < text.size()) {
            const char c = text[i];
            if (c == '"') {
                i = skipString(i);
                continue;
            }
            if (c == '{' || c == '[') ++depth;
            if (c == '}' || c == ']') {
                if (--depth == 0) return i + 1;
            }
            ++i;
        }
        return i;
    }
    while (i < text.size() && std::string_view(",}] \t\r\n").find(text[i]) == std::string_view::npos) ++i;
    return i;
}

// A piece of the assembled text and where it came from.
struct Cut {
    std::size_t at = 0;      // offset in the assembled text
    std::size_t from = 0;    // offset in the file
    std::size_t length = 0;
    bool shared = false;     // a shared field (its errors do not name the stream)
};

struct Assembled {
    std::string text;
    std::vector<Cut> cuts;
};

void appendValue(Assembled& a, std::string_view file, const detail::JsonPath& path, std::string_view key, bool shared) {
    const std::size_t from = detail::locateJsonValue(file, path);
    const std::size_t end = valueEnd(file, from);
    a.text += ",\n" + inQuotes(key) + ": ";
    a.cuts.push_back({a.text.size(), from, end - from, shared});
    a.text.append(file.substr(from, end - from));
}

// Offset of a 1-based line:column (column in code points) in `text`.
std::size_t offsetOf(std::string_view text, int line, int column) {
    std::size_t i = 0;
    for (int l = 1; l < line && i < text.size(); ++i)
        if (text[i] == '\n') ++l;
    for (int c = 1; c < column && i < text.size(); ++c) {
        ++i;
        while (i < text.size() && (static_cast<unsigned char>(text[i]) & 0xC0) == 0x80) ++i;
    }
    return i;
}

Error errorAt(std::string message, const std::string& where, std::string_view file, std::string_view text,
              std::size_t offset) {
    Error e = makeError(std::move(message), file.empty() ? where : std::string(file) + (where.empty() ? "" : ": ") + where);
    const auto pos = detail::positionOfOffset(text, offset);
    e.line = pos.line;
    e.column = pos.column;
    return e;
}

struct Failure {
    Error error;
};

class V2Reader {
public:
    V2Reader(std::string_view text, std::string_view file, const Json& root) : text_(text), file_(file), root_(root) {}

    [[noreturn]] void fail(const detail::JsonPath& path, std::string message, std::string where = {}) const {
        if (where.empty()) where = detail::formatJsonPath(path);
        throw Failure{errorAt(std::move(message), where, file_, text_, detail::locateJsonValue(text_, path))};
    }

    StreamSet read() const {
        StreamSet set;
        set.version = kStreamsFormatVersion;
        const Json* streams = member(root_, "streams");
        if (!streams) fail({}, "\"streams\" is missing: a version-2 worksheet lists its streams, "
                               "[ { \"id\": \"feed\", \"system\": ..., \"steps\": [] } ]");
        const detail::JsonPath streamsPath{{"streams", -1}};
        if (!streams->is_array()) fail(streamsPath, "\"streams\" must be a list [...]");
        if (streams->empty()) fail(streamsPath, "\"streams\" is empty: a worksheet needs at least one stream");

        std::set<std::string> ids;
        long index = 0;
        for (const Json& s : *streams) set.streams.push_back(stream(s, index++, ids));

        set.shared = set.streams.front().project;
        set.shared.steps.clear();
        set.shared.version = kStreamsFormatVersion;
        Json extra = Json::object();
        for (auto it = root_.begin(); it != root_.end(); ++it) {
            const std::string& k = it.key();
            if (k == "format" || k == "version" || k == "streams") continue;
            if (std::find(kSharedKeys.begin(), kSharedKeys.end(), k) != kSharedKeys.end()) continue;
            extra[k] = it.value();
        }
        set.shared.extra = detail::unknownFieldsOf(std::move(extra));
        return set;
    }

private:
    std::string_view text_;
    std::string_view file_;
    const Json& root_;

    Stream stream(const Json& s, long index, std::set<std::string>& ids) const {
        const detail::JsonPath path = detail::child({{"streams", -1}}, index);
        const std::string at = "streams[" + std::to_string(index) + "]";
        if (!s.is_object()) fail(path, "a stream must be an object { \"id\": ..., \"system\": ..., \"steps\": [] }", at);
        Stream out;
        const Json* id = member(s, "id");
        if (!id) fail(path, "the stream has no \"id\" (a short name such as \"feed\")", at);
        if (!id->is_string() || id->get_ref<const std::string&>().empty())
            fail(detail::child(path, "id"), "a stream's \"id\" must be a non-empty string", at + ".id");
        out.id = id->get<std::string>();
        const std::string label = "stream " + inQuotes(out.id);
        if (!ids.insert(out.id).second)
            fail(detail::child(path, "id"),
                 "the stream id " + inQuotes(out.id) + " is used twice; each stream needs its own id", label);
        if (const Json* name = member(s, "name")) {
            if (!name->is_string()) fail(detail::child(path, "name"), "a stream's \"name\" must be a string", label + ", name");
            out.name = name->get<std::string>();
        }
        if (const Json* d = member(s, "dTminContribution")) {
            const detail::JsonPath dPath = detail::child(path, "dTminContribution");
            if (!d->is_string())
                fail(dPath, "expected a temperature difference with a unit, e.g. \"5 K\"", label + ", dTminContribution");
            auto q = parseQuantity(d->get_ref<const std::string&>(), Dimension::TemperatureDifference);
            if (!q) fail(dPath, q.error().message, label + ", dTminContribution");
            if (*q < 0) fail(dPath, "the ΔTmin contribution must be zero or more", label + ", dTminContribution");
            out.dTminContribution = Quantity{d->get<std::string>(), *q};
        }
        if (const Json* c = member(s, "cycleTime")) {
            const detail::JsonPath cPath = detail::child(path, "cycleTime");
            if (!c->is_string()) fail(cPath, "expected a time with a unit, e.g. \"8 h\"", label + ", cycleTime");
            auto q = parseQuantity(c->get_ref<const std::string&>(), Dimension::Time);
            if (!q) fail(cPath, q.error().message, label + ", cycleTime");
            if (!(*q > 0)) fail(cPath, "the cycle time must be more than zero", label + ", cycleTime");
            out.cycleTime = Quantity{c->get<std::string>(), *q};
        }
        Json extra = Json::object();
        for (auto it = s.begin(); it != s.end(); ++it) {
            const std::string& k = it.key();
            if (k == "id" || k == "name" || k == "dTminContribution" || k == "cycleTime") continue;
            if (std::find(kStreamKeys.begin(), kStreamKeys.end(), k) != kStreamKeys.end()) continue;
            extra[k] = it.value();
        }
        out.extra = detail::unknownFieldsOf(std::move(extra));

        // The stream as a version-1 file, cut from this file's bytes.
        Assembled a;
        a.text = "{\"format\": \"heatchain-project\", \"version\": 1";
        for (std::string_view key : kSharedKeys)
            if (member(root_, key)) appendValue(a, text_, {{std::string(key), -1}}, key, true);
        for (std::string_view key : kStreamKeys)
            if (member(s, key)) appendValue(a, text_, detail::child(path, std::string(key)), key, false);
        a.text += "\n}\n";

        auto p = parseProject(a.text, {});
        if (!p) throw Failure{moved(p.error(), a, path, label)};
        out.project = std::move(*p);
        return out;
    }

    // An error of the version-1 reader on the assembled text, placed in the
    // file and, unless it is in a shared field, named by the stream.
    Error moved(const Error& e, const Assembled& a, const detail::JsonPath& streamPath, const std::string& label) const {
        std::size_t offset = detail::locateJsonValue(text_, streamPath);
        bool shared = false;
        if (e.line > 0) {
            const std::size_t at = offsetOf(a.text, e.line, e.column);
            for (const Cut& c : a.cuts) {
                if (at >= c.at && at <= c.at + c.length) {
                    offset = c.from + (at - c.at);
                    shared = c.shared;
                    break;
                }
            }
        }
        std::string where = e.where;
        if (!shared) where = label + (where.empty() ? "" : ", " + where);
        return errorAt(e.message, where, file_, text_, offset);
    }
};

std::string reindented(std::string_view value, std::string_view indent) {
    std::string out;
    out.reserve(value.size() + 64);
    for (const char c : value) {
        out += c;
        if (c == '\n') out.append(indent);
    }
    return out;
}

// The values of `keys` in a version-1 file written by writeProject, as
// "key": value lines indented for `indent`, in the order of `keys`.
void appendMembers(std::string& out, std::string_view v1, std::span<const std::string_view> keys, const Json& parsed,
                   std::string_view indent, bool& first) {
    for (std::string_view key : keys) {
        if (!member(parsed, key)) continue;
        const std::size_t from = detail::locateJsonValue(v1, {{std::string(key), -1}});
        const std::size_t end = valueEnd(v1, from);
        // writeProject indents top-level members by 2; here they sit deeper.
        out += first ? "\n" : ",\n";
        first = false;
        out.append(indent).append(Json(std::string(key)).dump()).append(": ");
        out += reindented(v1.substr(from, end - from), indent.substr(2));
    }
}

void appendExtra(std::string& out, const UnknownFields& fields, std::string_view indent, bool& first) {
    const Json& extra = detail::jsonOf(fields);
    for (auto it = extra.begin(); it != extra.end(); ++it) {
        out += first ? "\n" : ",\n";
        first = false;
        out.append(indent).append(Json(it.key()).dump()).append(": ");
        out += reindented(it.value().dump(2, ' ', false, Json::error_handler_t::replace), indent);
    }
}

// The project with the set's shared fields in place of its own.
// The set's shared fields put into one stream's project, in place (a copy
// of the whole project, steps and all, would cost every edit of a long
// worksheet).
void assignShared(Project& p, const Project& shared) {
    if (&p == &shared) return;
    p.meta = shared.meta;
    p.displayUnits = shared.displayUnits;
    p.displayExtra = shared.displayExtra;
    p.atmosphere = shared.atmosphere;
    p.surroundings = shared.surroundings;
    p.utilities = shared.utilities;
    p.minApproach = shared.minApproach;
}

Project withShared(const Project& stream, const Project& shared) {
    Project p = stream;
    assignShared(p, shared);
    return p;
}

}  // namespace

const Stream* StreamSet::find(std::string_view id) const {
    for (const Stream& s : streams)
        if (s.id == id) return &s;
    return nullptr;
}

void StreamSet::shareFields() {
    for (Stream& s : streams) assignShared(s.project, shared);
}

void StreamSet::takeShared(const Project& from) {
    assignShared(shared, from);
    shareFields();
}

bool StreamSet::writesAsVersion1() const {
    if (streams.size() != 1) return false;
    const Stream& s = streams.front();
    return !s.name && !s.dTminContribution && !s.cycleTime && s.extra.empty();
}

StreamSet streamSetOf(Project project) {
    StreamSet set;
    set.version = project.version;
    set.shared = project;
    set.shared.steps.clear();
    Stream s;
    s.id = "main";
    s.project = std::move(project);
    set.streams.push_back(std::move(s));
    return set;
}

Result<StreamSet> parseStreamSet(std::string_view text, std::string_view fileName) {
    // Only a well-formed version-2 file takes the new path; everything else
    // (including every malformed file) goes to the version-1 reader, which
    // says what is wrong exactly as it always has.
    const detail::PrescanResult pre = detail::prescanJson(text, kMaxDepth, detail::kMaxJsonValues);
    Json root;
    bool v2 = false;
    if (!pre.tooDeep && !pre.numberOutOfRange && !pre.tooManyValues) {
        try {
            root = Json::parse(text.begin(), text.end());
            const Json* format = member(root, "format");
            const Json* version = member(root, "version");
            v2 = format && format->is_string() && format->get_ref<const std::string&>() == "heatchain-project" &&
                 version && version->is_number_integer() && version->get<long long>() == kStreamsFormatVersion;
        } catch (const std::exception&) {
            v2 = false;
        }
    }
    if (!v2) {
        auto p = parseProject(text, fileName);
        if (!p) return p.error();
        return streamSetOf(std::move(*p));
    }
    if (pre.duplicateKey)
        return errorAt(pre.duplicateKey->message + " (at " + detail::formatJsonPath(pre.duplicateKey->path) +
                           "); each key may appear once",
                       {}, fileName, text, pre.duplicateKey->offset);
    try {
        return V2Reader(text, fileName, root).read();
    } catch (const Failure& f) {
        return f.error;
    } catch (const std::exception& e) {
        return makeError(std::string("cannot read the worksheet: ") + e.what(), std::string(fileName));
    }
}

Result<StreamSet> loadStreamSet(const std::filesystem::path& file) {
    auto text = detail::readProjectText(file);
    if (!text) return text.error();
    return parseStreamSet(*text, file.string());
}

std::string writeStreamSet(const StreamSet& set) {
    if (set.writesAsVersion1()) {
        Project p = set.streams.front().project;
        if (set.version != 1) {  // a one-stream version-2 worksheet: its shared fields are the set's
            p = withShared(p, set.shared);
            p.extra = set.shared.extra;
        }
        p.version = 1;
        return writeProject(p);
    }
    std::string out = "{\n  \"format\": \"heatchain-project\",\n  \"version\": 2";
    bool first = false;
    {
        Project shared = set.streams.empty() ? set.shared : withShared(set.streams.front().project, set.shared);
        shared.extra = {};
        shared.steps.clear();
        shared.version = 1;
        const std::string v1 = writeProject(shared);
        const Json parsed = Json::parse(v1);
        appendMembers(out, v1, kSharedKeys, parsed, "  ", first);
        appendExtra(out, set.shared.extra, "  ", first);
    }
    out += ",\n  \"streams\": [";
    bool firstStream = true;
    for (const Stream& s : set.streams) {
        out += firstStream ? "\n    {" : ",\n    {";
        firstStream = false;
        bool firstMember = false;  // "id" comes first
        out += "\n      \"id\": " + Json(s.id).dump(-1, ' ', false, Json::error_handler_t::replace);
        if (s.name) out += ",\n      \"name\": " + Json(*s.name).dump(-1, ' ', false, Json::error_handler_t::replace);
        if (s.dTminContribution)
            out += ",\n      \"dTminContribution\": " +
                   Json(s.dTminContribution->text).dump(-1, ' ', false, Json::error_handler_t::replace);
        if (s.cycleTime)
            out += ",\n      \"cycleTime\": " + Json(s.cycleTime->text).dump(-1, ' ', false, Json::error_handler_t::replace);
        Project p = withShared(s.project, set.shared);
        p.extra = {};
        p.version = 1;
        const std::string v1 = writeProject(p);
        const Json parsed = Json::parse(v1);
        constexpr std::array<std::string_view, 5> head{"system", "model", "substance", "basis", "start"};
        constexpr std::array<std::string_view, 1> tail{"steps"};
        appendMembers(out, v1, head, parsed, "      ", firstMember);
        appendExtra(out, s.extra, "      ", firstMember);
        appendMembers(out, v1, tail, parsed, "      ", firstMember);
        out += "\n    }";
    }
    out += "\n  ]\n}\n";
    return out;
}

Status saveStreamSet(const StreamSet& set, const std::filesystem::path& file) {
    return writeFileAtomically(file, writeStreamSet(set), true);
}

std::vector<SequenceResult> solveStreams(const StreamSet& set, const SolveOptions& options) {
    std::vector<SequenceResult> out;
    out.reserve(set.streams.size());
    for (const Stream& s : set.streams) out.push_back(solve(s.project, options));
    return out;
}

}  // namespace heatchain
