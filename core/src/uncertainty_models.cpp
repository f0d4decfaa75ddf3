// Each property model's stated relative standard uncertainty in enthalpy
// differences (so in duties and work) and in cp, with where the figure comes
// from. Kept apart from the models: these are statements about them.
// Figures typed from memory say so and wait for confirmation against the
// source named.
#include <cmath>
#include <string>

#include "heatchain/tolerance.hpp"
#include "heatchain/uncertainty.hpp"

namespace heatchain {

namespace {

// JCGM 100:2008, 4.3.7: a deviation known only as a limit ±a is taken as a
// rectangular distribution, u = a / √3.
double fromLimit(double a) { return a / std::sqrt(3.0); }

ModelUncertainty water() {
    return {"IAPWS-IF97", 0.002, 0.002,
            "IAPWS R6-95(2016), estimates of uncertainty: cp of the fluid within about 0.1 % (liquid) to 0.2 % "
            "(vapour) away from the critical region; IAPWS-IF97 (R7-97(2012)) reproduces IAPWS-95 within its "
            "consistency limits; taken as 0.2 % for h differences and cp (from memory; larger near the critical "
            "point)"};
}

ModelUncertainty ammonia() {
    return {"Tillner-Roth et al. (1993)", 0.01, 0.02,
            "Tillner-Roth, Harms-Watzenberg & Baehr (1993), stated uncertainties of the equation: about 1 % in "
            "enthalpy differences and 2 % in cp in the fluid region (from memory)"};
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
            "NIST-JANAF / Shomate and NASA polynomial fits reproduce their tabulated cp within about 1 % over "
            "their stated ranges (from memory); latent heats by Watson's relation add to this away from the anchor"};
}

ModelUncertainty constantCp() {
    return {"constant cp", 0.05, 0.05,
            "one cp per phase: the variation of cp over a typical 100 K span of a liquid or gas, about 5 % (an "
            "engineering estimate, from memory)"};
}

// "uncertainty": { "h": "1 %", "cp": "2 %", "source": "..." } on a custom substance.
Result<std::optional<ModelUncertainty>> customStatement(const Project& p) {
    if (!p.customSubstanceJson || !p.customSubstanceJson->is_object()) return std::optional<ModelUncertainty>{};
    auto it = p.customSubstanceJson->find("uncertainty");
    if (it == p.customSubstanceJson->end()) return std::optional<ModelUncertainty>{};
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
