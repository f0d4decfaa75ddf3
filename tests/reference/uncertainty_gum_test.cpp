// First-order propagation against python3-uncertainties (Debian's package, a
// general-purpose first-order propagation library by E. Lebigot), run live
// on the same expression: Q = m·cp·(T2 − T1) with independent tolerances.
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "heatchain/project_file.hpp"
#include "heatchain/uncertainty.hpp"
#include "support/python_oracle.hpp"

using namespace heatchain;

TEST(UncertaintyReference, FirstOrderMatchesPythonUncertainties) {
    // An invented constant-cp liquid (test data): its stated model uncertainty
    // of 1.5 % in enthalpy differences is cp's relative uncertainty here.
    const char* text = R"js({ "format": "heatchain-project", "version": 1, "system": "steady-flow",
      "model": "constant-cp",
      "substance": { "id": "test-liquid", "name": "Test liquid", "molarMass": "0.030 kg/mol",
                     "source": "invented test data",
                     "phases": { "liquid": { "cp": "3.2 kJ/(kg K)" }, "vapor": { "cp": "1.5 kJ/(kg K)" } },
                     "boiling": { "T": "450 K", "P": "1 atm", "enthalpy": "1200 kJ/kg" },
                     "uncertainty": { "h": "1.5 %", "source": "invented test statement" } },
      "basis": { "massFlow": "7.5 t/h ± 3 %" },
      "start": { "T": "15 degC ± 0.4 K", "P": "2 bar" },
      "steps": [ { "id": "warm", "kind": "heat", "to": { "T": "95 degC ± 1.2 K rect" } } ],
      "uncertainty": { "models": true } })js";
    auto p = parseProject(text);
    ASSERT_TRUE(p.ok()) << p.error().text();
    auto r = propagateUncertainty(*p);
    ASSERT_TRUE(r.ok()) << r.error().text();
    const auto* Q = r->find("steps.warm.Q");
    ASSERT_NE(Q, nullptr);

    const auto rows = heatchain::testing::parseOracleRows(heatchain::testing::runPython(R"(
from math import sqrt
from uncertainties import ufloat
m = ufloat(7500 / 3600, 0.03 * 7500 / 3600)
cp = ufloat(3200, 0.015 * 3200)
T1 = ufloat(288.15, 0.4)
T2 = ufloat(368.15, 1.2 / sqrt(3))   # rectangular half-width a: u = a/sqrt(3), JCGM 100:2008 4.3.7
Q = m * cp * (T2 - T1)
print("Q", repr(Q.nominal_value), repr(Q.std_dev))
)"));
    auto it = rows.find("Q");
    ASSERT_NE(it, rows.end()) << "python3-uncertainties did not answer";
    ASSERT_EQ(it->second.size(), 2u);
    EXPECT_NEAR(Q->value, it->second[0], 1e-9 * it->second[0]);
    EXPECT_NEAR(Q->u, it->second[1], 1e-9 * it->second[1]);
}
