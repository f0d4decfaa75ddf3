// Tests of heatchain/substance.hpp: both spellings of a substance (library
// file, project-file custom object), every error naming its JSON path, and
// the embedded library as a whole.
#include "heatchain/json.hpp"
#include "heatchain/substance.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "heatchain/constants.hpp"

namespace heatchain {
namespace {

using Json = nlohmann::ordered_json;

// The custom substance of project-format.md, verbatim (an invented demo material).
const char* kTestWax = R"js({ "id": "test-wax", "name": "Test wax", "molarMass": "0.352 kg/mol",
    "source": "supplier data sheet TW-3, rev 2",
    "phases": { "solid":  { "cp": "2.0 kJ/(kg K)" },
                "liquid": { "cp": { "T": ["60 degC", "120 degC", "180 degC"],
                                    "cp": ["2.21 kJ/(kg K)", "2.35 kJ/(kg K)", "2.49 kJ/(kg K)"] } },
                "vapor":  { "cp": "1.6 kJ/(kg K)" } },
    "melting": { "T": "58 degC", "enthalpy": "190 kJ/kg" },
    "boiling": { "T": "350 degC", "P": "1 atm", "enthalpy": "300 kJ/kg" },
    "critical": { "T": "650 K", "P": "1.2 MPa", "acentricFactor": 0.9 } })js";

// A library-format file with every block (values typed for the parse only).
const char* kLibraryStyle = R"js({
  "id": "sample-gas", "name": "Sample gas", "formula": "N2", "cas": "7727-37-9",
  "molarMass": { "value": "28.0134 g/mol", "source": "s-molar" },
  "critical": { "T": "126.19 K", "P": "3.3958 MPa", "acentricFactor": 0.0372, "rho": "313.3 kg/m3", "source": "s-crit" },
  "triple": { "T": "63.151 K", "P": "12.52 kPa", "source": "s-triple" },
  "melting": { "T": "63.15 K", "P": "1 atm", "enthalpy": "25.7 kJ/kg", "source": "s-melt" },
  "boiling": { "T": "77.355 K", "P": "1 atm", "enthalpy": "199.2 kJ/kg", "source": "s-boil" },
  "sublimation": { "T": "50 K", "P": "100 Pa", "enthalpy": "230 kJ/kg", "source": "s-subl" },
  "phases": {
    "solid":  { "cp": { "form": "polynomial", "unit": "J/(kmol K)", "Tmin": "20 K", "Tmax": "63.15 K",
                        "coefficients": [20000, 400] }, "density": "1027 kg/m3", "source": "s-solid" },
    "liquid": { "cp": "2.04 kJ/(kg K)", "density": "806 kg/m3", "source": "s-liquid" },
    "vapor":  { "cp": { "form": "shomate", "pieces": [
        { "Tmin": "100 K", "Tmax": "500 K", "A": 28.98641, "B": 1.853978, "C": -9.647459, "D": 16.63537, "E": 0.000117 },
        { "Tmin": "500 K", "Tmax": "2000 K", "A": 19.50583, "B": 19.88705, "C": -8.598535, "D": 1.369784, "E": 0.527601 } ] },
        "source": "s-vapor" }
  },
  "pengRobinson": { "twu": { "L": 0.1, "M": 0.8, "N": 2.0 }, "volumeShift": "-3.6e-6 m3/mol", "source": "s-pr" },
  "notes": "free text"
})js";

// The library files as they are in the source tree (the same files the build
// embeds; the embedding itself is checked by comparing with builtin()).
struct LibraryFile {
    std::string path;  // "substances/<id>.json"
    std::string content;
};
std::vector<LibraryFile> libraryFiles() {
    std::vector<LibraryFile> out;
    const std::filesystem::path dir = std::filesystem::path(HEATCHAIN_SOURCE_DIR) / "resources" / "substances";
    for (const auto& e : std::filesystem::directory_iterator(dir)) {
        if (e.path().extension() != ".json") continue;
        std::ifstream in(e.path());
        std::stringstream ss;
        ss << in.rdbuf();
        out.push_back({"substances/" + e.path().filename().string(), ss.str()});
    }
    return out;
}

Result<Substance> parse(const std::string& text, std::string_view where = "substance") {
    return parseSubstance(Json::parse(text), where);
}

TEST(Substance, ParsesLibraryFormat) {
    auto s = parse(kLibraryStyle);
    ASSERT_TRUE(s.ok()) << s.error().text();
    EXPECT_EQ(s->id, "sample-gas");
    EXPECT_EQ(s->formula, "N2");
    EXPECT_EQ(s->casNumber, "7727-37-9");
    EXPECT_NEAR(s->molarMass, 0.0280134, 1e-15);
    ASSERT_TRUE(s->critical && s->triple && s->melting && s->boiling && s->sublimation);
    EXPECT_DOUBLE_EQ(s->critical->P, 3.3958e6);
    EXPECT_DOUBLE_EQ(s->critical->acentricFactor, 0.0372);
    EXPECT_DOUBLE_EQ(*s->critical->rho, 313.3);
    EXPECT_DOUBLE_EQ(s->triple->P, 12520);
    EXPECT_DOUBLE_EQ(s->melting->P, 101325);  // 1 atm: NIST SP 811 (2008), B.8
    EXPECT_DOUBLE_EQ(s->boiling->enthalpy, 199.2e3);
    EXPECT_DOUBLE_EQ(*s->liquidDensity, 806);
    EXPECT_DOUBLE_EQ(*s->solidDensity, 1027);
    // J/(kmol K) polynomial, per kg: (20000 + 400 T) / 1000 / M.
    ASSERT_TRUE(s->cpSolid);
    EXPECT_NEAR(s->cpSolid->cp(40), (20000 + 400 * 40.0) / 1000 / 0.0280134, 1e-9);
    // Shomate in J/(mol K): NIST-JANAF 4th ed. (1998), N2 Cp(298.15 K) = 29.124 J/(mol K) (from memory).
    ASSERT_TRUE(s->cpVapor);
    EXPECT_NEAR(s->cpVapor->cp(298.15) * 0.0280134, 29.124, 0.002);
    EXPECT_DOUBLE_EQ(s->cpLiquid->cp(70), 2040);
    ASSERT_TRUE(s->pengRobinson);
    EXPECT_DOUBLE_EQ(*s->pengRobinson->twuN, 2.0);
    EXPECT_NEAR(*s->pengRobinson->volumeShift, -3.6e-6, 1e-20);
    EXPECT_EQ(s->sources.size(), 10u);  // one per block with a source (10 blocks)
    // Specific gas constant of nitrogen: R / M = 296.80 J/(kg K) (CODATA 2018 R, IUPAC M).
    EXPECT_NEAR(s->gasConstant(), 296.80, 0.005);
    EXPECT_DOUBLE_EQ(s->gasConstant(), kGasConstant / 0.0280134);
}

TEST(Substance, ParsesProjectCustomFormat) {
    auto s = parse(kTestWax);
    ASSERT_TRUE(s.ok()) << s.error().text();
    EXPECT_TRUE(s->custom);
    EXPECT_DOUBLE_EQ(s->molarMass, 0.352);
    EXPECT_NEAR(s->melting->T, 331.15, 1e-12);     // 58 degC
    EXPECT_DOUBLE_EQ(s->melting->P, 101325);       // default: 1 atm
    EXPECT_NEAR(s->boiling->T, 623.15, 1e-12);
    // The three liquid points lie on a line: the fit passes through them.
    ASSERT_TRUE(s->cpLiquid);
    EXPECT_NEAR(s->cpLiquid->cp(393.15), 2350, 1e-6);
    EXPECT_LT(s->cpLiquid->fitResidual(), 1e-6);
    ASSERT_EQ(s->sources.size(), 1u);
    EXPECT_EQ(s->sources[0].text, "supplier data sheet TW-3, rev 2");
}

TEST(Substance, PolynomialPiecesAndMolarConstant) {
    auto j = Json::parse(kTestWax);
    j["phases"]["vapor"]["cp"] = Json::parse(R"js({ "form": "polynomial", "unit": "kJ/(kg K)", "pieces": [
        { "Tmin": "300 K", "Tmax": "600 K", "coefficients": [1.0, 0.001] },
        { "Tmin": "600 K", "Tmax": "900 K", "coefficients": [1.6] } ] })js");
    j["phases"]["solid"]["cp"] = "704 J/(mol K)";
    auto s = parseSubstance(j, "substance");
    ASSERT_TRUE(s.ok()) << s.error().text();
    EXPECT_NEAR(s->cpVapor->cp(400), 1400, 1e-9);
    EXPECT_NEAR(s->cpVapor->cp(800), 1600, 1e-9);
    EXPECT_NEAR(s->cpSolid->cp(300), 704 / 0.352, 1e-9);
}

TEST(Substance, WatsonConvertsALatentHeatGivenElsewhere) {
    // enthalpyAt: Δh(Tb) = Δh(T1) ((Tc − Tb)/(Tc − T1))^0.38 (Watson 1943).
    auto j = Json::parse(kTestWax);
    j["boiling"]["enthalpyAt"] = "500 K";
    auto s = parseSubstance(j, "substance");
    ASSERT_TRUE(s.ok()) << s.error().text();
    EXPECT_NEAR(s->boiling->enthalpy, 300e3 * std::pow((650 - 623.15) / (650 - 500.0), 0.38), 1e-6);
}

TEST(Substance, BoilingAnchorMayBeTheTriplePoint) {
    // Carbon dioxide has no liquid at 1 atm; its vaporisation anchor is the
    // triple point, where melting and boiling share one temperature.
    auto j = Json::parse(kTestWax);
    j["boiling"] = Json::parse(R"js({ "T": "58 degC", "P": "5 kPa", "enthalpy": "300 kJ/kg" })js");
    auto s = parseSubstance(j, "substance");
    ASSERT_TRUE(s.ok()) << s.error().text();
    EXPECT_EQ(s->boiling->T, s->melting->T);
}

struct BadCase {
    const char* pointer;  // JSON pointer to change
    const char* value;    // new JSON value ("<remove>" to delete)
    const char* where;    // expected Error::where
};

TEST(Substance, EveryErrorNamesItsJsonPath) {
    const BadCase cases[] = {
        {"/phases/liquid/cp/T/2", R"js("180 kg")js", "substance.phases.liquid.cp.T[2]"},
        {"/phases/liquid/cp/cp/1", R"js(2.35)js", "substance.phases.liquid.cp.cp[1]"},
        {"/phases/liquid/cp/cp", R"js(["2.21 kJ/(kg K)"])js", "substance.phases.liquid.cp.cp"},
        {"/phases/liquid/cp/T/0", R"js("-300 degC")js", "substance.phases.liquid.cp.T[0]"},
        {"/phases/liquid/cp/degree", R"js(9)js", "substance.phases.liquid.cp.degree"},
        {"/phases/vapor/cp", R"js("1.6 kJ/kg")js", "substance.phases.vapor.cp"},
        {"/phases/vapor/cp", R"js(true)js", "substance.phases.vapor.cp"},
        {"/phases/vapor/cp", R"js({"form": "nasa"})js", "substance.phases.vapor.cp.form"},
        {"/phases/vapor/cp", R"js({"form": "shomate", "pieces": [{"Tmin": "300 K", "Tmax": "900 K", "A": 1, "B": 2, "C": 3, "D": 4}]})js",
         "substance.phases.vapor.cp.pieces[0].E"},
        {"/phases/vapor/cp", R"js({"form": "shomate", "pieces": [{"Tmin": "300 K", "Tmax": "900 K", "A": 30, "B": 0, "C": 0, "D": 0, "E": 0},
                                                             {"Tmin": "1000 K", "Tmax": "2000 K", "A": 30, "B": 0, "C": 0, "D": 0, "E": 0}]})js",
         "substance.phases.vapor.cp.pieces[1]"},
        {"/phases/vapor/cp", R"js({"form": "polynomial", "unit": "cal/(g K)", "Tmin": "300 K", "Tmax": "900 K", "coefficients": [1]})js",
         "substance.phases.vapor.cp.unit"},
        {"/phases/vapor/cp", R"js({"form": "polynomial", "unit": "J/(kg K)", "Tmin": "300 K", "Tmax": "900 K", "coefficients": [1, "x"]})js",
         "substance.phases.vapor.cp.coefficients[1]"},
        {"/phases/vapor/cp", R"js({"form": "polynomial", "unit": "J/(kg K)", "Tmin": "300 K", "coefficients": [1]})js",
         "substance.phases.vapor.cp.Tmax"},
        {"/phases/vapour", R"js({"cp": "1 kJ/(kg K)"})js", "substance.phases.vapour"},
        {"/phases/solid/density", R"js("-5 kg/m3")js", "substance.phases.solid.density"},
        {"/phases/solid/densty", R"js("900 kg/m3")js", "substance.phases.solid.densty"},
        {"/phases", R"js([])js", "substance.phases"},
        {"/molarMass", "<remove>", "substance.molarMass"},
        {"/molarMass", R"js(0.352)js", "substance.molarMass"},
        {"/molarMass", R"js("0.352 kg")js", "substance.molarMass"},
        {"/molarMass", R"js({"value": "-1 g/mol"})js", "substance.molarMass.value"},
        {"/id", "<remove>", "substance.id"},
        {"/id", R"js("Test Wax")js", "substance.id"},
        {"/name", R"js(3)js", "substance.name"},
        {"/melting/enthalpy", "<remove>", "substance.melting.enthalpy"},
        {"/melting/T", R"js("58")js", "substance.melting.T"},
        {"/melting/entalpy", R"js("1 kJ/kg")js", "substance.melting.entalpy"},
        {"/boiling/P", R"js("1 atm/s")js", "substance.boiling.P"},
        {"/boiling/T", R"js("40 degC")js", "substance.boiling.T"},
        {"/boiling/enthalpyAt", R"js("700 K")js", "substance.boiling.enthalpyAt"},
        {"/critical/P", "<remove>", "substance.critical.P"},
        {"/critical/acentricFactor", R"js("x")js", "substance.critical.acentricFactor"},
        {"/triple", R"js({"T": "63 K"})js", "substance.triple.P"},
        {"/sublimation", R"js("yes")js", "substance.sublimation"},
        {"/pengRobinson", R"js({"twu": {"L": 0.1, "M": 0.8}})js", "substance.pengRobinson.twu.N"},
        {"/pengRobinson", R"js({"volumeShift": "3 m3"})js", "substance.pengRobinson.volumeShift"},
        {"/source", R"js(12)js", "substance.source"},
        {"/colour", R"js("white")js", "substance.colour"},
        {"/hazards", R"js({"classes": ["toxic", "explosive"]})js", "substance.hazards.classes[1]"},
        {"/hazards", R"js({"classes": "toxic"})js", "substance.hazards.classes"},
        {"/hazards", R"js({"clases": ["toxic"]})js", "substance.hazards.clases"},
    };
    for (const auto& c : cases) {
        auto j = Json::parse(kTestWax);
        const Json::json_pointer ptr(c.pointer);
        if (std::string(c.value) == "<remove>") j[ptr.parent_pointer()].erase(ptr.back());
        else j[ptr] = Json::parse(c.value);
        auto s = parseSubstance(j, "substance");
        ASSERT_FALSE(s.ok()) << c.pointer << " = " << c.value;
        EXPECT_EQ(s.error().where, c.where) << c.pointer << ": " << s.error().text();
        EXPECT_FALSE(s.error().message.empty());
    }
}

TEST(Substance, SyntaxErrorsGiveLineAndColumn) {
    const std::string_view texts[] = {"{\n  \"id\": \"x\",\n  \"name\" \"X\"\n}"};
    auto lib = SubstanceLibrary::fromJsonTexts(texts);
    ASSERT_FALSE(lib.ok());
    EXPECT_EQ(lib.error().where, "texts[0]");
    EXPECT_EQ(lib.error().line, 3);
    EXPECT_GT(lib.error().column, 1);
}

// A library-format file: an error names the text and the path from its root,
// with the line:column of the value (counted by hand: line 4 is "critical",
// and 3.4 follows `  "critical": { "T": "126 K", "P": ` at column 36).
TEST(Substance, LibraryFileErrorsGivePathAndPosition) {
    const std::string_view texts[] = {
        "{\n"
        "  \"id\": \"sample-gas\", \"name\": \"Sample gas\",\n"
        "  \"molarMass\": { \"value\": \"28 g/mol\", \"source\": \"s\" },\n"
        "  \"critical\": { \"T\": \"126 K\", \"P\": 3.4, \"source\": \"s\" }\n"
        "}\n"};
    auto lib = SubstanceLibrary::fromJsonTexts(texts);
    ASSERT_FALSE(lib.ok());
    EXPECT_EQ(lib.error().where, "texts[0]: critical.P");
    EXPECT_NE(lib.error().message.find("a bare number needs a unit"), std::string::npos) << lib.error().message;
    EXPECT_EQ(lib.error().line, 4);
    EXPECT_EQ(lib.error().column, 36);

    // The same object given as a value, without its text: the path, no position.
    auto s = parseSubstance(Json::parse(texts[0]), "");
    ASSERT_FALSE(s.ok());
    EXPECT_EQ(s.error().where, "critical.P");
    EXPECT_EQ(s.error().line, 0);
    EXPECT_EQ(s.error().column, 0);
}

// A key written twice in one object of a library text is refused where it
// stands, not settled silently by the parser keeping the last one.
TEST(Substance, LibraryFileRepeatedKeyIsRefusedWithItsPosition) {
    const std::string_view texts[] = {
        "{\n"
        "  \"id\": \"sample-gas\", \"name\": \"Sample gas\",\n"
        "  \"molarMass\": { \"value\": \"28 g/mol\", \"value\": \"32 g/mol\", \"source\": \"s\" }\n"
        "}\n"};
    auto lib = SubstanceLibrary::fromJsonTexts(texts);
    ASSERT_FALSE(lib.ok());
    EXPECT_EQ(lib.error().where, "texts[0]");
    EXPECT_NE(lib.error().message.find("the key \"value\" appears twice"), std::string::npos) << lib.error().message;
    EXPECT_NE(lib.error().message.find("molarMass.value"), std::string::npos) << lib.error().message;
    EXPECT_EQ(lib.error().line, 3);
    EXPECT_GT(lib.error().column, 30);  // the second "value", not the first
}

TEST(Substance, DuplicateIdsAreRefused) {
    const std::string a = kTestWax;
    const std::string_view texts[] = {a, a};
    auto lib = SubstanceLibrary::fromJsonTexts(texts);
    ASSERT_FALSE(lib.ok());
    EXPECT_NE(lib.error().message.find("twice"), std::string::npos);
}

TEST(SubstanceLibrary, EveryEmbeddedFileLoads) {
    std::vector<std::string_view> texts;
    const auto files = libraryFiles();
    for (const auto& f : files) {
        texts.push_back(f.content);
        const std::string_view one[] = {std::string_view(f.content)};
        auto single = SubstanceLibrary::fromJsonTexts(one);
        ASSERT_TRUE(single.ok()) << f.path << ": " << single.error().text();
        // The file is named after its id (ARCHITECTURE.md: resources/substances/<id>.json).
        EXPECT_EQ("substances/" + single->all()[0].id + ".json", f.path);
        EXPECT_FALSE(single->all()[0].custom);
    }
    ASSERT_GE(texts.size(), 2u);
    auto lib = SubstanceLibrary::fromJsonTexts(texts);
    ASSERT_TRUE(lib.ok()) << lib.error().text();
    EXPECT_EQ(SubstanceLibrary::builtin().all().size(), texts.size());
    EXPECT_NE(SubstanceLibrary::builtin().find("water"), nullptr);
    EXPECT_NE(SubstanceLibrary::builtin().find("nitrogen"), nullptr);
    EXPECT_EQ(SubstanceLibrary::builtin().find("unobtainium"), nullptr);
}

TEST(SubstanceLibrary, EveryBlockCarriesItsSource) {
    // sources-and-originality.md: each constant or coefficient set carries its source.
    for (const auto& f : libraryFiles()) {
        const auto j = Json::parse(f.content);
        const Substance* s = SubstanceLibrary::builtin().find(j.at("id").get<std::string>());
        ASSERT_NE(s, nullptr) << f.path;
        EXPECT_FALSE(s->name.empty()) << f.path;
        EXPECT_GT(s->molarMass, 0) << f.path;
        auto hasSource = [&](const std::string& field) {
            for (const auto& n : s->sources)
                if (n.field == field && !n.text.empty()) return true;
            return false;
        };
        EXPECT_TRUE(hasSource("molarMass")) << f.path << ": molarMass";
        for (const char* block : {"critical", "triple", "melting", "boiling", "sublimation", "pengRobinson"})
            if (j.contains(block)) {
                EXPECT_TRUE(hasSource(block)) << f.path << ": " << block;
            }
        if (j.contains("phases")) {
            for (const auto& [phase, body] : j["phases"].items()) {
                EXPECT_TRUE(hasSource("phases." + phase)) << f.path << ": phases." << phase;
            }
        }
    }
}

// Hazard classes: parsed from the file's spelling, each with its caution
// clause; the library marks the substances a safety data sheet would
// (ammonia toxic, corrosive and flammable; oxygen an oxidiser; water none).
TEST(Substance, HazardsParseAndReadAsCautions) {
    auto j = Json::parse(kTestWax);
    j["hazards"] = Json::parse(R"js({"classes": ["flammable", "toxic", "flammable"], "source": "test"})js");
    auto s = parseSubstance(j, "substance");
    ASSERT_TRUE(s.ok()) << s.error().text();
    ASSERT_EQ(s->hazards.size(), 2u);  // a repeated class once
    EXPECT_EQ(s->hazards[0], Hazard::Flammable);
    EXPECT_EQ(s->hazards[1], Hazard::Toxic);
    const std::string line = hazardSentence(*s);
    EXPECT_EQ(line.rfind(s->name + ": flammable", 0), 0u) << line;
    EXPECT_NE(line.find("toxic by inhalation"), std::string::npos) << line;
    for (Hazard h : {Hazard::Toxic, Hazard::Corrosive, Hazard::Flammable, Hazard::Asphyxiant, Hazard::Oxidiser,
                     Hazard::Carcinogen}) {
        EXPECT_FALSE(hazardId(h).empty());
        EXPECT_EQ(hazardCaution(h).rfind(std::string(hazardId(h)), 0), 0u) << hazardId(h);
    }
    const auto& lib = SubstanceLibrary::builtin();
    const std::vector<Hazard> nh3 = {Hazard::Toxic, Hazard::Corrosive, Hazard::Flammable};
    EXPECT_EQ(lib.find("ammonia")->hazards, nh3);
    EXPECT_EQ(lib.find("oxygen")->hazards, std::vector<Hazard>{Hazard::Oxidiser});
    EXPECT_TRUE(lib.find("water")->hazards.empty());
    EXPECT_TRUE(hazardSentence(*lib.find("water")).empty());
}

}  // namespace
}  // namespace heatchain
