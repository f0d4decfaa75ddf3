// Writing *.hchain project files, format version 1 (shared design:
// project-format.md). The writer mirrors the reader: one object per write, one
// member per part of the file, in the reader's key order (project_file.cpp's
// header gives it). Writing is stable: fixed key order, 2-space indent,
// quantities exactly as typed, unknown fields written back where they were.
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/project_file.hpp"
#include "project_file_parts.hpp"

namespace heatchain {

namespace {

using detail::kProjectFormatName;


// The SI base unit of a dimension, for a quantity built in code without text.
std::string_view siSymbol(Dimension d) {
    for (const UnitInfo& u : knownUnits())
        if (u.dimension == d && u.factor == 1.0 && u.offset == 0.0 && !u.gauge) return u.symbol;
    return "";
}

Json quantityJson(const Quantity& q, Dimension d) {
    if (!q.text.empty()) return q.text;
    std::ostringstream s;
    s.precision(17);
    s << q.si << ' ' << siSymbol(d);
    return s.str();
}

void appendExtra(Json& j, const Json& extra) {
    if (!extra.is_object()) return;
    for (auto it = extra.begin(); it != extra.end(); ++it)
        if (!j.contains(it.key())) j[it.key()] = it.value();
}

// The writer mirrors the reader: one object per write, one member per part
// of the file. Numbers typed in a file are written through placeholders
// (when `typed` is given) that writeProject swaps for their original
// characters after the dump: nlohmann/json always reprints a double in its
// own shortest form.
class Writer {
public:
    explicit Writer(std::vector<std::string>* typed) : typed_(typed) {}

    std::string project(const Project& p) const;

private:
    std::vector<std::string>* typed_;  // null: numbers in nlohmann/json's form

    Json number(const Number& n) const {
        if (typed_ && !n.text.empty() && n.raw.is_number()) {
            typed_->push_back(n.text);
            return "\x01hcnum" + std::to_string(typed_->size() - 1) + "\x01";
        }
        if (n.raw.is_number() || n.raw.is_string()) return n.raw;
        return n.value;
    }

    static Json reservoir(const Reservoir& r) {
        Json j = Json::object();
        if (r.T) j["T"] = quantityJson(*r.T, Dimension::Temperature);
        if (r.utility) j["utility"] = *r.utility;
        appendExtra(j, r.extra);
        return j;
    }

    Json step(const Step& s, SystemKind system) const {
        Json j = Json::object();
        j["id"] = s.id;
        j["kind"] = std::string(stepKindId(s.kind));
        if (s.hasTo) {
            Json to = Json::object();
            if (s.to.T) to["T"] = quantityJson(*s.to.T, Dimension::Temperature);
            if (s.to.P) to["P"] = quantityJson(*s.to.P, Dimension::Pressure);
            if (s.to.duty)
                to["duty"] = quantityJson(*s.to.duty, system == SystemKind::Closed ? Dimension::Energy : Dimension::Power);
            if (s.to.quality) to["quality"] = number(*s.to.quality);
            if (s.to.ratio) to["ratio"] = number(*s.to.ratio);
            if (s.to.rated) to["rated"] = true;
            if (s.to.time) to["time"] = quantityJson(*s.to.time, Dimension::Time);
            appendExtra(to, s.to.extra);
            j["to"] = std::move(to);
        }
        if (s.at) j["at"] = *s.at == HeatingAt::ConstantVolume ? "constant-volume" : "constant-pressure";
        if (s.fraction) j["fraction"] = number(*s.fraction);
        if (s.path) j["path"] = std::string(pathId(*s.path));
        if (s.n) j["n"] = number(*s.n);
        if (s.efficiency) j["efficiency"] = number(*s.efficiency);
        if (s.source) j["source"] = reservoir(*s.source);
        if (s.sink) j["sink"] = reservoir(*s.sink);
        if (s.transfer) j["transfer"] = transfer(*s.transfer);
        if (s.duration) j["duration"] = quantityJson(*s.duration, Dimension::Time);
        if (s.heatLoss) j["heatLoss"] = heatLoss(*s.heatLoss);
        if (s.note) j["note"] = *s.note;
        appendExtra(j, s.extra);
        return j;
    }

    // Key order: U, area, UA, then unknown fields; a per-zone U keeps the file's order.
    static Json transfer(const HeatTransferSpec& t) {
        Json j = Json::object();
        if (t.U) {
            j["U"] = quantityJson(*t.U, Dimension::HeatTransferCoefficient);
        } else if (!t.zoneU.empty()) {
            Json u = Json::object();
            for (const auto& [zone, q] : t.zoneU) u[zone] = quantityJson(q, Dimension::HeatTransferCoefficient);
            appendExtra(u, t.Uextra);
            j["U"] = std::move(u);
        }
        if (t.area) j["area"] = quantityJson(*t.area, Dimension::Area);
        if (t.UA) j["UA"] = quantityJson(*t.UA, Dimension::ThermalConductance);
        appendExtra(j, t.extra);
        return j;
    }

    static Json heatLoss(const HeatLossSpec& h) {
        Json j = Json::object();
        j["UA"] = quantityJson(h.UA, Dimension::ThermalConductance);
        appendExtra(j, h.extra);
        return j;
    }

    // Key order: id, kind, name, P, in, out, cp, density, T, flow, then unknown fields.
    static Json utility(const Utility& u) {
        Json j = Json::object();
        j["id"] = u.id;
        j["kind"] = std::string(utilityKindId(u.kind));
        if (u.name) j["name"] = *u.name;
        if (u.P) j["P"] = quantityJson(*u.P, Dimension::Pressure);
        if (u.Tin) j["in"] = quantityJson(*u.Tin, Dimension::Temperature);
        if (u.Tout) j["out"] = quantityJson(*u.Tout, Dimension::Temperature);
        if (u.cp) j["cp"] = quantityJson(*u.cp, Dimension::SpecificEntropy);
        if (u.density) j["density"] = quantityJson(*u.density, Dimension::Density);
        if (u.T) j["T"] = quantityJson(*u.T, Dimension::Temperature);
        if (u.flow) j["flow"] = quantityJson(*u.flow, Dimension::MassFlow);
        appendExtra(j, u.extra);
        return j;
    }
};

}  // namespace

std::string writeProject(const Project& p) {
    std::vector<std::string> typed;
    std::string out = Writer(&typed).project(p);
    if (typed.empty()) return out;
    // Swap each placeholder for the typed characters; if a placeholder is not
    // found exactly once (a string value that happens to look like one), write
    // the numbers in nlohmann/json's form instead.
    // One pass over the dump (a search per placeholder made writing quadratic).
    const std::string_view open = "\"\\u0001hcnum", close = "\\u0001\"";
    std::vector<int> seen(typed.size(), 0);
    std::string swapped;
    swapped.reserve(out.size());
    std::size_t from = 0;
    for (std::size_t at = out.find(open); at != std::string::npos; at = out.find(open, at + 1)) {
        std::size_t k = 0, q = at + open.size();
        const std::size_t digits = q;
        while (q < out.size() && out[q] >= '0' && out[q] <= '9' && q - digits < 12) k = k * 10 + std::size_t(out[q++] - '0');
        if (q == digits || out.compare(q, close.size(), close) != 0) continue;  // not a placeholder
        if (k >= typed.size() || ++seen[k] > 1) return Writer(nullptr).project(p);
        swapped.append(std::string_view(out).substr(from, at - from)).append(typed[k]);
        from = q + close.size();
    }
    swapped.append(std::string_view(out).substr(from));
    for (int n : seen)
        if (n != 1) return Writer(nullptr).project(p);
    return swapped;
}

std::string Writer::project(const Project& p) const {
    Json j = Json::object();
    j["format"] = std::string(kProjectFormatName);
    j["version"] = p.version;

    Json meta = Json::object();
    auto put = [&](const char* key, const std::string& value) {
        if (!value.empty()) meta[key] = value;
    };
    put("title", p.meta.title);
    put("author", p.meta.author);
    put("revision", p.meta.revision);
    put("created", p.meta.created);
    put("modified", p.meta.modified);
    put("notes", p.meta.notes);
    appendExtra(meta, p.meta.extra);
    if (!meta.empty()) j["meta"] = std::move(meta);

    Json display = Json::object();
    display["units"] = std::string(unitSystemId(p.displayUnits));
    appendExtra(display, p.displayExtra);
    j["display"] = std::move(display);

    j["system"] = std::string(systemId(p.system));
    j["model"] = std::string(modelId(p.model));
    if (p.customSubstanceJson)
        j["substance"] = *p.customSubstanceJson;
    else
        j["substance"] = p.substanceId;

    Json basis = Json::object();
    switch (p.basis.kind) {
        case Basis::Kind::Mass: basis["mass"] = quantityJson(p.basis.amount, Dimension::Mass); break;
        case Basis::Kind::Amount: basis["amount"] = quantityJson(p.basis.amount, Dimension::Amount); break;
        case Basis::Kind::MassFlow: basis["massFlow"] = quantityJson(p.basis.amount, Dimension::MassFlow); break;
        case Basis::Kind::MolarFlow: basis["molarFlow"] = quantityJson(p.basis.amount, Dimension::MolarFlow); break;
    }
    appendExtra(basis, p.basis.extra);
    j["basis"] = std::move(basis);

    if (p.hasAtmosphere) j["atmosphere"] = quantityJson(p.atmosphere, Dimension::Pressure);
    if (p.hasSurroundings) {
        Json s = Json::object();
        s["T"] = quantityJson(p.surroundingsT, Dimension::Temperature);
        s["P"] = quantityJson(p.surroundingsP, Dimension::Pressure);
        appendExtra(s, p.surroundingsExtra);
        j["surroundings"] = std::move(s);
    }

    Json start = Json::object();
    if (p.start.T) start["T"] = quantityJson(*p.start.T, Dimension::Temperature);
    if (p.start.P) start["P"] = quantityJson(*p.start.P, Dimension::Pressure);
    if (p.start.quality) start["quality"] = number(*p.start.quality);
    if (p.start.meltFraction) start["meltFraction"] = number(*p.start.meltFraction);
    appendExtra(start, p.start.extra);
    j["start"] = std::move(start);

    // Utilities and minApproach: after start, before the unknown fields.
    if (p.minApproach) j["minApproach"] = quantityJson(*p.minApproach, Dimension::TemperatureDifference);
    if (p.hasUtilities || !p.utilities.empty()) {
        Json list = Json::array();
        for (const Utility& u : p.utilities) list.push_back(utility(u));
        j["utilities"] = std::move(list);
    }
    if (p.heatLoss) j["heatLoss"] = heatLoss(*p.heatLoss);

    // Unknown top-level fields keep their order, before the long list of steps.
    Json extra = p.extra;
    if (extra.is_object() && extra.contains("steps")) extra.erase("steps");
    appendExtra(j, extra);

    Json steps = Json::array();
    for (const Step& s : p.steps) steps.push_back(step(s, p.system));
    j["steps"] = std::move(steps);

    // Invalid UTF-8 cannot come from a parsed file; from code it is replaced
    // rather than thrown (writeProject cannot fail).
    return j.dump(2, ' ', false, Json::error_handler_t::replace) + "\n";
}

Result<Project> resolveProject(const Project& project) {
    return parseProject(writeProject(project), "worksheet");
}

Status saveProject(const Project& project, const std::filesystem::path& file) {
    return writeFileAtomically(file, writeProject(project), true);
}

}  // namespace heatchain
