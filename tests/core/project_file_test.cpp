// Project files (format version 1): reading, strict validation with
// positioned errors, stable writing, atomic saving.
//
// The example project and the custom substance below are the examples of
// the shared design note project-format.md (version 1), copied verbatim.
// Expected SI values come from the unit definitions of NIST SP 811 (2008)
// (4.2.1.1: T/K = t/°C + 273.15; B.8: bar = 1E+05 Pa, hour = 3600 s).
#include "heatchain/json.hpp"
#include "heatchain/project_file.hpp"
#include "heatchain/streams.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>

#include "../../core/src/atomic_save_faults.hpp"

namespace heatchain {
namespace {

namespace fs = std::filesystem;

// project-format.md, "Project file: *.hchain", the example, verbatim.
const std::string kFormatExample = R"json({
  "format": "heatchain-project",
  "version": 1,
  "meta": {
    "title": "Condensate return to process steam, line 2",
    "author": "R. Okafor",
    "revision": "B",
    "created": "2026-11-30T08:15:00Z",
    "modified": "2026-12-01T10:02:00Z",
    "notes": "Free text for the reviewer."
  },
  "display": { "units": "SI" },
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "4.2 t/h" },
  "atmosphere": "101.325 kPa",
  "surroundings": { "T": "25 degC", "P": "1 atm" },
  "start": { "T": "48 degC", "P": "1.4 bar" },
  "steps": [
    { "id": "feed-pump", "kind": "compress", "to": { "P": "14 barg" },
      "path": "adiabatic", "efficiency": 0.65 },
    { "id": "economiser", "kind": "heat", "to": { "T": "180 degC" },
      "source": { "T": "240 degC" }, "note": "flue-gas side" },
    { "id": "evaporate", "kind": "boil" },
    { "id": "superheat", "kind": "heat", "to": { "T": "265 degC" },
      "source": { "T": "420 degC" } },
    { "id": "let-down", "kind": "throttle", "to": { "P": "4 barg" } }
  ]
}
)json";

// project-format.md, the custom substance example, verbatim.
const std::string kCustomSubstance = R"json({ "id": "test-wax", "name": "Test wax", "molarMass": "0.352 kg/mol",
    "source": "supplier data sheet TW-3, rev 2",
    "phases": { "solid":  { "cp": "2.0 kJ/(kg K)" },
                "liquid": { "cp": { "T": ["60 degC", "120 degC", "180 degC"],
                                    "cp": ["2.21 kJ/(kg K)", "2.35 kJ/(kg K)", "2.49 kJ/(kg K)"] } },
                "vapor":  { "cp": "1.6 kJ/(kg K)" } },
    "melting": { "T": "58 degC", "enthalpy": "190 kJ/kg" },
    "boiling": { "T": "350 degC", "P": "1 atm", "enthalpy": "300 kJ/kg" },
    "critical": { "T": "650 K", "P": "1.2 MPa", "acentricFactor": 0.9 } })json";

// Replaces the first occurrence of `from` (which must be there).
std::string replaced(std::string text, const std::string& from, const std::string& to) {
    const auto at = text.find(from);
    EXPECT_NE(at, std::string::npos) << "test setup: '" << from << "' not in the text";
    if (at != std::string::npos) text.replace(at, from.size(), to);
    return text;
}

// Line and column (1-based, in characters) of the first occurrence of
// `needle`, counted here independently of the code under test.
std::pair<int, int> positionOf(const std::string& text, const std::string& needle) {
    const auto at = text.find(needle);
    EXPECT_NE(at, std::string::npos) << needle;
    int line = 1, column = 1;
    for (std::size_t i = 0; i < at; ++i) {
        const unsigned char c = static_cast<unsigned char>(text[i]);
        if (c == '\n') {
            ++line;
            column = 1;
        } else if ((c & 0xC0) != 0x80) {
            ++column;
        }
    }
    return {line, column};
}

Error errorOf(const std::string& text) {
    auto r = parseProject(text, "plant.hchain");
    EXPECT_FALSE(r.ok()) << "parsed without error:\n" << text;
    return r.ok() ? Error{} : r.error();
}

#define EXPECT_CONTAINS(haystack, needle) \
    EXPECT_NE(std::string(haystack).find(needle), std::string::npos) << "in: " << (haystack)

// The error names `where`, contains `message`, and points at `needle`.
void expectError(const std::string& text, const std::string& where, const std::string& message,
                 const std::string& needle) {
    const Error e = errorOf(text);
    EXPECT_CONTAINS(e.where, where);
    EXPECT_CONTAINS(e.where, "plant.hchain");
    EXPECT_CONTAINS(e.message, message);
    const auto [line, column] = positionOf(text, needle);
    EXPECT_EQ(e.line, line) << e.text();
    EXPECT_EQ(e.column, column) << e.text();
    EXPECT_CONTAINS(e.text(), "(line " + std::to_string(line) + ", column " + std::to_string(column) + ")");
}

TEST(ProjectFile, ReadsTheFormatExample) {
    auto r = parseProject(kFormatExample);
    ASSERT_TRUE(r.ok()) << r.error().text();
    const Project& p = *r;
    EXPECT_EQ(p.version, 1);
    EXPECT_EQ(p.meta.title, "Condensate return to process steam, line 2");
    EXPECT_EQ(p.meta.revision, "B");
    EXPECT_EQ(p.displayUnits, UnitSystem::SI);
    EXPECT_EQ(p.system, SystemKind::SteadyFlow);
    EXPECT_EQ(p.model, ModelKind::Reference);
    EXPECT_EQ(p.substance.id, "water");
    EXPECT_FALSE(p.substance.definition.has_value());
    EXPECT_EQ(p.basis.kind, Basis::Kind::MassFlow);
    EXPECT_NEAR(p.basis.amount.si, 4200.0 / 3600.0, 1e-15);  // 4.2 t/h; NIST SP 811 B.8 (hour = 3600 s)
    EXPECT_EQ(p.basis.amount.text, "4.2 t/h");
    ASSERT_TRUE(p.atmosphere);
    EXPECT_DOUBLE_EQ(p.atmosphere->si, 101325.0);
    ASSERT_TRUE(p.surroundings);
    EXPECT_DOUBLE_EQ(p.surroundings->T.si, 298.15);     // NIST SP 811 4.2.1.1
    EXPECT_DOUBLE_EQ(p.surroundings->P.si, 101325.0);   // NIST SP 811 B.8, atmosphere
    ASSERT_TRUE(p.start.T && p.start.P);
    EXPECT_DOUBLE_EQ(p.start.T->si, 321.15);          // 48 degC
    EXPECT_DOUBLE_EQ(p.start.P->si, 140000.0);        // 1.4 bar
    ASSERT_EQ(p.steps.size(), 5u);

    const Step& pump = p.steps[0];
    EXPECT_EQ(pump.id, "feed-pump");
    EXPECT_EQ(pump.kind, StepKind::Compress);
    ASSERT_TRUE(pump.to.P);
    EXPECT_DOUBLE_EQ(pump.to.P->si, 14e5 + 101325.0);  // gauge on the file's atmosphere
    EXPECT_EQ(pump.to.P->text, "14 barg");
    EXPECT_EQ(pump.path, PathKind::Adiabatic);
    ASSERT_TRUE(pump.efficiency);
    EXPECT_DOUBLE_EQ(pump.efficiency->value, 0.65);

    const Step& eco = p.steps[1];
    EXPECT_EQ(eco.kind, StepKind::Heat);
    EXPECT_DOUBLE_EQ(eco.to.T->si, 453.15);
    ASSERT_TRUE(eco.source && eco.source->T);
    EXPECT_DOUBLE_EQ(eco.source->T->si, 513.15);
    EXPECT_EQ(eco.note, "flue-gas side");
    EXPECT_EQ(p.steps[2].kind, StepKind::Boil);
    EXPECT_TRUE(p.steps[2].to.empty());
    EXPECT_EQ(p.steps[4].kind, StepKind::Throttle);
    EXPECT_DOUBLE_EQ(p.steps[4].to.P->si, 4e5 + 101325.0);

    EXPECT_EQ(p.findStep("superheat"), &p.steps[3]);
    EXPECT_EQ(p.findStep("nope"), nullptr);
    EXPECT_NEAR(p.massBasis(), 4200.0 / 3600.0, 1e-15);
}

TEST(ProjectFile, GaugePressuresUseTheFilesAtmosphere) {
    const std::string text = replaced(kFormatExample, "\"101.325 kPa\"", "\"0.9 bar\"");
    auto r = parseProject(text);
    ASSERT_TRUE(r.ok()) << r.error().text();
    EXPECT_DOUBLE_EQ(r->steps[0].to.P->si, 14e5 + 0.9e5);
}

TEST(ProjectFile, WritesInTheDocumentedLayout) {
    // Expected bytes written by hand from the documented rules (fixed key
    // order, 2-space indent, quantities as typed, trailing newline).
    const std::string in = R"json({"steps": [{"kind": "cool", "to": {"T": "20 degC"}, "id": "chill",
        "sink": {"T": "5 degC"}}], "start": {"P": "1 bar", "T": "80 degC"}, "basis": {"mass": "2 kg"},
        "substance": "water", "system": "closed", "version": 1, "format": "heatchain-project",
        "model": "constant-cp"})json";
    const std::string expected = R"json({
  "format": "heatchain-project",
  "version": 1,
  "display": {
    "units": "SI"
  },
  "system": "closed",
  "model": "constant-cp",
  "substance": "water",
  "basis": {
    "mass": "2 kg"
  },
  "start": {
    "T": "80 degC",
    "P": "1 bar"
  },
  "steps": [
    {
      "id": "chill",
      "kind": "cool",
      "to": {
        "T": "20 degC"
      },
      "sink": {
        "T": "5 degC"
      }
    }
  ]
}
)json";
    auto r = parseProject(in);
    ASSERT_TRUE(r.ok()) << r.error().text();
    EXPECT_EQ(writeProject(*r), expected);
}

TEST(ProjectFile, RoundTripIsByteStable) {
    for (const std::string& source :
         {kFormatExample, replaced(kFormatExample, "\"water\"", kCustomSubstance)}) {
        auto first = parseProject(source);
        ASSERT_TRUE(first.ok()) << first.error().text();
        const std::string written = writeProject(*first);
        auto second = parseProject(written);
        ASSERT_TRUE(second.ok()) << second.error().text() << "\n" << written;
        // write(parse(write(p))) == write(p): same project, same bytes.
        EXPECT_EQ(writeProject(*second), written);
        EXPECT_EQ(written.back(), '\n');
        // parse(write(parse(f))) == parse(f), field by field where it matters.
        EXPECT_EQ(second->steps.size(), first->steps.size());
        for (std::size_t i = 0; i < first->steps.size(); ++i) {
            EXPECT_EQ(second->steps[i].id, first->steps[i].id);
            EXPECT_EQ(second->steps[i].kind, first->steps[i].kind);
            EXPECT_EQ(second->steps[i].to.T.has_value(), first->steps[i].to.T.has_value());
            if (first->steps[i].to.P) {
                EXPECT_EQ(second->steps[i].to.P->si, first->steps[i].to.P->si);
            }
        }
        EXPECT_EQ(second->start.T->text, "48 degC");
        EXPECT_EQ(second->basis.amount.si, first->basis.amount.si);
        EXPECT_EQ(second->substance.definition, first->substance.definition);
        // Quantities stay as typed.
        EXPECT_CONTAINS(written, "\"P\": \"14 barg\"");
        EXPECT_CONTAINS(written, "\"efficiency\": 0.65");
    }
}

TEST(ProjectFile, CustomSubstanceIsKeptAsWritten) {
    auto r = parseProject(replaced(kFormatExample, "\"water\"", kCustomSubstance));
    ASSERT_TRUE(r.ok()) << r.error().text();
    ASSERT_TRUE(r->substance.definition);
    EXPECT_EQ(r->substance.id, "test-wax");
    EXPECT_TRUE(r->substance.custom);
    EXPECT_EQ(r->substance.definition->compact(), Json::parse(kCustomSubstance).dump());
    // Key order inside the definition is the author's, not alphabetical.
    const std::string written = writeProject(*r);
    EXPECT_LT(written.find("\"name\": \"Test wax\""), written.find("\"molarMass\""));
    EXPECT_LT(written.find("\"molarMass\""), written.find("\"source\": \"supplier"));
}

// An error inside a custom substance names its path under "substance" and
// the line:column of the value in the project file. The positions are counted
// by hand from the texts below (line 1 is the one with "format").
TEST(ProjectFile, CustomSubstanceErrorsGiveTheirPathAndPosition) {
    // "2.2 kJ/kg" is not a heat capacity: line 5, after 13 spaces.
    const std::string wrongUnit = R"json({ "format": "heatchain-project", "version": 1, "system": "closed",
  "substance": { "id": "test-oil", "name": "Test oil", "molarMass": "0.3 kg/mol",
    "phases": { "liquid": { "cp": { "T": ["20 degC", "80 degC"],
      "cp": ["2.0 kJ/(kg K)",
             "2.2 kJ/kg"] } } } },
  "basis": { "mass": "1 kg" },
  "start": { "T": "20 degC", "P": "1 bar" },
  "steps": [] })json";
    Error e = errorOf(wrongUnit);
    EXPECT_EQ(e.where, "plant.hchain: substance.phases.liquid.cp.cp[1]");
    EXPECT_CONTAINS(e.message, "a heat capacity per kilogram");
    EXPECT_EQ(e.line, 5);
    EXPECT_EQ(e.column, 14);

    // An unknown key that is not a plain name (it holds a dot) is written
    // ["T.max"] and located at its value: line 4, 17 spaces, then "T.max": .
    const std::string dottedKey = R"json({ "format": "heatchain-project", "version": 1, "system": "closed",
  "substance": { "id": "test-oil", "name": "Test oil", "molarMass": "0.3 kg/mol",
    "melting": { "T": "10 degC", "enthalpy": "150 kJ/kg",
                 "T.max": "12 degC" } },
  "basis": { "mass": "1 kg" },
  "start": { "T": "20 degC", "P": "1 bar" },
  "steps": [] })json";
    e = errorOf(dottedKey);
    EXPECT_EQ(e.where, "plant.hchain: substance.melting[\"T.max\"]");
    EXPECT_CONTAINS(e.message, "unknown field \"T.max\"");
    EXPECT_EQ(e.line, 4);
    EXPECT_EQ(e.column, 27);
}

TEST(ProjectFile, UnknownFieldsAreKeptInOrderAfterKnownOnes) {
    std::string text = replaced(kFormatExample, "\"steps\": [",
                                "\"spares\": [{\"name\": \"LP steam\"}], \"zeta\": 1, \"alpha\": true,\n  \"steps\": [");
    text = replaced(text, "\"note\": \"flue-gas side\"", "\"note\": \"flue-gas side\", \"cost-code\": \"E-12\"");
    text = replaced(text, "{ \"P\": \"14 barg\" }", "{ \"P\": \"14 barg\", \"tolerance\": \"0.1 bar\" }");
    text = replaced(text, "\"notes\": \"Free text for the reviewer.\"",
                    "\"notes\": \"Free text for the reviewer.\", \"checkedBy\": \"T. Lund\"");
    text = replaced(text, "{ \"units\": \"SI\" }", "{ \"units\": \"SI\", \"digits\": 4 }");
    text = replaced(text, "{ \"massFlow\": \"4.2 t/h\" }", "{ \"massFlow\": \"4.2 t/h\", \"basisNote\": \"design\" }");
    text = replaced(text, "\"P\": \"1.4 bar\" }", "\"P\": \"1.4 bar\", \"measured\": \"TI-201\" }");
    text = replaced(text, "\"P\": \"1 atm\" }", "\"P\": \"1 atm\", \"site\": \"north\" }");
    text = replaced(text, "\"source\": { \"T\": \"240 degC\" }", "\"source\": { \"T\": \"240 degC\", \"fluid\": \"flue gas\" }");
    auto r = parseProject(text);
    ASSERT_TRUE(r.ok()) << r.error().text();
    EXPECT_EQ(r->extra.size(), 3u);
    EXPECT_EQ(r->steps[1].extra.string("cost-code"), "E-12");
    EXPECT_EQ(r->steps[0].to.extra.string("tolerance"), "0.1 bar");
    EXPECT_EQ(r->meta.extra.string("checkedBy"), "T. Lund");
    EXPECT_EQ(r->displayExtra.json("digits"), "4");
    EXPECT_EQ(r->basis.extra.string("basisNote"), "design");
    EXPECT_EQ(r->start.extra.string("measured"), "TI-201");
    ASSERT_TRUE(r->surroundings);
    EXPECT_EQ(r->surroundings->extra.string("site"), "north");
    EXPECT_EQ(r->steps[1].source->extra.string("fluid"), "flue gas");

    const std::string written = writeProject(*r);
    // Top-level unknowns in their original order, after "start", before "steps".
    const auto start = written.find("\"start\"");
    const auto utilities = written.find("\"spares\"");
    const auto zeta = written.find("\"zeta\"");
    const auto alpha = written.find("\"alpha\"");
    const auto steps = written.find("\"steps\"");
    EXPECT_LT(start, utilities);
    EXPECT_LT(utilities, zeta);
    EXPECT_LT(zeta, alpha);
    EXPECT_LT(alpha, steps);
    // A step's unknown field comes after its known ones.
    EXPECT_LT(written.find("\"note\": \"flue-gas side\""), written.find("\"cost-code\""));
    for (const char* kept : {"\"checkedBy\"", "\"digits\": 4", "\"basisNote\"", "\"measured\"", "\"site\"",
                             "\"fluid\"", "\"tolerance\"", "\"LP steam\""})
        EXPECT_CONTAINS(written, kept);
    auto again = parseProject(written);
    ASSERT_TRUE(again.ok());
    EXPECT_EQ(writeProject(*again), written);
}

TEST(ProjectFile, EmptyNotJsonAndInvalidUtf8) {
    for (const std::string& blank : {std::string(), std::string("  \n\t ")}) {
        const Error e = errorOf(blank);
        EXPECT_CONTAINS(e.message, "empty");
        EXPECT_EQ(e.line, 1);
        EXPECT_EQ(e.where, "plant.hchain");
    }
    {
        const std::string text = "{\n  \"format\": \"heatchain-project\",\n  \"version\": tru\n}";
        const Error e = errorOf(text);
        EXPECT_CONTAINS(e.message, "not valid JSON");
        EXPECT_EQ(e.line, 3);
        EXPECT_GT(e.column, 0);
    }
    {
        const Error e = errorOf("this is a spreadsheet");
        EXPECT_CONTAINS(e.message, "not valid JSON");
        EXPECT_EQ(e.line, 1);
    }
    {
        const std::string text = replaced(kFormatExample, "flue-gas side", "flue\xFF gas");
        const Error e = errorOf(text);
        EXPECT_CONTAINS(e.message, "UTF-8");
        const auto [line, column] = positionOf(text, "\xFF");
        EXPECT_EQ(e.line, line);
        EXPECT_EQ(e.column, column);
    }
    EXPECT_CONTAINS(errorOf("[1, 2]").message, "a JSON object");
}

TEST(ProjectFile, FormatAndVersion) {
    expectError(replaced(kFormatExample, "\"heatchain-project\"", "\"spreadsheet\""), "format",
                "not a Heatchain project", "\"spreadsheet\"");
    EXPECT_CONTAINS(errorOf(replaced(kFormatExample, "\"format\": \"heatchain-project\",", "")).message,
                    "\"format\": \"heatchain-project\" is missing");
    expectError(replaced(kFormatExample, "\"version\": 1", "\"version\": 3"), "version",
                "file is format version 3; this Heatchain reads version 1", "3,");
    expectError(replaced(kFormatExample, "\"version\": 1", "\"version\": \"1\""), "version",
                "must be a whole number", "\"1\",");
    expectError(replaced(kFormatExample, "\"version\": 1", "\"version\": 1.5"), "version",
                "must be a whole number", "1.5");
    expectError(replaced(kFormatExample, "\"version\": 1", "\"version\": 0"), "version", "does not exist", "0,");
    EXPECT_CONTAINS(errorOf(replaced(kFormatExample, "\"version\": 1,", "")).message, "\"version\" is missing");
}

TEST(ProjectFile, StepKindSubstanceAndUnits) {
    expectError(replaced(kFormatExample, "\"kind\": \"boil\"", "\"kind\": \"warm\""), "step \"evaporate\" (steps[2]).kind",
                "unknown step kind 'warm'; valid kinds are heat, cool", "\"warm\"");
    {
        const std::string text = replaced(kFormatExample, "\"water\"", "\"unobtainium\"");
        expectError(text, "substance", "unknown substance \"unobtainium\"", "\"unobtainium\"");
        EXPECT_CONTAINS(errorOf(text).message, "water");
    }
    expectError(replaced(kFormatExample, "\"180 degC\"", "\"180\""), "step \"economiser\" (steps[1]).to.T",
                "needs a unit, e.g. 25 degC", "\"180\"");
    expectError(replaced(kFormatExample, "\"180 degC\"", "180"), "step \"economiser\" (steps[1]).to.T",
                "without a unit (180)", "180 }");
    expectError(replaced(kFormatExample, "\"180 degC\"", "\"180 degQ\""), "step \"economiser\" (steps[1]).to.T",
                "unknown unit 'degQ'", "\"180 degQ\"");
    expectError(replaced(kFormatExample, "\"180 degC\"", "\"3 bar\""), "step \"economiser\" (steps[1]).to.T",
                "'3 bar' is a pressure; a temperature is expected here", "\"3 bar\"");
    expectError(replaced(kFormatExample, "\"48 degC\"", "\"-300 degC\""), "start.T", "below absolute zero",
                "\"-300 degC\"");
    expectError(replaced(kFormatExample, "\"48 degC\"", "\"NaN degC\""), "start.T", "not a finite number",
                "\"NaN degC\"");
    expectError(replaced(kFormatExample, "\"48 degC\"", "\"Infinity K\""), "start.T", "not a finite number",
                "\"Infinity K\"");
    expectError(replaced(kFormatExample, "\"48 degC\"", "\"hot\""), "start.T", "does not start with a number",
                "\"hot\"");
    expectError(replaced(kFormatExample, "\"4 barg\"", "\"-2 barg\""), "step \"let-down\" (steps[4]).to.P",
                "below zero absolute pressure", "\"-2 barg\"");
    expectError(replaced(kFormatExample, "\"4.2 t/h\"", "\"-4.2 t/h\""), "basis.massFlow", "negative",
                "\"-4.2 t/h\"");
    expectError(replaced(kFormatExample, "\"4.2 t/h\"", "\"0 t/h\""), "basis.massFlow", "greater than zero",
                "\"0 t/h\"");
    expectError(replaced(kFormatExample, "\"101.325 kPa\"", "\"0 barg\""), "atmosphere", "absolute pressure",
                "\"0 barg\"");
    expectError(replaced(kFormatExample, "\"model\": \"reference\"", "\"model\": \"magic\""), "model", "magic",
                "\"magic\"");
    expectError(replaced(kFormatExample, "\"units\": \"SI\"", "\"units\": \"imperial\""), "display.units",
                "imperial", "\"imperial\"");
    expectError(replaced(kFormatExample, "\"steady-flow\"", "\"open\""), "system", "closed, steady-flow",
                "\"open\"");
}

TEST(ProjectFile, DimensionlessBounds) {
    expectError(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": 0"),
                "step \"feed-pump\" (steps[0]).efficiency", "(0, 1]", "0 }");
    expectError(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": 1.2"),
                "step \"feed-pump\" (steps[0]).efficiency", "(0, 1]", "1.2");
    expectError(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": \"fast\""),
                "step \"feed-pump\" (steps[0]).efficiency", "does not start with a number", "\"fast\"");
    expectError(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": 1e999"),
                "plant.hchain", "beyond the range of a double", "1e999");
    expectError(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": true"),
                "step \"feed-pump\" (steps[0]).efficiency", "expected a number", "true");
    {
        // "65 %" is a valid efficiency and is written back as typed.
        auto r = parseProject(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": \"65 %\""));
        ASSERT_TRUE(r.ok()) << r.error().text();
        EXPECT_DOUBLE_EQ(r->steps[0].efficiency->value, 0.65);
        EXPECT_CONTAINS(writeProject(*r), "\"efficiency\": \"65 %\"");
    }
    expectError(replaced(kFormatExample, "{ \"id\": \"evaporate\", \"kind\": \"boil\" }",
                         "{ \"id\": \"evaporate\", \"kind\": \"boil\", \"fraction\": 0 }"),
                "step \"evaporate\" (steps[2]).fraction", "(0, 1]", "0 }");
    expectError(replaced(kFormatExample, "{ \"id\": \"evaporate\", \"kind\": \"boil\" }",
                         "{ \"id\": \"evaporate\", \"kind\": \"boil\", \"fraction\": 1.5 }"),
                "step \"evaporate\" (steps[2]).fraction", "(0, 1]", "1.5");
    expectError(replaced(kFormatExample, "{ \"T\": \"180 degC\" }", "{ \"quality\": 1.1 }"),
                "step \"economiser\" (steps[1]).to.quality", "[0, 1]", "1.1");
    expectError(replaced(kFormatExample, "{ \"T\": \"48 degC\", \"P\": \"1.4 bar\" }",
                         "{ \"P\": \"1.4 bar\", \"quality\": -0.1 }"),
                "start.quality", "[0, 1]", "-0.1");
    expectError(replaced(kFormatExample, "{ \"P\": \"14 barg\" }", "{ \"ratio\": 0.5 }"),
                "step \"feed-pump\" (steps[0]).to.ratio", "greater than 1", "0.5");
    // Boundaries that are valid: quality 0 and 1, fraction 1, efficiency 1.
    EXPECT_TRUE(parseProject(replaced(kFormatExample, "{ \"T\": \"180 degC\" }", "{ \"quality\": 1 }")).ok());
    EXPECT_TRUE(parseProject(replaced(kFormatExample, "{ \"T\": \"48 degC\", \"P\": \"1.4 bar\" }",
                                      "{ \"P\": \"1.4 bar\", \"quality\": 0 }"))
                    .ok());
    EXPECT_TRUE(parseProject(replaced(kFormatExample, "\"efficiency\": 0.65", "\"efficiency\": 1")).ok());
}

TEST(ProjectFile, StepStructure) {
    expectError(replaced(kFormatExample, "\"id\": \"let-down\"", "\"id\": \"economiser\""),
                "(steps[4]).id", "\"economiser\" is used twice (also steps[1])", "\"economiser\", \"kind\": \"throttle\"");
    expectError(replaced(kFormatExample, "{ \"id\": \"evaporate\", \"kind\": \"boil\" }", "{ \"kind\": \"boil\" }"),
                "steps[2]", "has no id", "{ \"kind\": \"boil\" }");
    expectError(replaced(kFormatExample, "\"id\": \"evaporate\"", "\"id\": \"\""), "steps[2].id", "empty",
                "\"\", \"kind\": \"boil\"");
    expectError(replaced(kFormatExample, "\"id\": \"evaporate\"", "\"id\": 7"), "steps[2].id",
                "expected a string", "7, \"kind\"");
    expectError(replaced(kFormatExample, "{ \"id\": \"evaporate\", \"kind\": \"boil\" }",
                         "{ \"id\": \"evaporate\", \"kind\": \"boil\", \"path\": \"isothermal\" }"),
                "step \"evaporate\" (steps[2]).path", "\"path\" does not belong to a boil step", "\"isothermal\"");
    expectError(replaced(kFormatExample, "\"note\": \"flue-gas side\"", "\"path\": \"adiabatic\""),
                "step \"economiser\" (steps[1]).path", "does not belong to a heat step", "\"adiabatic\" }");
    expectError(replaced(kFormatExample, "{ \"T\": \"180 degC\" }", "{ \"P\": \"10 bar\" }"),
                "step \"economiser\" (steps[1]).to.P", "cannot aim at P", "\"10 bar\"");
    expectError(replaced(kFormatExample, "{ \"T\": \"180 degC\" }", "{ \"T\": \"180 degC\", \"duty\": \"5 kW\" }"),
                "step \"economiser\" (steps[1]).to.duty", "one target", "\"5 kW\"");
    expectError(replaced(kFormatExample, "{ \"T\": \"180 degC\" }", "{ \"duty\": \"5 kJ\" }"),
                "step \"economiser\" (steps[1]).to.duty", "is an energy; a power is expected", "\"5 kJ\"");
    expectError(replaced(kFormatExample, "\"to\": { \"T\": \"180 degC\" }", "\"to\": \"180 degC\""),
                "step \"economiser\" (steps[1]).to", "must be an object", "\"180 degC\"");
    expectError(replaced(kFormatExample, "\"note\": \"flue-gas side\"", "\"note\": 5555"),
                "step \"economiser\" (steps[1]).note", "expected a string", "5555");
    expectError(replaced(kFormatExample, "\"to\": { \"T\": \"265 degC\" },", ""), "step \"superheat\" (steps[3])",
                "needs a target", "{ \"id\": \"superheat\"");
    {
        // A missing path means adiabatic with an efficiency, else isentropic
        // (the solver's reading); adiabatic without efficiency is reversible.
        auto a = parseProject(replaced(kFormatExample, "\"path\": \"adiabatic\", ", ""));
        ASSERT_TRUE(a.ok()) << a.error().text();
        EXPECT_FALSE(a->steps[0].path.has_value());
        EXPECT_DOUBLE_EQ(a->steps[0].efficiency->value, 0.65);
        EXPECT_EQ(writeProject(*a).find("\"path\""), std::string::npos);
        EXPECT_TRUE(parseProject(replaced(kFormatExample, ", \"efficiency\": 0.65", "")).ok());
        expectError(replaced(kFormatExample, "\"path\": \"adiabatic\", ", "\"n\": 1.3, "),
                    "step \"feed-pump\" (steps[0]).n", "belongs to a polytropic path; this path is adiabatic",
                    "1.3, \"efficiency\"");
    }
    expectError(replaced(kFormatExample, "\"path\": \"adiabatic\", \"efficiency\": 0.65", "\"path\": \"polytropic\""),
                "step \"feed-pump\" (steps[0])", "needs the exponent \"n\"", "{ \"id\": \"feed-pump\"");
    expectError(replaced(kFormatExample, "\"path\": \"adiabatic\"", "\"path\": \"sideways\""),
                "step \"feed-pump\" (steps[0]).path", "unknown path \"sideways\"", "\"sideways\"");
    expectError(replaced(kFormatExample, "\"path\": \"adiabatic\"", "\"path\": \"isentropic\""),
                "step \"feed-pump\" (steps[0]).efficiency", "belongs to an adiabatic path", "0.65");
    expectError(replaced(kFormatExample, "\"source\": { \"T\": \"240 degC\" }", "\"source\": { }"),
                "step \"economiser\" (steps[1]).source", "needs a temperature", "{ }");
    expectError(replaced(kFormatExample, "\"steps\": [", "\"steps\": {\"a\": 1}, \"old\": ["), "steps",
                "must be a list", "{\"a\": 1}");
}

TEST(ProjectFile, StartSystemAndBasis) {
    expectError(replaced(kFormatExample, "{ \"T\": \"48 degC\", \"P\": \"1.4 bar\" }", "{ \"T\": \"48 degC\" }"),
                "start", "start needs P", "{ \"T\": \"48 degC\" }");
    expectError(replaced(kFormatExample, "{ \"T\": \"48 degC\", \"P\": \"1.4 bar\" }", "{ }"), "start",
                "start needs T and P", "{ },\n  \"steps\"");
    expectError(replaced(kFormatExample, "{ \"T\": \"48 degC\", \"P\": \"1.4 bar\" }",
                         "{ \"T\": \"48 degC\", \"quality\": 0.5, \"meltFraction\": 0.5 }"),
                "start.meltFraction", "not both", "0.5 }");
    // On a phase line T and P may both be given; their agreement is the solver's check.
    EXPECT_TRUE(parseProject(replaced(kFormatExample, "{ \"T\": \"48 degC\", \"P\": \"1.4 bar\" }",
                                      "{ \"T\": \"0 degC\", \"P\": \"1 atm\", \"meltFraction\": 0 }"))
                    .ok());
    EXPECT_CONTAINS(errorOf(replaced(kFormatExample, "\"start\": { \"T\": \"48 degC\", \"P\": \"1.4 bar\" },", ""))
                        .message,
                    "\"start\" is missing");
    expectError(replaced(kFormatExample, "\"steady-flow\"", "\"closed\""), "basis.massFlow",
                "a closed system takes a basis of mass or amount", "\"4.2 t/h\"");
    expectError(replaced(kFormatExample, "{ \"massFlow\": \"4.2 t/h\" }", "{ \"mass\": \"2 kg\" }"), "basis.mass",
                "a steady-flow system takes a basis of massFlow or molarFlow", "\"2 kg\"");
    expectError(replaced(kFormatExample, "{ \"massFlow\": \"4.2 t/h\" }", "{ }"), "basis", "basis needs massFlow",
                "{ }");
    expectError(replaced(kFormatExample, "\"note\": \"flue-gas side\"", "\"at\": \"constant-volume\""),
                "step \"economiser\" (steps[1]).at", "needs a closed system", "\"constant-volume\"");
    {
        std::string closed = replaced(kFormatExample, "\"steady-flow\"", "\"closed\"");
        closed = replaced(closed, "{ \"massFlow\": \"4.2 t/h\" }", "{ \"amount\": \"3 kmol\" }");
        closed = replaced(closed, "\"note\": \"flue-gas side\"", "\"at\": \"constant-volume\"");
        auto r = parseProject(closed);
        ASSERT_TRUE(r.ok()) << r.error().text();
        EXPECT_EQ(r->steps[1].at, HeatingAt::ConstantVolume);
        EXPECT_DOUBLE_EQ(r->basis.amount.si, 3000.0);
        // 3 kmol of water; molar mass 18.015268 g/mol, IAPWS R6-95(2018), or the library's own value.
        EXPECT_NEAR(r->massBasis(), 3000.0 * r->substance.molarMass, 1e-12);
        EXPECT_NEAR(r->massBasis(), 54.05, 0.01);
    }
    expectError(replaced(kFormatExample, "{ \"massFlow\": \"4.2 t/h\" }",
                         "{ \"massFlow\": \"4.2 t/h\", \"molarFlow\": \"1 kmol/h\" }"),
                "basis.molarFlow", "both massFlow and molarFlow", "\"1 kmol/h\"");
}

TEST(ProjectFile, DuplicateKeysAndDeepNesting) {
    {
        const std::string text = replaced(kFormatExample, "\"note\": \"flue-gas side\"",
                                          "\"note\": \"flue-gas side\", \"note\": \"second\"");
        const Error e = errorOf(text);
        EXPECT_CONTAINS(e.message, "\"note\" appears twice");
        EXPECT_CONTAINS(e.message, "steps[1].note");
        const auto [line, column] = positionOf(text, "\"note\": \"second\"");
        EXPECT_EQ(e.line, line);
        EXPECT_EQ(e.column, column);
    }
    {
        // 100 levels in an unknown field: refused, with the position of the 65th bracket.
        const std::string text =
            replaced(kFormatExample, "\"steps\": [", "\"deep\": " + std::string(100, '[') + std::string(100, ']') +
                                                         ",\n  \"steps\": [");
        const Error e = errorOf(text);
        EXPECT_CONTAINS(e.message, "nested deeper than 64 levels");
        const auto [line, column] = positionOf(text, std::string(100, '['));
        EXPECT_EQ(e.line, line);
        EXPECT_EQ(e.column, column + 63);  // the root object is level 1
    }
    {
        // A million open brackets: no recursion, no crash, an error.
        const std::string bomb(1000000, '[');
        EXPECT_CONTAINS(errorOf(bomb).message, "nested deeper");
        const std::string objects = [] {
            std::string s;
            for (int i = 0; i < 200000; ++i) s += "{\"a\":";
            return s;
        }();
        EXPECT_CONTAINS(errorOf(objects).message, "nested deeper");
    }
}

TEST(ProjectFile, LargeFileRoundTrips) {
    std::ostringstream text;
    text << R"json({"format": "heatchain-project", "version": 1, "system": "steady-flow", "substance": "water",
"basis": {"massFlow": "1 kg/s"}, "start": {"T": "20 degC", "P": "2 bar"}, "steps": [)json";
    const int n = 5000;
    for (int i = 0; i < n; ++i) {
        if (i) text << ",\n";
        if (i % 2 == 0)
            text << "{\"id\": \"h" << i << "\", \"kind\": \"heat\", \"to\": {\"T\": \"" << 30 + i % 50
                 << " degC\"}, \"source\": {\"T\": \"200 degC\"}}";
        else
            text << "{\"id\": \"c" << i << "\", \"kind\": \"cool\", \"to\": {\"duty\": \"" << i << " kW\"}}";
    }
    text << "]}";
    auto r = parseProject(text.str());
    ASSERT_TRUE(r.ok()) << r.error().text();
    ASSERT_EQ(r->steps.size(), static_cast<std::size_t>(n));
    EXPECT_DOUBLE_EQ(r->steps[n - 1].to.duty->si, (n - 1) * 1000.0);
    const std::string written = writeProject(*r);
    auto again = parseProject(written);
    ASSERT_TRUE(again.ok());
    EXPECT_EQ(writeProject(*again), written);

    // An error near the end still carries its step id and position.
    std::string bad = text.str();
    bad = replaced(bad, "\"id\": \"c4999\", \"kind\": \"cool\"", "\"id\": \"c4999\", \"kind\": \"chill\"");
    const Error e = errorOf(bad);
    EXPECT_CONTAINS(e.where, "step \"c4999\" (steps[4999]).kind");
    EXPECT_EQ(e.line, positionOf(bad, "\"chill\"").first);
}

TEST(ProjectFile, MalformedInputNeverCrashes) {
    // Every truncation of the example and 3000 seeded random byte mutations:
    // each comes back as a Project or an Error with a message; parse errors
    // carry a position.
    const std::string base = replaced(kFormatExample, "\"water\"", kCustomSubstance);
    int errors = 0;
    for (std::size_t cut = 0; cut < base.size(); ++cut) {
        auto r = parseProject(std::string_view(base).substr(0, cut));
        if (!r.ok()) {
            ++errors;
            EXPECT_FALSE(r.error().message.empty());
            EXPECT_GT(r.error().line, 0) << r.error().text();
        }
    }
    EXPECT_GE(errors, static_cast<int>(base.size()) - 2);  // only whole documents parse
    std::mt19937 rng(20261130u);
    const char alphabet[] = "{}[]\",:0123456789.eE+-aknrtu \\\n\xC3\xFF";
    for (int i = 0; i < 3000; ++i) {
        std::string mutated = base;
        const int edits = 1 + static_cast<int>(rng() % 4);
        for (int k = 0; k < edits; ++k) {
            const std::size_t at = rng() % mutated.size();
            const char c = alphabet[rng() % (sizeof alphabet - 1)];
            switch (rng() % 3) {
                case 0: mutated[at] = c; break;
                case 1: mutated.insert(mutated.begin() + static_cast<long>(at), c); break;
                default: mutated.erase(at, 1 + rng() % 8); break;
            }
            if (mutated.empty()) mutated = "{";
        }
        auto r = parseProject(mutated);
        if (!r.ok()) {
            EXPECT_FALSE(r.error().message.empty());
        } else {
            auto again = parseProject(writeProject(*r));
            EXPECT_TRUE(again.ok()) << "a parsed project must write back to a valid file";
        }
    }
}

TEST(ProjectFile, SampleProjectsReadAndWriteBackStably) {
    // The demo worksheets shipped with Heatchain must load, and a save of an
    // unchanged worksheet must be a fixed point.
    const fs::path folder = fs::path(HEATCHAIN_SOURCE_DIR) / "sample-projects";
    int count = 0;
    for (const auto& entry : fs::directory_iterator(folder)) {
        if (entry.path().extension() != ".hchain") continue;
        ++count;
        SCOPED_TRACE(entry.path().filename().string());
        if (auto set = loadStreamSet(entry.path()); set.ok() && set->streams.size() > 1) {
            const std::string written = writeStreamSet(*set);  // several streams: version 2
            auto again = parseStreamSet(written);
            ASSERT_TRUE(again.ok()) << again.error().text();
            EXPECT_EQ(writeStreamSet(*again), written);
            continue;
        }
        auto p = loadProject(entry.path());
        EXPECT_TRUE(p.ok()) << p.error().text();
        if (!p.ok()) continue;
        EXPECT_FALSE(p->steps.empty());
        const std::string written = writeProject(*p);
        auto again = parseProject(written);
        EXPECT_TRUE(again.ok()) << again.error().text();
        if (again.ok()) {
            EXPECT_EQ(writeProject(*again), written);
        }
    }
    EXPECT_GT(count, 0);
}

// ---- Files ------------------------------------------------------------------

class ProjectFileOnDisk : public ::testing::Test {
protected:
    void SetUp() override {
        dir_ = fs::temp_directory_path() /
               ("heatchain-project-file-test-" + std::to_string(::getpid()) + "-" +
                ::testing::UnitTest::GetInstance()->current_test_info()->name());
        fs::remove_all(dir_);
        fs::create_directories(dir_);
        detail::atomicSaveFaultsForTests() = {};
    }
    void TearDown() override {
        detail::atomicSaveFaultsForTests() = {};
        std::error_code ec;
        fs::remove_all(dir_, ec);
    }
    static std::string read(const fs::path& file) {
        std::ifstream in(file, std::ios::binary);
        return std::string(std::istreambuf_iterator<char>(in), {});
    }
    static void write(const fs::path& file, const std::string& bytes) {
        std::ofstream(file, std::ios::binary) << bytes;
    }
    std::vector<std::string> listing() const {
        std::vector<std::string> names;
        for (const auto& e : fs::directory_iterator(dir_)) names.push_back(e.path().filename().string());
        std::sort(names.begin(), names.end());
        return names;
    }
    fs::path dir_;
};

TEST_F(ProjectFileOnDisk, SaveLoadAndBackup) {
    const fs::path file = dir_ / "line2.hchain";
    write(file, kFormatExample);
    auto loaded = loadProject(file);
    ASSERT_TRUE(loaded.ok()) << loaded.error().text();
    loaded->meta.revision = "C";
    const Status saved = saveProject(*loaded, file);
    ASSERT_TRUE(saved.ok()) << saved.error().text();
    EXPECT_EQ(read(file), writeProject(*loaded));
    EXPECT_EQ(read(dir_ / "line2.hchain.bak"), kFormatExample);  // the previous version, byte for byte
    EXPECT_EQ(listing(), (std::vector<std::string>{"line2.hchain", "line2.hchain.bak"}));
    auto again = loadProject(file);
    ASSERT_TRUE(again.ok());
    EXPECT_EQ(again->meta.revision, "C");

    // A new file: no backup to keep.
    const fs::path fresh = dir_ / "fresh.hchain";
    ASSERT_TRUE(saveProject(*loaded, fresh).ok());
    EXPECT_FALSE(fs::exists(dir_ / "fresh.hchain.bak"));
}

TEST_F(ProjectFileOnDisk, EverySaveFailureLeavesTheOriginalUntouched) {
    const fs::path file = dir_ / "line2.hchain";
    write(file, kFormatExample);
    auto p = parseProject(kFormatExample);
    ASSERT_TRUE(p.ok());
    p->meta.title = "changed";
    struct Case {
        const char* name;
        detail::AtomicSaveFaults faults;
        const char* reason;  // strerror text of the simulated errno (glibc)
    };
    const Case cases[] = {
        {"disk full mid-write", {100, false, false, false}, "No space left on device"},
        {"disk full at once", {0, false, false, false}, "No space left on device"},
        {"fsync fails", {-1, true, false, false}, "Input/output error"},
        {"backup fails", {-1, false, true, false}, "Permission denied"},
        {"rename fails", {-1, false, false, true}, "Permission denied"},
    };
    for (const Case& c : cases) {
        SCOPED_TRACE(c.name);
        detail::atomicSaveFaultsForTests() = c.faults;
        const Status s = saveProject(*p, file);
        ASSERT_FALSE(s.ok());
        EXPECT_CONTAINS(s.error().text(), file.string());
        EXPECT_CONTAINS(s.error().message, c.reason);
        EXPECT_CONTAINS(s.error().message, "unchanged");
        EXPECT_EQ(read(file), kFormatExample);  // byte-identical
        // No temporary left behind. A failure after the backup step leaves
        // "<file>.bak", a byte copy of the untouched original.
        if (c.faults.failRename) {
            EXPECT_EQ(listing(), (std::vector<std::string>{"line2.hchain", "line2.hchain.bak"}));
            EXPECT_EQ(read(dir_ / "line2.hchain.bak"), kFormatExample);
            fs::remove(dir_ / "line2.hchain.bak");
        } else {
            EXPECT_EQ(listing(), std::vector<std::string>{"line2.hchain"});
        }
    }
}

TEST_F(ProjectFileOnDisk, ErrorsNameTheFile) {
    const fs::path missing = dir_ / "nope.hchain";
    auto r = loadProject(missing);
    ASSERT_FALSE(r.ok());
    EXPECT_CONTAINS(r.error().text(), "nope.hchain");
    EXPECT_CONTAINS(r.error().message, "No such file");

    auto p = parseProject(kFormatExample);
    ASSERT_TRUE(p.ok());
    const Status s = saveProject(*p, dir_ / "no-such-folder" / "x.hchain");
    ASSERT_FALSE(s.ok());
    EXPECT_CONTAINS(s.error().text(), "x.hchain");
    EXPECT_CONTAINS(s.error().message, "does not exist");

    EXPECT_FALSE(saveProject(*p, dir_).ok());  // a folder is not a file

    const fs::path broken = dir_ / "broken.hchain";
    write(broken, replaced(kFormatExample, "\"180 degC\"", "\"180 degQ\""));
    auto b = loadProject(broken);
    ASSERT_FALSE(b.ok());
    EXPECT_CONTAINS(b.error().text(), broken.string() + ": step \"economiser\" (steps[1]).to.T (line 23, column");
}

}  // namespace

// A broken or hostile file meets a stated limit with a clear error, before
// the parser or the solver can take the machine's memory: more steps than a
// worksheet may hold, more JSON values than a worksheet of that length has
// (8,000,001 zeros: 16 MB of text would parse to several hundred MB), and a
// file over 64 MiB (sparse on disk, so the test writes nothing).
TEST_F(ProjectFileOnDisk, HostileFilesMeetTheStatedLimits) {
    const std::string head = R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
        "model": "reference", "substance": "water", "basis": { "massFlow": "1 kg/s" },
        "start": { "T": "20 degC", "P": "1 atm" }, )";
    std::string steps = head + R"("steps": [)";
    for (int i = 0; i < 250001; ++i) steps += i ? ",{}" : "{}";
    steps += "] }";
    auto many = parseProject(steps, "many.hchain");
    ASSERT_FALSE(many.ok());
    EXPECT_NE(many.error().text().find("250001 steps; a worksheet holds at most 250000"), std::string::npos)
        << many.error().text();
    EXPECT_NE(many.error().text().find("steps"), std::string::npos);

    std::string values = head + R"("junk": [)";
    values.reserve(values.size() + 16'000'010);
    for (int i = 0; i < 8'000'001; ++i) values += i ? ",0" : "0";
    values += R"(], "steps": [] })";
    auto flood = parseProject(values, "flood.hchain");
    ASSERT_FALSE(flood.ok());
    EXPECT_NE(flood.error().text().find("more than 8000000 JSON values"), std::string::npos) << flood.error().text();
    EXPECT_NE(flood.error().text().find("flood.hchain (line 3, column"), std::string::npos) << flood.error().text();

    const fs::path big = dir_ / "big.hchain";
    write(big, head + R"("steps": [] })");
    fs::resize_file(big, std::uintmax_t{65} * 1024 * 1024);
    auto huge = loadProject(big);
    ASSERT_FALSE(huge.ok());
    EXPECT_NE(huge.error().text().find("limit 64 MiB"), std::string::npos) << huge.error().text();
    auto hugeSet = loadStreamSet(big);
    ASSERT_FALSE(hugeSet.ok());
    EXPECT_NE(hugeSet.error().text().find("64 MiB"), std::string::npos) << hugeSet.error().text();
}

}  // namespace heatchain

// project-format.md: "numbers as the user typed them". nlohmann/json reprints
// doubles in shortest form (0.60 → 0.6), so the writer must keep the text.
TEST(ProjectFileNumbers, DimensionlessNumbersKeepTheirTypedCharacters) {
    using heatchain::parseProject;
    using heatchain::writeProject;
    const std::string text = R"({
  "format": "heatchain-project",
  "version": 1,
  "meta": {
    "title": "looks like a placeholder: \u0001hcnum0\u0001"
  },
  "display": {
    "units": "SI"
  },
  "system": "steady-flow",
  "model": "constant-cp",
  "substance": "nitrogen",
  "basis": {
    "massFlow": "1 kg/s"
  },
  "start": {
    "T": "300 K",
    "P": "1 bar"
  },
  "steps": [
    {
      "id": "c1",
      "kind": "compress",
      "to": {
        "ratio": 2.50
      },
      "path": "adiabatic",
      "efficiency": 0.60
    },
    {
      "id": "c2",
      "kind": "compress",
      "to": {
        "ratio": 1.5e0
      },
      "path": "polytropic",
      "n": 1.30
    }
  ]
}
)";
    auto p = parseProject(text, "numbers.hchain");
    ASSERT_TRUE(p.ok()) << p.error().text();
    EXPECT_DOUBLE_EQ(p->steps[0].efficiency->value, 0.6);
    const std::string out = writeProject(*p);
    EXPECT_NE(out.find("\"efficiency\": 0.60"), std::string::npos) << out;
    EXPECT_NE(out.find("\"ratio\": 2.50"), std::string::npos) << out;
    EXPECT_NE(out.find("\"ratio\": 1.5e0"), std::string::npos) << out;
    EXPECT_NE(out.find("\"n\": 1.30"), std::string::npos) << out;
    EXPECT_NE(out.find("hcnum0"), std::string::npos) << "the title's text survives";
    auto again = parseProject(out, "numbers.hchain");
    ASSERT_TRUE(again.ok()) << again.error().text();
    EXPECT_EQ(writeProject(*again), out) << "same project, same bytes";
}

// A file that starts with the UTF-16 byte-order mark FF FE: the parser's
// message quotes the byte it read, which must reach people escaped, not raw.
TEST(ProjectFile, ParserMessageShowsStrayBytesEscaped) {
    const std::string text = std::string("\xFF\xFE{\x00\"", 5);
    auto r = heatchain::parseProject(text, "utf16.hchain");
    ASSERT_FALSE(r.ok());
    const std::string message = r.error().text();
    EXPECT_NE(message.find("\\xFF"), std::string::npos) << message;
    for (const char c : message) {
        const auto byte = static_cast<unsigned char>(c);
        EXPECT_FALSE(byte == 0xFF || byte == 0xFE || byte < 0x09) << "raw byte in: " << message;
    }
}
