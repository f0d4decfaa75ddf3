// The steps, utilities and heat-transfer fields of a project file, format
// version 1 (shared design: project-format.md): what each kind of step takes,
// the bounds of its numbers (rules.hpp), and the references between steps and
// utilities. The file's frame and its other sections are project_file.cpp's.
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

}  // namespace

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

namespace {

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
                    if (!isOneOf(it.key(), kZoneKeys)) continue;
                    spec.zoneU.emplace_back(it.key(), positiveQuantity(r, it.value(), child(up, it.key()),
                                                                       Dimension::HeatTransferCoefficient));
                }
                spec.Uextra = Reader::unknownFields(*u, kZoneKeys);
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

}  // namespace

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

namespace {

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

}  // namespace

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
    std::vector<Utility>& utilities = p.utilities.emplace();
    for (const Json& u : *list) utilities.push_back(readUtility(r, u, index++, ids));
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
            for (const Utility& u : p.utilityList()) known += (known.empty() ? "" : ", ") + u.id;
            r.fail({{"steps", -1}, {"", static_cast<long>(i)}, {key, -1}, {"utility", -1}},
                   "unknown utility " + inQuotes(*(*res)->utility) + "; " +
                       (known.empty() ? std::string("the project defines no \"utilities\"")
                                      : "the project's utilities are " + known));
        }
    }
}

}  // namespace heatchain::detail
