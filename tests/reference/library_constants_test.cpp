// The library's fixed points of water and ammonia (resources/substances/*.json,
// several typed from memory) against the reference equations as python3-iapws
// implements them, run live: IAPWS-95 (IAPWS R6-95(2018)) constants for water,
// and the Tillner-Roth, Harms-Watzenberg & Baehr (1993) ammonia equation
// (iapws.ammonia.NH3, called on (T, rho)) for ammonia's critical, triple and
// normal boiling points and its latent heat there.
#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <sstream>
#include <string>

#include "heatchain/substance.hpp"
#include "support/python_oracle.hpp"

namespace heatchain {
namespace {

std::map<std::string, double> keyValues(const std::string& out) {
    std::map<std::string, double> m;
    std::istringstream in(out);
    std::string k;
    double v;
    while (in >> k >> v) m[k] = v;
    return m;
}

const char* kScript = R"PY(
from iapws import _iapws
from iapws.ammonia import NH3
from scipy.optimize import brentq
print("w.M", _iapws.M * 1e-3)          # kg/mol
print("w.Tc", _iapws.Tc)
print("w.Pc", _iapws.Pc * 1e6)
print("w.rhoc", _iapws.rhoc)
print("w.Tt", _iapws.Tt)
print("w.Pt", _iapws.Pt * 1e6)
n = NH3()
print("a.M", NH3.M * 1e-3)
print("a.Tc", NH3.Tc)
print("a.Pc", NH3.Pc * 1e6)
print("a.rhoc", NH3.rhoc)
print("a.Tt", NH3.Tt)
def psat(T):
    rl, rv, _ = n._saturation(T)
    l, v = NH3(T=T, rho=rl), NH3(T=T, rho=rv)
    assert abs(l.P - v.P) < 1e-6 * v.P  # equal pressures of the two densities
    return v.P * 1e6, l, v
print("a.Pt", psat(NH3.Tt)[0])
Tb = brentq(lambda T: psat(T)[0] - 101325.0, 230.0, 250.0, xtol=1e-10)
_, l, v = psat(Tb)
print("a.Tb", Tb)
print("a.hvap", (v.h - l.h) * 1e3)
)PY";

TEST(LibraryConstants, WaterAndAmmoniaFixedPointsAgainstTheReferenceEquations) {
    const auto ref = keyValues(heatchain::testing::runPython(kScript));
    ASSERT_EQ(ref.size(), 14u);
    const Substance* w = SubstanceLibrary::builtin().find("water");
    const Substance* a = SubstanceLibrary::builtin().find("ammonia");
    ASSERT_TRUE(w && a);
    ASSERT_TRUE(w->critical && w->critical->rho && w->triple);
    ASSERT_TRUE(a->critical && a->critical->rho && a->triple && a->boiling);

    auto rel = [](double x, double r) { return std::fabs(x / r - 1.0); };
    // Water: the IAPWS-95 constants themselves (R6-95(2018), Eqs. 1-3 and
    // the triple point), so they must agree to the digits printed.
    EXPECT_LT(rel(w->molarMass, ref.at("w.M")), 1e-9);
    EXPECT_LT(rel(w->critical->T, ref.at("w.Tc")), 1e-9);
    EXPECT_LT(rel(w->critical->P, ref.at("w.Pc")), 1e-9);
    EXPECT_LT(rel(*w->critical->rho, ref.at("w.rhoc")), 1e-9);
    EXPECT_LT(rel(w->triple->T, ref.at("w.Tt")), 1e-9);
    EXPECT_LT(rel(w->triple->P, ref.at("w.Pt")), 1e-6);

    // Ammonia: critical point and triple temperature are the equation's
    // constants. The molar mass is the library's IUPAC value (17.0305 g/mol)
    // against the equation's 17.03026 g/mol: 1.4e-5 apart.
    EXPECT_LT(rel(a->molarMass, ref.at("a.M")), 2e-5);
    EXPECT_LT(rel(a->critical->T, ref.at("a.Tc")), 1e-9);
    EXPECT_LT(rel(a->critical->P, ref.at("a.Pc")), 1e-9);
    EXPECT_LT(rel(*a->critical->rho, ref.at("a.rhoc")), 1e-9);
    EXPECT_LT(rel(a->triple->T, ref.at("a.Tt")), 1e-9);
    // Triple pressure, normal boiling point and its latent heat are the
    // library's rounded figures: 4 figures, 0.01 K, 4 figures.
    EXPECT_LT(rel(a->triple->P, ref.at("a.Pt")), 1e-3);
    EXPECT_NEAR(a->boiling->T, ref.at("a.Tb"), 0.01);
    EXPECT_LT(rel(a->boiling->enthalpy, ref.at("a.hvap")), 1e-3);
    std::printf("ammonia: Pt %.1f Pa (ref %.1f), Tb %.3f K (ref %.4f), latent heat %.1f kJ/kg (ref %.2f)\n",
                a->triple->P, ref.at("a.Pt"), a->boiling->T, ref.at("a.Tb"), a->boiling->enthalpy / 1e3,
                ref.at("a.hvap") / 1e3);
}

}  // namespace
}  // namespace heatchain
