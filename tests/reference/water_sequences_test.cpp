// Whole worksheets of water through the solver against python3-iapws run
// live: IAPWS-IF97 (IAPWS97) for water and steam, and the ice Ih Gibbs
// function of IAPWS R10-06 (iapws._iapws._Ice). Scenarios are our own.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "support/python_oracle.hpp"

using namespace heatchain;

namespace {

std::vector<double> numbers(const std::string& out) {
    std::istringstream in(out);
    std::vector<double> v;
    double x;
    while (in >> x) v.push_back(x);
    return v;
}

}  // namespace

// The boiler-feed sample (feed pump at 60 %, economiser, drum, superheater,
// let-down) against the same chain computed state by state with IAPWS97.
TEST(WaterSequences, BoilerFeedTrainAgainstIapws97) {
    auto p = loadProject(std::string(HEATCHAIN_SOURCE_DIR) + "/sample-projects/boiler-feed.hchain");
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto ref = numbers(heatchain::testing::runPython(R"py(
from iapws import IAPWS97
m = 6.5 * 1000 / 3600                       # kg/s
P1, P2, P3 = 0.125, 2.2 + 0.101325, 0.8 + 0.101325   # MPa: 1.25 bar, 22 barg, 8 barg
s1 = IAPWS97(T=378.15, P=P1)
s2s = IAPWS97(P=P2, s=s1.s)
h2 = s1.h + (s2s.h - s1.h) / 0.6
s2 = IAPWS97(P=P2, h=h2)
e = IAPWS97(T=463.15, P=P2)
sv = IAPWS97(P=P2, x=1)
sh = IAPWS97(T=573.15, P=P2)
ld = IAPWS97(P=P3, h=sh.h)
k = 1000 * m                                 # kJ/kg -> W
print((h2 - s1.h) * k, (s2.s - s1.s) * k)
print((e.h - h2) * k, (e.s - s2.s) * k)
print((sv.h - e.h) * k, (sv.s - e.s) * k, sv.T)
print((sh.h - sv.h) * k, (sh.s - sv.s) * k)
print(ld.T, (ld.s - sh.s) * k)
)py"));
    ASSERT_EQ(ref.size(), 11u);
    const auto& st = r.steps;
    auto rel = [](double a, double b) { return std::fabs(a - b) / std::max(1.0, std::fabs(b)); };
    EXPECT_LT(rel(st[0].W, ref[0]), 1e-6) << "feed pump work";
    EXPECT_LT(rel(st[0].dS, ref[1]), 1e-5) << "feed pump entropy rise";
    EXPECT_LT(rel(st[1].Q, ref[2]), 1e-7) << "economiser duty";
    EXPECT_LT(rel(st[1].dS, ref[3]), 1e-7);
    EXPECT_LT(rel(st[2].Q, ref[4]), 1e-7) << "drum duty";
    EXPECT_LT(rel(st[2].dS, ref[5]), 1e-7);
    EXPECT_NEAR(st[2].end.T, ref[6], 1e-6) << "saturation temperature at drum pressure";
    EXPECT_LT(rel(st[3].Q, ref[7]), 1e-7) << "superheater duty";
    EXPECT_LT(rel(st[3].dS, ref[8]), 1e-7);
    EXPECT_NEAR(st[4].end.T, ref[9], 1e-5) << "temperature after the let-down valve";
    EXPECT_LT(rel(st[4].dS, ref[10]), 1e-6) << "let-down entropy generation";
}

// A thaw of 1.2 t of ice from −15 °C to 40 °C water at 1 atm: the duty is
// h(liquid, 40 °C) − h(ice Ih, −15 °C), both on the IAPWS reference state.
TEST(WaterSequences, IceThawAgainstIapws) {
    const std::string text = R"({
  "format": "heatchain-project", "version": 1,
  "meta": { "title": "Thawing a block-ice store" },
  "system": "closed", "model": "reference", "substance": "water",
  "basis": { "mass": "1.2 t" },
  "surroundings": { "T": "20 degC", "P": "1 atm" },
  "start": { "T": "-15 degC", "P": "1 atm" },
  "steps": [
    { "id": "warm-ice", "kind": "heat", "to": { "T": "-5 degC" }, "source": { "T": "45 degC" } },
    { "id": "thaw", "kind": "melt", "source": { "T": "45 degC" } },
    { "id": "warm-water", "kind": "heat", "to": { "T": "40 degC" }, "source": { "T": "45 degC" } }
  ]
})";
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto ref = numbers(heatchain::testing::runPython(R"py(
from iapws._iapws import _Ice
from iapws import IAPWS97
ice0 = _Ice(258.15, 0.101325)
ice1 = _Ice(268.15, 0.101325)
liq = IAPWS97(T=313.15, P=0.101325)
print(1200 * 1000 * (ice1['h'] - ice0['h']), 1200 * 1000 * (liq.h - ice0['h']), 1200 * 1000 * (liq.s - ice0['s']))
)py"));
    ASSERT_EQ(ref.size(), 3u);
    EXPECT_NEAR(r.steps[0].Q, ref[0], 1e-6 * std::fabs(ref[0])) << "warming ice, R10-06";
    // The whole thaw crosses from ice Ih (R10-06) to liquid (IF97); the two
    // share the triple-point reference to within IF97's own consistency.
    EXPECT_NEAR(r.totals.Q, ref[1], 2e-4 * std::fabs(ref[1])) << "total duty";
    EXPECT_NEAR(r.totals.dS, ref[2], 2e-4 * std::fabs(ref[2])) << "total entropy change";
    EXPECT_EQ(r.steps[1].end.phase, Phase::SolidLiquid);
    ASSERT_TRUE(r.steps[1].end.meltFraction.has_value());
    EXPECT_DOUBLE_EQ(*r.steps[1].end.meltFraction, 1.0);
    for (const auto& s : r.steps) {
        EXPECT_NEAR(s.dU, s.Q + s.W, 1e-9 * std::fabs(s.Q)) << "closed-system energy balance, " << s.id;
        EXPECT_GE(s.Sgen, 0.0) << s.id;
    }
}
