// Writing *.hchain project files, format version 1 (shared design:
// project-format.md). The writer mirrors the reader: one member function per
// part of the file, in the reader's key order (project_file.cpp's header
// gives it), writing the text directly through JsonWriter (json_writer.hpp).
// Writing is stable: fixed key order, 2-space indent, quantities and numbers
// exactly as typed, unknown fields written back where they were.
#include <algorithm>
#include <iterator>
#include <sstream>
#include <string>
#include <string_view>

#include "heatchain/project_file.hpp"
#include "json_writer.hpp"
#include "project_file_parts.hpp"
#include "substance_definition_json.hpp"

namespace heatchain {

namespace {

using detail::kProjectFormatName;

// The SI base unit of a dimension, for a quantity built in code without text.
std::string_view siSymbol(Dimension d) {
    for (const UnitInfo& u : knownUnits())
        if (u.dimension == d && u.factor == 1.0 && u.offset == 0.0 && !u.gauge) return u.symbol;
    return "";
}

std::string quantityText(const Quantity& q, Dimension d) {
    if (!q.text.empty()) return q.text;
    std::ostringstream s;
    s.precision(17);
    s << q.si << ' ' << siSymbol(d);
    return s.str();
}

// The writer mirrors the reader: one member function per part of the file,
// each writing its object straight into the text in the reader's key order,
// with the unknown fields after the known ones.
class Writer {
public:
    explicit Writer(detail::JsonWriter& w) : w_(w) {}

    void project(const Project& p);

private:
    detail::JsonWriter& w_;

    static void quantity(detail::ObjectWriter& o, std::string_view key, const Quantity& q, Dimension d) {
        o.key(key).string(quantityText(q, d));
    }

    // A number as typed ("0.60" stays "0.60"); one made in code without
    // characters in its shortest form.
    static void number(detail::ObjectWriter& o, std::string_view key, const Number& n) {
        detail::JsonWriter& w = o.key(key);
        if (n.quoted)
            w.string(n.text);
        else if (!n.text.empty())
            w.typedNumber(n.text);
        else
            w.number(n.value);
    }

    void reservoir(const Reservoir& r) {
        detail::ObjectWriter o(w_);
        if (r.T) quantity(o, "T", *r.T, Dimension::Temperature);
        if (r.utility) o.key("utility").string(*r.utility);
        o.unknown(r.extra);
        o.end();
    }

    void target(const StepTarget& t, SystemKind system) {
        detail::ObjectWriter o(w_);
        if (t.T) quantity(o, "T", *t.T, Dimension::Temperature);
        if (t.P) quantity(o, "P", *t.P, Dimension::Pressure);
        if (t.duty) quantity(o, "duty", *t.duty, system == SystemKind::Closed ? Dimension::Energy : Dimension::Power);
        if (t.quality) number(o, "quality", *t.quality);
        if (t.ratio) number(o, "ratio", *t.ratio);
        if (t.rated) o.key("rated").boolean(true);
        if (t.time) quantity(o, "time", *t.time, Dimension::Time);
        o.unknown(t.extra);
        o.end();
    }

    void step(const Step& s, SystemKind system) {
        detail::ObjectWriter o(w_);
        o.key("id").string(s.id);
        o.key("kind").string(stepKindId(s.kind));
        if (!s.to.empty()) {
            o.key("to");
            target(s.to, system);
        }
        if (s.at) o.key("at").string(*s.at == HeatingAt::ConstantVolume ? "constant-volume" : "constant-pressure");
        if (s.fraction) number(o, "fraction", *s.fraction);
        if (s.path) o.key("path").string(pathId(*s.path));
        if (s.n) number(o, "n", *s.n);
        if (s.efficiency) number(o, "efficiency", *s.efficiency);
        if (s.source) {
            o.key("source");
            reservoir(*s.source);
        }
        if (s.sink) {
            o.key("sink");
            reservoir(*s.sink);
        }
        if (s.transfer) {
            o.key("transfer");
            transfer(*s.transfer);
        }
        if (s.duration) quantity(o, "duration", *s.duration, Dimension::Time);
        if (s.heatLoss) {
            o.key("heatLoss");
            heatLoss(*s.heatLoss);
        }
        if (s.note) o.key("note").string(*s.note);
        o.unknown(s.extra);
        o.end();
    }

    // Key order: U, area, UA, then unknown fields; a per-zone U keeps the file's order.
    void transfer(const HeatTransferSpec& t) {
        detail::ObjectWriter o(w_);
        if (t.U) {
            quantity(o, "U", *t.U, Dimension::HeatTransferCoefficient);
        } else if (!t.zoneU.empty()) {
            o.key("U");
            detail::ObjectWriter u(w_);
            for (const auto& [zone, q] : t.zoneU) quantity(u, zone, q, Dimension::HeatTransferCoefficient);
            u.unknown(t.Uextra);
            u.end();
        }
        if (t.area) quantity(o, "area", *t.area, Dimension::Area);
        if (t.UA) quantity(o, "UA", *t.UA, Dimension::ThermalConductance);
        o.unknown(t.extra);
        o.end();
    }

    void heatLoss(const HeatLossSpec& h) {
        detail::ObjectWriter o(w_);
        quantity(o, "UA", h.UA, Dimension::ThermalConductance);
        o.unknown(h.extra);
        o.end();
    }

    // Key order: id, kind, name, P, in, out, cp, density, T, flow, then unknown fields.
    void utility(const Utility& u) {
        detail::ObjectWriter o(w_);
        o.key("id").string(u.id);
        o.key("kind").string(utilityKindId(u.kind));
        if (u.name) o.key("name").string(*u.name);
        if (u.P) quantity(o, "P", *u.P, Dimension::Pressure);
        if (u.Tin) quantity(o, "in", *u.Tin, Dimension::Temperature);
        if (u.Tout) quantity(o, "out", *u.Tout, Dimension::Temperature);
        if (u.cp) quantity(o, "cp", *u.cp, Dimension::SpecificEntropy);
        if (u.density) quantity(o, "density", *u.density, Dimension::Density);
        if (u.T) quantity(o, "T", *u.T, Dimension::Temperature);
        if (u.flow) quantity(o, "flow", *u.flow, Dimension::MassFlow);
        o.unknown(u.extra);
        o.end();
    }

    void meta(const Meta& m) {
        detail::ObjectWriter o(w_);
        for (const detail::MetaField& f : detail::kMetaFields)
            if (!(m.*f.member).empty()) o.key(f.key).string(m.*f.member);
        o.unknown(m.extra);
        o.end();
    }

    void basis(const Basis& b) {
        detail::ObjectWriter o(w_);
        switch (b.kind) {
            case Basis::Kind::Mass: quantity(o, "mass", b.amount, Dimension::Mass); break;
            case Basis::Kind::Amount: quantity(o, "amount", b.amount, Dimension::Amount); break;
            case Basis::Kind::MassFlow: quantity(o, "massFlow", b.amount, Dimension::MassFlow); break;
            case Basis::Kind::MolarFlow: quantity(o, "molarFlow", b.amount, Dimension::MolarFlow); break;
        }
        o.unknown(b.extra);
        o.end();
    }

    void start(const StartSpec& s) {
        detail::ObjectWriter o(w_);
        if (s.T) quantity(o, "T", *s.T, Dimension::Temperature);
        if (s.P) quantity(o, "P", *s.P, Dimension::Pressure);
        if (s.quality) number(o, "quality", *s.quality);
        if (s.meltFraction) number(o, "meltFraction", *s.meltFraction);
        o.unknown(s.extra);
        o.end();
    }
};

bool anyMeta(const Meta& m) {
    return !m.extra.empty() || std::any_of(std::begin(detail::kMetaFields), std::end(detail::kMetaFields),
                                [&](const detail::MetaField& f) { return !(m.*f.member).empty(); });
}

void Writer::project(const Project& p) {
    detail::ObjectWriter o(w_);
    o.key("format").string(kProjectFormatName);
    o.key("version").integer(p.version);
    if (anyMeta(p.meta)) {
        o.key("meta");
        meta(p.meta);
    }
    {
        o.key("display");
        detail::ObjectWriter d(w_);
        d.key("units").string(unitSystemId(p.displayUnits));
        d.unknown(p.displayExtra);
        d.end();
    }
    o.key("system").string(systemId(p.system));
    o.key("model").string(modelId(p.model));
    if (p.substance.definition)
        o.key("substance").value(SubstanceDefinitionAccess::json(*p.substance.definition));
    else
        o.key("substance").string(p.substance.id);
    o.key("basis");
    basis(p.basis);
    if (p.atmosphere) quantity(o, "atmosphere", *p.atmosphere, Dimension::Pressure);
    if (p.surroundings) {
        o.key("surroundings");
        detail::ObjectWriter s(w_);
        quantity(s, "T", p.surroundings->T, Dimension::Temperature);
        quantity(s, "P", p.surroundings->P, Dimension::Pressure);
        s.unknown(p.surroundings->extra);
        s.end();
    }
    o.key("start");
    start(p.start);

    // Utilities and minApproach: after start, before the unknown fields.
    if (p.minApproach) quantity(o, "minApproach", *p.minApproach, Dimension::TemperatureDifference);
    if (p.utilities) {
        o.key("utilities").beginArray();
        for (const Utility& u : *p.utilities) utility(u);
        w_.endArray();
    }
    if (p.heatLoss) {
        o.key("heatLoss");
        heatLoss(*p.heatLoss);
    }

    // Unknown top-level fields keep their order, before the long list of steps.
    o.unknown(p.extra, "steps");

    o.key("steps").beginArray();
    for (const Step& s : p.steps) step(s, p.system);
    w_.endArray();
    o.end();
}

}  // namespace

// Invalid UTF-8 cannot come from a parsed file; from code it is replaced
// rather than thrown (writeProject cannot fail).
std::string writeProject(const Project& p) {
    std::string out;
    detail::JsonWriter w(out);
    Writer(w).project(p);
    out += '\n';
    return out;
}

Status saveProject(const Project& project, const std::filesystem::path& file) {
    return writeFileAtomically(file, writeProject(project), true);
}

}  // namespace heatchain
