// Reading and writing *.hchain project files, format version 1
// (shared design: project-format.md).
//
// Reading is strict: every error names the JSON path (and the step id where
// there is one) and the line:column of the offending value. Known fields that
// do not belong where they are written (a "path" on a heat step) are errors;
// fields this version does not know are kept and written back, so a file
// from a newer minor revision or with a reviewer's additions survives a save.
//
// Writing is stable: fixed key order, 2-space indent, quantities exactly as
// typed. Top-level order: format, version, meta, display, system, model,
// substance, basis, atmosphere, surroundings, start, minApproach, utilities,
// then unknown top-level fields in their original order, then steps (last, because it is the long
// part a reviewer scrolls through). Inside a step: id, kind, to, at,
// fraction, path, n, efficiency, source, sink, note, then unknown fields.
// Dimensionless numbers are written as nlohmann/json prints the parsed
// double (shortest form that reads back to the same value: "2.50" becomes
// "2.5" on the first save, and stays so).
#include "heatchain/project_file.hpp"

#include <cerrno>
#include <cmath>
#include <cstring>
#include <fstream>
#include <initializer_list>
#include <optional>
#include <unordered_map>
#include <set>
#include <span>
#include <sstream>
#include <string>
#include <utility>

#include "heatchain/rules.hpp"
#include "json_locations.hpp"
#include "heatchain/tolerance.hpp"

namespace heatchain {

namespace {

using detail::JsonPath;
using detail::child;

// Deeper nesting than this is refused before any parser sees it; a project
// file needs about 8 levels (a custom substance's cp table is the deepest).
constexpr int kMaxDepth = 64;
// A project is a few kilobytes; a 1,000-step worksheet about 300 kB.
constexpr std::uintmax_t kMaxFileBytes = std::uintmax_t{64} * 1024 * 1024;

constexpr std::string_view kFormatName = "heatchain-project";

// Thrown inside this file only; parseProject turns it into an Error value.
struct Failure {
    Error error;
};

std::string inQuotes(std::string_view s) { return "\"" + std::string(s) + "\""; }

std::string jsonTypeName(const Json& v) {
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

const Json* member(const Json& object, std::string_view key) {
    if (!object.is_object()) return nullptr;
    const auto it = object.find(std::string(key));
    return it == object.end() ? nullptr : &*it;
}

bool isOneOf(std::string_view key, std::span<const std::string_view> set) {
    for (std::string_view k : set)
        if (k == key) return true;
    return false;
}

std::string listOf(std::span<const std::string_view> items) {
    std::string out;
    for (std::string_view s : items) {
        if (!out.empty()) out += ", ";
        out += s;
    }
    return out;
}

class Reader {
public:
    Reader(std::string_view text, std::string_view file, const Json& root)
        : text_(text), file_(file), root_(root) {}

    UnitContext units;

    // `step "economiser" (steps[1]).to.T`, or `steps[1].to.T` while the id
    // is unknown, prefixed with the file name when there is one.
    std::string label(const JsonPath& path) const {
        std::string where;
        if (path.size() >= 2 && path[0].index < 0 && path[0].key == "steps" && path[1].index >= 0) {
            const Json* steps = member(root_, "steps");
            const Json* id = nullptr;
            if (steps && steps->is_array() && static_cast<std::size_t>(path[1].index) < steps->size())
                id = member((*steps)[static_cast<std::size_t>(path[1].index)], "id");
            if (id && id->is_string() && !id->get_ref<const std::string&>().empty()) {
                where = "step " + inQuotes(id->get_ref<const std::string&>()) + " (steps[" +
                        std::to_string(path[1].index) + "])";
                const JsonPath rest(path.begin() + 2, path.end());
                if (!rest.empty()) {
                    const std::string tail = detail::formatJsonPath(rest);
                    where += (tail.front() == '[' ? "" : ".") + tail;
                }
            }
        }
        if (where.empty()) where = detail::formatJsonPath(path);
        if (!file_.empty()) where = where.empty() ? std::string(file_) : std::string(file_) + ": " + where;
        return where;
    }

    Error errorAt(const JsonPath& path, std::string message) const {
        Error e = makeError(std::move(message), label(path));
        const auto pos = detail::positionOfOffset(text_, detail::locateJsonValue(text_, path));
        e.line = pos.line;
        e.column = pos.column;
        return e;
    }

    [[noreturn]] void fail(const JsonPath& path, std::string message) const {
        throw Failure{errorAt(path, std::move(message))};
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
            return Number{v, x, typedNumber(path, x)};
        }
        if (v.is_string()) {
            auto x = parseToleranced(v.get_ref<const std::string&>(), Dimension::Dimensionless, units);
            if (!x) fail(path, x.error().message);
            return Number{v, x->si, {}};
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

    // A number within the range core gives its field (rules.hpp), the same
    // rule the step panel and quick add apply.
    Number bounded(const Json& v, const JsonPath& path, BoundedField field) const {
        Number n = number(v, path);
        if (auto problem = checkBounded(field, n.value)) fail(path, *problem);
        return n;
    }

    // Fields not in `known`, in their original order.
    static Json unknownFields(const Json& obj, std::initializer_list<std::string_view> known) {
        return unknownFields(obj, std::span<const std::string_view>(known.begin(), known.size()));
    }
    static Json unknownFields(const Json& obj, std::span<const std::string_view> known) {
        Json extra = Json::object();
        for (auto it = obj.begin(); it != obj.end(); ++it)
            if (!isOneOf(it.key(), known)) extra[it.key()] = it.value();
        return extra;
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
    mutable std::optional<std::unordered_map<std::string, std::size_t>> numberAt_;
};

// ---- Sections --------------------------------------------------------------

void readMeta(const Reader& r, const Json& v, Meta& meta) {
    const JsonPath path{{"meta", -1}};
    r.object(v, path, "meta");
    auto field = [&](std::string_view key, std::string& out) {
        if (auto s = r.optionalString(v, path, key)) out = *s;
    };
    field("title", meta.title);
    field("author", meta.author);
    field("revision", meta.revision);
    field("created", meta.created);
    field("modified", meta.modified);
    field("notes", meta.notes);
    meta.extra = Reader::unknownFields(v, {"title", "author", "revision", "created", "modified", "notes"});
}

void readSubstance(const Reader& r, const Json& v, std::string_view text, std::string_view file, Project& p) {
    const JsonPath path{{"substance", -1}};
    if (v.is_string()) {
        const std::string& id = v.get_ref<const std::string&>();
        const SubstanceLibrary& library = SubstanceLibrary::builtin();
        if (const Substance* s = library.find(id)) {
            p.substanceId = id;
            p.substance = *s;
            return;
        }
        std::string ids;
        for (const Substance& s : library.all()) ids += (ids.empty() ? "" : ", ") + s.id;
        r.fail(path, "unknown substance " + inQuotes(id) + "; the built-in library has " +
                         (ids.empty() ? std::string("no substances") : ids) +
                         " (or define one with an object, see the project format)");
    }
    if (!v.is_object())
        r.fail(path, "expected a substance id such as \"water\" or a substance definition object; found " +
                         jsonTypeName(v));
    auto s = parseSubstance(v, "substance", r.units);
    if (!s) {
        // Locate the field parseSubstance names ("substance.melting.T").
        Error e = s.error();
        const std::string inner = e.where.empty() ? std::string("substance") : e.where;
        const JsonPath innerPath = detail::parseDottedPath(inner);
        const auto pos = detail::positionOfOffset(text, detail::locateJsonValue(text, innerPath));
        e.where = file.empty() ? inner : std::string(file) + ": " + inner;
        e.line = pos.line;
        e.column = pos.column;
        throw Failure{e};
    }
    p.substance = std::move(*s);
    p.substance.custom = true;
    p.substanceId = p.substance.id;
    p.customSubstanceJson = v;
}

void readBasis(const Reader& r, const Json& v, Project& p) {
    const JsonPath path{{"basis", -1}};
    r.object(v, path, "basis");
    struct Option {
        std::string_view key;
        Basis::Kind kind;
        Dimension dimension;
        SystemKind system;
    };
    static constexpr Option options[] = {
        {"mass", Basis::Kind::Mass, Dimension::Mass, SystemKind::Closed},
        {"amount", Basis::Kind::Amount, Dimension::Amount, SystemKind::Closed},
        {"massFlow", Basis::Kind::MassFlow, Dimension::MassFlow, SystemKind::SteadyFlow},
        {"molarFlow", Basis::Kind::MolarFlow, Dimension::MolarFlow, SystemKind::SteadyFlow},
    };
    const Option* chosen = nullptr;
    for (const Option& o : options) {
        if (!member(v, o.key)) continue;
        if (chosen)
            r.fail(child(path, std::string(o.key)),
                   "basis has both " + std::string(chosen->key) + " and " + std::string(o.key) + "; give one");
        chosen = &o;
    }
    const std::string_view expected = p.system == SystemKind::Closed ? "mass or amount" : "massFlow or molarFlow";
    if (!chosen)
        r.fail(path, "basis needs " + std::string(expected) + " for a " + std::string(systemId(p.system)) +
                         " system, e.g. { \"" +
                         (p.system == SystemKind::Closed ? std::string("mass\": \"1 kg")
                                                         : std::string("massFlow\": \"4.2 t/h")) +
                         "\" }");
    const JsonPath at = child(path, std::string(chosen->key));
    if (chosen->system != p.system)
        r.fail(at, "a " + std::string(systemId(p.system)) + " system takes a basis of " + std::string(expected) +
                       ", not " + std::string(chosen->key));
    p.basis.kind = chosen->kind;
    p.basis.amount = r.quantity(*member(v, chosen->key), at, chosen->dimension);
    if (!(p.basis.amount.si > 0.0)) r.fail(at, "the basis must be greater than zero");
    p.basis.extra = Reader::unknownFields(v, {"mass", "amount", "massFlow", "molarFlow"});
}

void readStart(const Reader& r, const Json& v, StartSpec& start) {
    const JsonPath path{{"start", -1}};
    r.object(v, path, "start");
    start.T = r.optionalQuantity(v, path, "T", Dimension::Temperature);
    start.P = r.optionalQuantity(v, path, "P", Dimension::Pressure);
    if (const Json* q = member(v, "quality"))
        start.quality = r.bounded(*q, child(path, "quality"), BoundedField::Quality);
    if (const Json* m = member(v, "meltFraction"))
        start.meltFraction = r.bounded(*m, child(path, "meltFraction"), BoundedField::MeltFraction);
    start.extra = Reader::unknownFields(v, {"T", "P", "quality", "meltFraction"});

    const int given = (start.T ? 1 : 0) + (start.P ? 1 : 0);
    const int onLine = (start.quality ? 1 : 0) + (start.meltFraction ? 1 : 0);
    const std::string rule =
        "the start is T and P, or (on a phase line) T and/or P with quality or meltFraction";
    if (onLine > 1) r.fail(child(path, "meltFraction"), "give quality or meltFraction, not both; " + rule);
    // T and P with a quality or meltFraction is accepted: on a simple model's
    // melting line T does not move with P, so both are a natural way to write
    // it; whether they agree is the solver's check.
    if (given == 0) r.fail(path, "start needs T and P; " + rule);
    if (given == 1 && onLine == 0) r.fail(path, std::string("start needs ") + (start.T ? "P" : "T") + "; " + rule);
}

std::optional<Reservoir> readReservoir(const Reader& r, const Json& step, const JsonPath& stepPath,
                                       std::string_view key) {
    const Json* v = member(step, key);
    if (!v) return std::nullopt;
    const JsonPath path = child(stepPath, std::string(key));
    r.object(*v, path, key);
    Reservoir res;
    res.T = r.optionalQuantity(*v, path, "T", Dimension::Temperature);
    res.utility = r.optionalString(*v, path, "utility");
    if (res.utility && res.utility->empty()) r.fail(child(path, "utility"), "the utility name is empty");
    if (!res.T && !res.utility)
        r.fail(path, std::string(key) + " needs a temperature T, e.g. { \"T\": \"240 degC\" }");
    res.extra = Reader::unknownFields(*v, {"T", "utility"});
    return res;
}

constexpr std::string_view kStepFields[] = {"id",         "kind",   "to",   "at",  "fraction", "path",
                                            "n",          "efficiency", "source", "sink", "note",
                                            "transfer", "duration", "heatLoss"};
constexpr std::string_view kTargetFields[] = {"T", "P", "duty", "quality", "ratio", "rated", "time"};

// What each kind of step takes, for the "does not belong" errors.
std::string_view ownersOf(std::string_view field) {
    if (field == "to") return "heat, cool (T, duty or quality), compress, expand (P or ratio) and throttle (P)";
    if (field == "at") return "heat and cool";
    if (field == "fraction") return "melt, freeze, boil, condense, sublimate and deposit";
    if (field == "path") return "compress and expand";
    if (field == "n") return "compress and expand on a polytropic path";
    if (field == "efficiency") return "compress and expand on an adiabatic path";
    if (field == "transfer") return "heat, cool, the phase-change kinds and hold";
    if (field == "duration") return "hold";
    return "";
}

// ---- Heat transfer, batch time and heat loss (optional fields) ----

constexpr std::string_view kZoneKeys[] = {"liquid", "vapour", "two-phase", "solid", "solid-liquid", "solid-vapour"};

// A quantity that must be above zero (an area, a coefficient, a time).
Quantity positiveQuantity(const Reader& r, const Json& v, const JsonPath& path, Dimension d) {
    Quantity q = r.quantity(v, path, d);
    if (!(q.si > 0)) r.fail(path, "the " + std::string(dimensionName(d)) + " must be greater than zero");
    return q;
}

HeatLossSpec readHeatLoss(const Reader& r, const Json& v, const JsonPath& path, const Project& p) {
    r.object(v, path, "heatLoss");
    if (p.system != SystemKind::Closed)
        r.fail(path, "\"heatLoss\" belongs to a closed system (a batch); this project is steady-flow");
    const Json* ua = member(v, "UA");
    if (!ua) r.fail(path, "heatLoss needs \"UA\", the conductance to the surroundings, e.g. { \"UA\": \"25 W/K\" }");
    HeatLossSpec h;
    h.UA = r.quantity(*ua, child(path, "UA"), Dimension::ThermalConductance);
    if (!(h.UA.si >= 0)) r.fail(child(path, "UA"), "the heat-loss UA cannot be negative");
    h.extra = Reader::unknownFields(v, {"UA"});
    return h;
}

// "rated" and "time" targets of a heat or cool step.
void readTransferTarget(const Reader& r, const Json& to, const JsonPath& toPath, const Project& p, Step& s) {
    if (const Json* rated = member(to, "rated")) {
        if (!rated->is_boolean() || !rated->get<bool>())
            r.fail(child(toPath, "rated"), "\"rated\" is true (the end state the given area reaches); found " +
                                               (rated->is_boolean() ? std::string("false") : jsonTypeName(*rated)));
        if (p.system == SystemKind::Closed)
            r.fail(child(toPath, "rated"), "a batch (closed system) has no rated end state; give a time, "
                                           "e.g. \"to\": { \"time\": \"45 min\" }");
        s.to.rated = true;
    }
    if (const Json* time = member(to, "time")) {
        if (p.system != SystemKind::Closed)
            r.fail(child(toPath, "time"), "a time target belongs to a closed system (a batch); this project is "
                                          "steady-flow");
        s.to.time = positiveQuantity(r, *time, child(toPath, "time"), Dimension::Time);
    }
}

void readTransferFields(const Reader& r, const Json& v, const JsonPath& path, const Project& p, Step& s) {
    if (const Json* t = member(v, "transfer")) {
        const JsonPath tp = child(path, "transfer");
        r.object(*t, tp, "transfer");
        HeatTransferSpec spec;
        if (const Json* u = member(*t, "U")) {
            const JsonPath up = child(tp, "U");
            if (u->is_object()) {
                for (auto it = u->begin(); it != u->end(); ++it) {
                    if (!isOneOf(it.key(), kZoneKeys)) {
                        spec.Uextra[it.key()] = it.value();
                        continue;
                    }
                    spec.zoneU.emplace_back(it.key(), positiveQuantity(r, it.value(), child(up, it.key()),
                                                                       Dimension::HeatTransferCoefficient));
                }
                if (spec.zoneU.empty())
                    r.fail(up, "U per zone needs at least one of " + listOf(kZoneKeys));
            } else {
                spec.U = positiveQuantity(r, *u, up, Dimension::HeatTransferCoefficient);
            }
        }
        if (const Json* a = member(*t, "area")) spec.area = positiveQuantity(r, *a, child(tp, "area"), Dimension::Area);
        if (const Json* ua = member(*t, "UA")) {
            spec.UA = positiveQuantity(r, *ua, child(tp, "UA"), Dimension::ThermalConductance);
            if (spec.U || !spec.zoneU.empty() || spec.area)
                r.fail(child(tp, "UA"), "give U and area, or UA instead of both; not UA with them");
        }
        if (!spec.UA && spec.U == std::nullopt && spec.zoneU.empty())
            r.fail(tp, "transfer needs an overall coefficient U (with area), or UA, e.g. "
                       "{ \"U\": \"450 W/(m2 K)\", \"area\": \"6.5 m2\" }");
        spec.extra = Reader::unknownFields(*t, {"U", "area", "UA"});
        s.transfer = std::move(spec);
    }
    const bool hasArea = s.transfer && (s.transfer->UA || s.transfer->area);
    if (s.to.rated && !hasArea)
        r.fail(child(path, "to"), "a rated end state needs the exchanger: \"transfer\" with U and area (or UA)");
    if (s.to.time && !hasArea)
        r.fail(child(path, "to"), "a time target needs the jacket or coil: \"transfer\" with U and area (or UA)");
    if ((s.to.rated || s.to.time) && !s.source && !s.sink)
        r.fail(child(path, "to"), "a rated or timed step needs its source or sink (a utility or a temperature)");
    if (const Json* d = member(v, "duration")) s.duration = positiveQuantity(r, *d, child(path, "duration"), Dimension::Time);
    if (s.kind == StepKind::Hold) {
        if (p.system != SystemKind::Closed)
            r.fail(child(path, "kind"), "a hold step belongs to a closed system (a batch); this project is steady-flow");
        if (!s.duration) r.fail(path, "a hold step needs its \"duration\", e.g. \"2 h\"");
    }
    if (const Json* h = member(v, "heatLoss")) s.heatLoss = readHeatLoss(r, *h, child(path, "heatLoss"), p);
}

Step readStep(const Reader& r, const Json& v, long index, const Project& p, std::set<std::string>& ids,
              std::vector<std::pair<std::string, long>>& firstSeen) {
    const JsonPath path{{"steps", -1}, {"", index}};
    r.object(v, path, "a step");
    Step s;

    const Json* id = member(v, "id");
    if (!id) r.fail(path, "the step has no id; every step needs a unique \"id\", e.g. \"economiser\"");
    s.id = r.string(*id, child(path, "id"));
    if (s.id.empty()) r.fail(child(path, "id"), "the step id is empty");
    if (!ids.insert(s.id).second) {
        long first = 0;
        for (const auto& [seen, at] : firstSeen)
            if (seen == s.id) first = at;
        r.fail(child(path, "id"), "the step id " + inQuotes(s.id) + " is used twice (also steps[" +
                                      std::to_string(first) + "]); step ids must be unique");
    }
    firstSeen.emplace_back(s.id, index);

    const Json* kind = member(v, "kind");
    if (!kind) r.fail(path, "the step has no kind (heat, cool, melt, freeze, boil, condense, sublimate, deposit, "
                            "compress, expand, throttle, hold)");
    auto k = parseStepKind(r.string(*kind, child(path, "kind")));
    if (!k) r.fail(child(path, "kind"), k.error().message);
    s.kind = *k;
    const std::string kindName(stepKindId(s.kind));

    const bool heatCool = s.kind == StepKind::Heat || s.kind == StepKind::Cool;
    const bool phase = isPhaseChangeKind(s.kind);
    const bool machine = s.kind == StepKind::Compress || s.kind == StepKind::Expand;
    const bool throttle = s.kind == StepKind::Throttle;
    const bool hold = s.kind == StepKind::Hold;

    // Known fields in the wrong kind of step are errors, not extras.
    auto belongs = [&](std::string_view field) {
        if (field == "to") return heatCool || machine || throttle;
        if (field == "at") return heatCool;
        if (field == "fraction") return phase;
        if (field == "path" || field == "n" || field == "efficiency") return machine;
        if (field == "transfer") return heatCool || phase || hold;
        if (field == "duration") return hold;
        return true;
    };
    for (auto it = v.begin(); it != v.end(); ++it) {
        if (isOneOf(it.key(), kStepFields) && !belongs(it.key()))
            r.fail(child(path, it.key()), inQuotes(it.key()) + " does not belong to a " + kindName +
                                              " step; it is for " + std::string(ownersOf(it.key())));
    }

    // Target.
    if (const Json* to = member(v, "to")) {
        const JsonPath toPath = child(path, "to");
        r.object(*to, toPath, "to");
        static constexpr std::string_view heatCoolTargets[] = {"T", "duty", "quality", "rated", "time"};
        static constexpr std::string_view machineTargets[] = {"P", "ratio"};
        static constexpr std::string_view throttleTargets[] = {"P"};
        const std::span<const std::string_view> allowed =
            heatCool  ? std::span<const std::string_view>(heatCoolTargets)
            : machine ? std::span<const std::string_view>(machineTargets)
                      : std::span<const std::string_view>(throttleTargets);
        int count = 0;
        for (auto it = to->begin(); it != to->end(); ++it) {
            if (!isOneOf(it.key(), kTargetFields)) continue;
            if (!isOneOf(it.key(), allowed))
                r.fail(child(toPath, it.key()), "a " + kindName + " step cannot aim at " + it.key() +
                                                    "; its target is one of " + listOf(allowed));
            if (++count > 1)
                r.fail(child(toPath, it.key()), "give one target for a " + kindName + " step, not several (one of " +
                                                    listOf(allowed) + ")");
        }
        if (count == 0) r.fail(toPath, "\"to\" needs one of " + listOf(allowed));
        s.to.T = r.optionalQuantity(*to, toPath, "T", Dimension::Temperature);
        s.to.P = r.optionalQuantity(*to, toPath, "P", Dimension::Pressure);
        s.to.duty = r.optionalQuantity(*to, toPath, "duty",
                                       p.system == SystemKind::Closed ? Dimension::Energy : Dimension::Power);
        if (const Json* q = member(*to, "quality"))
            s.to.quality = r.bounded(*q, child(toPath, "quality"), BoundedField::Quality);
        if (const Json* ratio = member(*to, "ratio")) s.to.ratio = r.bounded(*ratio, child(toPath, "ratio"), BoundedField::Ratio);
        readTransferTarget(r, *to, toPath, p, s);
        s.to.extra = Reader::unknownFields(*to, kTargetFields);
        s.hasTo = true;
    } else if (heatCool) {
        r.fail(path, "a " + kindName + " step needs a target \"to\" with T, duty or quality, e.g. "
                     "\"to\": { \"T\": \"180 degC\" }");
    } else if (machine || throttle) {
        r.fail(path, "a " + kindName + " step needs a target pressure, e.g. \"to\": { \"P\": \"14 barg\" }");
    }

    if (const Json* at = member(v, "at")) {
        const std::string a = r.string(*at, child(path, "at"));
        if (a == "constant-pressure") {
            s.at = HeatingAt::ConstantPressure;
        } else if (a == "constant-volume") {
            if (p.system != SystemKind::Closed)
                r.fail(child(path, "at"), "constant-volume heating needs a closed system (a batch); this project is "
                                          "steady-flow");
            s.at = HeatingAt::ConstantVolume;
        } else {
            r.fail(child(path, "at"), "unknown " + inQuotes(a) + "; \"at\" is constant-pressure or constant-volume");
        }
    }

    if (const Json* f = member(v, "fraction"))
        s.fraction = r.bounded(*f, child(path, "fraction"), BoundedField::Fraction);

    if (machine) {
        // Without "path": adiabatic when an efficiency is given, else
        // isentropic (the solver reads a missing path the same way).
        const Json* n = member(v, "n");
        const Json* eff = member(v, "efficiency");
        std::string pathName = eff ? "adiabatic" : "isentropic";
        if (const Json* pathKind = member(v, "path")) {
            pathName = r.string(*pathKind, child(path, "path"));
            bool found = false;
            for (PathKind pk : {PathKind::Isothermal, PathKind::Isentropic, PathKind::Polytropic, PathKind::Adiabatic})
                if (pathId(pk) == pathName) {
                    s.path = pk;
                    found = true;
                }
            if (!found)
                r.fail(child(path, "path"), "unknown path " + inQuotes(pathName) +
                                                "; valid paths are isothermal, isentropic, polytropic, adiabatic");
        }
        const PathKind effective = s.path ? *s.path : (eff ? PathKind::Adiabatic : PathKind::Isentropic);
        if (effective == PathKind::Polytropic) {
            if (!n) r.fail(path, "a polytropic path needs the exponent \"n\", e.g. 1.3");
            s.n = r.bounded(*n, child(path, "n"), BoundedField::PolytropicExponent);
        } else if (n) {
            r.fail(child(path, "n"), "\"n\" belongs to a polytropic path; this path is " + pathName);
        }
        if (eff) {
            if (effective != PathKind::Adiabatic)
                r.fail(child(path, "efficiency"),
                       "\"efficiency\" belongs to an adiabatic path; this path is " + pathName);
            s.efficiency = r.bounded(*eff, child(path, "efficiency"), BoundedField::Efficiency);
        }
    }

    s.source = readReservoir(r, v, path, "source");
    s.sink = readReservoir(r, v, path, "sink");
    s.note = r.optionalString(v, path, "note");
    readTransferFields(r, v, path, p, s);
    s.extra = Reader::unknownFields(v, kStepFields);
    return s;
}

// ---- Utilities (optional top-level "utilities" and "minApproach") ----

constexpr std::string_view kUtilityFields[] = {"id", "kind", "name", "P", "in", "out", "cp", "density", "T", "flow"};

std::string_view utilityOwnersOf(std::string_view field) {
    if (field == "P") return "steam";
    if (field == "T") return "fixed";
    return "sensible";  // in, out, cp, density, flow
}

Utility readUtility(const Reader& r, const Json& v, long index, std::set<std::string>& ids) {
    const JsonPath path{{"utilities", -1}, {"", index}};
    r.object(v, path, "a utility");
    Utility u;
    const Json* id = member(v, "id");
    if (!id) r.fail(path, "the utility has no id; every utility needs a unique \"id\", e.g. \"lp-steam\"");
    u.id = r.string(*id, child(path, "id"));
    if (u.id.empty()) r.fail(child(path, "id"), "the utility id is empty");
    if (!ids.insert(u.id).second)
        r.fail(child(path, "id"), "the utility id " + inQuotes(u.id) + " is used twice; utility ids must be unique");
    const Json* kind = member(v, "kind");
    if (!kind) r.fail(path, "utility " + inQuotes(u.id) + " has no kind (steam, sensible or fixed)");
    const std::string k = r.string(*kind, child(path, "kind"));
    if (k == "steam") u.kind = UtilityKind::Steam;
    else if (k == "sensible") u.kind = UtilityKind::Sensible;
    else if (k == "fixed") u.kind = UtilityKind::Fixed;
    else r.fail(child(path, "kind"), "unknown utility kind " + inQuotes(k) + "; valid kinds are steam, sensible, fixed");
    for (auto it = v.begin(); it != v.end(); ++it) {
        const std::string& key = it.key();
        if (!isOneOf(key, kUtilityFields) || key == "id" || key == "kind" || key == "name") continue;
        if (utilityOwnersOf(key) != k)
            r.fail(child(path, key), inQuotes(key) + " does not belong to a " + k + " utility; it is for a " +
                                         std::string(utilityOwnersOf(key)) + " utility");
    }
    u.name = r.optionalString(v, path, "name");
    u.P = r.optionalQuantity(v, path, "P", Dimension::Pressure);
    u.Tin = r.optionalQuantity(v, path, "in", Dimension::Temperature);
    u.Tout = r.optionalQuantity(v, path, "out", Dimension::Temperature);
    u.cp = r.optionalQuantity(v, path, "cp", Dimension::SpecificEntropy);
    u.density = r.optionalQuantity(v, path, "density", Dimension::Density);
    u.T = r.optionalQuantity(v, path, "T", Dimension::Temperature);
    u.flow = r.optionalQuantity(v, path, "flow", Dimension::MassFlow);
    if (u.flow) {
        if (!(u.flow->si > 0)) r.fail(child(path, "flow"), "the flow must be greater than zero");
        if (u.Tout) r.fail(child(path, "flow"), "give \"out\" or \"flow\", not both: with a flow the outlet follows from the exchange");
    }
    switch (u.kind) {
        case UtilityKind::Steam:
            if (!u.P) r.fail(path, "a steam utility needs its pressure, e.g. \"P\": \"3 barg\"");
            if (!(u.P->si > 0)) r.fail(child(path, "P"), "the steam pressure must be above zero absolute");
            break;
        case UtilityKind::Sensible:
            if (!u.Tin || !(u.Tout || u.flow) || !u.cp)
                r.fail(path, "a sensible utility needs \"in\" and \"out\" temperatures (or \"in\" and a \"flow\") "
                             "and \"cp\", e.g. "
                             "{ \"in\": \"28 degC\", \"out\": \"36 degC\", \"cp\": \"4.18 kJ/(kg K)\" }");
            if (!(u.Tin->si > 0) || (u.Tout && !(u.Tout->si > 0)))
                r.fail(child(path, u.Tin->si > 0 ? "out" : "in"), "the temperature must be above absolute zero");
            if (u.Tout && u.Tin->si == u.Tout->si)
                r.fail(child(path, "out"), "\"in\" and \"out\" are equal; a sensible utility changes temperature "
                                           "(for one temperature use kind \"fixed\")");
            if (!(u.cp->si > 0)) r.fail(child(path, "cp"), "cp must be greater than zero");
            if (u.density && !(u.density->si > 0)) r.fail(child(path, "density"), "density must be greater than zero");
            break;
        case UtilityKind::Fixed:
            if (!u.T) r.fail(path, "a fixed utility needs its temperature, e.g. \"T\": \"900 degC\"");
            if (!(u.T->si > 0)) r.fail(child(path, "T"), "the temperature must be above absolute zero");
            break;
    }
    u.extra = Reader::unknownFields(v, kUtilityFields);
    return u;
}

void readUtilities(const Reader& r, const Json& root, Project& p) {
    if (const Json* m = member(root, "minApproach")) {
        const JsonPath path{{"minApproach", -1}};
        p.minApproach = r.quantity(*m, path, Dimension::TemperatureDifference);
        if (!(p.minApproach->si >= 0)) r.fail(path, "the minimum approach temperature cannot be negative");
    }
    const Json* list = member(root, "utilities");
    if (!list) return;
    const JsonPath path{{"utilities", -1}};
    if (!list->is_array()) r.fail(path, "\"utilities\" must be a list [...]; found " + jsonTypeName(*list));
    std::set<std::string> ids;
    long index = 0;
    for (const Json& u : *list) p.utilities.push_back(readUtility(r, u, index++, ids));
    p.hasUtilities = true;
}

// A step's source or sink naming a utility must name one of the list.
void checkUtilityReferences(const Reader& r, const Project& p) {
    for (std::size_t i = 0; i < p.steps.size(); ++i) {
        const Step& s = p.steps[i];
        for (const auto& [res, key] : {std::pair{&s.source, "source"}, std::pair{&s.sink, "sink"}}) {
            if (!*res || !(*res)->utility) continue;
            if ((*res)->T)
                r.fail({{"steps", -1}, {"", static_cast<long>(i)}, {key, -1}, {"T", -1}},
                       std::string("the ") + key + " names a utility and a temperature; give one");
            if (p.findUtility(*(*res)->utility)) continue;
            std::string known;
            for (const Utility& u : p.utilities) known += (known.empty() ? "" : ", ") + u.id;
            r.fail({{"steps", -1}, {"", static_cast<long>(i)}, {key, -1}, {"utility", -1}},
                   "unknown utility " + inQuotes(*(*res)->utility) + "; " +
                       (known.empty() ? std::string("the project defines no \"utilities\"")
                                      : "the project's utilities are " + known));
        }
    }
}

// ---- Parse errors from nlohmann/json ----------------------------------------

Error positioned(std::string message, std::string_view file, std::string_view text, std::size_t offset) {
    Error e = makeError(std::move(message), std::string(file));
    const auto pos = detail::positionOfOffset(text, offset);
    e.line = pos.line;
    e.column = pos.column;
    return e;
}

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

Result<Project> parseChecked(std::string_view text, std::string_view file) {
    // Empty or blank file.
    std::size_t first = text.substr(0, 3) == "\xEF\xBB\xBF" ? 3 : 0;
    while (first < text.size() && (text[first] == ' ' || text[first] == '\t' || text[first] == '\n' ||
                                   text[first] == '\r'))
        ++first;
    if (first >= text.size())
        return positioned("the file is empty; a Heatchain project is a JSON object starting with {", file, text, 0);

    const detail::PrescanResult pre = detail::prescanJson(text, kMaxDepth);
    if (pre.tooDeep)
        return positioned("JSON nested deeper than " + std::to_string(kMaxDepth) +
                              " levels; a Heatchain project never needs that (is this the right file?)",
                          file, text, pre.tooDeep->offset);

    Json root;
    try {
        root = Json::parse(text.begin(), text.end());
    } catch (const Json::parse_error& e) {
        const std::size_t offset = e.byte > 0 ? e.byte - 1 : 0;
        return positioned("not valid JSON: " + parserReason(e.what()), file, text, offset);
    } catch (const Json::out_of_range&) {
        if (pre.numberOutOfRange)
            return positioned(pre.numberOutOfRange->message, file, text, pre.numberOutOfRange->offset);
        return positioned("a number is beyond the range of a double", file, text, 0);
    }
    if (pre.duplicateKey)
        return positioned(pre.duplicateKey->message + " (at " + detail::formatJsonPath(pre.duplicateKey->path) +
                              "); each key may appear once",
                          file, text, pre.duplicateKey->offset);

    Reader r(text, file, root);
    const JsonPath top;
    if (!root.is_object())
        r.fail(top, "a Heatchain project is a JSON object {...}; this file holds " + jsonTypeName(root));

    // Format and version first: a newer file may differ in everything else.
    const Json* format = member(root, "format");
    if (!format)
        r.fail(top, "this is not a Heatchain project: \"format\": \"heatchain-project\" is missing");
    if (!format->is_string() || format->get_ref<const std::string&>() != kFormatName)
        r.fail({{"format", -1}}, "this is not a Heatchain project: \"format\" is " + format->dump() +
                                     ", expected \"heatchain-project\"");
    const Json* version = member(root, "version");
    if (!version) r.fail(top, "\"version\" is missing; this Heatchain reads version 1");
    if (!version->is_number_integer())
        r.fail({{"version", -1}}, "\"version\" must be a whole number such as 1; found " + version->dump());
    const long long v = version->is_number_unsigned() ? static_cast<long long>(std::min<std::uint64_t>(
                                                            version->get<std::uint64_t>(), 1ull << 62))
                                                      : version->get<long long>();
    if (v == 2)  // streams.hpp reads it; this reader holds one stream
        r.fail({{"version", -1}}, "this worksheet holds several streams (format version 2), which this part of "
                                  "Heatchain does not open yet; heatchain-cli compute, targets and chart read it");
    if (v > kProjectFormatVersion)
        r.fail({{"version", -1}}, "file is format version " + std::to_string(v) + "; this Heatchain reads version " +
                                      std::to_string(kProjectFormatVersion) + " (a newer Heatchain wrote it)");
    if (v < 1) r.fail({{"version", -1}}, "format version " + std::to_string(v) + " does not exist; expected 1");

    Project p;
    p.version = static_cast<int>(v);

    if (const Json* meta = member(root, "meta")) readMeta(r, *meta, p.meta);

    if (const Json* display = member(root, "display")) {
        const JsonPath path{{"display", -1}};
        r.object(*display, path, "display");
        if (const Json* u = member(*display, "units")) {
            auto system = parseUnitSystem(r.string(*u, child(path, "units")));
            if (!system) r.fail(child(path, "units"), system.error().message);
            p.displayUnits = *system;
        }
        p.displayExtra = Reader::unknownFields(*display, {"units"});
    }

    const Json* system = member(root, "system");
    if (!system) r.fail(top, "\"system\" is missing: \"closed\" (a batch) or \"steady-flow\"");
    const std::string systemText = r.string(*system, {{"system", -1}});
    if (systemText == "closed")
        p.system = SystemKind::Closed;
    else if (systemText == "steady-flow")
        p.system = SystemKind::SteadyFlow;
    else
        r.fail({{"system", -1}}, "unknown system " + inQuotes(systemText) + "; valid ones are closed, steady-flow");

    if (const Json* model = member(root, "model")) {
        auto m = parseModelKind(r.string(*model, {{"model", -1}}));
        if (!m) r.fail({{"model", -1}}, m.error().message);
        p.model = *m;
    }

    // The atmosphere comes before every other quantity: gauge pressures need it.
    if (const Json* atm = member(root, "atmosphere")) {
        const JsonPath path{{"atmosphere", -1}};
        p.atmosphere = r.quantity(*atm, path, Dimension::Pressure);
        // A gauge unit here would be circular: it reads differently under two atmospheres.
        auto other = parseQuantity(p.atmosphere.text, Dimension::Pressure, UnitContext{2.0 * p.atmosphere.si});
        if (!other || *other != p.atmosphere.si)
            r.fail(path, "the atmosphere must be an absolute pressure (e.g. \"101.325 kPa\"), not a gauge reading");
        p.hasAtmosphere = true;
    }
    r.units = p.unitContext();

    const Json* substance = member(root, "substance");
    if (!substance) r.fail(top, "\"substance\" is missing: a library id such as \"water\" or a definition object");
    readSubstance(r, *substance, text, file, p);

    const Json* basis = member(root, "basis");
    if (!basis)
        r.fail(top, std::string("\"basis\" is missing: ") +
                        (p.system == SystemKind::Closed ? "{ \"mass\": \"1 kg\" } or amount"
                                                        : "{ \"massFlow\": \"4.2 t/h\" } or molarFlow"));
    readBasis(r, *basis, p);

    if (const Json* surroundings = member(root, "surroundings")) {
        const JsonPath path{{"surroundings", -1}};
        r.object(*surroundings, path, "surroundings");
        if (auto T = r.optionalQuantity(*surroundings, path, "T", Dimension::Temperature)) p.surroundingsT = *T;
        if (auto P = r.optionalQuantity(*surroundings, path, "P", Dimension::Pressure)) p.surroundingsP = *P;
        p.surroundingsExtra = Reader::unknownFields(*surroundings, {"T", "P"});
        p.hasSurroundings = true;
    }

    const Json* start = member(root, "start");
    if (!start) r.fail(top, "\"start\" is missing: the state the material starts in, e.g. { \"T\": \"48 degC\", "
                            "\"P\": \"1.4 bar\" }");
    readStart(r, *start, p.start);

    readUtilities(r, root, p);
    if (const Json* h = member(root, "heatLoss")) p.heatLoss = readHeatLoss(r, *h, {{"heatLoss", -1}}, p);

    const Json* steps = member(root, "steps");
    if (!steps) r.fail(top, "\"steps\" is missing (an empty list [] is fine)");
    if (!steps->is_array()) r.fail({{"steps", -1}}, "\"steps\" must be a list [...]; found " + jsonTypeName(*steps));
    std::set<std::string> ids;
    std::vector<std::pair<std::string, long>> firstSeen;
    p.steps.reserve(steps->size());
    long index = 0;
    for (const Json& s : *steps) p.steps.push_back(readStep(r, s, index++, p, ids, firstSeen));
    checkUtilityReferences(r, p);

    p.extra = Reader::unknownFields(root, {"format", "version", "meta", "display", "system", "model", "substance",
                                           "basis", "atmosphere", "surroundings", "start", "steps",
                                           "minApproach", "utilities", "heatLoss"});
    return p;
}

// ---- Writing ----------------------------------------------------------------

// The SI base unit of a dimension, for a quantity built in code without text.
std::string_view siSymbol(Dimension d) {
    for (const UnitInfo& u : knownUnits())
        if (u.dimension == d && u.factor == 1.0 && u.offset == 0.0 && !u.gauge) return u.symbol;
    return "";
}

Json quantityJson(const Quantity& q, Dimension d) {
    if (!q.text.empty()) return q.text;
    std::ostringstream s;
    s.precision(17);
    s << q.si << ' ' << siSymbol(d);
    return s.str();
}

void appendExtra(Json& j, const Json& extra) {
    if (!extra.is_object()) return;
    for (auto it = extra.begin(); it != extra.end(); ++it)
        if (!j.contains(it.key())) j[it.key()] = it.value();
}

// The writer mirrors the reader: one object per write, one member per part
// of the file. Numbers typed in a file are written through placeholders
// (when `typed` is given) that writeProject swaps for their original
// characters after the dump: nlohmann/json always reprints a double in its
// own shortest form.
class Writer {
public:
    explicit Writer(std::vector<std::string>* typed) : typed_(typed) {}

    std::string project(const Project& p) const;

private:
    std::vector<std::string>* typed_;  // null: numbers in nlohmann/json's form

    Json number(const Number& n) const {
        if (typed_ && !n.text.empty() && n.raw.is_number()) {
            typed_->push_back(n.text);
            return "\x01hcnum" + std::to_string(typed_->size() - 1) + "\x01";
        }
        if (n.raw.is_number() || n.raw.is_string()) return n.raw;
        return n.value;
    }

    static Json reservoir(const Reservoir& r) {
        Json j = Json::object();
        if (r.T) j["T"] = quantityJson(*r.T, Dimension::Temperature);
        if (r.utility) j["utility"] = *r.utility;
        appendExtra(j, r.extra);
        return j;
    }

    Json step(const Step& s, SystemKind system) const {
        Json j = Json::object();
        j["id"] = s.id;
        j["kind"] = std::string(stepKindId(s.kind));
        if (s.hasTo) {
            Json to = Json::object();
            if (s.to.T) to["T"] = quantityJson(*s.to.T, Dimension::Temperature);
            if (s.to.P) to["P"] = quantityJson(*s.to.P, Dimension::Pressure);
            if (s.to.duty)
                to["duty"] = quantityJson(*s.to.duty, system == SystemKind::Closed ? Dimension::Energy : Dimension::Power);
            if (s.to.quality) to["quality"] = number(*s.to.quality);
            if (s.to.ratio) to["ratio"] = number(*s.to.ratio);
            if (s.to.rated) to["rated"] = true;
            if (s.to.time) to["time"] = quantityJson(*s.to.time, Dimension::Time);
            appendExtra(to, s.to.extra);
            j["to"] = std::move(to);
        }
        if (s.at) j["at"] = *s.at == HeatingAt::ConstantVolume ? "constant-volume" : "constant-pressure";
        if (s.fraction) j["fraction"] = number(*s.fraction);
        if (s.path) j["path"] = std::string(pathId(*s.path));
        if (s.n) j["n"] = number(*s.n);
        if (s.efficiency) j["efficiency"] = number(*s.efficiency);
        if (s.source) j["source"] = reservoir(*s.source);
        if (s.sink) j["sink"] = reservoir(*s.sink);
        if (s.transfer) j["transfer"] = transfer(*s.transfer);
        if (s.duration) j["duration"] = quantityJson(*s.duration, Dimension::Time);
        if (s.heatLoss) j["heatLoss"] = heatLoss(*s.heatLoss);
        if (s.note) j["note"] = *s.note;
        appendExtra(j, s.extra);
        return j;
    }

    // Key order: U, area, UA, then unknown fields; a per-zone U keeps the file's order.
    static Json transfer(const HeatTransferSpec& t) {
        Json j = Json::object();
        if (t.U) {
            j["U"] = quantityJson(*t.U, Dimension::HeatTransferCoefficient);
        } else if (!t.zoneU.empty()) {
            Json u = Json::object();
            for (const auto& [zone, q] : t.zoneU) u[zone] = quantityJson(q, Dimension::HeatTransferCoefficient);
            appendExtra(u, t.Uextra);
            j["U"] = std::move(u);
        }
        if (t.area) j["area"] = quantityJson(*t.area, Dimension::Area);
        if (t.UA) j["UA"] = quantityJson(*t.UA, Dimension::ThermalConductance);
        appendExtra(j, t.extra);
        return j;
    }

    static Json heatLoss(const HeatLossSpec& h) {
        Json j = Json::object();
        j["UA"] = quantityJson(h.UA, Dimension::ThermalConductance);
        appendExtra(j, h.extra);
        return j;
    }

    // Key order: id, kind, name, P, in, out, cp, density, T, flow, then unknown fields.
    static Json utility(const Utility& u) {
        Json j = Json::object();
        j["id"] = u.id;
        j["kind"] = std::string(utilityKindId(u.kind));
        if (u.name) j["name"] = *u.name;
        if (u.P) j["P"] = quantityJson(*u.P, Dimension::Pressure);
        if (u.Tin) j["in"] = quantityJson(*u.Tin, Dimension::Temperature);
        if (u.Tout) j["out"] = quantityJson(*u.Tout, Dimension::Temperature);
        if (u.cp) j["cp"] = quantityJson(*u.cp, Dimension::SpecificEntropy);
        if (u.density) j["density"] = quantityJson(*u.density, Dimension::Density);
        if (u.T) j["T"] = quantityJson(*u.T, Dimension::Temperature);
        if (u.flow) j["flow"] = quantityJson(*u.flow, Dimension::MassFlow);
        appendExtra(j, u.extra);
        return j;
    }
};

std::string osReason(int error) { return std::strerror(error); }

}  // namespace

Result<Project> parseProject(std::string_view text, std::string_view fileName) {
    try {
        return parseChecked(text, fileName);
    } catch (const Failure& f) {
        return f.error;
    } catch (const std::exception& e) {
        return makeError(std::string("cannot read the project: ") + e.what(), std::string(fileName));
    } catch (...) {
        return makeError("cannot read the project (unexpected failure)", std::string(fileName));
    }
}

Result<Project> loadProject(const std::filesystem::path& file) {
    std::error_code ec;
    const std::string name = file.string();
    if (std::filesystem::is_directory(file, ec)) return makeError("this is a folder, not a project file", name);
    const std::uintmax_t size = std::filesystem::file_size(file, ec);
    if (ec) return makeError("cannot open: " + ec.message(), name);
    if (size > kMaxFileBytes)
        return makeError("the file is " + std::to_string(size / (std::uintmax_t{1024} * 1024)) +
                             " MiB; a Heatchain project is far smaller (limit 64 MiB)",
                         name);
    std::ifstream in(file, std::ios::binary);
    if (!in) return makeError("cannot open: " + osReason(errno), name);
    std::string text;
    text.resize(static_cast<std::size_t>(size));
    in.read(text.data(), static_cast<std::streamsize>(size));
    text.resize(static_cast<std::size_t>(in.gcount()));
    if (in.bad()) return makeError("cannot read: " + osReason(errno), name);
    return parseProject(text, name);
}

std::string writeProject(const Project& p) {
    std::vector<std::string> typed;
    std::string out = Writer(&typed).project(p);
    if (typed.empty()) return out;
    // Swap each placeholder for the typed characters; if a placeholder is not
    // found exactly once (a string value that happens to look like one), write
    // the numbers in nlohmann/json's form instead.
    // One pass over the dump (a search per placeholder made writing quadratic).
    const std::string_view open = "\"\\u0001hcnum", close = "\\u0001\"";
    std::vector<int> seen(typed.size(), 0);
    std::string swapped;
    swapped.reserve(out.size());
    std::size_t from = 0;
    for (std::size_t at = out.find(open); at != std::string::npos; at = out.find(open, at + 1)) {
        std::size_t k = 0, q = at + open.size();
        const std::size_t digits = q;
        while (q < out.size() && out[q] >= '0' && out[q] <= '9' && q - digits < 12) k = k * 10 + std::size_t(out[q++] - '0');
        if (q == digits || out.compare(q, close.size(), close) != 0) continue;  // not a placeholder
        if (k >= typed.size() || ++seen[k] > 1) return Writer(nullptr).project(p);
        swapped.append(std::string_view(out).substr(from, at - from)).append(typed[k]);
        from = q + close.size();
    }
    swapped.append(std::string_view(out).substr(from));
    for (int n : seen)
        if (n != 1) return Writer(nullptr).project(p);
    return swapped;
}

std::string Writer::project(const Project& p) const {
    Json j = Json::object();
    j["format"] = std::string(kFormatName);
    j["version"] = p.version;

    Json meta = Json::object();
    auto put = [&](const char* key, const std::string& value) {
        if (!value.empty()) meta[key] = value;
    };
    put("title", p.meta.title);
    put("author", p.meta.author);
    put("revision", p.meta.revision);
    put("created", p.meta.created);
    put("modified", p.meta.modified);
    put("notes", p.meta.notes);
    appendExtra(meta, p.meta.extra);
    if (!meta.empty()) j["meta"] = std::move(meta);

    Json display = Json::object();
    display["units"] = std::string(unitSystemId(p.displayUnits));
    appendExtra(display, p.displayExtra);
    j["display"] = std::move(display);

    j["system"] = std::string(systemId(p.system));
    j["model"] = std::string(modelId(p.model));
    if (p.customSubstanceJson)
        j["substance"] = *p.customSubstanceJson;
    else
        j["substance"] = p.substanceId;

    Json basis = Json::object();
    switch (p.basis.kind) {
        case Basis::Kind::Mass: basis["mass"] = quantityJson(p.basis.amount, Dimension::Mass); break;
        case Basis::Kind::Amount: basis["amount"] = quantityJson(p.basis.amount, Dimension::Amount); break;
        case Basis::Kind::MassFlow: basis["massFlow"] = quantityJson(p.basis.amount, Dimension::MassFlow); break;
        case Basis::Kind::MolarFlow: basis["molarFlow"] = quantityJson(p.basis.amount, Dimension::MolarFlow); break;
    }
    appendExtra(basis, p.basis.extra);
    j["basis"] = std::move(basis);

    if (p.hasAtmosphere) j["atmosphere"] = quantityJson(p.atmosphere, Dimension::Pressure);
    if (p.hasSurroundings) {
        Json s = Json::object();
        s["T"] = quantityJson(p.surroundingsT, Dimension::Temperature);
        s["P"] = quantityJson(p.surroundingsP, Dimension::Pressure);
        appendExtra(s, p.surroundingsExtra);
        j["surroundings"] = std::move(s);
    }

    Json start = Json::object();
    if (p.start.T) start["T"] = quantityJson(*p.start.T, Dimension::Temperature);
    if (p.start.P) start["P"] = quantityJson(*p.start.P, Dimension::Pressure);
    if (p.start.quality) start["quality"] = number(*p.start.quality);
    if (p.start.meltFraction) start["meltFraction"] = number(*p.start.meltFraction);
    appendExtra(start, p.start.extra);
    j["start"] = std::move(start);

    // Utilities and minApproach: after start, before the unknown fields.
    if (p.minApproach) j["minApproach"] = quantityJson(*p.minApproach, Dimension::TemperatureDifference);
    if (p.hasUtilities || !p.utilities.empty()) {
        Json list = Json::array();
        for (const Utility& u : p.utilities) list.push_back(utility(u));
        j["utilities"] = std::move(list);
    }
    if (p.heatLoss) j["heatLoss"] = heatLoss(*p.heatLoss);

    // Unknown top-level fields keep their order, before the long list of steps.
    Json extra = p.extra;
    if (extra.is_object() && extra.contains("steps")) extra.erase("steps");
    appendExtra(j, extra);

    Json steps = Json::array();
    for (const Step& s : p.steps) steps.push_back(step(s, p.system));
    j["steps"] = std::move(steps);

    // Invalid UTF-8 cannot come from a parsed file; from code it is replaced
    // rather than thrown (writeProject cannot fail).
    return j.dump(2, ' ', false, Json::error_handler_t::replace) + "\n";
}

Status saveProject(const Project& project, const std::filesystem::path& file) {
    return writeFileAtomically(file, writeProject(project), true);
}

}  // namespace heatchain
