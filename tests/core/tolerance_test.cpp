// Tolerances on typed quantities (shared design project-format.md,
// "Tolerances and uncertainty"): read, validated with errors naming the
// field, and written back exactly as typed.
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/tolerance.hpp"

using namespace heatchain;

TEST(Tolerance, NormalAndRectangular) {
    auto a = parseToleranced("80 degC ± 2 K", Dimension::Temperature);
    ASSERT_TRUE(a.ok()) << a.error().text();
    EXPECT_DOUBLE_EQ(a->si, 353.15);  // 0 degC = 273.15 K (NIST SP 811, B.8)
    ASSERT_TRUE(a->tolerance);
    EXPECT_EQ(a->nominalText, "80 degC");
    EXPECT_EQ(a->tolerance->distribution, Distribution::Normal);
    EXPECT_DOUBLE_EQ(a->tolerance->u, 2.0);

    auto b = parseToleranced("80 degC +/- 2 K rect", Dimension::Temperature);
    ASSERT_TRUE(b.ok()) << b.error().text();
    EXPECT_EQ(b->tolerance->distribution, Distribution::Rectangular);
    EXPECT_DOUBLE_EQ(b->tolerance->halfWidth, 2.0);
    // JCGM 100:2008, 4.3.7: half-width a of a rectangular distribution → u = a/√3.
    EXPECT_NEAR(b->tolerance->u, 2.0 / std::sqrt(3.0), 1e-15);

    // A temperature tolerance in degF is a difference: 3.6 degF = 2 K (1 degF = 5/9 K, NIST SP 811, B.8).
    auto f = parseToleranced("176 degF ± 3.6 degF", Dimension::Temperature);
    ASSERT_TRUE(f.ok()) << f.error().text();
    EXPECT_NEAR(f->tolerance->u, 2.0, 1e-12);
    auto c = parseToleranced("80 degC ± 2 degC", Dimension::Temperature);
    ASSERT_TRUE(c.ok()) << c.error().text();
    EXPECT_DOUBLE_EQ(c->tolerance->u, 2.0);
}

TEST(Tolerance, RelativeAndDimensionless) {
    auto m = parseToleranced("4.2 t/h ± 5 %", Dimension::MassFlow);
    ASSERT_TRUE(m.ok()) << m.error().text();
    EXPECT_NEAR(m->si, 4200.0 / 3600.0, 1e-12);  // 1 t = 1000 kg, 1 h = 3600 s
    EXPECT_TRUE(m->tolerance->relative);
    EXPECT_NEAR(m->tolerance->u, 0.05 * 4200.0 / 3600.0, 1e-12);

    auto e = parseToleranced("0.72 ± 0.03", Dimension::Dimensionless);
    ASSERT_TRUE(e.ok()) << e.error().text();
    EXPECT_DOUBLE_EQ(e->si, 0.72);
    EXPECT_DOUBLE_EQ(e->tolerance->u, 0.03);

    // A percentage of a gauge reading is of the reading: 5 % of 6 bar(g) = 0.3 bar = 30 kPa.
    auto g = parseToleranced("6 barg ± 5 %", Dimension::Pressure);
    ASSERT_TRUE(g.ok()) << g.error().text();
    EXPECT_NEAR(g->tolerance->u, 30000.0, 1e-6);
    auto h = parseToleranced("6 barg ± 0.1 bar", Dimension::Pressure);
    ASSERT_TRUE(h.ok()) << h.error().text();
    EXPECT_NEAR(h->tolerance->u, 10000.0, 1e-6);

    auto plain = parseToleranced("80 degC", Dimension::Temperature);
    ASSERT_TRUE(plain.ok());
    EXPECT_FALSE(plain->tolerance);
}

TEST(Tolerance, BadTolerancesAreErrors) {
    for (const char* bad : {"80 degC ± 5 %", "80 degC ± 2", "80 degC ±", "± 2 K", "80 degC ± -2 K",
                            "80 degC ± 2 kPa", "4.2 t/h ± five %", "0.72 ± 0.03 kg"}) {
        const Dimension d = std::string(bad).rfind("0.72", 0) == 0 ? Dimension::Dimensionless
                            : std::string(bad).find("t/h") != std::string::npos ? Dimension::MassFlow
                                                                                 : Dimension::Temperature;
        auto r = parseToleranced(bad, d);
        EXPECT_FALSE(r.ok()) << bad;
        if (!r.ok()) {
            EXPECT_FALSE(r.error().message.empty());
        }
    }
}

namespace {
const char* kProject = R"({
  "format": "heatchain-project",
  "version": 1,
  "system": "steady-flow",
  "model": "reference",
  "substance": "water",
  "basis": { "massFlow": "4.2 t/h ± 5 %" },
  "start": { "T": "20 degC +/- 0.5 K rect", "P": "3 bar" },
  "steps": [
    { "id": "warm", "kind": "heat", "to": { "T": "80 degC ± 2 K" } },
    { "id": "pump", "kind": "compress", "to": { "P": "6 bar" }, "path": "adiabatic", "efficiency": "0.72 ± 0.03" }
  ]
})";
}  // namespace

TEST(Tolerance, ProjectsKeepTheTextAsTyped) {
    auto p = parseProject(kProject);
    ASSERT_TRUE(p.ok()) << p.error().text();
    EXPECT_DOUBLE_EQ(p->start.T->si, 293.15);
    EXPECT_DOUBLE_EQ(p->steps[0].to.T->si, 353.15);
    EXPECT_DOUBLE_EQ(p->steps[1].efficiency->value, 0.72);
    const std::string out = writeProject(*p);
    for (const char* typed : {"\"4.2 t/h ± 5 %\"", "\"20 degC +/- 0.5 K rect\"", "\"80 degC ± 2 K\"", "\"0.72 ± 0.03\""})
        EXPECT_NE(out.find(typed), std::string::npos) << typed << " not written back in\n" << out;
    auto again = parseProject(out);
    ASSERT_TRUE(again.ok()) << again.error().text();
    EXPECT_EQ(writeProject(*again), out);
}

TEST(Tolerance, ProjectErrorsNameTheField) {
    std::string text = kProject;
    text.replace(text.find("80 degC ± 2 K"), std::string("80 degC ± 2 K").size(), "80 degC ± 5 %");
    auto p = parseProject(text);
    ASSERT_FALSE(p.ok());
    EXPECT_NE(p.error().text().find("steps[0]).to.T"), std::string::npos) << p.error().text();
    EXPECT_NE(p.error().text().find("\"warm\""), std::string::npos) << p.error().text();
    EXPECT_NE(p.error().text().find("temperature difference"), std::string::npos) << p.error().text();

    text = kProject;
    text.replace(text.find("0.72 ± 0.03"), std::string("0.72 ± 0.03").size(), "0.72 ± x");
    auto q = parseProject(text);
    ASSERT_FALSE(q.ok());
    EXPECT_NE(q.error().text().find("efficiency"), std::string::npos) << q.error().text();
}
