#pragma once
// Writing JSON text directly, the counterpart of json_reader.hpp: the project
// writer (project_writer.cpp) and the streamed `compute --json` output
// (results_json.cpp) both write through JsonWriter. The layout is the one
// nlohmann/json's dump(2) gives (2-space indent, "key": value, an empty
// object as {}), so files written before and after read byte for byte the
// same. A number of ours is written either as the characters the user typed
// or in the shortest form that reads back to the same double; a value kept
// as parsed (value()) keeps the digits nlohmann/json gives it.
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "unknown_fields_json.hpp"

namespace heatchain::detail {

// The shortest characters that read back to `x` (std::to_chars), placed as
// nlohmann/json places a double's digits: plain with ".0" up to 15 digits
// before the point, "0.000ddd" down to 1e-4, else "d.ddde+XX"; not finite
// is written "null", as JSON has no such number.
void appendJsonNumber(std::string& out, double x);

// `s` in double quotes, escaped as nlohmann/json escapes a string when it
// keeps non-ASCII as UTF-8: \" \\ \b \f \n \r \t, other control characters
// as \u00xx; bytes that are not UTF-8 are replaced by U+FFFD.
void appendJsonString(std::string& out, std::string_view s);

class JsonWriter {
public:
    // Appends to `out`; `depth` is the indentation the first value sits at
    // (0 for a whole document).
    explicit JsonWriter(std::string& out, int depth = 0) : out_(out), depth_(depth) {}

    void beginObject() { open('{', false); }
    void endObject() { close('}'); }
    void beginArray() { open('[', true); }
    void endArray() { close(']'); }
    JsonWriter& key(std::string_view k);  // the caller writes its value next

    void string(std::string_view s) {
        beforeValue();
        appendJsonString(out_, s);
    }
    void number(double x) {
        beforeValue();
        appendJsonNumber(out_, x);
    }
    void integer(long long i) {
        beforeValue();
        out_.append(std::to_string(i));
    }
    // A number's characters as typed; the reader checked that they are a
    // JSON number reading back to the value it holds.
    void typedNumber(std::string_view chars) {
        beforeValue();
        out_.append(chars);
    }
    void boolean(bool b) {
        beforeValue();
        out_.append(b ? "true" : "false");
    }
    void null() {
        beforeValue();
        out_.append("null");
    }
    // A whole value kept as parsed (unknown fields, a custom substance, a
    // results tree), laid out as dump(2) lays it out at this depth, its
    // numbers in nlohmann/json's digits (its Grisu2 is not always the
    // shortest form, and these bytes were written that way before).
    void value(const Json& v);

private:
    struct Level {
        bool array = false;
        std::size_t members = 0;
    };
    void open(char bracket, bool array);
    void close(char bracket);
    void beforeValue();
    void newLine(std::size_t depth);

    std::string& out_;
    int depth_ = 0;
    std::vector<Level> levels_;
    bool afterKey_ = false;
};

// The members of one object as they are written, so that unknown fields
// kept from the file go after the known ones and never repeat one of them.
class ObjectWriter {
public:
    explicit ObjectWriter(JsonWriter& w) : w_(w) { w_.beginObject(); }
    ObjectWriter(const ObjectWriter&) = delete;
    ObjectWriter& operator=(const ObjectWriter&) = delete;

    // Writes the key; the caller writes its value next.
    JsonWriter& key(std::string_view key) {
        written_.push_back(key);
        return w_.key(key);
    }
    // Every member of `fields` (an object) whose key is not written yet and
    // is not `skip`, in the order they are kept.
    void unknown(const Json& fields, std::string_view skip = {});
    void unknown(const UnknownFields& fields, std::string_view skip = {}) { unknown(jsonOf(fields), skip); }
    void end() { w_.endObject(); }

private:
    JsonWriter& w_;
    std::vector<std::string_view> written_;  // keys live as long as the project written
};

}  // namespace heatchain::detail
