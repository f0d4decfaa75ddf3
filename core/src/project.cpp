// The small vocabulary of a project: ids of systems, step kinds and paths.
// The ids are the spellings of the project file (project-format.md, version 1).
#include "heatchain/project.hpp"

#include "json_writer.hpp"

#include <array>
#include <string>

namespace heatchain {
namespace {

constexpr std::array kStepKinds = {
    StepKind::Heat,      StepKind::Cool,    StepKind::Melt,     StepKind::Freeze,
    StepKind::Boil,      StepKind::Condense, StepKind::Sublimate, StepKind::Deposit,
    StepKind::Compress,  StepKind::Expand,  StepKind::Throttle, StepKind::Hold,
};

}  // namespace

std::string_view systemId(SystemKind s) {
    return s == SystemKind::Closed ? "closed" : "steady-flow";
}

std::string_view stepKindId(StepKind k) {
    switch (k) {
        case StepKind::Heat: return "heat";
        case StepKind::Cool: return "cool";
        case StepKind::Melt: return "melt";
        case StepKind::Freeze: return "freeze";
        case StepKind::Boil: return "boil";
        case StepKind::Condense: return "condense";
        case StepKind::Sublimate: return "sublimate";
        case StepKind::Deposit: return "deposit";
        case StepKind::Compress: return "compress";
        case StepKind::Expand: return "expand";
        case StepKind::Throttle: return "throttle";
        case StepKind::Hold: return "hold";
    }
    return "heat";
}

Result<StepKind> parseStepKind(std::string_view id) {
    std::string valid;
    for (StepKind k : kStepKinds) {
        if (stepKindId(k) == id) return k;
        if (!valid.empty()) valid += ", ";
        valid += stepKindId(k);
    }
    return makeError("unknown step kind '" + std::string(id) + "'; valid kinds are " + valid);
}

bool isPhaseChangeKind(StepKind k) {
    switch (k) {
        case StepKind::Melt: case StepKind::Freeze: case StepKind::Boil: case StepKind::Condense:
        case StepKind::Sublimate: case StepKind::Deposit:
            return true;
        default:
            return false;
    }
}

bool isPressureChangeKind(StepKind k) {
    return k == StepKind::Compress || k == StepKind::Expand || k == StepKind::Throttle;
}

std::string_view pathId(PathKind p) {
    switch (p) {
        case PathKind::Isothermal: return "isothermal";
        case PathKind::Isentropic: return "isentropic";
        case PathKind::Polytropic: return "polytropic";
        case PathKind::Adiabatic: return "adiabatic";
    }
    return "isentropic";
}

std::string_view basisKey(Basis::Kind k) {
    switch (k) {
        case Basis::Kind::Mass: return "mass";
        case Basis::Kind::Amount: return "amount";
        case Basis::Kind::MassFlow: return "massFlow";
        case Basis::Kind::MolarFlow: return "molarFlow";
    }
    return "mass";
}

Dimension basisDimension(Basis::Kind k) {
    switch (k) {
        case Basis::Kind::Mass: return Dimension::Mass;
        case Basis::Kind::Amount: return Dimension::Amount;
        case Basis::Kind::MassFlow: return Dimension::MassFlow;
        case Basis::Kind::MolarFlow: return Dimension::MolarFlow;
    }
    return Dimension::Mass;
}

// Mass and mass-flow bases are already kg or kg/s; a molar basis is turned
// into mass with the substance's molar mass (kg/mol).
double Project::massBasis() const {
    switch (basis.kind) {
        case Basis::Kind::Mass:
        case Basis::Kind::MassFlow:
            return basis.amount.si;
        case Basis::Kind::Amount:
        case Basis::Kind::MolarFlow:
            return basis.amount.si * substance.molarMass;
    }
    return basis.amount.si;
}

const Step* Project::findStep(std::string_view id) const {
    for (const Step& s : steps)
        if (s.id == id) return &s;
    return nullptr;
}

std::string Number::typed() const {
    if (!text.empty()) return text;
    std::string out;
    detail::appendJsonNumber(out, value);
    return out;
}

const Quantity& Project::atmosphereOrDefault() const {
    static const Quantity standard{"101.325 kPa", kStandardAtmosphere};
    return atmosphere ? *atmosphere : standard;
}

const Surroundings& Project::surroundingsOrDefault() const {
    static const Surroundings standard;
    return surroundings ? *surroundings : standard;
}

const std::vector<Utility>& Project::utilityList() const {
    static const std::vector<Utility> none;
    return utilities ? *utilities : none;
}

const Utility* Project::findUtility(std::string_view id) const {
    for (const Utility& u : utilityList())
        if (u.id == id) return &u;
    return nullptr;
}

std::string_view utilityKindId(UtilityKind k) {
    switch (k) {
        case UtilityKind::Steam: return "steam";
        case UtilityKind::Sensible: return "sensible";
        case UtilityKind::Fixed: return "fixed";
    }
    return "fixed";
}

}  // namespace heatchain
