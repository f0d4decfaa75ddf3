// Reading substance definitions: the library's JSON files (resources/
// substances/<id>.json) and a project file's custom substance object share one
// reader, so both spellings stay the same. Every field is read through
// JsonReader (substance_fields.hpp), so an error names its JSON path and,
// where the definition came from a text, the line:column.
#include "heatchain/substance.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <initializer_list>
#include <string>
#include <utility>
#include <variant>

#include "heatchain/constants.hpp"
#include "heatchain/embedded_resources.hpp"
#include "heatchain/latent_heat.hpp"
#include "json_text.hpp"
#include "substance_definition_json.hpp"
#include "substance_fields.hpp"

namespace heatchain {
namespace {

using detail::child;
using detail::JsonPath;
using detail::JsonReader;
using detail::member;
using namespace detail::substance_fields;

// "source": "citation", or { "text": "citation", "confirmed": false } for a
// value not independently confirmed against the publication it cites.
void addSource(const JsonReader& r, Substance& s, const Json& block, std::string_view field, const JsonPath& path) {
    const Json* src = member(block, "source");
    if (src && src->is_object()) {
        const JsonPath sp = child(path, "source");
        checkKeys(r, *src, sp, {"text", "confirmed"});
        std::string text = stringAt(r, *src, sp, "text", true);
        bool confirmed = true;
        if (const Json* c = member(*src, "confirmed")) {
            if (!c->is_boolean()) r.fail(child(sp, "confirmed"), "must be true or false");
            confirmed = c->get<bool>();
        }
        s.sources.push_back({std::string(field), std::move(text), confirmed});
        return;
    }
    std::string text = stringAt(r, block, path, "source", false);
    if (!text.empty()) s.sources.push_back({std::string(field), std::move(text), true});
}

PhaseChangeData readPhaseChange(const JsonReader& r, const Json& block, const JsonPath& path, bool allowEnthalpyAt,
                                const std::optional<CriticalPoint>& critical) {
    if (allowEnthalpyAt)
        checkKeys(r, block, path, {"T", "P", "enthalpy", "enthalpyAt", "source"});
    else
        checkKeys(r, block, path, {"T", "P", "enthalpy", "source"});
    PhaseChangeData d;
    d.T = positive(r, temperatureAt(r, block, path, "T"), child(path, "T"));
    d.P = optionalQuantity(r, block, path, "P", Dimension::Pressure).value_or(kStandardAtmosphere);
    if (!(d.P > 0)) r.fail(child(path, "P"), "must be positive");
    const JsonPath hPath = child(path, "enthalpy");
    d.enthalpy = positive(r, requiredQuantity(r, block, path, "enthalpy", Dimension::SpecificEnergy), hPath);
    if (block.contains("enthalpyAt")) {
        // The latent heat was measured at another temperature: carry it to the
        // anchor by the Watson relation (latent_heat.hpp).
        const JsonPath atPath = child(path, "enthalpyAt");
        const double T1 = positive(r, temperatureAt(r, block, path, "enthalpyAt"), atPath);
        if (!critical)
            r.fail(atPath,
                   "converting the latent heat to the anchor temperature needs the critical temperature "
                   "(critical block)");
        if (!(T1 < critical->T) || !(d.T < critical->T))
            r.fail(atPath, "both temperatures must lie below the critical temperature");
        d.enthalpy = watsonLatentHeat(d.enthalpy, T1, d.T, critical->T);
    }
    return d;
}

// Library molar volumes ("-3.6e-6 m3/mol"): the volume and amount units are
// converted by units.cpp separately, as there is no molar-volume dimension.
double molarVolumeOf(const JsonReader& r, const Json& value, const JsonPath& path) {
    if (!value.is_string()) r.fail(path, "must be a quantity string such as \"-3.6e-6 m3/mol\"");
    const std::string& text = value.get_ref<const std::string&>();
    const auto slash = text.rfind('/');
    if (slash == std::string::npos) r.fail(path, "needs a volume per amount unit, e.g. m3/mol or cm3/mol");
    std::string volumeText = text.substr(0, slash);
    const std::string amountUnit = text.substr(slash + 1);
    // A volume shift may be negative; units.cpp refuses negative volumes, so
    // the sign is taken off first.
    double sign = 1.0;
    if (auto first = volumeText.find_first_not_of(" \t"); first != std::string::npos && volumeText[first] == '-') {
        volumeText.erase(0, first + 1);
        sign = -1.0;
    }
    // "cm3" is not a volume unit of units.cpp; it is 1e-6 m3 exactly (SI prefix).
    double scale = 1.0;
    if (auto pos = volumeText.rfind("cm3"); pos != std::string::npos && pos + 3 == volumeText.size()) {
        volumeText.replace(pos, 3, "m3");
        scale = 1e-6;
    }
    auto vol = parseQuantity(volumeText, Dimension::Volume, r.units);
    if (!vol) r.fail(path, vol.error().message + " (a molar volume, e.g. \"-3.6e-6 m3/mol\")");
    auto amount = toSI(1.0, amountUnit, Dimension::Amount, r.units);
    if (!amount) r.fail(path, "unknown amount unit \"" + amountUnit + "\"; valid: mol, kmol");
    return sign * *vol * scale / *amount;
}

constexpr std::pair<Hazard, std::string_view> kHazardIds[] = {
    {Hazard::Toxic, "toxic"},           {Hazard::Corrosive, "corrosive"}, {Hazard::Flammable, "flammable"},
    {Hazard::Asphyxiant, "asphyxiant"}, {Hazard::Oxidiser, "oxidiser"},   {Hazard::Carcinogen, "carcinogen"},
};

}  // namespace

std::string_view hazardId(Hazard h) {
    for (const auto& [k, id] : kHazardIds)
        if (k == h) return id;
    return "";
}

std::string_view hazardCaution(Hazard h) {
    switch (h) {
        case Hazard::Toxic:
            return "toxic by inhalation: keep exposure below the applicable limits, with gas detection, "
                   "ventilation and escape routes as the local code requires";
        case Hazard::Corrosive:
            return "corrosive to skin and eyes: protective equipment wherever containment is broken";
        case Hazard::Flammable:
            return "flammable: a release can form an ignitable mixture with air; ignition sources, ventilation "
                   "and hazardous-area classification follow the applicable code";
        case Hazard::Asphyxiant:
            return "asphyxiant: a release displaces the oxygen of an enclosed space without warning; monitor "
                   "oxygen where it can collect";
        case Hazard::Oxidiser:
            return "oxidiser: makes other materials burn far more readily; keep oils and greases away and clean "
                   "equipment for oxygen service";
        case Hazard::Carcinogen:
            return "carcinogen: keep exposure as low as practicable under the occupational-health rules";
    }
    return "";
}

std::string sourceFieldLabel(std::string_view field) {
    static constexpr std::pair<std::string_view, std::string_view> kLabels[] = {
        {"substance", "Substance"},          {"molarMass", "Molar mass"},
        {"critical", "Critical point"},      {"triple", "Triple point"},
        {"melting", "Melting"},              {"boiling", "Boiling"},
        {"sublimation", "Sublimation"},      {"phases.solid", "Solid phase"},
        {"phases.liquid", "Liquid phase"},   {"phases.vapor", "Vapour (ideal gas)"},
        {"pengRobinson", "Peng-Robinson refinements"}, {"hazards", "Hazard classes"}};
    for (const auto& [key, label] : kLabels)
        if (key == field) return std::string(label);
    return std::string(field);
}

std::string hazardSentence(const Substance& s) {
    if (s.hazards.empty()) return {};
    std::string out = (s.name.empty() ? s.id : s.name) + ": ";
    for (std::size_t i = 0; i < s.hazards.size(); ++i) {
        if (i) out += "; ";
        out += hazardCaution(s.hazards[i]);
    }
    return out + ". Read the supplier's safety data sheet.";
}

namespace {

// Molar mass: "28.0134 g/mol" or { "value": ..., "source": ... }.
double readMolarMass(const JsonReader& r, const Json& j, const JsonPath& where, Substance& s) {
    const JsonPath path = child(where, "molarMass");
    const Json* m = member(j, "molarMass");
    if (!m) r.fail(path, "missing (a molar mass such as \"18.015 g/mol\")");
    if (!m->is_object()) return positive(r, quantityOf(r, *m, path, Dimension::MolarMass), path);
    checkKeys(r, *m, path, {"value", "source"});
    const JsonPath vPath = child(path, "value");
    const Json* v = member(*m, "value");
    if (!v) r.fail(vPath, "missing");
    const double M = positive(r, quantityOf(r, *v, vPath, Dimension::MolarMass), vPath);
    addSource(r, s, *m, "molarMass", path);
    return M;
}

void readCritical(const JsonReader& r, const Json& b, const JsonPath& path, Substance& s) {
    checkKeys(r, b, path, {"T", "P", "acentricFactor", "rho", "source"});
    CriticalPoint cp;
    cp.T = positive(r, temperatureAt(r, b, path, "T"), child(path, "T"));
    cp.P = positive(r, requiredQuantity(r, b, path, "P", Dimension::Pressure), child(path, "P"));
    cp.acentricFactor = optionalQuantity(r, b, path, "acentricFactor", Dimension::Dimensionless).value_or(0.0);
    cp.rho = optionalQuantity(r, b, path, "rho", Dimension::Density);
    if (cp.rho && !(*cp.rho > 0)) r.fail(child(path, "rho"), "must be positive");
    s.critical = cp;
    addSource(r, s, b, "critical", path);
}

void readTriple(const JsonReader& r, const Json& b, const JsonPath& path, Substance& s) {
    checkKeys(r, b, path, {"T", "P", "source"});
    const double T = positive(r, temperatureAt(r, b, path, "T"), child(path, "T"));
    const double P = positive(r, requiredQuantity(r, b, path, "P", Dimension::Pressure), child(path, "P"));
    s.triple = TriplePoint{T, P};
    addSource(r, s, b, "triple", path);
}

void readPhases(const JsonReader& r, const Json& phases, const JsonPath& path, Substance& s) {
    checkKeys(r, phases, path, {"solid", "liquid", "vapor"});
    struct PhaseBlock {
        const char* key;
        std::optional<HeatCapacity>* cp;
        std::optional<double>* density;
    };
    for (const PhaseBlock& pb : {PhaseBlock{"solid", &s.cpSolid, &s.solidDensity},
                                 PhaseBlock{"liquid", &s.cpLiquid, &s.liquidDensity},
                                 PhaseBlock{"vapor", &s.cpVapor, nullptr}}) {
        const Json* b = objectAt(r, phases, path, pb.key, false);
        if (!b) continue;
        const JsonPath pp = child(path, pb.key);
        if (pb.density)
            checkKeys(r, *b, pp, {"cp", "density", "source"});
        else
            checkKeys(r, *b, pp, {"cp", "source"});
        if (const Json* cp = member(*b, "cp")) *pb.cp = readHeatCapacity(r, *cp, child(pp, "cp"), s.molarMass);
        if (pb.density) {
            *pb.density = optionalQuantity(r, *b, pp, "density", Dimension::Density);
            if (*pb.density && !(**pb.density > 0)) r.fail(child(pp, "density"), "must be positive");
        }
        addSource(r, s, *b, "phases." + std::string(pb.key), pp);
    }
}

void readPengRobinson(const JsonReader& r, const Json& b, const JsonPath& path, Substance& s) {
    checkKeys(r, b, path, {"twu", "volumeShift", "source"});
    PengRobinsonData pr;
    if (const Json* twu = objectAt(r, b, path, "twu", false)) {
        const JsonPath tp = child(path, "twu");
        checkKeys(r, *twu, tp, {"L", "M", "N"});
        std::optional<double>* out[3] = {&pr.twuL, &pr.twuM, &pr.twuN};
        const char* keys[3] = {"L", "M", "N"};
        for (int i = 0; i < 3; ++i) {
            const Json* x = member(*twu, keys[i]);
            if (!x) r.fail(child(tp, keys[i]), "missing (Twu alpha needs L, M and N)");
            *out[i] = coefficientOf(r, *x, child(tp, keys[i]));
        }
    }
    if (const Json* c = member(b, "volumeShift")) pr.volumeShift = molarVolumeOf(r, *c, child(path, "volumeShift"));
    s.pengRobinson = pr;
    addSource(r, s, b, "pengRobinson", path);
}

// "hazards": { "classes": ["toxic", ...], "source": "..." }
void readHazards(const JsonReader& r, const Json& b, const JsonPath& path, Substance& s) {
    checkKeys(r, b, path, {"classes", "source"});
    const JsonPath cPath = child(path, "classes");
    const Json* classes = member(b, "classes");
    if (!classes || !classes->is_array()) r.fail(cPath, "expected a list of hazard classes");
    for (std::size_t i = 0; i < classes->size(); ++i) {
        const Json& v = (*classes)[i];
        std::optional<Hazard> h;
        if (v.is_string())
            for (const auto& [k, id] : kHazardIds)
                if (v.get_ref<const std::string&>() == id) h = k;
        if (!h) {
            std::string valid;
            for (const auto& [k, id] : kHazardIds) {
                if (!valid.empty()) valid += ", ";
                valid += id;
            }
            r.fail(child(cPath, static_cast<long>(i)), "unknown hazard class " + v.dump() + "; valid: " + valid);
        }
        if (std::find(s.hazards.begin(), s.hazards.end(), *h) == s.hazards.end()) s.hazards.push_back(*h);
    }
    addSource(r, s, b, "hazards", path);
}

}  // namespace

Substance detail::readSubstanceDefinition(const JsonReader& r, const Json& j, const JsonPath& where) {
    if (!j.is_object()) r.fail(where, "a substance must be a JSON object");
    checkKeys(r, j, where,
              {"id", "name", "formula", "cas", "molarMass", "critical", "triple", "melting", "boiling", "sublimation",
               "phases", "pengRobinson", "hazards", "source", "uncertainty"});
    Substance s;
    s.custom = true;  // the library loader marks its own substances

    s.id = stringAt(r, j, where, "id", true);
    if (s.id.empty() || !std::all_of(s.id.begin(), s.id.end(), [](char c) {
            return (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '-';
        }))
        r.fail(child(where, "id"),
               "\"" + s.id + "\" is not a valid id: use lower-case letters, digits and hyphens (\"n-hexane\")");
    s.name = stringAt(r, j, where, "name", true);
    if (s.name.empty()) r.fail(child(where, "name"), "must not be empty");
    s.formula = stringAt(r, j, where, "formula", false);
    s.casNumber = stringAt(r, j, where, "cas", false);
    addSource(r, s, j, "substance", where);
    s.molarMass = readMolarMass(r, j, where, s);

    if (const Json* b = objectAt(r, j, where, "critical", false)) readCritical(r, *b, child(where, "critical"), s);
    if (const Json* b = objectAt(r, j, where, "triple", false)) readTriple(r, *b, child(where, "triple"), s);
    struct ChangeBlock {
        const char* key;
        std::optional<PhaseChangeData>* target;
        bool enthalpyAt;
    };
    for (const ChangeBlock& cb : {ChangeBlock{"melting", &s.melting, false}, ChangeBlock{"boiling", &s.boiling, true},
                                  ChangeBlock{"sublimation", &s.sublimation, false}}) {
        const Json* b = objectAt(r, j, where, cb.key, false);
        if (!b) continue;
        const JsonPath path = child(where, cb.key);
        *cb.target = readPhaseChange(r, *b, path, cb.enthalpyAt, s.critical);
        addSource(r, s, *b, cb.key, path);
    }
    if (const Json* b = objectAt(r, j, where, "phases", false)) readPhases(r, *b, child(where, "phases"), s);
    if (const Json* b = objectAt(r, j, where, "pengRobinson", false))
        readPengRobinson(r, *b, child(where, "pengRobinson"), s);
    if (const Json* b = objectAt(r, j, where, "hazards", false)) readHazards(r, *b, child(where, "hazards"), s);

    // Cross-checks between blocks that a typing slip would break.
    // Equal is allowed: a boiling anchor may be the triple point (carbon dioxide).
    const JsonPath boilingT = child(child(where, "boiling"), "T");
    if (s.melting && s.boiling && !(s.melting->T <= s.boiling->T))
        r.fail(boilingT, "the melting temperature must not lie above the boiling temperature");
    if (s.critical && s.boiling && !(s.boiling->T < s.critical->T))
        r.fail(boilingT, "the boiling temperature must lie below the critical temperature");
    return s;
}

namespace {

// A library file: the definition is the whole text, and an error is labelled
// with `name` (the file's path, or "texts[i]") and the path from its root.
Result<Substance> parseText(std::string_view text, const std::string& name) {
    // A library text holds a few hundred values a dozen levels deep at most:
    // these limits only stop a broken or hostile text.
    auto parsed = detail::parseJsonText(text, 64, 1'000'000);
    if (auto* fault = std::get_if<detail::JsonTextFault>(&parsed)) {
        Error err = makeError(std::move(fault->message), name);
        const auto pos = detail::positionOfOffset(text, fault->offset);
        err.line = pos.line;
        err.column = pos.column;
        return err;
    }
    const Json j = std::move(std::get<Json>(parsed));
    const JsonReader r(text, name, j, JsonReader::Labels::PathOnly);
    try {
        Substance s = detail::readSubstanceDefinition(r, j, {});
        s.custom = false;
        return s;
    } catch (const detail::ReadFailure& f) {
        return f.error;
    }
}

}  // namespace

double Substance::gasConstant() const { return kGasConstant / molarMass; }

Result<Substance> parseSubstance(const nlohmann::ordered_json& j, std::string_view where, const UnitContext& context) {
    // No text: the errors name the path under `where` without a line:column.
    JsonReader r({}, {}, j, JsonReader::Labels::PathOnly);
    r.units = context;
    JsonPath path;
    if (!where.empty()) path.push_back({std::string(where), -1});
    // Nothing may escape core: nlohmann throws on a few type mismatches that the
    // checks are meant to prevent; a slip there still becomes an error value.
    try {
        return detail::readSubstanceDefinition(r, j, path);
    } catch (const detail::ReadFailure& f) {
        return f.error;
    } catch (const std::exception& e) {
        return makeError(std::string("cannot read the substance: ") + e.what(), std::string(where));
    }
}

Result<SubstanceLibrary> SubstanceLibrary::fromJsonTexts(std::span<const std::string_view> texts) {
    SubstanceLibrary lib;
    for (std::size_t i = 0; i < texts.size(); ++i) {
        Result<Substance> s = makeError("");
        try {
            s = parseText(texts[i], "texts[" + std::to_string(i) + "]");
        } catch (const std::exception& e) {
            return makeError(std::string("cannot read the substance: ") + e.what(), "texts[" + std::to_string(i) + "]");
        }
        if (!s) return s.error();
        if (lib.find(s->id)) return makeError("the id \"" + s->id + "\" appears twice", s->id);
        lib.substances_.push_back(std::move(*s));
    }
    return lib;
}

const SubstanceLibrary& SubstanceLibrary::builtin() {
    static const SubstanceLibrary lib = [] {
        SubstanceLibrary out;
        for (const auto& f : resources::embeddedFiles()) {
            if (!f.path.starts_with("substances/") || !f.path.ends_with(".json")) continue;
            // A broken embedded file is a build defect that the tests report
            // (substance_test.cpp); here it is left out rather than abort.
            Result<Substance> s = makeError("");
            try {
                s = parseText(f.content, std::string(f.path));
            } catch (const std::exception&) {
                continue;
            }
            if (s && !out.find(s->id)) out.substances_.push_back(std::move(*s));
        }
        return out;
    }();
    return lib;
}

const Json& SubstanceDefinitionAccess::json(const SubstanceDefinition& d) {
    static const Json none = Json::object();
    return d.kept_ ? d.kept_->object : none;
}

SubstanceDefinition SubstanceDefinitionAccess::of(Json object) {
    SubstanceDefinition d;
    d.kept_ = std::make_shared<const SubstanceDefinition::Kept>(SubstanceDefinition::Kept{std::move(object)});
    return d;
}

std::string SubstanceDefinition::compact() const {
    return SubstanceDefinitionAccess::json(*this).dump(-1, ' ', false, Json::error_handler_t::replace);
}

bool operator==(const SubstanceDefinition& a, const SubstanceDefinition& b) {
    return a.kept_ == b.kept_ || SubstanceDefinitionAccess::json(a) == SubstanceDefinitionAccess::json(b);
}

const Substance* SubstanceLibrary::find(std::string_view id) const {
    for (const auto& s : substances_)
        if (s.id == id) return &s;
    return nullptr;
}

}  // namespace heatchain
