#include "cli_json.hpp"

#include <cmath>

#include "heatchain/results_json.hpp"

namespace heatchain::cli {

std::string siLabel(Dimension d) {
    switch (d) {
        case Dimension::Temperature:
        case Dimension::TemperatureDifference: return "K";
        case Dimension::Pressure: return "Pa";
        case Dimension::Energy: return "J";
        case Dimension::Power: return "W";
        case Dimension::Entropy: return "J/K";
        case Dimension::EntropyRate: return "W/K";
        case Dimension::Mass: return "kg";
        case Dimension::MassFlow: return "kg/s";
        case Dimension::Area: return "m2";
        case Dimension::HeatTransferCoefficient: return "W/(m2 K)";
        case Dimension::ThermalConductance: return "W/K";
        case Dimension::Time: return "s";
        default: return "1";
    }
}

Json sweepToJson(const SweepSpec& spec, const SweepResult& r) {
    Json j = Json::object();
    j["step"] = spec.step;
    j["input"] = spec.input;
    j["inputUnit"] = siLabel(r.inputDimension);
    Json outs = Json::array();
    for (const auto& o : r.outputs) outs.push_back({{"key", o.key}, {"label", o.label}, {"unit", siLabel(o.dimension)}});
    j["outputs"] = outs;
    Json pts = Json::array();
    for (const auto& p : r.points) {
        Json v = Json::object();
        for (std::size_t i = 0; i < r.outputs.size(); ++i)
            v[r.outputs[i].key] = p.values[i] && std::isfinite(*p.values[i]) ? Json(*p.values[i]) : Json(nullptr);
        pts.push_back({{"x", p.x}, {"text", p.text}, {"values", v},
                       {"error", p.error ? Json(p.error->text()) : Json(nullptr)}, {"warnings", p.warnings}});
    }
    j["points"] = pts;
    j["computed"] = r.computed();
    return j;
}

Json substancesToJson(const SubstanceLibrary& library) {
    Json arr = Json::array();
    for (const auto& s : library.all()) {
        Json j = {{"id", s.id}, {"name", s.name}, {"formula", s.formula}, {"molarMass_kg_per_mol", s.molarMass}};
        if (s.critical) j["critical"] = {{"T_K", s.critical->T}, {"P_Pa", s.critical->P}, {"acentricFactor", s.critical->acentricFactor}};
        if (s.boiling) j["boiling"] = {{"T_K", s.boiling->T}, {"P_Pa", s.boiling->P}, {"enthalpy_J_per_kg", s.boiling->enthalpy}};
        if (s.melting) j["melting"] = {{"T_K", s.melting->T}, {"P_Pa", s.melting->P}, {"enthalpy_J_per_kg", s.melting->enthalpy}};
        Json src = Json::array();
        for (const auto& n : s.sources)
            src.push_back({{"field", n.field}, {"source", n.text}, {"confirmed", n.confirmed}});
        j["sources"] = src;
        arr.push_back(j);
    }
    return arr;
}

Result<StateAnswer> queryState(const std::string& substanceId, const std::map<std::string, std::string>& props,
                               ModelKind kind, StateFailure& why) {
    const Substance* sub = SubstanceLibrary::builtin().find(substanceId);
    if (!sub) {
        std::string known;
        for (const auto& s : SubstanceLibrary::builtin().all()) known += (known.empty() ? "" : ", ") + s.id;
        why = StateFailure::InvalidInput;
        return makeError("unknown substance \"" + substanceId + "\"; known: " + known);
    }
    auto has = [&](const char* a1, const char* a2) { return props.size() == 2 && props.count(a1) && props.count(a2); };
    if (!has("T", "P") && !has("P", "h") && !has("P", "s") && !has("T", "quality") && !has("P", "quality")) {
        why = StateFailure::Usage;
        return makeError("give T and P, P and h, P and s, T and quality, or P and quality");
    }
    auto model = makeModel(kind, *sub);
    if (!model) {
        why = StateFailure::CannotCompute;
        return model.error();
    }
    const PropertyModel& m = **model;
    auto q = [&](const std::string& name, Dimension d) -> Result<double> {
        auto v = parseQuantity(props.at(name), d);
        if (!v) return makeError(v.error().message, name);
        return v;
    };
    Result<State> st = makeError("");
    Result<double> x1 = makeError(""), x2 = makeError("");
    if (has("T", "P")) {
        x1 = q("T", Dimension::Temperature); x2 = q("P", Dimension::Pressure);
        if (x1 && x2) st = m.stateTP(*x1, *x2);
    } else if (has("P", "h")) {
        x1 = q("P", Dimension::Pressure); x2 = q("h", Dimension::SpecificEnergy);
        if (x1 && x2) st = m.statePH(*x1, *x2);
    } else if (has("P", "s")) {
        x1 = q("P", Dimension::Pressure); x2 = q("s", Dimension::SpecificEntropy);
        if (x1 && x2) st = m.statePS(*x1, *x2);
    } else if (has("T", "quality")) {
        x1 = q("T", Dimension::Temperature); x2 = q("quality", Dimension::Dimensionless);
        if (x1 && x2) st = m.stateOnLineT(Transition::Boiling, *x1, *x2);
    } else {
        x1 = q("P", Dimension::Pressure); x2 = q("quality", Dimension::Dimensionless);
        if (x1 && x2) st = m.stateOnLineP(Transition::Boiling, *x1, *x2);
    }
    if (!x1 || !x2) {
        why = StateFailure::InvalidInput;
        return !x1 ? x1.error() : x2.error();
    }
    if (!st) {
        why = StateFailure::CannotCompute;
        return st.error();
    }
    return StateAnswer{sub, *model, std::move(*st)};
}

Json stateAnswerToJson(const StateAnswer& a) {
    const std::string warnings = describeWarnings(a.state.warnings);
    Json j = stateToJson(a.state);
    j["model"] = std::string(a.model->name());
    j["source"] = std::string(a.state.source);
    j["warnings"] = warnings.empty() ? Json::array() : Json::array({warnings});
    return j;
}

}  // namespace heatchain::cli
