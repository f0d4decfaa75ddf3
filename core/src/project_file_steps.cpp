// The steps, utilities and heat-transfer fields of a project file, format
// version 1 (shared design: project-format.md): their shape in JSON. What
// each kind of step takes, the bounds of its numbers and the references
// between steps and utilities are rules on the typed project
// (project_rules.hpp), applied here as each part is read. The file's frame
// and its other sections are project_file.cpp's.
#include <set>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "project_file_parts.hpp"

namespace heatchain::detail {

using Reader = JsonReader;

namespace {

std::optional<Reservoir> readReservoir(const Reader& r, const Json& step, const JsonPath& stepPath,
                                       std::string_view key) {
    const Json* v = member(step, key);
    if (!v) return std::nullopt;
    const JsonPath path = child(stepPath, std::string(key));
    r.object(*v, path, key);
    Reservoir res;
    res.T = r.optionalQuantity(*v, path, "T", Dimension::Temperature);
    res.utility = r.optionalString(*v, path, "utility");
    res.extra = Reader::unknownFields(*v, {"T", "utility"});
    return res;
}

// A step's or a utility's id, which it must have.
std::string readId(const Reader& r, const Json& v, const JsonPath& path, std::string_view owner,
                   std::string_view example) {
    const Json* id = member(v, "id");
    if (!id)
        r.fail(path, "the " + std::string(owner) + " has no id; every " + std::string(owner) +
                         " needs a unique \"id\", e.g. " + inQuotes(example));
    return r.string(*id, child(path, "id"));
}

}  // namespace

HeatLossSpec readHeatLoss(const Reader& r, const Json& v, const JsonPath& path) {
    r.object(v, path, "heatLoss");
    const Json* ua = member(v, "UA");
    if (!ua) r.fail(path, "heatLoss needs \"UA\", the conductance to the surroundings, e.g. { \"UA\": \"25 W/K\" }");
    HeatLossSpec h;
    h.UA = r.quantity(*ua, child(path, "UA"), Dimension::ThermalConductance);
    h.extra = Reader::unknownFields(v, {"UA"});
    return h;
}

namespace {

// The keys of an object, in their order.
std::vector<std::string_view> keysOf(const Json& object) {
    std::vector<std::string_view> keys;
    for (auto it = object.begin(); it != object.end(); ++it) keys.emplace_back(it.key());
    return keys;
}

std::optional<std::vector<std::string_view>> toKeysOf(const Json* to) {
    if (!to || !to->is_object()) return std::nullopt;  // not an object: readTarget says so
    return keysOf(*to);
}

// A step's "to" (which keys it may hold is checkStepKeys').
void readTarget(const Reader& r, const Json& to, const JsonPath& toPath, const Project& p, Step& s) {
    r.object(to, toPath, "to");
    s.to.T = r.optionalQuantity(to, toPath, "T", Dimension::Temperature);
    s.to.P = r.optionalQuantity(to, toPath, "P", Dimension::Pressure);
    s.to.duty = r.optionalQuantity(to, toPath, "duty",
                                   p.system == SystemKind::Closed ? Dimension::Energy : Dimension::Power);
    if (const Json* q = member(to, "quality")) s.to.quality = r.number(*q, child(toPath, "quality"));
    if (const Json* ratio = member(to, "ratio")) s.to.ratio = r.number(*ratio, child(toPath, "ratio"));
    if (const Json* rated = member(to, "rated")) {
        if (!rated->is_boolean() || !rated->get<bool>())
            r.fail(child(toPath, "rated"), "\"rated\" is true (the end state the given area reaches); found " +
                                               (rated->is_boolean() ? std::string("false") : jsonTypeName(*rated)));
        s.to.rated = true;
    }
    s.to.time = r.optionalQuantity(to, toPath, "time", Dimension::Time);
    s.to.extra = Reader::unknownFields(to, kTargetFields);
}

HeatTransferSpec readTransfer(const Reader& r, const Json& t, const JsonPath& tp) {
    r.object(t, tp, "transfer");
    HeatTransferSpec spec;
    if (const Json* u = member(t, "U")) {
        const JsonPath up = child(tp, "U");
        if (u->is_object()) {
            for (auto it = u->begin(); it != u->end(); ++it) {
                if (!isOneOf(it.key(), kZoneKeys)) continue;
                spec.zoneU.emplace_back(it.key(), r.quantity(it.value(), child(up, it.key()),
                                                             Dimension::HeatTransferCoefficient));
            }
            spec.Uextra = Reader::unknownFields(*u, kZoneKeys);
            if (spec.zoneU.empty()) r.fail(up, "U per zone needs at least one of " + listOf(kZoneKeys));
        } else {
            spec.U = r.quantity(*u, up, Dimension::HeatTransferCoefficient);
        }
    }
    spec.area = r.optionalQuantity(t, tp, "area", Dimension::Area);
    spec.UA = r.optionalQuantity(t, tp, "UA", Dimension::ThermalConductance);
    spec.extra = Reader::unknownFields(t, {"U", "area", "UA"});
    return spec;
}

std::optional<PathKind> readPathKind(const Reader& r, const Json& v, const JsonPath& path) {
    const std::string name = r.string(v, path);
    for (PathKind pk : {PathKind::Isothermal, PathKind::Isentropic, PathKind::Polytropic, PathKind::Adiabatic})
        if (pathId(pk) == name) return pk;
    r.fail(path, "unknown path " + inQuotes(name) + "; valid paths are isothermal, isentropic, polytropic, adiabatic");
}

}  // namespace

Step readStep(const Reader& r, const Json& v, long index, const Project& p) {
    const JsonPath path{{"steps", -1}, {"", index}};
    r.object(v, path, "a step");
    Step s;

    s.id = readId(r, v, path, "step", "economiser");

    const Json* kind = member(v, "kind");
    if (!kind) r.fail(path, "the step has no kind (heat, cool, melt, freeze, boil, condense, sublimate, deposit, "
                            "compress, expand, throttle, hold)");
    auto k = parseStepKind(r.string(*kind, child(path, "kind")));
    if (!k) r.fail(child(path, "kind"), k.error().message);
    s.kind = *k;

    // Known fields in the wrong kind of step are errors, not extras; found
    // before their values are read.
    enforce(r, checkStepKeys(s.kind, keysOf(v), toKeysOf(member(v, "to")), index));

    if (const Json* to = member(v, "to")) readTarget(r, *to, child(path, "to"), p, s);
    if (const Json* at = member(v, "at")) {
        const std::string a = r.string(*at, child(path, "at"));
        if (a == "constant-pressure")
            s.at = HeatingAt::ConstantPressure;
        else if (a == "constant-volume")
            s.at = HeatingAt::ConstantVolume;
        else
            r.fail(child(path, "at"), "unknown " + inQuotes(a) + "; \"at\" is constant-pressure or constant-volume");
    }
    if (const Json* f = member(v, "fraction")) s.fraction = r.number(*f, child(path, "fraction"));
    if (const Json* pk = member(v, "path")) s.path = readPathKind(r, *pk, child(path, "path"));
    if (const Json* n = member(v, "n")) s.n = r.number(*n, child(path, "n"));
    if (const Json* eff = member(v, "efficiency")) s.efficiency = r.number(*eff, child(path, "efficiency"));
    s.source = readReservoir(r, v, path, "source");
    s.sink = readReservoir(r, v, path, "sink");
    s.note = r.optionalString(v, path, "note");
    if (const Json* t = member(v, "transfer")) s.transfer = readTransfer(r, *t, child(path, "transfer"));
    s.duration = r.optionalQuantity(v, path, "duration", Dimension::Time);
    if (const Json* h = member(v, "heatLoss")) s.heatLoss = readHeatLoss(r, *h, child(path, "heatLoss"));
    s.extra = Reader::unknownFields(v, kStepFields);
    enforce(r, checkStep(s, index, p.system));
    return s;
}

// ---- Utilities (optional top-level "utilities" and "minApproach") ----

namespace {

Utility readUtility(const Reader& r, const Json& v, long index) {
    const JsonPath path{{"utilities", -1}, {"", index}};
    r.object(v, path, "a utility");
    Utility u;
    u.id = readId(r, v, path, "utility", "lp-steam");
    const Json* kind = member(v, "kind");
    if (!kind) r.fail(path, "utility " + inQuotes(u.id) + " has no kind (steam, sensible or fixed)");
    const std::string k = r.string(*kind, child(path, "kind"));
    if (k == "steam") u.kind = UtilityKind::Steam;
    else if (k == "sensible") u.kind = UtilityKind::Sensible;
    else if (k == "fixed") u.kind = UtilityKind::Fixed;
    else r.fail(child(path, "kind"), "unknown utility kind " + inQuotes(k) + "; valid kinds are steam, sensible, fixed");
    enforce(r, checkUtilityKeys(u.kind, keysOf(v), index));
    u.name = r.optionalString(v, path, "name");
    u.P = r.optionalQuantity(v, path, "P", Dimension::Pressure);
    u.Tin = r.optionalQuantity(v, path, "in", Dimension::Temperature);
    u.Tout = r.optionalQuantity(v, path, "out", Dimension::Temperature);
    u.cp = r.optionalQuantity(v, path, "cp", Dimension::SpecificEntropy);
    u.density = r.optionalQuantity(v, path, "density", Dimension::Density);
    u.T = r.optionalQuantity(v, path, "T", Dimension::Temperature);
    u.flow = r.optionalQuantity(v, path, "flow", Dimension::MassFlow);
    u.extra = Reader::unknownFields(v, kUtilityFields);
    enforce(r, checkUtility(u, index));
    return u;
}

}  // namespace

void readUtilities(const Reader& r, const Json& root, Project& p) {
    if (const Json* m = member(root, "minApproach")) {
        p.minApproach = r.quantity(*m, {{"minApproach", -1}}, Dimension::TemperatureDifference);
        enforce(r, checkMinApproach(*p.minApproach));
    }
    const Json* list = member(root, "utilities");
    if (!list) return;
    const JsonPath path{{"utilities", -1}};
    if (!list->is_array()) r.fail(path, "\"utilities\" must be a list [...]; found " + jsonTypeName(*list));
    long index = 0;
    std::vector<Utility>& utilities = p.utilities.emplace();
    for (const Json& u : *list) utilities.push_back(readUtility(r, u, index++));
    enforce(r, checkUtilityIds(utilities));
}

}  // namespace heatchain::detail
