// Sweeps: every point equals a single computation at the same
// input; a point that cannot be computed is reported with its error, not
// dropped; a bad specification is an error value.
#include <gtest/gtest.h>

#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/sweep.hpp"
#include "support/samples.hpp"

using namespace heatchain;

namespace {

Project sample(const char* name) {
    auto p = loadProject(heatchain::testing::samplePath(name));
    EXPECT_TRUE(p.ok()) << p.error().text();
    return *p;
}

std::size_t indexOf(const SweepResult& r, const std::string& key) {
    for (std::size_t i = 0; i < r.outputs.size(); ++i)
        if (r.outputs[i].key == key) return i;
    ADD_FAILURE() << "no output " << key;
    return 0;
}

}  // namespace

TEST(Sweep, PointsEqualSingleComputations) {
    const Project p = sample("solvent-recovery");
    SweepSpec spec{"superheat", "to.T", "120 degC", "135 degC", 4, {}};
    spec.outputs = {"total.Q", "total.Sgen", "total.exergyDestroyed", "step:superheat.T_end", "utility:lp-steam.mass",
                    "step:superheat.approach"};
    auto r = sweep(p, spec);
    ASSERT_TRUE(r.ok()) << r.error().text();
    ASSERT_EQ(r->points.size(), 4u);
    EXPECT_EQ(r->computed(), 4u);
    for (const auto& pt : r->points) {
        ASSERT_FALSE(pt.error) << pt.error->text();
        Project q = p;
        Step* s = nullptr;
        for (auto& st : q.steps)
            if (st.id == "superheat") s = &st;
        ASSERT_NE(s, nullptr);
        auto T = parseQuantity(pt.text, Dimension::Temperature);
        ASSERT_TRUE(T.ok());
        s->to.T = Quantity{pt.text, *T};
        const SequenceResult single = solve(q);
        ASSERT_TRUE(single.ok());
        EXPECT_EQ(*pt.values[indexOf(*r, "total.Q")], single.totals.Q);
        EXPECT_EQ(*pt.values[indexOf(*r, "total.Sgen")], single.totals.Sgen);
        EXPECT_EQ(*pt.values[indexOf(*r, "total.exergyDestroyed")], single.totals.exergyDestroyed);
        EXPECT_EQ(*pt.values[indexOf(*r, "step:superheat.T_end")], single.steps[2].end.T);
        EXPECT_EQ(*pt.values[indexOf(*r, "utility:lp-steam.mass")], single.utilities[0].mass);
        EXPECT_EQ(*pt.values[indexOf(*r, "step:superheat.approach")], single.steps[2].utility->minApproach);
    }
    // The input runs from → to in SI: 120 °C and 135 °C at the ends.
    EXPECT_DOUBLE_EQ(r->points.front().x, 393.15);
    EXPECT_DOUBLE_EQ(r->points.back().x, 408.15);
}

// Points the model or the file rules cannot take stay in the result with
// their error; the others are computed.
TEST(Sweep, FailedPointsAreReportedNotDropped) {
    const Project p = sample("boiler-feed");
    // Superheating at 22 barg up to 1000 degC: the flue gas at 650 degC cannot
    // heat steam above 650 degC, so the upper points fail.
    auto hot = sweep(p, SweepSpec{"superheater", "to.T", "300 degC", "1000 degC", 8, {}});
    ASSERT_TRUE(hot.ok()) << hot.error().text();
    ASSERT_EQ(hot->points.size(), 8u);
    std::size_t failed = 0;
    for (const auto& pt : hot->points) {
        if (pt.error) {
            ++failed;
            EXPECT_NE(pt.error->text().find("superheater"), std::string::npos) << pt.error->text();
            for (const auto& v : pt.values) EXPECT_FALSE(v.has_value());
        }
    }
    EXPECT_GT(failed, 0u);
    EXPECT_LT(failed, 8u);
    // Past the model's range: a start at 3000 °C is beyond what IAPWS-IF97
    // can be stretched to (2500 K), so that point carries the model's error.
    auto hotStart = sweep(p, SweepSpec{"start", "T", "105 degC", "3000 degC", 3, {}});
    ASSERT_TRUE(hotStart.ok()) << hotStart.error().text();
    ASSERT_EQ(hotStart->points.size(), 3u);
    EXPECT_FALSE(hotStart->points[0].error);
    ASSERT_TRUE(hotStart->points[2].error);
    EXPECT_NE(hotStart->points[2].error->text().find("IAPWS-IF97"), std::string::npos)
        << hotStart->points[2].error->text();
    // Efficiency beyond (0, 1]: rejected by the file rules at those points.
    auto eta = sweep(p, SweepSpec{"feed-pump", "efficiency", "0.5", "1.5", 5, {}});
    ASSERT_TRUE(eta.ok());
    EXPECT_EQ(eta->computed(), 3u);  // 0.5, 0.75, 1.0
    ASSERT_TRUE(eta->points[4].error);
    EXPECT_NE(eta->points[4].error->text().find("efficiency"), std::string::npos);
}

TEST(Sweep, BadSpecificationsAreErrors) {
    const Project p = sample("boiler-feed");
    struct Case { SweepSpec spec; const char* needle; };
    const Case cases[] = {
        {{"nowhere", "to.T", "1 degC", "2 degC", 3, {}}, "no step \"nowhere\""},
        {{"economiser", "to.X", "1 degC", "2 degC", 3, {}}, "unknown input"},
        {{"economiser", "to.T", "1 bar", "2 degC", 3, {}}, "sweep --from"},
        {{"economiser", "to.T", "1 degC", "2 degC", 1, {}}, "points"},
        {{"economiser", "to.T", "1 degC", "2 degC", 3, {"total.nothing"}}, "unknown output"},
        {{"start", "to.T", "1 degC", "2 degC", 3, {}}, "start state"},
    };
    for (const auto& c : cases) {
        auto r = sweep(p, c.spec);
        ASSERT_FALSE(r.ok()) << c.needle;
        EXPECT_NE(r.error().text().find(c.needle), std::string::npos) << r.error().text();
    }
}

// Sweeping a source temperature replaces the utility named there.
TEST(Sweep, SourceTemperatureOfAUtilityStep) {
    const Project p = sample("boiler-feed");
    auto r = sweep(p, SweepSpec{"economiser", "source.T", "200 degC", "400 degC", 3,
                                {"step:economiser.Sgen", "total.Sgen"}});
    ASSERT_TRUE(r.ok()) << r.error().text();
    // The water leaves at 190 °C, so every source from 200 °C up can heat it.
    // Q and ΔS stay the same, so S_gen = ΔS − Q / T_source rises with T_source.
    ASSERT_EQ(r->computed(), 3u);
    EXPECT_LT(*r->points[0].values[0], *r->points[1].values[0]);
    EXPECT_LT(*r->points[1].values[0], *r->points[2].values[0]);
}
