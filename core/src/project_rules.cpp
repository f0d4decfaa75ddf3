// The rules a worksheet obeys, on the typed project (project_rules.hpp).
#include "project_rules.hpp"

#include <algorithm>
#include <set>
#include <utility>
#include <vector>

#include "heatchain/rules.hpp"

namespace heatchain::detail {

namespace {

std::string listOf(std::span<const std::string_view> items) {
    std::string out;
    for (std::string_view s : items) {
        if (!out.empty()) out += ", ";
        out += s;
    }
    return out;
}

bool contains(std::span<const std::string_view> set, std::string_view key) {
    return std::find(set.begin(), set.end(), key) != set.end();
}

RuleBreach breach(JsonPath path, std::string message) { return RuleBreach{std::move(path), std::move(message)}; }

RuleCheck bounded(const std::optional<Number>& n, const JsonPath& path, BoundedField field) {
    if (!n) return std::nullopt;
    if (auto problem = checkBounded(field, n->value)) return breach(path, *problem);
    return std::nullopt;
}

// A quantity that must be above zero (an area, a coefficient, a time).
RuleCheck positive(const std::optional<Quantity>& q, const JsonPath& path, Dimension d) {
    if (q && !(q->si > 0)) return breach(path, "the " + std::string(dimensionName(d)) + " must be greater than zero");
    return std::nullopt;
}

bool isHeatCool(StepKind k) { return k == StepKind::Heat || k == StepKind::Cool; }
bool isMachine(StepKind k) { return k == StepKind::Compress || k == StepKind::Expand; }

// The target keys a step holds, in the file's order.
std::vector<std::string_view> targetKeys(const StepTarget& to) {
    std::vector<std::string_view> keys;
    if (to.T) keys.emplace_back("T");
    if (to.P) keys.emplace_back("P");
    if (to.duty) keys.emplace_back("duty");
    if (to.quality) keys.emplace_back("quality");
    if (to.ratio) keys.emplace_back("ratio");
    if (to.rated) keys.emplace_back("rated");
    if (to.time) keys.emplace_back("time");
    return keys;
}

RuleCheck checkReservoir(const std::optional<Reservoir>& res, const JsonPath& path, std::string_view key) {
    if (!res) return std::nullopt;
    if (res->utility && res->utility->empty()) return breach(child(path, "utility"), "the utility name is empty");
    if (!res->T && !res->utility)
        return breach(path, std::string(key) + " needs a temperature T, e.g. { \"T\": \"240 degC\" }");
    return std::nullopt;
}

RuleCheck checkTarget(const Step& s, const JsonPath& path, SystemKind system) {
    const std::string kindName(stepKindId(s.kind));
    const JsonPath toPath = child(path, "to");
    const std::span<const std::string_view> allowed = targetsOf(s.kind);
    if (allowed.empty()) return std::nullopt;  // "to" itself does not belong: checked before
    if (s.to.empty()) {
        if (isHeatCool(s.kind))
            return breach(path, "a " + kindName + " step needs a target \"to\" with T, duty or quality, e.g. "
                                                  "\"to\": { \"T\": \"180 degC\" }");
        return breach(path, "a " + kindName + " step needs a target pressure, e.g. \"to\": { \"P\": \"14 barg\" }");
    }
    if (auto b = bounded(s.to.quality, child(toPath, "quality"), BoundedField::Quality)) return b;
    if (auto b = bounded(s.to.ratio, child(toPath, "ratio"), BoundedField::Ratio)) return b;
    if (s.to.rated && system == SystemKind::Closed)
        return breach(child(toPath, "rated"), "a batch (closed system) has no rated end state; give a time, "
                                              "e.g. \"to\": { \"time\": \"45 min\" }");
    if (s.to.time && system != SystemKind::Closed)
        return breach(child(toPath, "time"), "a time target belongs to a closed system (a batch); this project is "
                                             "steady-flow");
    return positive(s.to.time, child(toPath, "time"), Dimension::Time);
}

RuleCheck checkMachine(const Step& s, const JsonPath& path) {
    if (!isMachine(s.kind)) return std::nullopt;
    // Without "path": adiabatic when an efficiency is given, else isentropic
    // (the solver reads a missing path the same way).
    const PathKind effective = s.path ? *s.path : (s.efficiency ? PathKind::Adiabatic : PathKind::Isentropic);
    const std::string pathName(pathId(effective));
    if (effective == PathKind::Polytropic) {
        if (!s.n) return breach(path, "a polytropic path needs the exponent \"n\", e.g. 1.3");
        if (auto b = bounded(s.n, child(path, "n"), BoundedField::PolytropicExponent)) return b;
    } else if (s.n) {
        return breach(child(path, "n"), "\"n\" belongs to a polytropic path; this path is " + pathName);
    }
    if (s.efficiency) {
        if (effective != PathKind::Adiabatic)
            return breach(child(path, "efficiency"),
                          "\"efficiency\" belongs to an adiabatic path; this path is " + pathName);
        if (auto b = bounded(s.efficiency, child(path, "efficiency"), BoundedField::Efficiency)) return b;
    }
    return std::nullopt;
}

RuleCheck checkTransfer(const Step& s, const JsonPath& path) {
    if (s.transfer) {
        const HeatTransferSpec& t = *s.transfer;
        const JsonPath tp = child(path, "transfer");
        if (auto b = positive(t.U, child(tp, "U"), Dimension::HeatTransferCoefficient)) return b;
        for (const auto& [zone, U] : t.zoneU) {
            if (!contains(kZoneKeys, zone))
                return breach(child(child(tp, "U"), zone),
                              "unknown zone " + inQuotes(zone) + "; U per zone names " + listOf(kZoneKeys));
            if (auto b = positive(U, child(child(tp, "U"), zone), Dimension::HeatTransferCoefficient)) return b;
        }
        if (auto b = positive(t.area, child(tp, "area"), Dimension::Area)) return b;
        if (auto b = positive(t.UA, child(tp, "UA"), Dimension::ThermalConductance)) return b;
        if (t.UA && (t.U || !t.zoneU.empty() || t.area))
            return breach(child(tp, "UA"), "give U and area, or UA instead of both; not UA with them");
        if (!t.UA && !t.U && t.zoneU.empty())
            return breach(tp, "transfer needs an overall coefficient U (with area), or UA, e.g. "
                              "{ \"U\": \"450 W/(m2 K)\", \"area\": \"6.5 m2\" }");
    }
    const bool hasArea = s.transfer && (s.transfer->UA || s.transfer->area);
    if (s.to.rated && !hasArea)
        return breach(child(path, "to"), "a rated end state needs the exchanger: \"transfer\" with U and area (or UA)");
    if (s.to.time && !hasArea)
        return breach(child(path, "to"), "a time target needs the jacket or coil: \"transfer\" with U and area (or UA)");
    if ((s.to.rated || s.to.time) && !s.source && !s.sink)
        return breach(child(path, "to"), "a rated or timed step needs its source or sink (a utility or a temperature)");
    return std::nullopt;
}

}  // namespace

// ---- What belongs where ------------------------------------------------------

JsonPath stepPath(long index) { return JsonPath{{"steps", -1}, {"", index}}; }

bool stepFieldBelongs(StepKind kind, std::string_view field) {
    const bool heatCool = isHeatCool(kind);
    const bool machine = isMachine(kind);
    if (field == "to") return heatCool || machine || kind == StepKind::Throttle;
    if (field == "at") return heatCool;
    if (field == "fraction") return isPhaseChangeKind(kind);
    if (field == "path" || field == "n" || field == "efficiency") return machine;
    if (field == "transfer") return heatCool || isPhaseChangeKind(kind) || kind == StepKind::Hold;
    if (field == "duration") return kind == StepKind::Hold;
    return true;
}

std::string_view stepFieldOwners(std::string_view field) {
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

std::span<const std::string_view> targetsOf(StepKind kind) {
    static constexpr std::string_view heatCool[] = {"T", "duty", "quality", "rated", "time"};
    static constexpr std::string_view machine[] = {"P", "ratio"};
    static constexpr std::string_view throttle[] = {"P"};
    if (isHeatCool(kind)) return heatCool;
    if (isMachine(kind)) return machine;
    if (kind == StepKind::Throttle) return throttle;
    return {};
}

std::string_view utilityFieldOwner(std::string_view field) {
    if (field == "id" || field == "kind" || field == "name") return "";
    if (field == "P") return "steam";
    if (field == "T") return "fixed";
    return "sensible";  // in, out, cp, density, flow
}

// ---- Rules -------------------------------------------------------------------

RuleCheck checkAtmosphere(const Quantity& a) {
    // A gauge unit here would be circular: it reads differently under two atmospheres.
    auto other = parseQuantity(a.text, Dimension::Pressure, UnitContext{2.0 * a.si});
    if (!other || *other != a.si)
        return breach({{"atmosphere", -1}},
                      "the atmosphere must be an absolute pressure (e.g. \"101.325 kPa\"), not a gauge reading");
    return std::nullopt;
}

RuleCheck checkBasis(const Basis& basis, SystemKind system) {
    const bool closedKind = basis.kind == Basis::Kind::Mass || basis.kind == Basis::Kind::Amount;
    const JsonPath at{{"basis", -1}, {std::string(basisKey(basis.kind)), -1}};
    if (closedKind != (system == SystemKind::Closed)) {
        const std::string_view expected = system == SystemKind::Closed ? "mass or amount" : "massFlow or molarFlow";
        return breach(at, "a " + std::string(systemId(system)) + " system takes a basis of " + std::string(expected) +
                              ", not " + std::string(basisKey(basis.kind)));
    }
    if (!(basis.amount.si > 0.0)) return breach(at, "the basis must be greater than zero");
    return std::nullopt;
}

RuleCheck checkStart(const StartSpec& start) {
    const JsonPath path{{"start", -1}};
    if (auto b = bounded(start.quality, child(path, "quality"), BoundedField::Quality)) return b;
    if (auto b = bounded(start.meltFraction, child(path, "meltFraction"), BoundedField::MeltFraction)) return b;
    const int given = (start.T ? 1 : 0) + (start.P ? 1 : 0);
    const int onLine = (start.quality ? 1 : 0) + (start.meltFraction ? 1 : 0);
    const std::string rule = "the start is T and P, or (on a phase line) T and/or P with quality or meltFraction";
    if (onLine > 1) return breach(child(path, "meltFraction"), "give quality or meltFraction, not both; " + rule);
    // T and P with a quality or meltFraction is accepted: on a simple model's
    // melting line T does not move with P, so both are a natural way to write
    // it; whether they agree is the solver's check.
    if (given == 0) return breach(path, "start needs T and P; " + rule);
    if (given == 1 && onLine == 0)
        return breach(path, std::string("start needs ") + (start.T ? "P" : "T") + "; " + rule);
    return std::nullopt;
}

RuleCheck checkMinApproach(const Quantity& minApproach) {
    if (!(minApproach.si >= 0))
        return breach({{"minApproach", -1}}, "the minimum approach temperature cannot be negative");
    return std::nullopt;
}

RuleCheck checkUtilityKeys(UtilityKind kind, std::span<const std::string_view> keys, long index) {
    const std::string_view k = utilityKindId(kind);
    for (std::string_view key : keys) {
        if (!contains(kUtilityFields, key)) continue;
        const std::string_view owner = utilityFieldOwner(key);
        if (!owner.empty() && owner != k)
            return breach({{"utilities", -1}, {"", index}, {std::string(key), -1}},
                          inQuotes(key) + " does not belong to a " + std::string(k) + " utility; it is for a " +
                              std::string(owner) + " utility");
    }
    return std::nullopt;
}

RuleCheck checkUtilityKeys(const Utility& u, long index) {
    std::vector<std::string_view> keys;
    const std::pair<std::string_view, bool> given[] = {
        {"P", u.P.has_value()},   {"in", u.Tin.has_value()},           {"out", u.Tout.has_value()},
        {"cp", u.cp.has_value()}, {"density", u.density.has_value()}, {"T", u.T.has_value()},
        {"flow", u.flow.has_value()}};
    for (const auto& [key, present] : given)
        if (present) keys.push_back(key);
    return checkUtilityKeys(u.kind, keys, index);
}

RuleCheck checkUtility(const Utility& u, long index) {
    const JsonPath path{{"utilities", -1}, {"", index}};
    if (u.id.empty()) return breach(child(path, "id"), "the utility id is empty");
    if (u.flow) {
        if (!(u.flow->si > 0)) return breach(child(path, "flow"), "the flow must be greater than zero");
        if (u.Tout)
            return breach(child(path, "flow"),
                          "give \"out\" or \"flow\", not both: with a flow the outlet follows from the exchange");
    }
    switch (u.kind) {
        case UtilityKind::Steam:
            if (!u.P) return breach(path, "a steam utility needs its pressure, e.g. \"P\": \"3 barg\"");
            if (!(u.P->si > 0)) return breach(child(path, "P"), "the steam pressure must be above zero absolute");
            break;
        case UtilityKind::Sensible:
            if (!u.Tin || !(u.Tout || u.flow) || !u.cp)
                return breach(path, "a sensible utility needs \"in\" and \"out\" temperatures (or \"in\" and a "
                                    "\"flow\") and \"cp\", e.g. "
                                    "{ \"in\": \"28 degC\", \"out\": \"36 degC\", \"cp\": \"4.18 kJ/(kg K)\" }");
            if (!(u.Tin->si > 0) || (u.Tout && !(u.Tout->si > 0)))
                return breach(child(path, u.Tin->si > 0 ? "out" : "in"), "the temperature must be above absolute zero");
            if (u.Tout && u.Tin->si == u.Tout->si)
                return breach(child(path, "out"), "\"in\" and \"out\" are equal; a sensible utility changes "
                                                  "temperature (for one temperature use kind \"fixed\")");
            if (!(u.cp->si > 0)) return breach(child(path, "cp"), "cp must be greater than zero");
            if (u.density && !(u.density->si > 0))
                return breach(child(path, "density"), "density must be greater than zero");
            break;
        case UtilityKind::Fixed:
            if (!u.T) return breach(path, "a fixed utility needs its temperature, e.g. \"T\": \"900 degC\"");
            if (!(u.T->si > 0)) return breach(child(path, "T"), "the temperature must be above absolute zero");
            break;
    }
    return std::nullopt;
}

RuleCheck checkUtilityIds(const std::vector<Utility>& utilities) {
    std::set<std::string_view> ids;
    for (std::size_t i = 0; i < utilities.size(); ++i) {
        if (!ids.insert(utilities[i].id).second)
            return breach({{"utilities", -1}, {"", static_cast<long>(i)}, {"id", -1}},
                          "the utility id " + inQuotes(utilities[i].id) + " is used twice; utility ids must be unique");
    }
    return std::nullopt;
}

RuleCheck checkHeatLoss(const HeatLossSpec& h, const JsonPath& path, SystemKind system) {
    if (system != SystemKind::Closed)
        return breach(path, "\"heatLoss\" belongs to a closed system (a batch); this project is steady-flow");
    if (!(h.UA.si >= 0)) return breach(child(path, "UA"), "the heat-loss UA cannot be negative");
    return std::nullopt;
}

RuleCheck checkStepKeys(StepKind kind, std::span<const std::string_view> keys,
                        const std::optional<std::vector<std::string_view>>& toKeys, long index) {
    const JsonPath path = stepPath(index);
    const std::string kindName(stepKindId(kind));
    for (std::string_view key : keys) {
        if (contains(kStepFields, key) && !stepFieldBelongs(kind, key))
            return breach(child(path, std::string(key)), inQuotes(key) + " does not belong to a " + kindName +
                                                             " step; it is for " + std::string(stepFieldOwners(key)));
    }
    if (!toKeys) return std::nullopt;
    const JsonPath toPath = child(path, "to");
    const std::span<const std::string_view> allowed = targetsOf(kind);
    int count = 0;
    for (std::string_view key : *toKeys) {
        if (!contains(kTargetFields, key)) continue;
        if (!contains(allowed, key))
            return breach(child(toPath, std::string(key)), "a " + kindName + " step cannot aim at " + std::string(key) +
                                                               "; its target is one of " + listOf(allowed));
        if (++count > 1)
            return breach(child(toPath, std::string(key)), "give one target for a " + kindName +
                                                               " step, not several (one of " + listOf(allowed) + ")");
    }
    if (count == 0) return breach(toPath, "\"to\" needs one of " + listOf(allowed));
    return std::nullopt;
}

RuleCheck checkStepKeys(const Step& s, long index) {
    std::vector<std::string_view> keys;
    const std::pair<std::string_view, bool> held[] = {
        {"to", !s.to.empty()},       {"at", s.at.has_value()},
        {"fraction", s.fraction.has_value()}, {"path", s.path.has_value()},
        {"n", s.n.has_value()},      {"efficiency", s.efficiency.has_value()},
        {"transfer", s.transfer.has_value()}, {"duration", s.duration.has_value()}};
    for (const auto& [key, present] : held)
        if (present) keys.push_back(key);
    std::optional<std::vector<std::string_view>> toKeys;
    if (!s.to.empty()) toKeys = targetKeys(s.to);
    return checkStepKeys(s.kind, keys, toKeys, index);
}

RuleCheck checkStep(const Step& s, long index, SystemKind system) {
    const JsonPath path = stepPath(index);
    if (s.id.empty()) return breach(child(path, "id"), "the step id is empty");
    if (auto b = checkTarget(s, path, system)) return b;
    if (s.at == HeatingAt::ConstantVolume && system != SystemKind::Closed)
        return breach(child(path, "at"), "constant-volume heating needs a closed system (a batch); this project is "
                                         "steady-flow");
    if (auto b = bounded(s.fraction, child(path, "fraction"), BoundedField::Fraction)) return b;
    if (auto b = checkMachine(s, path)) return b;
    if (auto b = checkReservoir(s.source, child(path, "source"), "source")) return b;
    if (auto b = checkReservoir(s.sink, child(path, "sink"), "sink")) return b;
    if (auto b = checkTransfer(s, path)) return b;
    if (auto b = positive(s.duration, child(path, "duration"), Dimension::Time)) return b;
    if (s.kind == StepKind::Hold) {
        if (system != SystemKind::Closed)
            return breach(child(path, "kind"),
                          "a hold step belongs to a closed system (a batch); this project is steady-flow");
        if (!s.duration) return breach(path, "a hold step needs its \"duration\", e.g. \"2 h\"");
    }
    if (s.heatLoss) return checkHeatLoss(*s.heatLoss, child(path, "heatLoss"), system);
    return std::nullopt;
}

RuleCheck checkStepIds(const std::vector<Step>& steps) {
    std::vector<std::pair<std::string_view, long>> seen;
    std::set<std::string_view> ids;
    for (std::size_t i = 0; i < steps.size(); ++i) {
        const std::string& id = steps[i].id;
        if (!ids.insert(id).second) {
            long first = 0;
            for (const auto& [other, at] : seen)
                if (other == id) first = at;
            return breach(child(stepPath(static_cast<long>(i)), "id"),
                          "the step id " + inQuotes(id) + " is used twice (also steps[" + std::to_string(first) +
                              "]); step ids must be unique");
        }
        seen.emplace_back(id, static_cast<long>(i));
    }
    return std::nullopt;
}

RuleCheck checkUtilityReferences(const Project& p) {
    for (std::size_t i = 0; i < p.steps.size(); ++i) {
        const Step& s = p.steps[i];
        for (const auto& [res, key] : {std::pair{&s.source, "source"}, std::pair{&s.sink, "sink"}}) {
            if (!*res || !(*res)->utility) continue;
            const JsonPath at = child(stepPath(static_cast<long>(i)), key);
            if ((*res)->T) return breach(child(at, "T"), std::string("the ") + key + " names a utility and a temperature; give one");
            if (p.findUtility(*(*res)->utility)) continue;
            std::string known;
            for (const Utility& u : p.utilityList()) known += (known.empty() ? "" : ", ") + u.id;
            return breach(child(at, "utility"),
                          "unknown utility " + inQuotes(*(*res)->utility) + "; " +
                              (known.empty() ? std::string("the project defines no \"utilities\"")
                                             : "the project's utilities are " + known));
        }
    }
    return std::nullopt;
}

}  // namespace heatchain::detail
