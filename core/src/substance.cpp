// Reading substance definitions: the library's JSON files (resources/
// substances/<id>.json) and a project file's custom substance object share one
// parser, so both spellings stay the same. Every error names its JSON path.
#include "heatchain/substance.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <initializer_list>
#include <string>
#include <utility>

#include "heatchain/constants.hpp"
#include "heatchain/embedded_resources.hpp"
#include "heatchain/latent_heat.hpp"
#include "substance_fields.hpp"

namespace heatchain {
namespace {

using Json = nlohmann::ordered_json;
using namespace detail::substance_fields;

// "source": "citation", or { "text": "citation", "confirmed": false } for a
// value not independently confirmed against the publication it cites.
void addSource(Substance& s, const Json& block, std::string_view field, std::string_view where, Status& st) {
    auto it = block.find("source");
    if (it != block.end() && it->is_object()) {
        const std::string path = join(where, "source");
        if (auto ok = checkKeys(*it, path, {"text", "confirmed"}); !ok) {
            st = ok.error();
            return;
        }
        auto text = stringAt(*it, "text", path, true);
        if (!text) {
            st = text.error();
            return;
        }
        bool confirmed = true;
        if (auto c = it->find("confirmed"); c != it->end()) {
            if (!c->is_boolean()) {
                st = makeError("must be true or false", join(path, "confirmed"));
                return;
            }
            confirmed = c->get<bool>();
        }
        s.sources.push_back({std::string(field), *text, confirmed});
        return;
    }
    auto src = stringAt(block, "source", where, false);
    if (!src) {
        st = src.error();
        return;
    }
    if (!src->empty()) s.sources.push_back({std::string(field), *src, true});
}

Result<PhaseChangeData> parsePhaseChange(const Json& block, const std::string& path, bool allowEnthalpyAt,
                                         const std::optional<CriticalPoint>& critical, const UnitContext& uc) {
    if (allowEnthalpyAt) {
        if (auto ok = checkKeys(block, path, {"T", "P", "enthalpy", "enthalpyAt", "source"}); !ok) return ok.error();
    } else if (auto ok = checkKeys(block, path, {"T", "P", "enthalpy", "source"}); !ok) {
        return ok.error();
    }
    PhaseChangeData d;
    auto T = positive(temperatureAt(block, "T", path, uc), join(path, "T"));
    if (!T) return T.error();
    d.T = *T;
    auto P = optionalQuantity(block, "P", Dimension::Pressure, path, uc);
    if (!P) return P.error();
    d.P = P->value_or(kStandardAtmosphere);
    if (!(d.P > 0)) return makeError("must be positive", join(path, "P"));
    auto h = positive(requiredQuantity(block, "enthalpy", Dimension::SpecificEnergy, path, uc), join(path, "enthalpy"));
    if (!h) return h.error();
    d.enthalpy = *h;
    if (block.contains("enthalpyAt")) {
        // The latent heat was measured at another temperature: carry it to the
        // anchor by the Watson relation (latent_heat.hpp).
        auto T1 = positive(temperatureAt(block, "enthalpyAt", path, uc), join(path, "enthalpyAt"));
        if (!T1) return T1.error();
        if (!critical)
            return makeError("converting the latent heat to the anchor temperature needs the critical temperature "
                             "(critical block)",
                             join(path, "enthalpyAt"));
        if (!(*T1 < critical->T) || !(d.T < critical->T))
            return makeError("both temperatures must lie below the critical temperature", join(path, "enthalpyAt"));
        d.enthalpy = watsonLatentHeat(d.enthalpy, *T1, d.T, critical->T);
    }
    return d;
}

// Library molar volumes ("-3.6e-6 m3/mol"): the volume and amount units are
// converted by units.cpp separately, as there is no molar-volume dimension.
Result<double> molarVolumeOf(const Json& value, const std::string& path, const UnitContext& uc) {
    if (!value.is_string()) return makeError("must be a quantity string such as \"-3.6e-6 m3/mol\"", path);
    const std::string text = value.get<std::string>();
    const auto slash = text.rfind('/');
    if (slash == std::string::npos) return makeError("needs a volume per amount unit, e.g. m3/mol or cm3/mol", path);
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
    auto vol = parseQuantity(volumeText, Dimension::Volume, uc);
    if (!vol) return makeError(vol.error().message + " (a molar volume, e.g. \"-3.6e-6 m3/mol\")", path);
    auto amount = toSI(1.0, amountUnit, Dimension::Amount, uc);
    if (!amount) return makeError("unknown amount unit \"" + amountUnit + "\"; valid: mol, kmol", path);
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

Result<Substance> parseImpl(const Json& j, std::string_view where, const UnitContext& uc) {
    if (!j.is_object()) return makeError("a substance must be a JSON object", std::string(where));
    if (auto ok = checkKeys(j, where,
                            {"id", "name", "formula", "cas", "molarMass", "critical", "triple", "melting", "boiling",
                             "sublimation", "phases", "pengRobinson", "hazards", "source", "uncertainty"});
        !ok)
        return ok.error();
    Substance s;
    s.custom = true;  // the library loader marks its own substances
    Status st = Ok{};

    auto id = stringAt(j, "id", where, true);
    if (!id) return id.error();
    if (id->empty() || !std::all_of(id->begin(), id->end(), [](char c) {
            return (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '-';
        }))
        return makeError("\"" + *id + "\" is not a valid id: use lower-case letters, digits and hyphens (\"n-hexane\")",
                         join(where, "id"));
    s.id = *id;
    auto name = stringAt(j, "name", where, true);
    if (!name) return name.error();
    if (name->empty()) return makeError("must not be empty", join(where, "name"));
    s.name = *name;
    auto formula = stringAt(j, "formula", where, false);
    if (!formula) return formula.error();
    s.formula = *formula;
    auto cas = stringAt(j, "cas", where, false);
    if (!cas) return cas.error();
    s.casNumber = *cas;
    addSource(s, j, "substance", where, st);
    if (!st) return st.error();

    // Molar mass: "28.0134 g/mol" or { "value": ..., "source": ... }.
    {
        auto it = j.find("molarMass");
        const std::string path = join(where, "molarMass");
        if (it == j.end()) return makeError("missing (a molar mass such as \"18.015 g/mol\")", path);
        Result<double> M = makeError("", path);
        if (it->is_object()) {
            if (auto ok = checkKeys(*it, path, {"value", "source"}); !ok) return ok.error();
            auto v = it->find("value");
            if (v == it->end()) return makeError("missing", join(path, "value"));
            M = positive(quantityOf(*v, Dimension::MolarMass, join(path, "value"), uc), join(path, "value"));
            addSource(s, *it, "molarMass", path, st);
            if (!st) return st.error();
        } else {
            M = positive(quantityOf(*it, Dimension::MolarMass, path, uc), path);
        }
        if (!M) return M.error();
        s.molarMass = *M;
    }

    if (auto c = objectAt(j, "critical", where, false); !c) {
        return c.error();
    } else if (*c) {
        const Json& b = **c;
        const std::string path = join(where, "critical");
        if (auto ok = checkKeys(b, path, {"T", "P", "acentricFactor", "rho", "source"}); !ok) return ok.error();
        CriticalPoint cp;
        auto T = positive(temperatureAt(b, "T", path, uc), join(path, "T"));
        if (!T) return T.error();
        auto P = positive(requiredQuantity(b, "P", Dimension::Pressure, path, uc), join(path, "P"));
        if (!P) return P.error();
        cp.T = *T;
        cp.P = *P;
        auto w = optionalQuantity(b, "acentricFactor", Dimension::Dimensionless, path, uc);
        if (!w) return w.error();
        cp.acentricFactor = w->value_or(0.0);
        auto rho = optionalQuantity(b, "rho", Dimension::Density, path, uc);
        if (!rho) return rho.error();
        if (*rho && !(**rho > 0)) return makeError("must be positive", join(path, "rho"));
        cp.rho = *rho;
        s.critical = cp;
        addSource(s, b, "critical", path, st);
        if (!st) return st.error();
    }

    if (auto c = objectAt(j, "triple", where, false); !c) {
        return c.error();
    } else if (*c) {
        const Json& b = **c;
        const std::string path = join(where, "triple");
        if (auto ok = checkKeys(b, path, {"T", "P", "source"}); !ok) return ok.error();
        auto T = positive(temperatureAt(b, "T", path, uc), join(path, "T"));
        if (!T) return T.error();
        auto P = positive(requiredQuantity(b, "P", Dimension::Pressure, path, uc), join(path, "P"));
        if (!P) return P.error();
        s.triple = TriplePoint{*T, *P};
        addSource(s, b, "triple", path, st);
        if (!st) return st.error();
    }

    struct ChangeBlock {
        const char* key;
        std::optional<PhaseChangeData>* target;
        bool enthalpyAt;
    };
    for (const ChangeBlock& cb : {ChangeBlock{"melting", &s.melting, false}, ChangeBlock{"boiling", &s.boiling, true},
                                  ChangeBlock{"sublimation", &s.sublimation, false}}) {
        auto c = objectAt(j, cb.key, where, false);
        if (!c) return c.error();
        if (!*c) continue;
        const std::string path = join(where, cb.key);
        auto d = parsePhaseChange(**c, path, cb.enthalpyAt, s.critical, uc);
        if (!d) return d.error();
        *cb.target = *d;
        addSource(s, **c, cb.key, path, st);
        if (!st) return st.error();
    }

    if (auto c = objectAt(j, "phases", where, false); !c) {
        return c.error();
    } else if (*c) {
        const Json& phases = **c;
        const std::string path = join(where, "phases");
        if (auto ok = checkKeys(phases, path, {"solid", "liquid", "vapor"}); !ok) return ok.error();
        struct PhaseBlock {
            const char* key;
            std::optional<HeatCapacity>* cp;
            std::optional<double>* density;
        };
        for (const PhaseBlock& pb : {PhaseBlock{"solid", &s.cpSolid, &s.solidDensity},
                                     PhaseBlock{"liquid", &s.cpLiquid, &s.liquidDensity},
                                     PhaseBlock{"vapor", &s.cpVapor, nullptr}}) {
            auto b = objectAt(phases, pb.key, path, false);
            if (!b) return b.error();
            if (!*b) continue;
            const std::string pp = join(path, pb.key);
            if (pb.density) {
                if (auto ok = checkKeys(**b, pp, {"cp", "density", "source"}); !ok) return ok.error();
            } else if (auto ok = checkKeys(**b, pp, {"cp", "source"}); !ok) {
                return ok.error();
            }
            if (auto cpj = (*b)->find("cp"); cpj != (*b)->end()) {
                auto hc = parseHeatCapacity(*cpj, join(pp, "cp"), s.molarMass, uc);
                if (!hc) return hc.error();
                *pb.cp = std::move(*hc);
            }
            if (pb.density) {
                auto rho = optionalQuantity(**b, "density", Dimension::Density, pp, uc);
                if (!rho) return rho.error();
                if (*rho && !(**rho > 0)) return makeError("must be positive", join(pp, "density"));
                *pb.density = *rho;
            }
            addSource(s, **b, "phases." + std::string(pb.key), pp, st);
            if (!st) return st.error();
        }
    }

    if (auto c = objectAt(j, "pengRobinson", where, false); !c) {
        return c.error();
    } else if (*c) {
        const Json& b = **c;
        const std::string path = join(where, "pengRobinson");
        if (auto ok = checkKeys(b, path, {"twu", "volumeShift", "source"}); !ok) return ok.error();
        PengRobinsonData pr;
        auto twu = objectAt(b, "twu", path, false);
        if (!twu) return twu.error();
        if (*twu) {
            const std::string tp = join(path, "twu");
            if (auto ok = checkKeys(**twu, tp, {"L", "M", "N"}); !ok) return ok.error();
            std::optional<double>* out[3] = {&pr.twuL, &pr.twuM, &pr.twuN};
            const char* keys[3] = {"L", "M", "N"};
            for (int i = 0; i < 3; ++i) {
                auto it = (*twu)->find(keys[i]);
                if (it == (*twu)->end()) return makeError("missing (Twu alpha needs L, M and N)", join(tp, keys[i]));
                auto x = coefficientOf(*it, join(tp, keys[i]));
                if (!x) return x.error();
                *out[i] = *x;
            }
        }
        if (auto it = b.find("volumeShift"); it != b.end()) {
            auto c2 = molarVolumeOf(*it, join(path, "volumeShift"), uc);
            if (!c2) return c2.error();
            pr.volumeShift = *c2;
        }
        s.pengRobinson = pr;
        addSource(s, b, "pengRobinson", path, st);
        if (!st) return st.error();
    }

    // "hazards": { "classes": ["toxic", ...], "source": "..." }
    if (auto c = objectAt(j, "hazards", where, false); !c) {
        return c.error();
    } else if (*c) {
        const Json& b = **c;
        const std::string path = join(where, "hazards");
        if (auto ok = checkKeys(b, path, {"classes", "source"}); !ok) return ok.error();
        auto it = b.find("classes");
        if (it == b.end() || !it->is_array()) return makeError("expected a list of hazard classes", join(path, "classes"));
        for (std::size_t i = 0; i < it->size(); ++i) {
            const std::string ip = join(path, "classes") + "[" + std::to_string(i) + "]";
            const Json& v = (*it)[i];
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
                return makeError("unknown hazard class " + v.dump() + "; valid: " + valid, ip);
            }
            if (std::find(s.hazards.begin(), s.hazards.end(), *h) == s.hazards.end()) s.hazards.push_back(*h);
        }
        addSource(s, b, "hazards", path, st);
        if (!st) return st.error();
    }

    // Cross-checks between blocks that a typing slip would break.
    // Equal is allowed: a boiling anchor may be the triple point (carbon dioxide).
    if (s.melting && s.boiling && !(s.melting->T <= s.boiling->T))
        return makeError("the melting temperature must not lie above the boiling temperature", join(where, "boiling.T"));
    if (s.critical && s.boiling && !(s.boiling->T < s.critical->T))
        return makeError("the boiling temperature must lie below the critical temperature", join(where, "boiling.T"));
    return s;
}

// Line and column of a byte offset, for JSON syntax errors.
void locate(std::string_view text, std::size_t byte, int& line, int& column) {
    line = 1;
    column = 1;
    for (std::size_t i = 0; i < byte && i < text.size(); ++i) {
        if (text[i] == '\n') {
            ++line;
            column = 1;
        } else {
            ++column;
        }
    }
}

Result<Substance> parseText(std::string_view text, const std::string& name) {
    Json j;
    try {
        j = Json::parse(text);
    } catch (const Json::parse_error& e) {
        Error err = makeError("not valid JSON: " + std::string(e.what()), name);
        locate(text, e.byte > 0 ? e.byte - 1 : 0, err.line, err.column);
        return err;
    }
    std::string where = name;
    if (j.is_object())
        if (auto it = j.find("id"); it != j.end() && it->is_string()) where = it->get<std::string>();
    auto s = parseImpl(j, where, UnitContext{});
    if (!s) return s;
    s->custom = false;
    return s;
}

}  // namespace

double Substance::gasConstant() const { return kGasConstant / molarMass; }

Result<Substance> parseSubstance(const nlohmann::ordered_json& j, std::string_view where, const UnitContext& context) {
    // Nothing may escape core: nlohmann throws on a few type mismatches that the
    // checks above are meant to prevent; a slip there still becomes an error value.
    try {
        return parseImpl(j, where, context);
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

const Substance* SubstanceLibrary::find(std::string_view id) const {
    for (const auto& s : substances_)
        if (s.id == id) return &s;
    return nullptr;
}

}  // namespace heatchain
