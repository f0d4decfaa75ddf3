#pragma once
// Reading JSON input so that every error names where it is: the JSON path
// (with the step id where there is one) and the line:column of the value.
// The project file's reader and the substance reader (substance_fields.hpp)
// read through JsonReader; a failure is thrown as ReadFailure inside the
// reading code and turned into an Error value at the public entry point
// (parseProject, parseSubstance, SubstanceLibrary), so nothing escapes core
// as an exception.
#include <cmath>
#include <cstdlib>
#include <initializer_list>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <unordered_map>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/tolerance.hpp"
#include "heatchain/units.hpp"
#include "json_locations.hpp"
#include "unknown_fields_json.hpp"

namespace heatchain::detail {

// Thrown by JsonReader::fail; caught where reading starts (parseProject,
// parseSubstance, SubstanceLibrary::fromJsonTexts).
struct ReadFailure {
    Error error;
    JsonPath path;  // where, as a path from the root (the error has it as a label)
};

inline std::string jsonTypeName(const Json& v) {
    switch (v.type()) {
        case Json::value_t::null: return "null";
        case Json::value_t::object: return "an object";
        case Json::value_t::array: return "an array";
        case Json::value_t::string: return "a string";
        case Json::value_t::boolean: return "true/false";
        case Json::value_t::number_integer:
        case Json::value_t::number_unsigned:
        case Json::value_t::number_float: return "a number";
        default: return "something else";
    }
}

inline const Json* member(const Json& object, std::string_view key) {
    if (!object.is_object()) return nullptr;
    const auto it = object.find(std::string(key));
    return it == object.end() ? nullptr : &*it;
}

inline bool isOneOf(std::string_view key, std::span<const std::string_view> set) {
    for (std::string_view k : set)
        if (k == key) return true;
    return false;
}

inline std::string listOf(std::span<const std::string_view> items) {
    std::string out;
    for (std::string_view s : items) {
        if (!out.empty()) out += ", ";
        out += s;
    }
    return out;
}

class JsonReader {
public:
    // How a path is labelled: a project names its steps by their ids; any
    // other document (a substance library file) by the path alone.
    enum class Labels { ProjectSteps, PathOnly };

    // `text` is the document `root` was parsed from; every path is a path
    // from that root (a project's custom substance is read at ["substance"],
    // a library file at the root). An empty text, for a value built in
    // memory rather than read from a file, gives errors without line:column.
    JsonReader(std::string_view text, std::string_view file, const Json& root,
               Labels labels = Labels::ProjectSteps)
        : text_(text), file_(file), root_(root), labels_(labels) {}

    UnitContext units;

    // `step "economiser" (steps[1]).to.T`, or `steps[1].to.T` while the id
    // is unknown, prefixed with the file name when there is one.
    std::string label(const JsonPath& path) const {
        std::string_view stepId;
        if (const auto index = stepIndexOf(path); index && labels_ == Labels::ProjectSteps) {
            const Json* steps = member(root_, "steps");
            const Json* id = steps && steps->is_array() && *index < steps->size() ? member((*steps)[*index], "id") : nullptr;
            if (id && id->is_string()) stepId = id->get_ref<const std::string&>();
        }
        std::string where = labelJsonPath(path, stepId);
        if (!file_.empty()) where = where.empty() ? std::string(file_) : std::string(file_) + ": " + where;
        return where;
    }

    Error errorAt(const JsonPath& path, std::string message) const {
        Error e = makeError(std::move(message), label(path));
        if (text_.empty()) return e;
        const auto pos = detail::positionOfOffset(text_, detail::locateJsonValue(text_, path));
        e.line = pos.line;
        e.column = pos.column;
        return e;
    }

    [[noreturn]] void fail(const JsonPath& path, std::string message) const {
        throw ReadFailure{errorAt(path, std::move(message)), path};
    }

    const Json& object(const Json& v, const JsonPath& path, std::string_view what) const {
        if (!v.is_object()) fail(path, std::string(what) + " must be an object {...}; found " + jsonTypeName(v));
        return v;
    }

    std::string string(const Json& v, const JsonPath& path) const {
        if (!v.is_string()) fail(path, "expected a string; found " + jsonTypeName(v));
        return v.get<std::string>();
    }

    std::optional<std::string> optionalString(const Json& obj, const JsonPath& path, std::string_view key) const {
        const Json* v = member(obj, key);
        if (!v) return std::nullopt;
        return string(*v, child(path, std::string(key)));
    }

    Quantity quantity(const Json& v, const JsonPath& path, Dimension d) const {
        if (!v.is_string()) {
            std::string found = jsonTypeName(v);
            if (v.is_number()) found += " without a unit (" + v.dump() + ")";
            fail(path, "expected " + std::string(dimensionName(d)) + " as a quantity string with a unit, e.g. \"" +
                           std::string(displayExample(d)) + "\"; found " + found);
        }
        const std::string& text = v.get_ref<const std::string&>();
        auto si = parseToleranced(text, d, units);  // the tolerance, if any, stays in the text
        if (!si) fail(path, si.error().message);
        return Quantity{text, si->si};
    }

    std::optional<Quantity> optionalQuantity(const Json& obj, const JsonPath& path, std::string_view key,
                                             Dimension d) const {
        const Json* v = member(obj, key);
        if (!v) return std::nullopt;
        return quantity(*v, child(path, std::string(key)), d);
    }

    // A dimensionless number: a JSON number, or a string such as "65 %".
    Number number(const Json& v, const JsonPath& path) const {
        if (v.is_number()) {
            const double x = v.get<double>();
            if (!std::isfinite(x)) fail(path, "the number is not finite");
            return Number{x, typedNumber(path, x), false};
        }
        if (v.is_string()) {
            auto x = parseToleranced(v.get_ref<const std::string&>(), Dimension::Dimensionless, units);
            if (!x) fail(path, x.error().message);
            return Number{x->si, v.get<std::string>(), true};
        }
        fail(path, "expected a number; found " + jsonTypeName(v));
    }

    // The characters of a JSON number as typed, so "0.60" is written back as
    // "0.60" and not as "0.6"; empty if the text cannot be found or disagrees.
    // The offsets of all numbers are found in one walk over the file, the
    // first time one is asked for (a walk per number made loading quadratic).
    std::string typedNumber(const JsonPath& path, double value) const {
        if (!numberAt_) numberAt_ = detail::numberOffsets(text_);
        const auto hit = numberAt_->find(detail::formatJsonPath(path));
        if (hit == numberAt_->end()) return {};
        const std::size_t at = hit->second;
        std::size_t end = at;
        while (end < text_.size() && std::string_view("+-0123456789.eE").find(text_[end]) != std::string_view::npos)
            ++end;
        if (end == at || end - at > 64) return {};
        std::string token(text_.substr(at, end - at));
        char* stop = nullptr;
        const double parsed = std::strtod(token.c_str(), &stop);
        if (stop != token.c_str() + token.size() || parsed != value) return {};
        return token;
    }

    // Fields not in `known`, in their original order.
    static UnknownFields unknownFields(const Json& obj, std::initializer_list<std::string_view> known) {
        return unknownFields(obj, std::span<const std::string_view>(known.begin(), known.size()));
    }
    static UnknownFields unknownFields(const Json& obj, std::span<const std::string_view> known) {
        Json extra = Json::object();
        for (auto it = obj.begin(); it != obj.end(); ++it)
            if (!isOneOf(it.key(), known)) extra[it.key()] = it.value();
        return unknownFieldsOf(std::move(extra));
    }

    static std::string_view displayExample(Dimension d) {
        switch (d) {
            case Dimension::Temperature: return "25 degC";
            case Dimension::Pressure: return "5 bar";
            case Dimension::Energy: return "100 kJ";
            case Dimension::Power: return "50 kW";
            case Dimension::Mass: return "1 kg";
            case Dimension::Amount: return "1 kmol";
            case Dimension::MassFlow: return "4.2 t/h";
            case Dimension::MolarFlow: return "10 kmol/h";
            default: return "1 unit";
        }
    }

private:
    std::string_view text_;
    std::string_view file_;
    const Json& root_;
    Labels labels_;
    mutable std::optional<std::unordered_map<std::string, std::size_t>> numberAt_;
};

}  // namespace heatchain::detail
