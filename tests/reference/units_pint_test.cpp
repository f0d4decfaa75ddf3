// Cross-checks every conversion factor and offset of knownUnits() against
// python3-pint (Debian package), run live through /usr/bin/python3.
//
// Where pint spells a unit differently the mapping below says so. Two
// deliberate choices:
// - Btu: Heatchain uses the International Table Btu (1055.05585262 J, NIST
//   SP 811 (2008) B.8). pint's plain "Btu" is the ISO 31-4 Btu (1055.056 J),
//   so every Btu unit is compared with pint's
//   "international_british_thermal_unit".
// - "%": pint 0.19 has no percent unit; it is the one unit not compared.
// - Gauge units (barg, kPag, psig) have no pint counterpart: their factor is
//   compared with the absolute unit, and their offset (the context's
//   atmosphere) is checked end to end through parseQuantity against pint's
//   "atm" and a second, non-standard atmosphere.
#include "heatchain/units.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <sstream>
#include <string>
#include <utility>

#include "support/python_oracle.hpp"

namespace heatchain {
namespace {

using D = Dimension;

// Our (dimension, canonical symbol) → pint expression. A known unit missing
// here fails the test, so a new unit cannot skip the cross-check.
const std::map<std::pair<D, std::string>, std::string>& pintNames() {
    static const std::map<std::pair<D, std::string>, std::string> m = {
        // pint 0.19 (Debian 12) defines no percent; "%" (= 1/100 by
        // definition) is checked in tests/core/units_test.cpp instead.
        {{D::Dimensionless, "%"}, ""},
        {{D::Temperature, "K"}, "kelvin"},
        {{D::Temperature, "degC"}, "degC"},
        {{D::Temperature, "degF"}, "degF"},
        {{D::Temperature, "degR"}, "degR"},
        {{D::TemperatureDifference, "K"}, "kelvin"},
        {{D::TemperatureDifference, "delta_degC"}, "delta_degC"},
        {{D::TemperatureDifference, "delta_degF"}, "delta_degF"},
        {{D::Pressure, "Pa"}, "Pa"},
        {{D::Pressure, "kPa"}, "kPa"},
        {{D::Pressure, "MPa"}, "MPa"},
        {{D::Pressure, "bar"}, "bar"},
        {{D::Pressure, "mbar"}, "mbar"},
        {{D::Pressure, "atm"}, "atm"},
        {{D::Pressure, "psia"}, "psi"},
        {{D::Pressure, "barg"}, "bar"},   // factor only, see header comment
        {{D::Pressure, "kPag"}, "kPa"},   // factor only
        {{D::Pressure, "psig"}, "psi"},   // factor only
        {{D::Pressure, "MPag"}, "MPa"},   // factor only
        {{D::Pressure, "kgf/cm2"}, "kgf/cm**2"},
        {{D::Pressure, "kgf/cm2g"}, "kgf/cm**2"},  // factor only
        {{D::Mass, "kg"}, "kg"},
        {{D::Mass, "g"}, "g"},
        {{D::Mass, "t"}, "tonne"},
        {{D::Mass, "lb"}, "lb"},
        {{D::Amount, "mol"}, "mol"},
        {{D::Amount, "kmol"}, "kmol"},
        {{D::Amount, "lbmol"}, "lb * mol / g"},  // pint 0.19 has no pound-mole
        {{D::MassFlow, "kg/s"}, "kg/s"},
        {{D::MassFlow, "kg/h"}, "kg/hour"},
        {{D::MassFlow, "t/h"}, "tonne/hour"},
        {{D::MassFlow, "lb/h"}, "lb/hour"},
        {{D::MolarFlow, "mol/s"}, "mol/s"},
        {{D::MolarFlow, "kmol/h"}, "kmol/hour"},
        {{D::MolarFlow, "lbmol/h"}, "lb * mol / g / hour"},
        {{D::Energy, "J"}, "J"},
        {{D::Energy, "kJ"}, "kJ"},
        {{D::Energy, "MJ"}, "MJ"},
        {{D::Energy, "kWh"}, "kW * hour"},
        {{D::Energy, "Btu"}, "international_british_thermal_unit"},
        {{D::Power, "W"}, "W"},
        {{D::Power, "kW"}, "kW"},
        {{D::Power, "MW"}, "MW"},
        {{D::Power, "Btu/h"}, "international_british_thermal_unit / hour"},
        {{D::Entropy, "J/K"}, "J/K"},
        {{D::Entropy, "kJ/K"}, "kJ/K"},
        {{D::Entropy, "Btu/degR"}, "international_british_thermal_unit / degR"},
        {{D::EntropyRate, "W/K"}, "W/K"},
        {{D::EntropyRate, "kW/K"}, "kW/K"},
        {{D::EntropyRate, "Btu/(h degR)"}, "international_british_thermal_unit / hour / degR"},
        {{D::SpecificEnergy, "J/kg"}, "J/kg"},
        {{D::SpecificEnergy, "kJ/kg"}, "kJ/kg"},
        {{D::SpecificEnergy, "MJ/kg"}, "MJ/kg"},
        {{D::SpecificEnergy, "Btu/lb"}, "international_british_thermal_unit / lb"},
        {{D::SpecificEntropy, "J/(kg K)"}, "J / kg / K"},
        {{D::SpecificEntropy, "kJ/(kg K)"}, "kJ / kg / K"},
        {{D::SpecificEntropy, "Btu/(lb degF)"}, "international_british_thermal_unit / lb / delta_degF"},
        {{D::MolarEntropy, "J/(mol K)"}, "J / mol / K"},
        {{D::MolarEntropy, "kJ/(kmol K)"}, "kJ / kmol / K"},
        {{D::MolarEntropy, "J/(kmol K)"}, "J / kmol / K"},
        {{D::MolarEntropy, "Btu/(lbmol degF)"},
         "international_british_thermal_unit / (lb * mol / g) / delta_degF"},
        {{D::MolarEnergy, "J/mol"}, "J/mol"},
        {{D::MolarEnergy, "kJ/mol"}, "kJ/mol"},
        {{D::MolarEnergy, "kJ/kmol"}, "kJ/kmol"},
        {{D::MolarEnergy, "Btu/lbmol"}, "international_british_thermal_unit / (lb * mol / g)"},
        {{D::MolarMass, "kg/mol"}, "kg/mol"},
        {{D::MolarMass, "g/mol"}, "g/mol"},
        {{D::MolarMass, "kg/kmol"}, "kg/kmol"},
        {{D::MolarMass, "lb/lbmol"}, "lb / (lb * mol / g)"},
        {{D::Volume, "m3"}, "m**3"},
        {{D::Volume, "L"}, "liter"},
        {{D::Volume, "ft3"}, "ft**3"},
        {{D::SpecificVolume, "m3/kg"}, "m**3/kg"},
        {{D::SpecificVolume, "L/kg"}, "liter/kg"},
        {{D::SpecificVolume, "ft3/lb"}, "ft**3/lb"},
        {{D::Density, "kg/m3"}, "kg/m**3"},
        {{D::Density, "g/cm3"}, "g/cm**3"},
        {{D::Density, "lb/ft3"}, "lb/ft**3"},
        {{D::VolumeFlow, "m3/s"}, "m**3/s"},
        {{D::VolumeFlow, "m3/h"}, "m**3/hour"},
        {{D::VolumeFlow, "L/s"}, "liter/s"},
        {{D::VolumeFlow, "L/min"}, "liter/minute"},
        {{D::VolumeFlow, "ft3/min"}, "ft**3/minute"},
        {{D::Area, "m2"}, "m**2"},
        {{D::Area, "cm2"}, "cm**2"},
        {{D::Area, "ft2"}, "ft**2"},
        {{D::HeatTransferCoefficient, "W/(m2 K)"}, "W/m**2/kelvin"},
        {{D::HeatTransferCoefficient, "kW/(m2 K)"}, "kW/m**2/kelvin"},
        {{D::HeatTransferCoefficient, "Btu/(h ft2 degF)"}, "international_british_thermal_unit/hour/ft**2/delta_degF"},
        {{D::ThermalConductance, "W/K"}, "W/kelvin"},
        {{D::ThermalConductance, "kW/K"}, "kW/kelvin"},
        {{D::ThermalConductance, "Btu/(h degF)"}, "international_british_thermal_unit/hour/delta_degF"},
        {{D::Time, "s"}, "second"},
        {{D::Time, "min"}, "minute"},
        {{D::Time, "h"}, "hour"},
    };
    return m;
}

// The SI unit of each dimension, as pint spells it.
std::string pintSI(D d) {
    switch (d) {
        case D::Dimensionless: return "dimensionless";
        case D::Temperature: case D::TemperatureDifference: return "kelvin";
        case D::Pressure: return "Pa";
        case D::Mass: return "kg";
        case D::Amount: return "mol";
        case D::MassFlow: return "kg/s";
        case D::MolarFlow: return "mol/s";
        case D::Energy: return "J";
        case D::Power: return "W";
        case D::Entropy: return "J/K";
        case D::EntropyRate: return "W/K";
        case D::SpecificEnergy: return "J/kg";
        case D::SpecificEntropy: return "J/kg/K";
        case D::MolarEntropy: return "J/mol/K";
        case D::MolarEnergy: return "J/mol";
        case D::MolarMass: return "kg/mol";
        case D::Volume: return "m**3";
        case D::SpecificVolume: return "m**3/kg";
        case D::Density: return "kg/m**3";
        case D::VolumeFlow: return "m**3/s";
        case D::Area: return "m**2";
        case D::HeatTransferCoefficient: return "W/m**2/K";
        case D::ThermalConductance: return "W/K";
        case D::Time: return "s";
    }
    return "";
}

void expectRelNear(double ours, double ref, const std::string& what) {
    const double tol = 1e-12 * std::max(std::fabs(ref), 1e-300);
    EXPECT_NEAR(ours, ref, tol) << what << ": ours " << ours << ", pint " << ref;
}

TEST(UnitsAgainstPint, EveryFactorAndOffset) {
    // One script: for each unit, print index, SI value of 0 and of 1 unit
    // (offset units) or of 1 unit (others). For offset temperatures the
    // factor comes from the matching delta unit, so no subtraction loses digits.
    std::ostringstream script;
    script << "import pint\nu = pint.UnitRegistry()\nQ = u.Quantity\n";
    script << "rows = [\n";
    int index = 0;
    for (const UnitInfo& unit : knownUnits()) {
        auto it = pintNames().find({unit.dimension, std::string(unit.symbol)});
        ASSERT_NE(it, pintNames().end()) << "no pint mapping for " << unit.symbol << " ("
                                         << dimensionName(unit.dimension) << ")";
        const std::string& name = it->second;
        if (name.empty()) {
            ++index;
            continue;
        }
        std::string deltaName = name;
        if (name == "degC") deltaName = "delta_degC";
        if (name == "degF") deltaName = "delta_degF";
        script << "  (" << index++ << ", '" << name << "', '" << deltaName << "', '" << pintSI(unit.dimension)
               << "'),\n";
    }
    script << "]\n"
              "for i, name, delta, si in rows:\n"
              "    factor = Q(1.0, delta).to(si).magnitude\n"
              "    offset = Q(0.0, name).to(si).magnitude\n"
              "    print(i, repr(float(factor)), repr(float(offset)))\n";
    const std::string out = heatchain::testing::runPython(script.str());
    std::istringstream lines(out);
    int seen = 0;
    int i;
    double factor, offset;
    const auto units = knownUnits();
    while (lines >> i >> factor >> offset) {
        ASSERT_GE(i, 0);
        ASSERT_LT(i, static_cast<int>(units.size()));
        const UnitInfo& unit = units[static_cast<size_t>(i)];
        const std::string what = std::string(unit.symbol) + " (" + std::string(dimensionName(unit.dimension)) + ")";
        expectRelNear(unit.factor, factor, what + " factor");
        if (offset == 0.0)
            EXPECT_EQ(unit.offset, 0.0) << what;
        else
            expectRelNear(unit.offset, offset, what + " offset");
        ++seen;
    }
    EXPECT_EQ(seen, static_cast<int>(units.size()) - 1) << "pint printed:\n" << out;  // all but "%"
}

TEST(UnitsAgainstPint, ParsedTextMatchesPintIncludingGauge) {
    // parseQuantity end to end (aliases, gauge offsets) against pint.
    const std::string out = heatchain::testing::runPython(
        "import pint\nu = pint.UnitRegistry()\nQ = u.Quantity\n"
        "print(repr(Q(48.0, 'degC').to('K').magnitude))\n"
        "print(repr(Q(-40.0, 'degF').to('K').magnitude))\n"
        "print(repr((Q(14.0, 'bar') + Q(1.0, 'atm')).to('Pa').magnitude))\n"
        "print(repr((Q(150.0, 'psi') + Q(1.0, 'atm')).to('Pa').magnitude))\n"
        "print(repr((Q(3.0, 'kPa') + Q(95.0, 'kPa')).to('Pa').magnitude))\n"
        "print(repr(Q(4.2, 'tonne/hour').to('kg/s').magnitude))\n"
        "print(repr(Q(0.5, 'international_british_thermal_unit/lb/delta_degF').to('J/kg/K').magnitude))\n"
        "print(repr(Q(25.0, 'delta_degF').to('K').magnitude))\n"
        "print(repr((Q(7.0, 'kgf/cm**2') + Q(1.0, 'atm')).to('Pa').magnitude))\n"
        "print(repr(Q(2.5, 'bar').to('Pa').magnitude))\n"
        "print(repr((Q(1.2, 'MPa') + Q(1.0, 'atm')).to('Pa').magnitude))\n"
        "print(repr((Q(10.0, 'psi') + Q(1.0, 'atm')).to('Pa').magnitude))\n");
    std::istringstream in(out);
    double v[12];
    for (double& x : v) ASSERT_TRUE(static_cast<bool>(in >> x)) << out;
    expectRelNear(*parseQuantity("48 °C", D::Temperature), v[0], "48 °C");
    expectRelNear(*parseQuantity("-40 F", D::Temperature), v[1], "-40 F");
    expectRelNear(*parseQuantity("14 barg", D::Pressure), v[2], "14 barg");
    expectRelNear(*parseQuantity("150 psig", D::Pressure), v[3], "150 psig");
    expectRelNear(*parseQuantity("3 kPag", D::Pressure, UnitContext{95000.0}), v[4], "3 kPag at 95 kPa");
    expectRelNear(*parseQuantity("4.2 t/h", D::MassFlow), v[5], "4.2 t/h");
    expectRelNear(*parseQuantity("0.5 Btu/lb/F", D::SpecificEntropy), v[6], "0.5 Btu/lb/F");
    expectRelNear(*parseQuantity("25 degF", D::TemperatureDifference), v[7], "25 degF difference");
    // The written forms of gauge and absolute (pint has no gauge: its
    // absolute value plus one atmosphere).
    expectRelNear(*parseQuantity("7 kg/cm2 g", D::Pressure), v[8], "7 kg/cm2 g");
    expectRelNear(*parseQuantity("2.5 bar(a)", D::Pressure), v[9], "2.5 bar(a)");
    expectRelNear(*parseQuantity("2.5 bara", D::Pressure), v[9], "2.5 bara");
    expectRelNear(*parseQuantity("1.2 MPa(g)", D::Pressure), v[10], "1.2 MPa(g)");
    expectRelNear(*parseQuantity("10 psi(g)", D::Pressure), v[11], "10 psi(g)");
    expectRelNear(*parseQuantity("10 psig", D::Pressure), v[11], "10 psig");
}

}  // namespace
}  // namespace heatchain
