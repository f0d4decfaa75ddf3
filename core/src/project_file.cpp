// Reading *.hchain project files, format version 1 (shared design:
// project-format.md): the file's frame (size, nesting, JSON syntax, format
// and version) and its top-level sections. The steps, utilities and
// heat-transfer fields are read in project_file_steps.cpp, the file is
// written by project_writer.cpp, and every value is read through JsonReader
// (json_reader.hpp).
//
// Reading is strict: every error names the JSON path (and the step id where
// there is one) and the line:column of the offending value. Known fields that
// do not belong where they are written (a "path" on a heat step) are errors;
// fields this version does not know are kept and written back, so a file
// from a newer minor revision or with a reviewer's additions survives a save.
//
// Writing is stable: fixed key order, 2-space indent, quantities exactly as
// typed. Top-level order: format, version, meta, display, system, model,
// substance, basis, atmosphere, surroundings, start, minApproach, utilities,
// then unknown top-level fields in their original order, then steps (last, because it is the long
// part a reviewer scrolls through). Inside a step: id, kind, to, at,
// fraction, path, n, efficiency, source, sink, note, then unknown fields.
// Dimensionless numbers are written with the characters typed in the file
// ("2.50" stays "2.50").
#include "heatchain/project_file.hpp"

#include <cerrno>
#include <cstring>
#include <fstream>
#include <set>
#include <string>
#include <utility>
#include <variant>
#include <vector>

#include "json_text.hpp"
#include "project_file_parts.hpp"
#include "substance_definition_json.hpp"
#include "substance_fields.hpp"

namespace heatchain {

namespace {

using detail::JsonPath;
using detail::child;
using detail::inQuotes;
using detail::jsonTypeName;
using detail::member;
using Reader = detail::JsonReader;
using Failure = detail::ReadFailure;

constexpr int kMaxDepth = detail::kMaxJsonDepth;
// A project is a few kilobytes; a 1,000-step worksheet about 300 kB.
constexpr std::uintmax_t kMaxFileBytes = std::uintmax_t{64} * 1024 * 1024;

constexpr std::string_view kFormatName = detail::kProjectFormatName;

// ---- Sections --------------------------------------------------------------

void readMeta(const Reader& r, const Json& v, Meta& meta) {
    const JsonPath path{{"meta", -1}};
    r.object(v, path, "meta");
    for (const detail::MetaField& f : detail::kMetaFields)
        if (auto s = r.optionalString(v, path, f.key)) meta.*f.member = *s;
    meta.extra = Reader::unknownFields(v, detail::kMetaKeys);
}

void readSubstance(const Reader& r, const Json& v, Project& p) {
    const JsonPath path{{"substance", -1}};
    if (v.is_string()) {
        const std::string& id = v.get_ref<const std::string&>();
        const SubstanceLibrary& library = SubstanceLibrary::builtin();
        if (const Substance* s = library.find(id)) {
            p.substance = *s;
            return;
        }
        std::string ids;
        for (const Substance& s : library.all()) ids += (ids.empty() ? "" : ", ") + s.id;
        r.fail(path, "unknown substance " + inQuotes(id) + "; the built-in library has " +
                         (ids.empty() ? std::string("no substances") : ids) +
                         " (or define one with an object, see the project format)");
    }
    if (!v.is_object())
        r.fail(path, "expected a substance id such as \"water\" or a substance definition object; found " +
                         jsonTypeName(v));
    // Read through this file's reader: an error names its path under
    // "substance" and its line:column in this file.
    std::optional<Substance> s = detail::readSubstanceDefinition(r, v, path);
    p.substance = std::move(*s);
    p.substance.custom = true;
    p.substance.definition = SubstanceDefinitionAccess::of(v);
}

void readBasis(const Reader& r, const Json& v, Project& p) {
    const JsonPath path{{"basis", -1}};
    r.object(v, path, "basis");
    struct Option {
        std::string_view key;
        Basis::Kind kind;
        Dimension dimension;
    };
    static constexpr Option options[] = {
        {"mass", Basis::Kind::Mass, Dimension::Mass},
        {"amount", Basis::Kind::Amount, Dimension::Amount},
        {"massFlow", Basis::Kind::MassFlow, Dimension::MassFlow},
        {"molarFlow", Basis::Kind::MolarFlow, Dimension::MolarFlow},
    };
    const Option* chosen = nullptr;
    for (const Option& o : options) {
        if (!member(v, o.key)) continue;
        if (chosen)
            r.fail(child(path, std::string(o.key)),
                   "basis has both " + std::string(chosen->key) + " and " + std::string(o.key) + "; give one");
        chosen = &o;
    }
    const std::string_view expected = p.system == SystemKind::Closed ? "mass or amount" : "massFlow or molarFlow";
    if (!chosen)
        r.fail(path, "basis needs " + std::string(expected) + " for a " + std::string(systemId(p.system)) +
                         " system, e.g. { \"" +
                         (p.system == SystemKind::Closed ? std::string("mass\": \"1 kg")
                                                         : std::string("massFlow\": \"4.2 t/h")) +
                         "\" }");
    p.basis.kind = chosen->kind;
    p.basis.amount = r.quantity(*member(v, chosen->key), child(path, std::string(chosen->key)), chosen->dimension);
    detail::enforce(r, detail::checkBasis(p.basis, p.system));
    p.basis.extra = Reader::unknownFields(v, {"mass", "amount", "massFlow", "molarFlow"});
}

void readStart(const Reader& r, const Json& v, StartSpec& start) {
    const JsonPath path{{"start", -1}};
    r.object(v, path, "start");
    start.T = r.optionalQuantity(v, path, "T", Dimension::Temperature);
    start.P = r.optionalQuantity(v, path, "P", Dimension::Pressure);
    if (const Json* q = member(v, "quality")) start.quality = r.number(*q, child(path, "quality"));
    if (const Json* m = member(v, "meltFraction")) start.meltFraction = r.number(*m, child(path, "meltFraction"));
    start.extra = Reader::unknownFields(v, {"T", "P", "quality", "meltFraction"});
    detail::enforce(r, detail::checkStart(start));
}


// ---- Parse errors from nlohmann/json ----------------------------------------

Error positioned(std::string message, std::string_view file, std::string_view text, std::size_t offset) {
    Error e = makeError(std::move(message), std::string(file));
    const auto pos = detail::positionOfOffset(text, offset);
    e.line = pos.line;
    e.column = pos.column;
    return e;
}

Result<Project> parseChecked(std::string_view text, std::string_view file) {
    // Empty or blank file.
    std::size_t first = text.substr(0, 3) == "\xEF\xBB\xBF" ? 3 : 0;
    while (first < text.size() && (text[first] == ' ' || text[first] == '\t' || text[first] == '\n' ||
                                   text[first] == '\r'))
        ++first;
    if (first >= text.size())
        return positioned("the file is empty; a Heatchain project is a JSON object starting with {", file, text, 0);

    auto parsed = detail::parseJsonText(text, kMaxDepth, detail::kMaxJsonValues);
    if (auto* fault = std::get_if<detail::JsonTextFault>(&parsed)) {
        using Kind = detail::JsonTextFault::Kind;
        if (fault->kind == Kind::TooDeep) fault->message += "; a Heatchain project never needs that (is this the right file?)";
        if (fault->kind == Kind::TooManyValues)
            fault->message += "; a Heatchain project of the largest allowed length has far fewer (is this the right file?)";
        return positioned(std::move(fault->message), file, text, fault->offset);
    }
    const Json root = std::move(std::get<Json>(parsed));

    Reader r(text, file, root);
    const JsonPath top;
    if (!root.is_object())
        r.fail(top, "a Heatchain project is a JSON object {...}; this file holds " + jsonTypeName(root));

    // Format and version first: a newer file may differ in everything else.
    const Json* format = member(root, "format");
    if (!format)
        r.fail(top, "this is not a Heatchain project: \"format\": \"heatchain-project\" is missing");
    if (!format->is_string() || format->get_ref<const std::string&>() != kFormatName)
        r.fail({{"format", -1}}, "this is not a Heatchain project: \"format\" is " + format->dump() +
                                     ", expected \"heatchain-project\"");
    const Json* version = member(root, "version");
    if (!version) r.fail(top, "\"version\" is missing; this Heatchain reads version 1");
    if (!version->is_number_integer())
        r.fail({{"version", -1}}, "\"version\" must be a whole number such as 1; found " + version->dump());
    const long long v = version->is_number_unsigned() ? static_cast<long long>(std::min<std::uint64_t>(
                                                            version->get<std::uint64_t>(), 1ull << 62))
                                                      : version->get<long long>();
    if (v == 2)  // streams.hpp reads it; this reader holds one stream
        r.fail({{"version", -1}}, "this worksheet holds several streams (format version 2), which this part of "
                                  "Heatchain does not open yet; heatchain-cli compute, targets and chart read it");
    if (v > kProjectFormatVersion)
        r.fail({{"version", -1}}, "file is format version " + std::to_string(v) + "; this Heatchain reads version " +
                                      std::to_string(kProjectFormatVersion) + " (a newer Heatchain wrote it)");
    if (v < 1) r.fail({{"version", -1}}, "format version " + std::to_string(v) + " does not exist; expected 1");

    Project p;
    p.version = static_cast<int>(v);

    if (const Json* meta = member(root, "meta")) readMeta(r, *meta, p.meta);

    if (const Json* display = member(root, "display")) {
        const JsonPath path{{"display", -1}};
        r.object(*display, path, "display");
        if (const Json* u = member(*display, "units")) {
            auto system = parseUnitSystem(r.string(*u, child(path, "units")));
            if (!system) r.fail(child(path, "units"), system.error().message);
            p.displayUnits = *system;
        }
        p.displayExtra = Reader::unknownFields(*display, {"units"});
    }

    const Json* system = member(root, "system");
    if (!system) r.fail(top, "\"system\" is missing: \"closed\" (a batch) or \"steady-flow\"");
    const std::string systemText = r.string(*system, {{"system", -1}});
    if (systemText == "closed")
        p.system = SystemKind::Closed;
    else if (systemText == "steady-flow")
        p.system = SystemKind::SteadyFlow;
    else
        r.fail({{"system", -1}}, "unknown system " + inQuotes(systemText) + "; valid ones are closed, steady-flow");

    if (const Json* model = member(root, "model")) {
        auto m = parseModelKind(r.string(*model, {{"model", -1}}));
        if (!m) r.fail({{"model", -1}}, m.error().message);
        p.model = *m;
    }

    // The atmosphere comes before every other quantity: gauge pressures need it.
    if (const Json* atm = member(root, "atmosphere")) {
        const JsonPath path{{"atmosphere", -1}};
        const Quantity a = r.quantity(*atm, path, Dimension::Pressure);
        detail::enforce(r, detail::checkAtmosphere(a));
        p.atmosphere = a;
    }
    r.units = p.unitContext();

    const Json* substance = member(root, "substance");
    if (!substance) r.fail(top, "\"substance\" is missing: a library id such as \"water\" or a definition object");
    readSubstance(r, *substance, p);

    const Json* basis = member(root, "basis");
    if (!basis)
        r.fail(top, std::string("\"basis\" is missing: ") +
                        (p.system == SystemKind::Closed ? "{ \"mass\": \"1 kg\" } or amount"
                                                        : "{ \"massFlow\": \"4.2 t/h\" } or molarFlow"));
    readBasis(r, *basis, p);

    if (const Json* surroundings = member(root, "surroundings")) {
        const JsonPath path{{"surroundings", -1}};
        r.object(*surroundings, path, "surroundings");
        Surroundings s;
        if (auto T = r.optionalQuantity(*surroundings, path, "T", Dimension::Temperature)) s.T = *T;
        if (auto P = r.optionalQuantity(*surroundings, path, "P", Dimension::Pressure)) s.P = *P;
        s.extra = Reader::unknownFields(*surroundings, {"T", "P"});
        p.surroundings = std::move(s);
    }

    const Json* start = member(root, "start");
    if (!start) r.fail(top, "\"start\" is missing: the state the material starts in, e.g. { \"T\": \"48 degC\", "
                            "\"P\": \"1.4 bar\" }");
    readStart(r, *start, p.start);

    detail::readUtilities(r, root, p);
    if (const Json* h = member(root, "heatLoss")) {
        p.heatLoss = detail::readHeatLoss(r, *h, {{"heatLoss", -1}});
        detail::enforce(r, detail::checkHeatLoss(*p.heatLoss, {{"heatLoss", -1}}, p.system));
    }

    const Json* steps = member(root, "steps");
    if (!steps) r.fail(top, "\"steps\" is missing (an empty list [] is fine)");
    if (!steps->is_array()) r.fail({{"steps", -1}}, "\"steps\" must be a list [...]; found " + jsonTypeName(*steps));
    if (steps->size() > detail::kMaxSteps)
        r.fail({{"steps", -1}}, "has " + std::to_string(steps->size()) + " steps; a worksheet holds at most " +
                                    std::to_string(detail::kMaxSteps) + " (split it into several)");
    p.steps.reserve(steps->size());
    long index = 0;
    for (const Json& s : *steps) p.steps.push_back(detail::readStep(r, s, index++, p));
    detail::enforce(r, detail::checkStepIds(p.steps));
    detail::enforce(r, detail::checkUtilityReferences(p));

    p.extra = Reader::unknownFields(root, {"format", "version", "meta", "display", "system", "model", "substance",
                                           "basis", "atmosphere", "surroundings", "start", "steps",
                                           "minApproach", "utilities", "heatLoss"});
    return p;
}

std::string osReason(int error) { return std::strerror(error); }

}  // namespace

Result<std::string> detail::readProjectText(const std::filesystem::path& file) {
    std::error_code ec;
    const std::string name = file.string();
    if (std::filesystem::is_directory(file, ec)) return makeError("this is a folder, not a project file", name);
    const std::uintmax_t size = std::filesystem::file_size(file, ec);
    if (ec) return makeError("cannot open: " + ec.message(), name);
    if (size > kMaxFileBytes)
        return makeError("the file is " + std::to_string(size / (std::uintmax_t{1024} * 1024)) +
                             " MiB; a Heatchain project is far smaller (limit 64 MiB)",
                         name);
    std::ifstream in(file, std::ios::binary);
    if (!in) return makeError("cannot open: " + osReason(errno), name);
    std::string text;
    text.resize(static_cast<std::size_t>(size));
    in.read(text.data(), static_cast<std::streamsize>(size));
    text.resize(static_cast<std::size_t>(in.gcount()));
    if (in.bad()) return makeError("cannot read: " + osReason(errno), name);
    return text;
}

Result<Project> parseProject(std::string_view text, std::string_view fileName) {
    try {
        return parseChecked(text, fileName);
    } catch (const Failure& f) {
        return f.error;
    } catch (const std::exception& e) {
        return makeError(std::string("cannot read the project: ") + e.what(), std::string(fileName));
    } catch (...) {
        return makeError("cannot read the project (unexpected failure)", std::string(fileName));
    }
}

Result<Project> loadProject(const std::filesystem::path& file) {
    auto text = detail::readProjectText(file);
    if (!text) return text.error();
    return parseProject(*text, file.string());
}

}  // namespace heatchain
