// The sources of the built-in substance library (resources/substances/*.json):
// a value typed from memory is flagged as not independently confirmed, a
// source names publications (never this repository's files nor a software
// package), the README lists every value not independently confirmed, and
// the values confirmed against a publication without a reference library
// (molar masses from the atomic weights, the nitrogen Shomate fit) agree
// with that publication's figures, typed here with the source beside them.
#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <initializer_list>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/substance.hpp"

namespace heatchain {
namespace {

std::string lower(std::string s) {
    std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return s;
}

TEST(LibrarySources, FromMemoryIsFlaggedAndNoSourceNamesRepositoryFilesOrPackages) {
    int notes = 0;
    int unconfirmed = 0;
    for (const Substance& s : SubstanceLibrary::builtin().all()) {
        for (const SourceNote& n : s.sources) {
            ++notes;
            if (!n.confirmed) ++unconfirmed;
            const std::string t = lower(n.text);
            const std::string where = s.id + " " + n.field + ": " + n.text;
            EXPECT_FALSE(t.find("from memory") != std::string::npos && n.confirmed)
                << "typed from memory but not flagged \"confirmed\": false: " << where;
            for (const char* path : {"tests/", "resources/", "core/", "app/", ".cpp", ".hpp", ".py", ".json"})
                EXPECT_EQ(t.find(path), std::string::npos) << "names a repository file (" << path << "): " << where;
            // A reference library is how a value was checked, not where it comes from.
            for (const char* pkg : {"python3-", "iapws 1.", "coolprop", "refprop"})
                EXPECT_EQ(t.find(pkg), std::string::npos) << "names a software package (" << pkg << "): " << where;
            EXPECT_FALSE(n.text.empty()) << where;
        }
    }
    EXPECT_GT(notes, 150);
    EXPECT_GT(unconfirmed, 0);  // the library is honest about them; the README lists them (below)
}

// The two spellings of a source: a citation string, or an object with the
// citation and its status. A wrong status is an error naming its place.
TEST(LibrarySources, SourceObjectCarriesTheConfirmedFlag) {
    auto parse = [](const std::string& src) {
        return parseSubstance(nlohmann::ordered_json::parse(
                                  R"js({ "id": "demo-oil", "name": "Demo oil", "molarMass": "0.3 kg/mol",
                                       "phases": { "liquid": { "cp": "2.1 kJ/(kg K)", "source": )js" +
                                  src + " } } }"),
                              "substance");
    };
    auto plain = parse(R"("supplier sheet DO-1")");
    ASSERT_TRUE(plain) << plain.error().message;
    ASSERT_EQ(plain->sources.size(), 1u);
    EXPECT_EQ(plain->sources[0].text, "supplier sheet DO-1");
    EXPECT_TRUE(plain->sources[0].confirmed);
    auto flagged = parse(R"({ "text": "handbook table 4", "confirmed": false })");
    ASSERT_TRUE(flagged) << flagged.error().message;
    ASSERT_EQ(flagged->sources.size(), 1u);
    EXPECT_EQ(flagged->sources[0].text, "handbook table 4");
    EXPECT_EQ(flagged->sources[0].field, "phases.liquid");
    EXPECT_FALSE(flagged->sources[0].confirmed);
    auto bad = parse(R"({ "text": "handbook table 4", "confirmed": "no" })");
    ASSERT_FALSE(bad);
    EXPECT_NE(bad.error().message.find("true or false"), std::string::npos) << bad.error().message;
    EXPECT_NE(bad.error().where.find("source.confirmed"), std::string::npos) << bad.error().where;
    auto noText = parse(R"({ "confirmed": false })");
    ASSERT_FALSE(noText);
    EXPECT_NE(noText.error().where.find("source.text"), std::string::npos) << noText.error().where;
    EXPECT_FALSE(parse(R"({ "text": "x", "checked": false })"));
}

// README.md, section "Values not independently confirmed": one line per
// substance, "- <Name>: <label>, <label>, ...", with the labels of
// sourceFieldLabel(). Every flagged value must be listed, and nothing else.
TEST(LibrarySources, ReadmeListsEveryValueNotIndependentlyConfirmed) {
    std::ifstream in(std::filesystem::path(HEATCHAIN_SOURCE_DIR) / "README.md");
    ASSERT_TRUE(in) << "README.md not found";
    std::map<std::string, std::string> listed;  // substance name -> its line
    bool inSection = false;
    for (std::string line; std::getline(in, line);) {
        if (line.rfind("#", 0) == 0) inSection = line.find("Values not independently confirmed") != std::string::npos;
        if (!inSection || line.rfind("- ", 0) != 0) continue;
        const auto colon = line.find(':');
        if (colon != std::string::npos) listed[line.substr(2, colon - 2)] = line.substr(colon + 1);
    }
    ASSERT_FALSE(listed.empty()) << "README.md has no section \"Values not independently confirmed\"";
    for (const Substance& s : SubstanceLibrary::builtin().all()) {
        std::vector<std::string> labels;
        for (const SourceNote& n : s.sources)
            if (!n.confirmed) labels.push_back(lower(sourceFieldLabel(n.field)));
        const auto it = listed.find(s.name);
        if (labels.empty()) {
            EXPECT_EQ(it, listed.end()) << s.name << " is listed in README.md but has no unconfirmed value";
            continue;
        }
        ASSERT_NE(it, listed.end()) << s.name << " has values not independently confirmed; README.md does not list it";
        // Split the README's list on commas and compare as sets of labels.
        std::vector<std::string> inReadme;
        std::istringstream items(lower(it->second));
        for (std::string item; std::getline(items, item, ',');) {
            item.erase(0, item.find_first_not_of(' '));
            item.erase(item.find_last_not_of(" .") + 1);
            inReadme.push_back(item);
        }
        std::sort(labels.begin(), labels.end());
        std::sort(inReadme.begin(), inReadme.end());
        EXPECT_EQ(inReadme, labels) << s.name;
    }
}

// Standard atomic weights, conventional values: Meija et al., "Atomic weights
// of the elements 2013 (IUPAC Technical Report)", Pure Appl. Chem. 88 (2016)
// 265-291, Tables 1 and 3 (H, C, N, O and S are intervals; their conventional
// values are the ones given for trade and education).
const std::map<std::string, double> kAtomicWeight2013 = {
    {"H", 1.008},      {"He", 4.002602}, {"C", 12.011},        {"N", 14.007},
    {"O", 15.999},     {"F", 18.998403163}, {"S", 32.06},     {"Ar", 39.948}};

// "CH3OH", "C2H5OH", "CH2FCF3" -> summed atomic weights, g/mol; 0 when a
// symbol is not in the table above.
double formulaMass(const std::string& formula) {
    double m = 0;
    for (size_t i = 0; i < formula.size();) {
        if (!std::isupper(static_cast<unsigned char>(formula[i]))) return 0;
        std::string sym(1, formula[i++]);
        while (i < formula.size() && std::islower(static_cast<unsigned char>(formula[i]))) sym += formula[i++];
        int n = 0;
        while (i < formula.size() && std::isdigit(static_cast<unsigned char>(formula[i]))) n = n * 10 + (formula[i++] - '0');
        const auto w = kAtomicWeight2013.find(sym);
        if (w == kAtomicWeight2013.end()) return 0;
        m += w->second * (n == 0 ? 1 : n);
    }
    return m;
}

TEST(LibrarySources, MolarMassesAgreeWithTheStandardAtomicWeights) {
    int checked = 0;
    for (const Substance& s : SubstanceLibrary::builtin().all()) {
        double ref = 0;
        if (s.id == "air") {
            // Composition of Lemmon, Jacobsen, Penoncello & Friend, J. Phys.
            // Chem. Ref. Data 29 (2000) 331, as the library's formula states it.
            ref = 0.7812 * formulaMass("N2") + 0.2096 * formulaMass("O2") + 0.0092 * formulaMass("Ar");
        } else {
            ref = formulaMass(s.formula);
        }
        ASSERT_GT(ref, 0) << s.id << ": formula \"" << s.formula << "\" not read";
        // 1e-4: the width of the atomic-weight intervals of H and C; the
        // library's figures come from older tables (1.00794, 12.0107, ...).
        EXPECT_NEAR(s.molarMass * 1000 / ref, 1.0, 1e-4) << s.id << ": " << s.molarMass * 1000 << " g/mol, "
                                                       << ref << " from the atomic weights";
        ++checked;
    }
    EXPECT_EQ(checked, static_cast<int>(SubstanceLibrary::builtin().all().size()));
}

// NIST Chemistry WebBook (SRD 69), Nitrogen, "Gas Phase Heat Capacity
// (Shomate Equation)", after Chase, NIST-JANAF Thermochemical Tables, 4th ed.
// (1998), parameter fit of January 2009: pieces 100-500 K and 500-2000 K,
// cp in J/(mol K), t = T/1000 K.
struct ShomatePiece {
    double Tlo, Thi, A, B, C, D, E;
};

void expectShomate(const char* id, std::initializer_list<ShomatePiece> pieces) {
    const Substance* s = SubstanceLibrary::builtin().find(id);
    ASSERT_TRUE(s && s->cpVapor) << id;
    for (const ShomatePiece& p : pieces) {
        for (double T = p.Tlo + 1; T < p.Thi; T += (p.Thi - p.Tlo) / 13) {
            const double t = T / 1000;
            const double cp = (p.A + p.B * t + p.C * t * t + p.D * t * t * t + p.E / (t * t)) / s->molarMass;
            EXPECT_NEAR(s->cpVapor->cp(T) / cp, 1.0, 1e-6) << id << ", T = " << T << " K";
        }
    }
}

TEST(LibrarySources, NitrogenShomateFitIsTheWebBooksFit) {
    expectShomate("nitrogen", {{100, 500, 28.98641, 1.853978, -9.647459, 16.63537, 0.000117},
                               {500, 2000, 19.50583, 19.88705, -8.598535, 1.369784, 0.527601}});
}

// NIST Chemistry WebBook (SRD 69), Carbon monoxide, "Gas Phase Heat Capacity
// (Shomate Equation)", after Chase (1998): pieces 298-1300 K and 1300-6000 K.
// (The library's piece below 298 K is its own, and stays flagged.)
TEST(LibrarySources, CarbonMonoxideShomateFitAbove298KIsTheWebBooksFit) {
    expectShomate("carbon-monoxide", {{298, 1300, 25.56759, 6.096130, 4.054656, -2.671301, 0.131021},
                                      {1300, 6000, 35.15070, 1.300095, -0.205921, 0.013550, -3.282780}});
}

}  // namespace
}  // namespace heatchain
