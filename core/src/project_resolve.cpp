// Resolving a worksheet edited in code (project_rules.hpp): every quantity
// read again from its text, the substance found again, and every rule
// applied, in the order the file's reader meets them.
#include <exception>
#include <string>
#include <utility>

#include "heatchain/project_file.hpp"
#include "heatchain/substance.hpp"
#include "heatchain/tolerance.hpp"
#include "project_rules.hpp"
#include "substance_definition_json.hpp"
#include "substance_fields.hpp"

namespace heatchain::detail {

namespace {

RuleBreach breach(JsonPath path, std::string message) { return RuleBreach{std::move(path), std::move(message)}; }

Dimension dutyDimension(SystemKind s) { return s == SystemKind::Closed ? Dimension::Energy : Dimension::Power; }

class Resolver {
public:
    explicit Resolver(const UnitContext& units) : units_(units) {}

    void quantity(Quantity& q, const JsonPath& path, Dimension d) {
        if (failed_) return;
        auto si = parseToleranced(q.text, d, units_);  // the tolerance, if any, stays in the text
        if (!si) {
            failed_ = breach(path, si.error().message);
            return;
        }
        q.si = si->si;
    }
    void quantity(std::optional<Quantity>& q, const JsonPath& path, Dimension d) {
        if (q) quantity(*q, path, d);
    }
    // A number written as text ("65 %", "0.72 ± 0.03") is read again; a
    // JSON number is its value.
    void number(std::optional<Number>& n, const JsonPath& path) {
        if (failed_ || !n || !n->quoted) return;
        auto x = parseToleranced(n->text, Dimension::Dimensionless, units_);
        if (!x) {
            failed_ = breach(path, x.error().message);
            return;
        }
        n->value = x->si;
    }

    RuleCheck result() const { return failed_; }

private:
    UnitContext units_;
    RuleCheck failed_;
};

void resolveStep(Resolver& r, Step& s, long index, SystemKind system) {
    const JsonPath path = stepPath(index);
    const JsonPath to = child(path, "to");
    r.quantity(s.to.T, child(to, "T"), Dimension::Temperature);
    r.quantity(s.to.P, child(to, "P"), Dimension::Pressure);
    r.quantity(s.to.duty, child(to, "duty"), dutyDimension(system));
    r.number(s.to.quality, child(to, "quality"));
    r.number(s.to.ratio, child(to, "ratio"));
    r.quantity(s.to.time, child(to, "time"), Dimension::Time);
    r.number(s.fraction, child(path, "fraction"));
    r.number(s.n, child(path, "n"));
    r.number(s.efficiency, child(path, "efficiency"));
    for (auto& [res, key] : {std::pair{&s.source, "source"}, std::pair{&s.sink, "sink"}})
        if (*res) r.quantity((*res)->T, child(child(path, key), "T"), Dimension::Temperature);
    if (s.transfer) {
        const JsonPath tp = child(path, "transfer");
        r.quantity(s.transfer->U, child(tp, "U"), Dimension::HeatTransferCoefficient);
        for (auto& [zone, U] : s.transfer->zoneU) r.quantity(U, child(child(tp, "U"), zone), Dimension::HeatTransferCoefficient);
        r.quantity(s.transfer->area, child(tp, "area"), Dimension::Area);
        r.quantity(s.transfer->UA, child(tp, "UA"), Dimension::ThermalConductance);
    }
    r.quantity(s.duration, child(path, "duration"), Dimension::Time);
    if (s.heatLoss) r.quantity(s.heatLoss->UA, child(child(path, "heatLoss"), "UA"), Dimension::ThermalConductance);
}

void resolveUtility(Resolver& r, Utility& u, long index) {
    const JsonPath path{{"utilities", -1}, {"", index}};
    r.quantity(u.P, child(path, "P"), Dimension::Pressure);
    r.quantity(u.Tin, child(path, "in"), Dimension::Temperature);
    r.quantity(u.Tout, child(path, "out"), Dimension::Temperature);
    r.quantity(u.cp, child(path, "cp"), Dimension::SpecificEntropy);
    r.quantity(u.density, child(path, "density"), Dimension::Density);
    r.quantity(u.T, child(path, "T"), Dimension::Temperature);
    r.quantity(u.flow, child(path, "flow"), Dimension::MassFlow);
}

// The substance as the reader finds it: from the library by id, or its
// definition read again under the project's atmosphere.
RuleCheck resolveSubstance(Project& p, const UnitContext& units) {
    if (p.substance.definition) {
        // Read as the file's reader reads it, under "substance" (gauge
        // pressures against this project's atmosphere), so that a fault is
        // named at the same path.
        const SubstanceDefinition definition = *p.substance.definition;
        const Json& j = SubstanceDefinitionAccess::json(definition);
        JsonReader reader({}, {}, j, JsonReader::Labels::PathOnly);
        reader.units = units;
        try {
            p.substance = readSubstanceDefinition(reader, j, {{"substance", -1}});
        } catch (const ReadFailure& f) {
            return breach(f.path, f.error.message);
        } catch (const std::exception& e) {  // a slip past the reader's type checks
            return breach({{"substance", -1}}, std::string("cannot read the substance: ") + e.what());
        }
        p.substance.custom = true;
        p.substance.definition = definition;
    } else if (const Substance* s = SubstanceLibrary::builtin().find(p.substance.id)) {
        p.substance = *s;
    } else {
        return breach({{"substance", -1}}, "unknown substance " + inQuotes(p.substance.id));
    }
    return std::nullopt;
}

}  // namespace

RuleCheck resolveProject(Project& p) {
    // In the order the file's reader meets each part, so that a worksheet
    // with several faults is refused for the one its file would be.
    if (p.atmosphere) {  // first: gauge pressures are read against it
        Resolver r{UnitContext{}};
        r.quantity(*p.atmosphere, {{"atmosphere", -1}}, Dimension::Pressure);
        if (auto b = r.result()) return b;
        if (auto b = checkAtmosphere(*p.atmosphere)) return b;
    }
    const UnitContext units = p.unitContext();
    if (auto b = resolveSubstance(p, units)) return b;
    Resolver r(units);
    r.quantity(p.basis.amount, {{"basis", -1}, {std::string(basisKey(p.basis.kind)), -1}},
               basisDimension(p.basis.kind));
    if (auto b = r.result()) return b;
    if (auto b = checkBasis(p.basis, p.system)) return b;
    if (p.surroundings) {
        r.quantity(p.surroundings->T, {{"surroundings", -1}, {"T", -1}}, Dimension::Temperature);
        r.quantity(p.surroundings->P, {{"surroundings", -1}, {"P", -1}}, Dimension::Pressure);
    }
    r.quantity(p.start.T, {{"start", -1}, {"T", -1}}, Dimension::Temperature);
    r.quantity(p.start.P, {{"start", -1}, {"P", -1}}, Dimension::Pressure);
    r.number(p.start.quality, {{"start", -1}, {"quality", -1}});
    r.number(p.start.meltFraction, {{"start", -1}, {"meltFraction", -1}});
    if (auto b = r.result()) return b;
    if (auto b = checkStart(p.start)) return b;
    if (p.minApproach) {
        r.quantity(*p.minApproach, {{"minApproach", -1}}, Dimension::TemperatureDifference);
        if (auto b = r.result()) return b;
        if (auto b = checkMinApproach(*p.minApproach)) return b;
    }
    if (p.utilities) {
        for (std::size_t i = 0; i < p.utilities->size(); ++i) {
            Utility& u = (*p.utilities)[i];
            const long index = static_cast<long>(i);
            if (auto b = checkUtilityKeys(u, index)) return b;
            resolveUtility(r, u, index);
            if (auto b = r.result()) return b;
            if (auto b = checkUtility(u, index)) return b;
        }
        if (auto b = checkUtilityIds(*p.utilities)) return b;
    }
    if (p.heatLoss) {
        r.quantity(p.heatLoss->UA, {{"heatLoss", -1}, {"UA", -1}}, Dimension::ThermalConductance);
        if (auto b = r.result()) return b;
        if (auto b = checkHeatLoss(*p.heatLoss, {{"heatLoss", -1}}, p.system)) return b;
    }
    for (std::size_t i = 0; i < p.steps.size(); ++i) {
        Step& s = p.steps[i];
        const long index = static_cast<long>(i);
        if (auto b = checkStepKeys(s, index)) return b;
        resolveStep(r, s, index, p.system);
        if (auto b = r.result()) return b;
        if (auto b = checkStep(s, index, p.system)) return b;
    }
    if (auto b = checkStepIds(p.steps)) return b;
    return checkUtilityReferences(p);
}

std::string ruleLabel(const JsonPath& path, const Project& p) {
    const auto index = stepIndexOf(path);
    return labelJsonPath(path, index && *index < p.steps.size() ? std::string_view(p.steps[*index].id) : "");
}

}  // namespace heatchain::detail

namespace heatchain {

Result<Project> resolveProject(const Project& project) {
    Project p = project;
    if (auto b = detail::resolveProject(p)) return makeError(b->message, detail::ruleLabel(b->path, p));
    return p;
}

}  // namespace heatchain
