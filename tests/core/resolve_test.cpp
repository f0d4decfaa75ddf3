// resolveProject (a worksheet edited in code) against the file's reader: for
// every sample worksheet and many edits of it — bounds, missing and misplaced
// fields, a new atmosphere, stale SI values, utilities and heat transfer —
// resolving the edited project in memory accepts exactly what writing it and
// reading the file back accepts, refuses with the same message at the same
// field, and when it accepts, holds the same quantities (the solved results
// and the written file are the same).
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <functional>
#include <sstream>
#include <string>
#include <vector>

#include "heatchain/project_file.hpp"
#include "heatchain/results_json.hpp"
#include "heatchain/solver.hpp"

using namespace heatchain;
namespace fs = std::filesystem;

namespace {

std::vector<Project> sampleProjects() {
    std::vector<Project> out;
    for (const auto& e : fs::directory_iterator(fs::path(HEATCHAIN_SOURCE_DIR) / "sample-projects")) {
        if (e.path().extension() != ".hchain") continue;
        std::ifstream in(e.path(), std::ios::binary);
        std::stringstream text;
        text << in.rdbuf();
        if (text.str().find("\"version\": 2") != std::string::npos) continue;  // several streams
        auto p = parseProject(text.str());
        EXPECT_TRUE(p.ok()) << e.path() << ": " << (p ? "" : p.error().text());
        if (p) out.push_back(std::move(*p));
    }
    return out;
}

Number number(double v) { return Number{v, {}, false}; }
Number typedNumber(const std::string& text) { return Number{0.0, text, true}; }
// A quantity as the step panel makes it: the text, and an SI value that may be stale.
Quantity typed(const std::string& text) { return Quantity{text, -12345.0}; }

struct Edit {
    std::string name;
    std::function<void(Project&)> apply;
};

// Edits of the whole worksheet.
std::vector<Edit> worksheetEdits() {
    return {
        {"nothing", [](Project&) {}},
        {"stale SI values", [](Project& p) {
             if (p.start.T) p.start.T->si = 1.0;
             if (p.start.P) p.start.P->si = 1.0;
             p.basis.amount.si = 99.0;
         }},
        {"a lower atmosphere", [](Project& p) { p.atmosphere = typed("0.8 bar"); }},
        {"a gauge atmosphere", [](Project& p) { p.atmosphere = typed("1 barg"); }},
        {"start at a gauge pressure", [](Project& p) {
             p.atmosphere = typed("0.9 bar");
             p.start.P = typed("2 barg");
         }},
        {"no start T", [](Project& p) { p.start.T.reset(); }},
        {"no start T or P", [](Project& p) {
             p.start.T.reset();
             p.start.P.reset();
         }},
        {"start quality 1.5", [](Project& p) { p.start.quality = number(1.5); }},
        {"start quality and melt fraction", [](Project& p) {
             p.start.quality = number(0.5);
             p.start.meltFraction = number(0.5);
         }},
        {"a zero basis", [](Project& p) { p.basis.amount = typed(p.system == SystemKind::Closed ? "0 kg" : "0 kg/s"); }},
        {"the other system's basis", [](Project& p) {
             p.basis.kind = p.system == SystemKind::Closed ? Basis::Kind::MassFlow : Basis::Kind::Mass;
             p.basis.amount = typed(p.system == SystemKind::Closed ? "2 kg/s" : "2 kg");
         }},
        {"a basis that does not read", [](Project& p) { p.basis.amount = typed("3 parsecs"); }},
        {"a negative minimum approach", [](Project& p) { p.minApproach = typed("-1 K"); }},
        {"surroundings at 5 degC", [](Project& p) { p.surroundings = Surroundings{typed("5 degC"), typed("1 atm"), {}}; }},
        {"a heat loss", [](Project& p) { p.heatLoss = HeatLossSpec{typed("25 W/K"), {}}; }},
        {"a negative heat loss", [](Project& p) { p.heatLoss = HeatLossSpec{typed("-25 W/K"), {}}; }},
        {"a steam utility without P", [](Project& p) {
             Utility u;
             u.id = "lp";
             u.kind = UtilityKind::Steam;
             p.utilities.emplace().push_back(u);
         }},
        {"a sensible utility with in = out", [](Project& p) {
             Utility u;
             u.id = "cw";
             u.kind = UtilityKind::Sensible;
             u.Tin = typed("28 degC");
             u.Tout = typed("28 degC");
             u.cp = typed("4.18 kJ/(kg K)");
             p.utilities.emplace().push_back(u);
         }},
        {"a sensible utility with out and flow", [](Project& p) {
             Utility u;
             u.id = "cw";
             u.kind = UtilityKind::Sensible;
             u.Tin = typed("28 degC");
             u.Tout = typed("36 degC");
             u.flow = typed("2 kg/s");
             u.cp = typed("4.18 kJ/(kg K)");
             p.utilities.emplace().push_back(u);
         }},
        {"a fixed utility with P", [](Project& p) {
             Utility u;
             u.id = "air";
             u.kind = UtilityKind::Fixed;
             u.T = typed("20 degC");
             u.P = typed("1 bar");
             p.utilities.emplace().push_back(u);
         }},
        {"two utilities of one id", [](Project& p) {
             Utility u;
             u.id = "air";
             u.kind = UtilityKind::Fixed;
             u.T = typed("20 degC");
             p.utilities.emplace() = {u, u};
         }},
        {"a utility without an id", [](Project& p) {
             Utility u;
             u.kind = UtilityKind::Fixed;
             u.T = typed("20 degC");
             p.utilities.emplace().push_back(u);
         }},
        {"a repeated step id", [](Project& p) {
             if (p.steps.size() >= 2) p.steps[1].id = p.steps[0].id;
         }},
    };
}

// Edits of one step.
std::vector<Edit> stepEdits() {
    std::vector<Edit> edits = {
        {"an empty id", [](Project& p) { p.steps[0].id.clear(); }},
        {"no target", [](Project& p) { p.steps[0].to = StepTarget{}; }},
        {"T and duty", [](Project& p) {
             p.steps[0].to.T = typed("80 degC");
             p.steps[0].to.duty = typed(p.system == SystemKind::Closed ? "10 kJ" : "10 kW");
         }},
        {"a target T that does not read", [](Project& p) {
             p.steps[0].to = StepTarget{};
             p.steps[0].to.T = typed("eighty");
         }},
        {"a target T", [](Project& p) {
             p.steps[0].to = StepTarget{};
             p.steps[0].to.T = typed("350 K");
         }},
        {"a target P in barg", [](Project& p) {
             p.steps[0].to = StepTarget{};
             p.steps[0].to.P = typed("3 barg");
         }},
        {"constant volume", [](Project& p) { p.steps[0].at = HeatingAt::ConstantVolume; }},
        {"a polytropic path without n", [](Project& p) {
             p.steps[0].path = PathKind::Polytropic;
             p.steps[0].n.reset();
             p.steps[0].efficiency.reset();
         }},
        {"n on an isentropic path", [](Project& p) {
             p.steps[0].path = PathKind::Isentropic;
             p.steps[0].n = number(1.3);
         }},
        {"efficiency on an isothermal path", [](Project& p) {
             p.steps[0].path = PathKind::Isothermal;
             p.steps[0].n.reset();
             p.steps[0].efficiency = number(0.8);
         }},
        {"efficiency as text", [](Project& p) {
             p.steps[0].path = PathKind::Adiabatic;
             p.steps[0].n.reset();
             p.steps[0].efficiency = typedNumber("72 %");
         }},
        {"a source naming no utility", [](Project& p) { p.steps[0].source = Reservoir{std::nullopt, "nowhere", {}}; }},
        {"a source with a utility and a T", [](Project& p) {
             p.utilities.emplace().push_back(Utility{"hot", UtilityKind::Fixed, {}, {}, {}, {}, {}, {},
                                                     typed("300 degC"), {}, {}});
             p.steps[0].source = Reservoir{typed("200 degC"), "hot", {}};
         }},
        {"a source with nothing", [](Project& p) { p.steps[0].source = Reservoir{}; }},
        {"a sink with an empty utility name", [](Project& p) { p.steps[0].sink = Reservoir{std::nullopt, "", {}}; }},
        {"a transfer with U alone", [](Project& p) {
             p.steps[0].transfer = HeatTransferSpec{};
             p.steps[0].transfer->U = typed("450 W/(m2 K)");
         }},
        {"a transfer with UA and area", [](Project& p) {
             p.steps[0].transfer = HeatTransferSpec{};
             p.steps[0].transfer->UA = typed("3 kW/K");
             p.steps[0].transfer->area = typed("4 m2");
         }},
        {"an empty transfer", [](Project& p) { p.steps[0].transfer = HeatTransferSpec{}; }},
        {"a zero area", [](Project& p) {
             p.steps[0].transfer = HeatTransferSpec{};
             p.steps[0].transfer->U = typed("450 W/(m2 K)");
             p.steps[0].transfer->area = typed("0 m2");
         }},
        {"U per zone", [](Project& p) {
             p.steps[0].transfer = HeatTransferSpec{};
             p.steps[0].transfer->zoneU = {{"liquid", typed("600 W/(m2 K)")}, {"two-phase", typed("1.2 kW/(m2 K)")}};
             p.steps[0].transfer->area = typed("5 m2");
         }},
        {"rated without an exchanger", [](Project& p) {
             p.steps[0].to = StepTarget{};
             p.steps[0].to.rated = true;
             p.steps[0].transfer.reset();
         }},
        {"rated with an exchanger and a source", [](Project& p) {
             p.steps[0].to = StepTarget{};
             p.steps[0].to.rated = true;
             p.steps[0].transfer = HeatTransferSpec{};
             p.steps[0].transfer->UA = typed("2 kW/K");
             p.steps[0].source = Reservoir{typed("150 degC"), std::nullopt, {}};
             p.steps[0].sink.reset();
         }},
        {"a time target", [](Project& p) {
             p.steps[0].to = StepTarget{};
             p.steps[0].to.time = typed("10 min");
             p.steps[0].transfer = HeatTransferSpec{};
             p.steps[0].transfer->UA = typed("2 kW/K");
             p.steps[0].source = Reservoir{typed("150 degC"), std::nullopt, {}};
         }},
        {"a duration", [](Project& p) { p.steps[0].duration = typed("1 h"); }},
        {"a zero duration", [](Project& p) { p.steps[0].duration = typed("0 h"); }},
        {"a step heat loss", [](Project& p) { p.steps[0].heatLoss = HeatLossSpec{typed("5 W/K"), {}}; }},
    };
    // Every bounded number at and around its bounds.
    for (double v : {-0.5, 0.0, 1e-9, 0.5, 1.0, 1.0 + 1e-12, 1.5}) {
        const std::string at = std::to_string(v);
        edits.push_back({"fraction " + at, [v](Project& p) { p.steps[0].fraction = number(v); }});
        edits.push_back({"ratio " + at, [v](Project& p) {
                             p.steps[0].to = StepTarget{};
                             p.steps[0].to.ratio = number(v);
                         }});
        edits.push_back({"quality " + at, [v](Project& p) {
                             p.steps[0].to = StepTarget{};
                             p.steps[0].to.quality = number(v);
                         }});
        edits.push_back({"efficiency " + at, [v](Project& p) {
                             p.steps[0].path = PathKind::Adiabatic;
                             p.steps[0].n.reset();
                             p.steps[0].efficiency = number(v);
                         }});
        edits.push_back({"n " + at, [v](Project& p) {
                             p.steps[0].path = PathKind::Polytropic;
                             p.steps[0].efficiency.reset();
                             p.steps[0].n = number(v);
                         }});
    }
    return edits;
}

const StepKind kAllKinds[] = {StepKind::Heat,     StepKind::Cool,     StepKind::Melt,     StepKind::Freeze,
                              StepKind::Boil,     StepKind::Condense, StepKind::Sublimate, StepKind::Deposit,
                              StepKind::Compress, StepKind::Expand,   StepKind::Throttle, StepKind::Hold};

// The edited project resolved in memory and read back from its file agree.
void expectAgreement(const Project& edited, const std::string& what, int& accepted, int& refused) {
    SCOPED_TRACE(what);
    const std::string text = writeProject(edited);
    const auto fromFile = parseProject(text);
    const auto resolved = resolveProject(edited);
    ASSERT_EQ(resolved.ok(), fromFile.ok()) << (resolved ? "resolve accepted; the file reader says: " + fromFile.error().text()
                                                         : "resolve refused (" + resolved.error().text() +
                                                               "); the file reader accepted it");
    if (!fromFile) {
        ++refused;
        EXPECT_EQ(resolved.error().message, fromFile.error().message);
        EXPECT_EQ(resolved.error().where, fromFile.error().where);
        return;
    }
    ++accepted;
    EXPECT_EQ(writeProject(*resolved), writeProject(*fromFile));
    EXPECT_EQ(resultsToJson(*resolved, solve(*resolved)).dump(), resultsToJson(*fromFile, solve(*fromFile)).dump());
}

}  // namespace

TEST(ResolveProject, AgreesWithTheFileReaderOnEveryEdit) {
    const std::vector<Project> samples = sampleProjects();
    ASSERT_GE(samples.size(), 6u);
    int accepted = 0, refused = 0;
    for (const Project& base : samples) {
        for (const Edit& e : worksheetEdits()) {
            Project p = base;
            e.apply(p);
            expectAgreement(p, base.meta.title + ": " + e.name, accepted, refused);
        }
        if (base.steps.empty()) continue;
        // Each edit on the first step, made each kind in turn.
        for (StepKind kind : kAllKinds) {
            for (const Edit& e : stepEdits()) {
                Project p = base;
                p.steps[0].kind = kind;
                e.apply(p);
                expectAgreement(p, base.meta.title + ": a " + std::string(stepKindId(kind)) + " step, " + e.name,
                                accepted, refused);
            }
        }
    }
    // Both outcomes are exercised, many times over.
    EXPECT_GT(accepted, 100);
    EXPECT_GT(refused, 1000);
}

TEST(ResolveProject, ANewAtmosphereMovesEveryGaugePressure) {
    auto p = parseProject(R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "substance": "water", "basis": { "massFlow": "1 kg/s" }, "start": { "T": "20 degC", "P": "2 barg" },
      "steps": [ { "id": "pump", "kind": "compress", "to": { "P": "10 barg" } } ] })");
    ASSERT_TRUE(p.ok()) << p.error().text();
    EXPECT_DOUBLE_EQ(p->start.P->si, 200000.0 + 101325.0);
    p->atmosphere = Quantity{"95 kPa", 0.0};
    auto r = resolveProject(*p);
    ASSERT_TRUE(r.ok()) << r.error().text();
    EXPECT_DOUBLE_EQ(r->atmosphere->si, 95000.0);
    EXPECT_DOUBLE_EQ(r->start.P->si, 200000.0 + 95000.0);
    EXPECT_DOUBLE_EQ(r->steps[0].to.P->si, 1000000.0 + 95000.0);
}

TEST(ResolveProject, NamesTheStepAndField) {
    auto p = parseProject(R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "substance": "water", "basis": { "massFlow": "1 kg/s" }, "start": { "T": "20 degC", "P": "2 bar" },
      "steps": [ { "id": "pump", "kind": "compress", "to": { "P": "10 bar" } } ] })");
    ASSERT_TRUE(p.ok()) << p.error().text();
    p->steps[0].to = StepTarget{};
    p->steps[0].to.ratio = Number{1.0, "1", false};
    auto r = resolveProject(*p);
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.error().where, "step \"pump\" (steps[0]).to.ratio");
    EXPECT_NE(r.error().message.find("greater than 1"), std::string::npos) << r.error().message;
}

// A custom substance is read again under a new atmosphere; a pressure of it
// that the new atmosphere puts below zero absolute is named at its own field,
// as the file's reader names it, not at "substance" as a whole.
TEST(ResolveProject, NamesTheFieldOfACustomSubstance) {
    std::ifstream in(fs::path(HEATCHAIN_SOURCE_DIR) / "sample-projects" / "melt-tank.hchain", std::ios::binary);
    std::stringstream text;
    text << in.rdbuf();
    std::string s = text.str();
    const std::string boilingP = "\"P\": \"1 atm\"";
    const auto at = s.find(boilingP, s.find("\"boiling\""));
    ASSERT_NE(at, std::string::npos);
    s.replace(at, boilingP.size(), "\"P\": \"-0.5 barg\"");  // 0.51 bar absolute under 1 atm
    auto p = parseProject(s);
    ASSERT_TRUE(p.ok()) << p.error().text();
    ASSERT_TRUE(p->substance.custom);

    p->atmosphere = Quantity{"0.4 bar", 0.0};  // now -0.1 bar absolute
    const auto resolved = resolveProject(*p);
    ASSERT_FALSE(resolved.ok());
    EXPECT_EQ(resolved.error().where, "substance.boiling.P");
    const auto fromFile = parseProject(writeProject(*p));
    ASSERT_FALSE(fromFile.ok());
    EXPECT_EQ(resolved.error().where, fromFile.error().where);
    EXPECT_EQ(resolved.error().message, fromFile.error().message);
}
