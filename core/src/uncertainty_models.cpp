// Each property model's stated relative standard uncertainty in enthalpy
// differences (so in duties and work) and in cp, with where the figure comes
// from. Kept apart from the models: these are statements about them. What
// was measured here says where (tests/reference); a figure taken from a
// publication without a second check says "not independently confirmed",
// as the substance library does.
#include <cmath>
#include <string>

#include "heatchain/tolerance.hpp"
#include "heatchain/uncertainty.hpp"
#include "substance_definition_json.hpp"

namespace heatchain {

namespace {

// JCGM 100:2008, 4.3.7: a deviation known only as a limit ±a is taken as a
// rectangular distribution, u = a / √3.
double fromLimit(double a) { return a / std::sqrt(3.0); }

// Two parts, combined as independent (JCGM 100:2008, 5.1.2). First, how
// far IF97 departs from IAPWS-95, the formulation it was fitted to, measured
// live by tests/reference/model_uncertainty_test.cpp: at most 0.15 % in cp
// and 0.10 % in 40 K enthalpy differences from 10 kPa to 10 MPa and 280 to
// 1000 K, taken as rectangular limits (more near the critical point: 0.5 %
// in cp at 15 MPa just above saturation). Second, IAPWS-95's own
// uncertainty against measurement, about 0.2 % in cp of the vapour (0.1 % of
// the liquid) away from the critical point per IAPWS R6-95(2016), used for
// h differences too.
ModelUncertainty water() {
    constexpr double kIf97DepartureCp = 0.0015, kIf97DepartureDh = 0.0010, kIapws95 = 0.002;
    return {"IAPWS-IF97", std::hypot(fromLimit(kIf97DepartureDh), kIapws95),
            std::hypot(fromLimit(kIf97DepartureCp), kIapws95),
            "IF97 against IAPWS-95: within 0.15 % in cp and 0.10 % in enthalpy differences from 10 kPa to 10 MPa "
            "and 280 to 1000 K (measured, tests/reference), as rectangular limits; "
            "with IAPWS-95's own uncertainty of about 0.2 % (IAPWS R6-95(2016), estimates of uncertainty; not "
            "independently confirmed); larger near the critical point"};
}

ModelUncertainty ammonia() {
    return {"Tillner-Roth et al. (1993)", 0.01, 0.02,
            "Tillner-Roth, Harms-Watzenberg & Baehr (1993), stated uncertainties of the equation: about 1 % in "
            "enthalpy differences and 2 % in cp in the fluid region (not independently confirmed)"};
}

ModelUncertainty pengRobinson() {
    // tests/reference and README "Property models": against the reference
    // equations, Peng–Robinson's duties and latent heats deviate by up to
    // +4.75 % (ammonia latent heat at 70 °C; loop work +2.6 %, condenser
    // duty +2.2 %, vapour Δh −2.1 %), its superheat Δh by 7–25 %.
    return {"Peng-Robinson", fromLimit(0.0475), fromLimit(0.25),
            "measured in tests/reference against the reference equations (README, Property models): duties and "
            "latent heats within ±4.75 %, superheated-vapour Δh near saturation 7–25 % low; each taken as the "
            "half-width of a rectangular distribution (JCGM 100:2008, 4.3.7)"};
}

ModelUncertainty fittedCp() {
    return {"temperature-dependent cp", 0.01, 0.01,
            "the library's ideal-gas cp fits agree with the NIST-JANAF tables within 0.5 % where the tables were "
            "checked (tests/core/janaf_test.cpp; its table values not independently confirmed); 1 % is taken to cover the gases and liquid fits not checked "
            "against a table (an estimate); latent heats by Watson's relation add to this away from the anchor"};
}

ModelUncertainty constantCp() {
    return {"constant cp", 0.05, 0.05,
            "one cp per phase: the variation of cp over a typical 100 K span of a liquid or gas, about 5 % (an "
            "engineering estimate; the temperature-dependent-cp model removes most of it)"};
}

// "uncertainty": { "h": "1 %", "cp": "2 %", "source": "..." } on a custom substance.
Result<std::optional<ModelUncertainty>> customStatement(const Project& p) {
    if (!p.substance.definition) return std::optional<ModelUncertainty>{};
    const Json& definition = SubstanceDefinitionAccess::json(*p.substance.definition);
    auto it = definition.find("uncertainty");
    if (it == definition.end()) return std::optional<ModelUncertainty>{};
    const std::string where = "substance.uncertainty";
    if (!it->is_object()) return makeError("must be an object { \"h\": \"1 %\", \"cp\": \"2 %\", \"source\": \"...\" }", where);
    ModelUncertainty m{"stated for " + (p.substance.id.empty() ? std::string("the substance") : p.substance.id), 0, 0,
                       ""};
    for (auto f = it->begin(); f != it->end(); ++f) {
        const std::string& key = f.key();
        if (key == "source") {
            if (!f->is_string()) return makeError("must be a string", where + ".source");
            m.source = f->get<std::string>();
            continue;
        }
        if (key != "h" && key != "cp")
            return makeError("unknown field \"" + key + "\"; expected h, cp, source", where);
        std::string field = where;
        field += '.';
        field += key;
        if (!f->is_string()) return makeError("must be a percentage such as \"1 %\"", field);
        auto v = parseQuantity(f->get<std::string>(), Dimension::Dimensionless);
        if (!v || !(*v >= 0) || *v >= 1)
            return makeError("must be a percentage from 0 to 100 % such as \"1 %\"; found " + f->dump(), field);
        (key == "h" ? m.h : m.cp) = *v;
    }
    if (m.source.empty()) return makeError("needs a \"source\" saying where the figures come from", where);
    return std::optional<ModelUncertainty>{m};
}

}  // namespace

Result<ModelUncertainty> statedModelUncertainty(const Project& project) {
    auto custom = customStatement(project);
    if (!custom) return custom.error();
    if (*custom) return **custom;
    switch (project.model) {
        case ModelKind::ConstantCp: return constantCp();
        case ModelKind::TemperatureDependentCp: return fittedCp();
        case ModelKind::RealFluid: return pengRobinson();
        case ModelKind::Reference:
            if (referenceEquation(project.substance)) return project.substance.id == "water" ? water() : ammonia();
            if (project.substance.critical && project.substance.cpVapor) return pengRobinson();
            return fittedCp();
    }
    return makeError("unknown model kind", "model");
}

}  // namespace heatchain
