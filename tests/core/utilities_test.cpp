// Utilities: reading and writing the "utilities" list, the
// approach temperature along a step's T–Q curve, consumption, and S_gen
// against a utility. Expected values are computed in the tests from the
// water model's saturation states and the utility's straight line, by a
// different route than the solver's (which walks the sampled curve).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/substance.hpp"

using namespace heatchain;

namespace {

#define EXPECT_CONTAINS(hay, needle) EXPECT_NE(std::string(hay).find(needle), std::string::npos) << (hay)

std::string project(const std::string& utilities, const std::string& steps, const std::string& start,
                    const std::string& extraTop = "") {
    return R"j({ "format": "heatchain-project", "version": 1, "system": "steady-flow", "model": "reference",
      "substance": "water", "basis": { "massFlow": "1 kg/s" },
      "surroundings": { "T": "25 degC", "P": "1 atm" }, "start": )j" +
           start + "," + extraTop + R"j( "utilities": )j" + utilities + R"j(, "steps": )j" + steps + "}";
}

SequenceResult solveText(const std::string& text) {
    auto p = parseProject(text);
    EXPECT_TRUE(p.ok()) << p.error().text();
    if (!p) return {};
    return solve(*p);
}

const PropertyModel& water() {
    static auto m = makeModel(ModelKind::Reference, *SubstanceLibrary::builtin().find("water"));
    return **m;
}

// Hot oil 300 → 160 °C heating water at 5 bar from 20 °C to 200 °C.
const char* kOil = R"j([{ "id": "oil", "kind": "sensible", "in": "300 degC", "out": "160 degC", "cp": "2.3 kJ/(kg K)" }])j";
const char* kRaise = R"j([{ "id": "raise", "kind": "heat", "to": { "T": "200 degC" }, "source": { "utility": "oil" } }])j";
const char* kStart5bar = R"j({ "T": "20 degC", "P": "5 bar" })j";

}  // namespace

TEST(Utilities, ReadAndWriteBack) {
    const std::string text = project(
        R"j([{ "id": "lp-steam", "kind": "steam", "P": "3 barg", "name": "LP header", "tag": "U-1" },
            { "id": "cw", "kind": "sensible", "in": "28 degC", "out": "36 degC", "cp": "4.18 kJ/(kg K)", "density": "995 kg/m3" },
            { "id": "furnace", "kind": "fixed", "T": "900 degC" }])j",
        R"j([{ "id": "h", "kind": "heat", "to": { "T": "90 degC" }, "source": { "utility": "lp-steam" } }])j",
        kStart5bar, R"j("minApproach": "8 K",)j");
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    ASSERT_EQ(p->utilityList().size(), 3u);
    EXPECT_EQ(p->utilityList()[0].kind, UtilityKind::Steam);
    EXPECT_DOUBLE_EQ(p->utilityList()[0].P->si, 3e5 + 101325.0);  // gauge on the default atmosphere
    EXPECT_EQ(p->utilityList()[0].extra.string("tag"), "U-1");
    EXPECT_EQ(p->utilityList()[1].Tin->text, "28 degC");
    EXPECT_DOUBLE_EQ(p->utilityList()[1].cp->si, 4180.0);
    EXPECT_DOUBLE_EQ(p->utilityList()[1].density->si, 995.0);
    EXPECT_DOUBLE_EQ(p->utilityList()[2].T->si, 1173.15);
    EXPECT_DOUBLE_EQ(p->minApproachK(), 8.0);
    EXPECT_TRUE(p->extra.empty());
    // Stable writing: write(parse(write(p))) == write(p), texts as typed.
    const std::string written = writeProject(*p);
    auto again = parseProject(written);
    ASSERT_TRUE(again.ok()) << again.error().text();
    EXPECT_EQ(writeProject(*again), written);
    EXPECT_CONTAINS(written, "\"P\": \"3 barg\"");
    EXPECT_CONTAINS(written, "\"cp\": \"4.18 kJ/(kg K)\"");
    EXPECT_CONTAINS(written, "\"minApproach\": \"8 K\"");
    EXPECT_CONTAINS(written, "\"utility\": \"lp-steam\"");
    EXPECT_LT(written.find("\"start\""), written.find("\"utilities\""));
    EXPECT_LT(written.find("\"utilities\""), written.find("\"steps\""));
    // A file without utilities is written without them (version-1 files unchanged).
    auto plain = parseProject(project("[]", "[]", kStart5bar));
    ASSERT_TRUE(plain.ok());
    plain->utilities.reset();
    EXPECT_EQ(writeProject(*plain).find("utilities"), std::string::npos);
}

TEST(Utilities, InvalidDefinitionsAndReferencesNameWhere) {
    struct Case { std::string utilities, steps, needle1, needle2; };
    const std::string heat = R"j([{ "id": "warm", "kind": "heat", "to": { "T": "90 degC" }, "source": { "utility": "lp" } }])j";
    const Case cases[] = {
        {"[]", heat, "step \"warm\"", "unknown utility \"lp\""},
        {R"j([{ "id": "steam", "kind": "steam", "P": "3 bar" }])j", heat, "step \"warm\"", "steam"},
        {R"j([{ "id": "lp", "kind": "vapour", "P": "3 bar" }])j", heat, "utilities[0].kind", "steam, sensible, fixed"},
        {R"j([{ "id": "lp", "kind": "steam" }])j", heat, "utilities[0]", "pressure"},
        {R"j([{ "id": "lp", "kind": "steam", "P": "3 bar", "cp": "4 kJ/(kg K)" }])j", heat, "utilities[0].cp", "sensible"},
        {R"j([{ "id": "lp", "kind": "sensible", "in": "30 degC", "out": "30 degC", "cp": "4 kJ/(kg K)" }])j", heat, "utilities[0].out", "equal"},
        {R"j([{ "id": "lp", "kind": "fixed", "T": "900 degC" }, { "id": "lp", "kind": "fixed", "T": "90 degC" }])j", heat, "utilities[1].id", "twice"},
        {R"j([{ "id": "lp", "kind": "fixed", "T": "9 bar" }])j", heat, "utilities[0].T", "temperature"},
    };
    for (const auto& c : cases) {
        auto p = parseProject(project(c.utilities, c.steps, kStart5bar));
        ASSERT_FALSE(p.ok()) << c.utilities;
        EXPECT_CONTAINS(p.error().text(), c.needle1);
        EXPECT_CONTAINS(p.error().text(), c.needle2);
        EXPECT_GT(p.error().line, 0) << p.error().text();
    }
}

// The closest approach is inside the step: water heated against hot oil is
// pinched at the bubble point, not at either end.
TEST(Utilities, ApproachPinchAtTheBubblePoint) {
    auto r = solveText(project(kOil, kRaise, kStart5bar));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const StepResult& s = r.steps[0];
    ASSERT_TRUE(s.utility);
    // Independent expectation: the oil line T(f) = T_out + (T_in − T_out) f,
    // f the fraction of the duty, taken at the bubble point of water at 5 bar.
    const double P = 5e5;
    auto a = water().stateTP(293.15, P);
    auto b = water().stateTP(473.15, P);
    auto f0 = water().stateOnLineP(Transition::Boiling, P, 0.0);
    ASSERT_TRUE(a && b && f0);
    const double fBubble = (f0->h - a->h) / (b->h - a->h);
    const double Toil = 433.15 + (573.15 - 433.15) * fBubble;
    const double expected = Toil - f0->T;
    EXPECT_NEAR(s.utility->minApproach, expected, 1e-6);
    EXPECT_NEAR(s.utility->Tmaterial, f0->T, 1e-6);
    EXPECT_NEAR(s.utility->approachDuty, 1.0 * (f0->h - a->h), 1e-6 * (f0->h - a->h));
    // Not at the ends: both end approaches are larger.
    EXPECT_LT(s.utility->minApproach, (433.15 - 293.15) - 1.0);
    EXPECT_LT(s.utility->minApproach, (573.15 - 473.15) - 1.0);
    // The segment boundary between sensible liquid and boiling.
    ASSERT_LT(s.utility->segment, s.segments.size());
    const std::string where = s.segments[s.utility->segment].label + " " + s.utility->position;
    EXPECT_TRUE(where == "liquid, sensible end" || where == "boiling start") << where;
    EXPECT_TRUE(s.utility->counterCurrent);
    // The chart line runs from the oil outlet at the step's start to its inlet at the end.
    ASSERT_EQ(s.utility->line.size(), 2u);
    EXPECT_DOUBLE_EQ(s.utility->line[0].T, 433.15);
    EXPECT_DOUBLE_EQ(s.utility->line[1].T, 573.15);
    EXPECT_DOUBLE_EQ(s.utility->line[1].Q - s.utility->line[0].Q, s.Q);
    // About 36 K: no approach warning at the default 10 K; one at 40 K. (The
    // step also warns that it boils the water, which a heat step to 200 °C
    // at 5 bar does without being asked.)
    auto approachWarnings = [](const StepResult& st) {
        return std::count_if(st.warnings.begin(), st.warnings.end(),
                             [](const std::string& w) { return w.find("approach") != std::string::npos; });
    };
    EXPECT_EQ(approachWarnings(s), 0);
    auto r40 = solveText(project(kOil, kRaise, kStart5bar, R"j("minApproach": "40 K",)j"));
    ASSERT_TRUE(r40.ok());
    ASSERT_EQ(approachWarnings(r40.steps[0]), 1);
    for (const auto& w : r40.steps[0].warnings)
        if (w.find("approach") != std::string::npos) {
            EXPECT_CONTAINS(w, "below the minimum 40 K");
        }
}

TEST(Utilities, HeatFromColdToHotIsAnError) {
    // Oil 180 → 100 °C: its line crosses below the 151.8 °C boiling water.
    auto r = solveText(project(R"j([{ "id": "oil", "kind": "sensible", "in": "180 degC", "out": "100 degC", "cp": "2.3 kJ/(kg K)" }])j",
                               kRaise, kStart5bar));
    const Error* e = r.firstError();
    ASSERT_NE(e, nullptr);
    EXPECT_CONTAINS(e->text(), "step \"raise\"");
    EXPECT_CONTAINS(e->text(), "cold to hot");
    // A sensible utility that warms cannot be a source; a steam source must be hotter.
    auto wrongWay = solveText(project(R"j([{ "id": "oil", "kind": "sensible", "in": "160 degC", "out": "300 degC", "cp": "2.3 kJ/(kg K)" }])j",
                                      kRaise, kStart5bar));
    ASSERT_NE(wrongWay.firstError(), nullptr);
    EXPECT_CONTAINS(wrongWay.firstError()->text(), "a sink");
    auto cold = solveText(project(R"j([{ "id": "oil", "kind": "steam", "P": "3 bar" }])j", kRaise, kStart5bar));
    ASSERT_NE(cold.firstError(), nullptr);
    EXPECT_CONTAINS(cold.firstError()->text(), "cold to hot");
}

TEST(Utilities, CoolingWaterUseAndEntropyAtTheMeanTemperature) {
    const std::string cw = R"j([{ "id": "cw", "kind": "sensible", "in": "28 degC", "out": "36 degC", "cp": "4.18 kJ/(kg K)", "density": "995 kg/m3" }])j";
    const std::string steps = R"j([{ "id": "chill", "kind": "cool", "to": { "T": "50 degC" }, "sink": { "utility": "cw" } }])j";
    auto r = solveText(project(cw, steps, R"j({ "T": "90 degC", "P": "2 bar" })j"));
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const StepResult& s = r.steps[0];
    ASSERT_TRUE(s.utility);
    // m = |Q| / (cp ΔT), V = m / ρ.
    const double m = -s.Q / (4180.0 * 8.0);
    EXPECT_NEAR(s.utility->mass, m, 1e-12 * m);
    ASSERT_TRUE(s.utility->volume);
    EXPECT_NEAR(*s.utility->volume, m / 995.0, 1e-12 * m);
    // S_gen = ΔS − Q / T_mean, T_mean = (T_in − T_out) / ln(T_in / T_out).
    const double Tin = 301.15, Tout = 309.15;
    const double Tmean = (Tin - Tout) / std::log(Tin / Tout);
    EXPECT_NEAR(s.utility->Tmean, Tmean, 1e-12 * Tmean);
    EXPECT_NEAR(s.Sgen, s.dS - s.Q / Tmean, 1e-9 * std::fabs(s.dS));
    // The same S_gen as the entropy balance of the water stream itself:
    // S_gen = ΔS_material + m_cw cp ln(T_out / T_in).
    EXPECT_NEAR(s.Sgen, s.dS + m * 4180.0 * std::log(Tout / Tin), 1e-9 * std::fabs(s.dS));
    // Counter-current: the closest point is the cold end (water leaves at 50 °C, cw enters at 28 °C).
    EXPECT_NEAR(s.utility->minApproach, 22.0, 1e-9);
    // Totals per utility.
    ASSERT_EQ(r.utilities.size(), 1u);
    EXPECT_EQ(r.utilities[0].steps, 1);
    EXPECT_DOUBLE_EQ(r.utilities[0].mass, s.utility->mass);
    EXPECT_DOUBLE_EQ(r.utilities[0].heatAbsorbed, -s.Q);
}

TEST(Utilities, FixedUtilityEqualsATemperatureReservoir) {
    const std::string steps = R"j([{ "id": "h", "kind": "heat", "to": { "T": "120 degC" }, "source": { "utility": "f" } }])j";
    auto a = solveText(project(R"j([{ "id": "f", "kind": "fixed", "T": "260 degC" }])j", steps, kStart5bar));
    auto b = solveText(project("[]", R"j([{ "id": "h", "kind": "heat", "to": { "T": "120 degC" }, "source": { "T": "260 degC" } }])j",
                               kStart5bar));
    ASSERT_TRUE(a.ok() && b.ok());
    EXPECT_DOUBLE_EQ(a.steps[0].Sgen, b.steps[0].Sgen);
    EXPECT_DOUBLE_EQ(a.steps[0].Q, b.steps[0].Q);
    EXPECT_EQ(a.steps[0].utility->mass, 0.0);
    EXPECT_NEAR(a.steps[0].utility->minApproach, 260.0 - 120.0, 1e-9);
}

// Between sampled points: superheated steam at 100 bar cooled from 500 °C to
// 320 °C, where cp rises toward saturation (311 °C) so T(Q) sags about 16 K
// below its chord, against a sensible utility warming 300 → 480 °C, a line
// 20 K below the chord. The closest point is inside the step; the smallest
// approach is checked against a dense scan of the isobar made here (20,001
// points on h).
TEST(Utilities, ApproachBetweenSampledPointsMatchesADenseScan) {
    const std::string util = R"j([{ "id": "salt", "kind": "sensible", "in": "300 degC", "out": "480 degC", "cp": "1.5 kJ/(kg K)" }])j";
    const std::string steps = R"j([{ "id": "desuper", "kind": "cool", "to": { "T": "320 degC" }, "sink": { "utility": "salt" } }])j";
    auto p = parseProject(project(util, steps, R"j({ "T": "500 degC", "P": "100 bar" })j"));
    ASSERT_TRUE(p.ok()) << p.error().text();
    for (int points : {8, 64}) {
        SolveOptions opt;
        opt.curvePointsPerStep = points;
        auto r = solve(*p, opt);
        ASSERT_TRUE(r.ok()) << r.firstError()->text();
        const auto& s = r.steps[0];
        const double P = 100e5;
        auto a = water().stateTP(773.15, P);
        auto b = water().stateTP(593.15, P);
        ASSERT_TRUE(a && b);
        double best = 1e300;
        const int n = 20000;
        for (int k = 0; k <= n; ++k) {
            const double f = double(k) / n;  // fraction of the duty from the step's start
            auto st = water().statePH(P, a->h + f * (b->h - a->h));
            ASSERT_TRUE(st.ok());
            const double Tu = 753.15 + (573.15 - 753.15) * f;  // counter-current: out at the start, in at the end
            best = std::min(best, st->T - Tu);
        }
        ASSERT_TRUE(s.utility);
        EXPECT_NEAR(s.utility->minApproach, best, 1e-4) << points << " curve points";
        EXPECT_LT(best, 10.0);  // well inside: both ends are 20 K
        EXPECT_EQ(s.utility->position, "inside");
    }
}
