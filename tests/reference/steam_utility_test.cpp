// A steam utility's condensing temperature and latent heat against
// python3-iapws (IAPWS-IF97) run live, and the steam used by a
// steam-heated step: duty / latent heat.
#include <gtest/gtest.h>

#include <cmath>
#include <sstream>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/solver.hpp"
#include "support/python_oracle.hpp"

using namespace heatchain;

namespace {

// Tsat [K] and h_g − h_f [J/kg] at P [Pa] from python3-iapws IAPWS97.
std::pair<double, double> oracle(double P) {
    std::ostringstream py;
    py.precision(17);
    py << "from iapws import IAPWS97\n"
          "P = " << P / 1e6 << "\n"
          "l = IAPWS97(P=P, x=0)\n"
          "v = IAPWS97(P=P, x=1)\n"
          "print(repr(l.T), repr((v.h - l.h) * 1000))\n";
    std::istringstream out(heatchain::testing::runPython(py.str()));
    double T = NAN, L = NAN;
    out >> T >> L;
    return {T, L};
}

}  // namespace

TEST(SteamUtilityReference, SaturationAndLatentHeatMatchIapws) {
    for (const char* P : {"0.5 bar", "3 barg", "10 barg", "40 bar", "150 bar"}) {
        Utility u;
        u.id = "steam";
        u.kind = UtilityKind::Steam;
        auto si = parseQuantity(P, Dimension::Pressure);
        ASSERT_TRUE(si.ok());
        u.P = Quantity{P, *si};
        auto prof = resolveUtility(u);
        ASSERT_TRUE(prof.ok()) << prof.error().text();
        const auto [T, L] = oracle(*si);
        ASSERT_TRUE(std::isfinite(T) && std::isfinite(L)) << "python3-iapws gave no answer at " << P;
        EXPECT_NEAR(prof->Tin, T, 1e-9 * T) << P;
        EXPECT_NEAR(prof->latentHeat, L, 1e-9 * L) << P;
        EXPECT_DOUBLE_EQ(prof->Tmean, prof->Tin);
    }
}

TEST(SteamUtilityReference, SteamUseIsDutyOverLatentHeat) {
    const std::string text = R"({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "model": "reference", "substance": "water", "basis": { "massFlow": "5 t/h" },
      "start": { "T": "20 degC", "P": "3 bar" },
      "utilities": [ { "id": "mp", "kind": "steam", "P": "10 barg" } ],
      "steps": [ { "id": "warm", "kind": "heat", "to": { "T": "120 degC" }, "source": { "utility": "mp" } },
                 { "id": "hotter", "kind": "heat", "to": { "T": "130 degC" }, "source": { "utility": "mp" } } ] })";
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = solve(*p);
    ASSERT_TRUE(r.ok()) << r.firstError()->text();
    const auto [T, L] = oracle(10e5 + 101325.0);
    double total = 0;
    for (const auto& s : r.steps) {
        ASSERT_TRUE(s.utility);
        EXPECT_NEAR(s.utility->mass, s.Q / L, 1e-9 * s.Q / L) << s.id;
        EXPECT_NEAR(*s.reservoirT, T, 1e-9 * T);
        total += s.Q / L;
    }
    ASSERT_EQ(r.utilities.size(), 1u);
    EXPECT_NEAR(r.utilities[0].mass, total, 1e-6 * total);
    EXPECT_EQ(r.utilities[0].steps, 2);
}
