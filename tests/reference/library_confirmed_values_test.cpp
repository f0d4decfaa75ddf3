// Every library value whose source is given as confirmed against a reference
// equation (resources/substances/*.json), checked live against python3-iapws,
// which implements those equations:
//   water   IAPWS R6-95(2018) (IAPWS-95): molar mass, critical point, triple
//           point, acentric factor from its definition, normal boiling point
//           and latent heat, liquid cp at 1 atm, liquid density at 25 degC;
//           IAPWS R14-08(2011) melting pressure: normal melting point;
//           IAPWS R10-06(2009) ice Ih: cp and density at 1 atm, and with
//           IAPWS-95 the enthalpy of fusion. (The vapour's ideal-gas cp
//           against the ideal-gas part of IAPWS-95: water_ideal_gas_test.cpp.)
//   ammonia Tillner-Roth, Harms-Watzenberg & Baehr (1993), called on (T, rho):
//           molar mass, critical point, acentric factor, triple point, normal
//           boiling point and latent heat, saturated-liquid cp and density.
//   air     ideal-gas part of the Lemmon, Jacobsen, Penoncello & Friend (2000)
//           equation as adopted in IAPWS G8-10(2010) (iapws.humidAir.Air).
// Tolerances are the figures the library prints (its values are rounded);
// cp tables are checked as typed, and the fitted curve the model uses apart.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <string>
#include <vector>

#include "heatchain/heat_capacity.hpp"
#include "heatchain/json.hpp"
#include "heatchain/substance.hpp"
#include "support/python_oracle.hpp"

namespace heatchain {
namespace {

using heatchain::testing::OracleRows;

const char* kScript = R"PY(
import math, warnings
warnings.simplefilter("ignore")
from iapws import IAPWS95, _iapws
from iapws._iapws import _Ice, _Melting_Pressure
from iapws.ammonia import NH3
from iapws.humidAir import Air
from scipy.optimize import brentq
P0 = 0.101325  # MPa
print("w.M", _iapws.M * 1e-3)
print("w.Tc", _iapws.Tc); print("w.Pc", _iapws.Pc * 1e6); print("w.rhoc", _iapws.rhoc)
print("w.Tt", _iapws.Tt); print("w.Pt", _iapws.Pt * 1e6)
print("w.omega", -math.log10(IAPWS95(T=0.7 * _iapws.Tc, x=0).P / _iapws.Pc) - 1)
Tm = brentq(lambda T: _Melting_Pressure(T) - P0, 273.0, 273.16, xtol=1e-12)
print("w.Tm", Tm)
print("w.hfus", (IAPWS95(T=Tm, P=P0).h - _Ice(Tm, P0)["h"]) * 1e3)
l, v = IAPWS95(P=P0, x=0), IAPWS95(P=P0, x=1)
print("w.Tb", l.T); print("w.hvap", (v.h - l.h) * 1e3)
for T in (200.0, 230.0, 250.0, 273.15):
    print("w.ice.cp", T, _Ice(T, P0)["cp"] * 1e3)
print("w.ice.rho", _Ice(273.15, P0)["rho"])
for T in (273.16, 298.15, 323.15, 348.15, 372.15):
    print("w.liq.cp", T, IAPWS95(T=T, P=P0).cp * 1e3)
print("w.liq.rho", IAPWS95(T=298.15, P=P0).rho)

n = NH3()
def sat(T):
    rl, rv, _ = n._saturation(T)
    return NH3(T=T, rho=rl), NH3(T=T, rho=rv)
print("a.M", NH3.M * 1e-3)
print("a.Tc", NH3.Tc); print("a.Pc", NH3.Pc * 1e6); print("a.rhoc", NH3.rhoc); print("a.Tt", NH3.Tt)
print("a.omega", -math.log10(sat(0.7 * NH3.Tc)[1].P / NH3.Pc) - 1)
print("a.Pt", sat(NH3.Tt)[1].P * 1e6)
Tb = brentq(lambda T: sat(T)[1].P * 1e6 - 101325.0, 230.0, 250.0, xtol=1e-10)
l, v = sat(Tb)
print("a.Tb", Tb); print("a.hvap", (v.h - l.h) * 1e3); print("a.liq.rho", l.rho)
for T in (233.15, 253.15, 273.15, 293.15, 313.15, 333.15):
    print("a.liq.cp", T, sat(T)[0].cp * 1e3)

for T in (60, 80, 100, 150, 200, 250, 300, 400, 500, 700, 1000, 1500, 2000):
    print("air.cp0", T, Air(T=T, rho=1e-7).cp0 * 1e3)
)PY";

double one(const OracleRows& ref, const std::string& key) {
    const auto it = ref.find(key);
    if (it == ref.end() || it->second.size() != 1) {
        ADD_FAILURE() << "oracle printed no single value for " << key;
        return NAN;
    }
    return it->second[0];
}

std::vector<std::vector<double>> rows(const OracleRows& ref, const std::string& key) {
    std::vector<std::vector<double>> out;
    for (auto [it, end] = ref.equal_range(key); it != end; ++it) out.push_back(it->second);
    return out;
}

double rel(double x, double r) { return std::fabs(x / r - 1.0); }

// The cp table as typed in resources/substances/<id>.json (the model uses a
// least-squares fit through it): T in K -> cp in J/(kg K).
std::map<double, double> typedCpTable(const std::string& id, const std::string& phase) {
    std::ifstream in(std::filesystem::path(HEATCHAIN_SOURCE_DIR) / "resources" / "substances" / (id + ".json"));
    const auto j = nlohmann::json::parse(in);
    const auto& cp = j.at("phases").at(phase).at("cp");
    std::map<double, double> t;
    for (std::size_t i = 0; i < cp.at("T").size(); ++i) {
        const std::string T = cp.at("T")[i].get<std::string>();
        const std::string c = cp.at("cp")[i].get<std::string>();
        EXPECT_NE(T.find(" K"), std::string::npos) << T;
        EXPECT_NE(c.find(" kJ/(kg K)"), std::string::npos) << c;
        t[std::stod(T)] = std::stod(c) * 1e3;
    }
    return t;
}

// Each oracle row {T, cp}: the typed table value at T within `typedTol`, and
// the fitted curve the model uses within `fitTol`.
void expectTable(const std::vector<std::vector<double>>& ref, const std::map<double, double>& typed,
                 const HeatCapacity& fit, double typedTol, double fitTol, const char* what) {
    ASSERT_EQ(ref.size(), typed.size()) << what;
    for (const auto& r : ref) {
        const auto it = typed.lower_bound(r[0] - 1e-9);
        ASSERT_TRUE(it != typed.end() && std::fabs(it->first - r[0]) < 1e-9) << what << ": no entry at " << r[0] << " K";
        EXPECT_LT(rel(it->second, r[1]), typedTol) << what << ", typed value at T = " << r[0] << " K";
        EXPECT_LT(rel(fit.cp(r[0]), r[1]), fitTol) << what << ", fitted curve at T = " << r[0] << " K";
    }
}

class LibraryConfirmed : public ::testing::Test {
protected:
    static void SetUpTestSuite() { ref_ = new OracleRows(heatchain::testing::parseOracleRows(heatchain::testing::runPython(kScript))); }
    static void TearDownTestSuite() {
        delete ref_;
        ref_ = nullptr;
    }
    static const OracleRows& ref() { return *ref_; }
    static const Substance& substance(const char* id) {
        const Substance* s = SubstanceLibrary::builtin().find(id);
        if (!s) throw std::runtime_error(std::string("no library substance ") + id);
        return *s;
    }

private:
    static inline OracleRows* ref_ = nullptr;
};

TEST_F(LibraryConfirmed, WaterAgainstIapws95IceIhAndTheMeltingLine) {
    const Substance& w = substance("water");
    ASSERT_TRUE(w.critical && w.critical->rho && w.triple && w.melting && w.boiling);
    ASSERT_TRUE(w.cpSolid && w.cpLiquid && w.solidDensity && w.liquidDensity);
    // The constants of the release: to the digits printed.
    EXPECT_LT(rel(w.molarMass, one(ref(), "w.M")), 1e-9);
    EXPECT_LT(rel(w.critical->T, one(ref(), "w.Tc")), 1e-9);
    EXPECT_LT(rel(w.critical->P, one(ref(), "w.Pc")), 1e-9);
    EXPECT_LT(rel(*w.critical->rho, one(ref(), "w.rhoc")), 1e-9);
    EXPECT_LT(rel(w.triple->T, one(ref(), "w.Tt")), 1e-9);
    EXPECT_LT(rel(w.triple->P, one(ref(), "w.Pt")), 1e-6);
    // Acentric factor, 4 figures.
    EXPECT_NEAR(w.critical->acentricFactor, one(ref(), "w.omega"), 5e-5);
    // Normal melting point (R14-08 melting pressure = 101.325 kPa), 9 figures;
    // enthalpy of fusion there (IAPWS-95 liquid − ice Ih), 5 figures.
    EXPECT_NEAR(w.melting->T, one(ref(), "w.Tm"), 1e-6);
    EXPECT_LT(rel(w.melting->enthalpy, one(ref(), "w.hfus")), 5e-5);
    // Normal boiling point, 0.001 K; latent heat, 6 figures.
    EXPECT_NEAR(w.boiling->T, one(ref(), "w.Tb"), 1e-3);
    EXPECT_LT(rel(w.boiling->enthalpy, one(ref(), "w.hvap")), 1e-5);
    // The cp tables at their own temperatures, 5 figures; densities, 5 figures.
    // The quadratic fit the model draws through them: ice within 0.01 %,
    // liquid within 0.2 % (its minimum near 35 degC is flatter than a parabola).
    expectTable(rows(ref(), "w.ice.cp"), typedCpTable("water", "solid"), *w.cpSolid, 5e-5, 1e-4, "ice");
    expectTable(rows(ref(), "w.liq.cp"), typedCpTable("water", "liquid"), *w.cpLiquid, 5e-5, 2e-3, "liquid water");
    EXPECT_LT(rel(*w.solidDensity, one(ref(), "w.ice.rho")), 1e-5);
    EXPECT_LT(rel(*w.liquidDensity, one(ref(), "w.liq.rho")), 1e-5);
}

TEST_F(LibraryConfirmed, AmmoniaAgainstTheTillnerRothEquation) {
    const Substance& a = substance("ammonia");
    ASSERT_TRUE(a.critical && a.critical->rho && a.triple && a.boiling && a.cpLiquid && a.liquidDensity);
    // The library's molar mass comes from the atomic weights (17.0305 g/mol);
    // the equation's is 17.03026 g/mol: 1.4e-5 apart.
    EXPECT_LT(rel(a.molarMass, one(ref(), "a.M")), 2e-5);
    EXPECT_LT(rel(a.critical->T, one(ref(), "a.Tc")), 1e-9);
    EXPECT_LT(rel(a.critical->P, one(ref(), "a.Pc")), 1e-9);
    EXPECT_LT(rel(*a.critical->rho, one(ref(), "a.rhoc")), 1e-9);
    EXPECT_NEAR(a.critical->acentricFactor, one(ref(), "a.omega"), 5e-5);
    EXPECT_LT(rel(a.triple->T, one(ref(), "a.Tt")), 1e-9);
    // Rounded figures: triple pressure 4 figures, boiling point 0.01 K,
    // latent heat 4 figures, liquid density at the boiling point 4 figures.
    EXPECT_LT(rel(a.triple->P, one(ref(), "a.Pt")), 1e-3);
    EXPECT_NEAR(a.boiling->T, one(ref(), "a.Tb"), 0.01);
    EXPECT_LT(rel(a.boiling->enthalpy, one(ref(), "a.hvap")), 1e-3);
    EXPECT_LT(rel(*a.liquidDensity, one(ref(), "a.liq.rho")), 1e-4);
    // Saturated-liquid cp table, 4 figures, at its own temperatures; the
    // cubic fit through it within 0.1 %.
    expectTable(rows(ref(), "a.liq.cp"), typedCpTable("ammonia", "liquid"), *a.cpLiquid, 2e-4, 1e-3, "liquid ammonia");
}

TEST_F(LibraryConfirmed, AirIdealGasCpAgainstTheLemmonEquationAsInIapwsG8) {
    const Substance& air = substance("air");
    ASSERT_TRUE(air.cpVapor);
    const auto cp0 = rows(ref(), "air.cp0");
    ASSERT_EQ(cp0.size(), 13u);
    double worst = 0;
    for (const auto& r : cp0) {
        const double dev = rel(air.cpVapor->cp(r[0]), r[1]);
        worst = std::max(worst, dev);
        // Below 200 K the library uses 3.5 R (vibration frozen): 0.3 %;
        // from 200 K the summed Shomate fits of N2, O2 and Ar: 0.05 %.
        EXPECT_LT(dev, r[0] < 200 ? 3e-3 : 5e-4) << "T = " << r[0] << " K";
    }
    std::printf("[ air ideal gas ] largest deviation from the Lemmon et al. (2000) ideal part: %.3f %%\n", worst * 100);
}

}  // namespace
}  // namespace heatchain
