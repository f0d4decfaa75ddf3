// A sweep solved on several threads gives exactly the serial sweep, point by
// point in input order (the points are independent solves).
#include <gtest/gtest.h>

#include "heatchain/project_file.hpp"
#include "heatchain/sweep.hpp"
#include "support/samples.hpp"

using namespace heatchain;

TEST(SweepParallel, EqualsTheSerialSweep) {
    auto p = loadProject(heatchain::testing::samplePath("solvent-recovery"));
    ASSERT_TRUE(p.ok()) << p.error().text();
    SweepSpec spec{"superheat", "to.T", "110 degC", "160 degC", 37, {}};
    spec.threads = 1;
    auto serial = sweep(*p, spec);
    ASSERT_TRUE(serial.ok()) << serial.error().text();
    for (unsigned threads : {2u, 3u, 0u}) {
        spec.threads = threads;
        auto parallel = sweep(*p, spec);
        ASSERT_TRUE(parallel.ok()) << parallel.error().text();
        ASSERT_EQ(parallel->points.size(), serial->points.size());
        for (std::size_t k = 0; k < serial->points.size(); ++k) {
            const auto& a = serial->points[k];
            const auto& b = parallel->points[k];
            EXPECT_EQ(a.x, b.x) << k;
            EXPECT_EQ(a.text, b.text) << k;
            EXPECT_EQ(a.error.has_value(), b.error.has_value()) << k;
            EXPECT_EQ(a.warnings, b.warnings) << k;
            ASSERT_EQ(a.values.size(), b.values.size()) << k;
            for (std::size_t j = 0; j < a.values.size(); ++j) EXPECT_EQ(a.values[j], b.values[j]) << k << " " << j;
        }
        // In input order: x rises along the sweep.
        for (std::size_t k = 1; k < parallel->points.size(); ++k)
            EXPECT_LT(parallel->points[k - 1].x, parallel->points[k].x);
    }
}
