// Units: parsing into SI, conversion back, display, and every error path.
// Check values are the exact definitions or the tabulated factors of
// NIST SP 811 (2008), "Guide for the Use of the International System of
// Units", Appendix B.8 (factors for units listed alphabetically) and 4.2.1.1
// (Celsius temperature), named beside each check.
#include "heatchain/units.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <set>
#include <string>

namespace heatchain {
namespace {

double parsed(std::string_view text, Dimension d, const UnitContext& c = {}) {
    auto r = parseQuantity(text, d, c);
    EXPECT_TRUE(r.ok()) << text << ": " << (r.ok() ? "" : r.error().text());
    return r.ok() ? *r : std::nan("");
}

std::string errorOf(std::string_view text, Dimension d, const UnitContext& c = {}) {
    auto r = parseQuantity(text, d, c);
    EXPECT_FALSE(r.ok()) << text << " parsed as " << (r.ok() ? *r : 0.0);
    return r.ok() ? std::string() : r.error().text();
}

#define EXPECT_CONTAINS(haystack, needle) \
    EXPECT_NE(std::string(haystack).find(needle), std::string::npos) << "in: " << (haystack)

TEST(Units, CelsiusAndFahrenheitTemperatures) {
    // NIST SP 811 (2008) 4.2.1.1: T/K = t/°C + 273.15.
    EXPECT_DOUBLE_EQ(parsed("25 degC", Dimension::Temperature), 298.15);
    EXPECT_DOUBLE_EQ(parsed("25°C", Dimension::Temperature), 298.15);
    EXPECT_DOUBLE_EQ(parsed("  25 C ", Dimension::Temperature), 298.15);
    // NIST SP 811 (2008) B.9: T/K = (t/°F + 459.67)/1.8; 212 °F is 373.15 K.
    EXPECT_NEAR(parsed("212 degF", Dimension::Temperature), 373.15, 1e-12);
    EXPECT_NEAR(parsed("32 °F", Dimension::Temperature), 273.15, 1e-12);
    // NIST SP 811 (2008) B.9: T/K = (T/°R)/1.8.
    EXPECT_NEAR(parsed("671.67 degR", Dimension::Temperature), 373.15, 1e-12);
    EXPECT_DOUBLE_EQ(parsed("300 K", Dimension::Temperature), 300.0);
    EXPECT_DOUBLE_EQ(parsed("-40 degC", Dimension::Temperature), 233.15);
    // A Unicode minus (U+2212) as typed by word processors.
    EXPECT_DOUBLE_EQ(parsed("\xE2\x88\x92" "40 degC", Dimension::Temperature), 233.15);
}

TEST(Units, TemperatureDifferenceIsNotATemperature) {
    // A difference of 10 °C is 10 K (NIST SP 811 (2008) 4.2.1.1: the degree
    // Celsius is equal in magnitude to the kelvin); 18 °F difference is 10 K.
    EXPECT_DOUBLE_EQ(parsed("10 degC", Dimension::TemperatureDifference), 10.0);
    EXPECT_DOUBLE_EQ(parsed("10 delta_degC", Dimension::TemperatureDifference), 10.0);
    EXPECT_NEAR(parsed("18 degF", Dimension::TemperatureDifference), 10.0, 1e-12);
    EXPECT_NEAR(parsed("18 delta_degF", Dimension::TemperatureDifference), 10.0, 1e-12);
    EXPECT_DOUBLE_EQ(parsed("-5 K", Dimension::TemperatureDifference), -5.0);
    EXPECT_DOUBLE_EQ(parsed("10 degC", Dimension::Temperature), 283.15);
}

TEST(Units, PressuresAbsoluteAndGauge) {
    EXPECT_DOUBLE_EQ(parsed("1 atm", Dimension::Pressure), 101325.0);     // NIST SP 811 B.8, exact
    EXPECT_DOUBLE_EQ(parsed("1.4 bar", Dimension::Pressure), 140000.0);   // NIST SP 811 B.8: bar = 1E+05 Pa
    EXPECT_DOUBLE_EQ(parsed("250 mbar", Dimension::Pressure), 25000.0);
    EXPECT_DOUBLE_EQ(parsed("101.325 kPa", Dimension::Pressure), 101325.0);
    EXPECT_DOUBLE_EQ(parsed("2.5 MPa", Dimension::Pressure), 2.5e6);
    // NIST SP 811 (2008) B.8: pound-force per square inch = 6.894 757 E+03 Pa.
    EXPECT_NEAR(parsed("1 psi", Dimension::Pressure), 6894.757, 1e-3);
    EXPECT_NEAR(parsed("1 psia", Dimension::Pressure), 6894.757, 1e-3);
    // Gauge: absolute = gauge + atmosphere.
    EXPECT_DOUBLE_EQ(parsed("14 barg", Dimension::Pressure), 14e5 + 101325.0);
    EXPECT_DOUBLE_EQ(parsed("0 barg", Dimension::Pressure), 101325.0);
    EXPECT_DOUBLE_EQ(parsed("50 kPag", Dimension::Pressure), 50e3 + 101325.0);
    EXPECT_NEAR(parsed("10 psig", Dimension::Pressure), 68947.57 + 101325.0, 1e-2);
    UnitContext highland{90000.0};
    EXPECT_DOUBLE_EQ(parsed("1 barg", Dimension::Pressure, highland), 190000.0);
    // Vacuum gauge readings are fine while the absolute pressure stays positive.
    EXPECT_DOUBLE_EQ(parsed("-0.5 barg", Dimension::Pressure), 51325.0);
}

TEST(Units, WrittenFormsOfAbsoluteAndGauge) {
    // The forms on data sheets and P&IDs: each is the same pressure as the
    // plain spelling (absolute = gauge + atmosphere, 101 325 Pa by default).
    for (const char* gauge : {"4 barg", "4 bar g", "4 bar(g)", "4 bar (g)"})
        EXPECT_DOUBLE_EQ(parsed(gauge, Dimension::Pressure), 4e5 + 101325.0) << gauge;
    for (const char* absolute : {"4 bar", "4 bara", "4 bar a", "4 bar(a)", "4 bar (abs)"})
        EXPECT_DOUBLE_EQ(parsed(absolute, Dimension::Pressure), 4e5) << absolute;
    EXPECT_DOUBLE_EQ(parsed("300 kPa(a)", Dimension::Pressure), 3e5);
    EXPECT_DOUBLE_EQ(parsed("300 kPa(g)", Dimension::Pressure), 3e5 + 101325.0);
    EXPECT_DOUBLE_EQ(parsed("1.2 MPa(g)", Dimension::Pressure), 1.2e6 + 101325.0);
    EXPECT_DOUBLE_EQ(parsed("1.2 MPag", Dimension::Pressure), 1.2e6 + 101325.0);
    EXPECT_NEAR(parsed("10 psi(g)", Dimension::Pressure), 68947.57 + 101325.0, 1e-2);
    EXPECT_NEAR(parsed("10 psi g", Dimension::Pressure), 68947.57 + 101325.0, 1e-2);
    EXPECT_NEAR(parsed("10 psi(a)", Dimension::Pressure), 68947.57, 1e-2);
    // Kilogram-force per square centimetre: 9.806 65 E+04 Pa (NIST SP 811
    // (2008), Appendix B.8, "kilogram-force per square centimeter").
    EXPECT_DOUBLE_EQ(parsed("1 kgf/cm2", Dimension::Pressure), 98066.5);
    EXPECT_DOUBLE_EQ(parsed("1 kg/cm2", Dimension::Pressure), 98066.5);
    EXPECT_DOUBLE_EQ(parsed("1 kg/cm²", Dimension::Pressure), 98066.5);
    EXPECT_DOUBLE_EQ(parsed("7 kg/cm2 g", Dimension::Pressure), 7 * 98066.5 + 101325.0);
    EXPECT_DOUBLE_EQ(parsed("7 kg/cm2(g)", Dimension::Pressure), 7 * 98066.5 + 101325.0);
    EXPECT_DOUBLE_EQ(parsed("7 kgf/cm2g", Dimension::Pressure), 7 * 98066.5 + 101325.0);
    // Gauge follows the worksheet's atmosphere.
    EXPECT_DOUBLE_EQ(parsed("1 bar(g)", Dimension::Pressure, UnitContext{90000.0}), 190000.0);
}

TEST(Units, GaugeDisplay) {
    // A display context may ask for gauge: the number is absolute minus the
    // atmosphere, and the unit says gauge.
    UnitContext gauge{101325.0, true};
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::MetricEngineering, gauge), "barg");
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::SI, gauge), "kPag");
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::USCustomary, gauge), "psig");
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::MetricEngineering, UnitContext{}), "bar");
    EXPECT_DOUBLE_EQ(toDisplay(501325.0, Dimension::Pressure, UnitSystem::MetricEngineering, gauge), 4.0);
    EXPECT_DOUBLE_EQ(toDisplay(501325.0, Dimension::Pressure, UnitSystem::MetricEngineering), 5.01325);
    EXPECT_EQ(formatQuantity(501325.0, Dimension::Pressure, UnitSystem::MetricEngineering, gauge), "4.0000 barg");
    // Temperatures are not affected.
    EXPECT_DOUBLE_EQ(toDisplay(373.15, Dimension::Temperature, UnitSystem::MetricEngineering, gauge), 100.0);
    // What is printed reads back as the same pressure.
    EXPECT_DOUBLE_EQ(parsed(formatQuantity(501325.0, Dimension::Pressure, UnitSystem::MetricEngineering, gauge),
                            Dimension::Pressure),
                     501325.0);
}

TEST(Units, MassFlowEnergyAndTheRest) {
    EXPECT_NEAR(parsed("4.2 t/h", Dimension::MassFlow), 4200.0 / 3600.0, 1e-15);
    EXPECT_NEAR(parsed("3600 kg/h", Dimension::MassFlow), 1.0, 1e-15);
    EXPECT_NEAR(parsed("1 lb", Dimension::Mass), 0.45359237, 1e-17);  // NIST SP 811 B.8, exact
    EXPECT_DOUBLE_EQ(parsed("2 t", Dimension::Mass), 2000.0);
    EXPECT_DOUBLE_EQ(parsed("500 g", Dimension::Mass), 0.5);
    EXPECT_DOUBLE_EQ(parsed("2 kmol", Dimension::Amount), 2000.0);
    EXPECT_NEAR(parsed("1 lbmol", Dimension::Amount), 453.59237, 1e-10);
    EXPECT_DOUBLE_EQ(parsed("1 kWh", Dimension::Energy), 3.6e6);         // NIST SP 811 B.8
    EXPECT_DOUBLE_EQ(parsed("1 Btu", Dimension::Energy), 1055.05585262); // NIST SP 811 B.8, Btu_IT
    // NIST SP 811 B.8: Btu_IT per hour = 2.930 711 E-01 W.
    EXPECT_NEAR(parsed("1 Btu/h", Dimension::Power), 0.2930711, 1e-7);
    // NIST SP 811 B.8: Btu_IT per pound = 2.326 E+03 J/kg (exact).
    EXPECT_NEAR(parsed("1 Btu/lb", Dimension::SpecificEnergy), 2326.0, 1e-9);
    // NIST SP 811 B.8: Btu_IT per pound degree Fahrenheit = 4.1868 E+03 J/(kg K) (exact).
    EXPECT_NEAR(parsed("1 Btu/(lb degF)", Dimension::SpecificEntropy), 4186.8, 1e-9);
    EXPECT_NEAR(parsed("1 Btu/lb/F", Dimension::SpecificEntropy), 4186.8, 1e-9);
    EXPECT_NEAR(parsed("1 Btu/(lb F)", Dimension::SpecificEntropy), 4186.8, 1e-9);
    for (const char* s : {"4.18 kJ/(kg K)", "4.18 kJ/kgK", "4.18 kJ/(kg*K)", "4.18 kJ/(kg\xC2\xB7K)",
                          "4.18 kJ/kg/K", "4.18kJ/(kg K)"})
        EXPECT_DOUBLE_EQ(parsed(s, Dimension::SpecificEntropy), 4180.0) << s;
    EXPECT_DOUBLE_EQ(parsed("29.1 kJ/(kmol K)", Dimension::MolarEntropy), 29.1);
    EXPECT_DOUBLE_EQ(parsed("29100 J/(kmol K)", Dimension::MolarEntropy), 29.1);
    EXPECT_DOUBLE_EQ(parsed("40.7 kJ/mol", Dimension::MolarEnergy), 40700.0);
    EXPECT_DOUBLE_EQ(parsed("40700 kJ/kmol", Dimension::MolarEnergy), 40700.0);
    EXPECT_DOUBLE_EQ(parsed("18 g/mol", Dimension::MolarMass), 0.018);
    EXPECT_DOUBLE_EQ(parsed("0.352 kg/mol", Dimension::MolarMass), 0.352);
    EXPECT_DOUBLE_EQ(parsed("18 kg/kmol", Dimension::MolarMass), 0.018);
    EXPECT_DOUBLE_EQ(parsed("5 L", Dimension::Volume), 0.005);            // NIST SP 811 B.8: liter = 1E-03 m3
    EXPECT_DOUBLE_EQ(parsed("5 l", Dimension::Volume), 0.005);
    EXPECT_DOUBLE_EQ(parsed("2 m\xC2\xB3", Dimension::Volume), 2.0);
    EXPECT_DOUBLE_EQ(parsed("1.043 L/kg", Dimension::SpecificVolume), 1.043e-3);
    EXPECT_DOUBLE_EQ(parsed("0.998 g/cm3", Dimension::Density), 998.0);
    EXPECT_NEAR(parsed("60 L/min", Dimension::VolumeFlow), 1e-3, 1e-18);
    EXPECT_NEAR(parsed("36 m3/h", Dimension::VolumeFlow), 0.01, 1e-17);
    EXPECT_DOUBLE_EQ(parsed("2 kW/K", Dimension::EntropyRate), 2000.0);
    EXPECT_DOUBLE_EQ(parsed("2 kJ/K", Dimension::Entropy), 2000.0);
    EXPECT_DOUBLE_EQ(parsed("-150 kW", Dimension::Power), -150000.0);
}

TEST(Units, NumberForms) {
    EXPECT_DOUBLE_EQ(parsed("1.5e3 kPa", Dimension::Pressure), 1.5e6);
    EXPECT_DOUBLE_EQ(parsed("1.5E+3kPa", Dimension::Pressure), 1.5e6);
    EXPECT_DOUBLE_EQ(parsed("+2 bar", Dimension::Pressure), 2e5);
    EXPECT_DOUBLE_EQ(parsed(".5 bar", Dimension::Pressure), 0.5e5);
    EXPECT_DOUBLE_EQ(parsed("\t3 kg\n", Dimension::Mass), 3.0);
}

TEST(Units, DimensionlessBareNumberOrPercent) {
    EXPECT_DOUBLE_EQ(parsed("0.65", Dimension::Dimensionless), 0.65);
    EXPECT_DOUBLE_EQ(parsed("65 %", Dimension::Dimensionless), 0.65);
    EXPECT_DOUBLE_EQ(parsed("65%", Dimension::Dimensionless), 0.65);
    EXPECT_DOUBLE_EQ(parsed("-1.3", Dimension::Dimensionless), -1.3);
    EXPECT_CONTAINS(errorOf("3 bar", Dimension::Dimensionless), "is a pressure");
}

TEST(Units, ErrorsQuoteTheTextAndSayWhatIsExpected) {
    EXPECT_CONTAINS(errorOf("", Dimension::Temperature), "empty");
    EXPECT_CONTAINS(errorOf("   ", Dimension::Temperature), "a temperature is expected, e.g. 25 degC");
    EXPECT_CONTAINS(errorOf("hot", Dimension::Temperature), "'hot' does not start with a number");
    EXPECT_CONTAINS(errorOf("degC", Dimension::Temperature), "does not start with a number");
    EXPECT_CONTAINS(errorOf("25", Dimension::Temperature), "'25' needs a unit, e.g. 25 degC");
    EXPECT_CONTAINS(errorOf("5", Dimension::Pressure), "'5' needs a unit, e.g. 5 bar");

    const std::string unknown = errorOf("25 degX", Dimension::Temperature);
    EXPECT_CONTAINS(unknown, "unknown unit 'degX'");
    EXPECT_CONTAINS(unknown, "degC");
    EXPECT_CONTAINS(unknown, "degF");
    EXPECT_CONTAINS(errorOf("3 Mbar", Dimension::Pressure), "unknown unit 'Mbar'");
    EXPECT_CONTAINS(errorOf("3 Mbar", Dimension::Pressure), "barg");

    EXPECT_CONTAINS(errorOf("3 bar", Dimension::Temperature),
                    "'3 bar' is a pressure; a temperature is expected here");
    EXPECT_CONTAINS(errorOf("3 K", Dimension::Pressure), "is a temperature; a pressure is expected here");
    EXPECT_CONTAINS(errorOf("3 kJ", Dimension::Power), "is an energy; a power is expected here");
    EXPECT_CONTAINS(errorOf("3 kJ/kg", Dimension::SpecificEntropy), "is a specific energy");

    EXPECT_CONTAINS(errorOf("nan K", Dimension::Temperature), "not a finite number");
    EXPECT_CONTAINS(errorOf("inf bar", Dimension::Pressure), "not a finite number");
    EXPECT_CONTAINS(errorOf("-Infinity kW", Dimension::Power), "not a finite number");
    EXPECT_CONTAINS(errorOf("1e999 Pa", Dimension::Pressure), "not a finite number");
    EXPECT_CONTAINS(errorOf("1e308 MPa", Dimension::Pressure), "not a finite number");

    EXPECT_CONTAINS(errorOf("-300 degC", Dimension::Temperature), "below absolute zero");
    EXPECT_CONTAINS(errorOf("-300 degC", Dimension::Temperature), "-26.85 K");
    EXPECT_CONTAINS(errorOf("0 K", Dimension::Temperature), "at or below absolute zero");
    EXPECT_CONTAINS(errorOf("-500 degF", Dimension::Temperature), "below absolute zero");
    EXPECT_CONTAINS(errorOf("-1 degR", Dimension::Temperature), "below absolute zero");

    const std::string vacuum = errorOf("-2 barg", Dimension::Pressure);
    EXPECT_CONTAINS(vacuum, "'-2 barg' is at or below zero absolute pressure");
    EXPECT_CONTAINS(vacuum, "101325 Pa");
    EXPECT_CONTAINS(errorOf("-1 bar", Dimension::Pressure), "below zero absolute pressure");
    EXPECT_CONTAINS(errorOf("0 Pa", Dimension::Pressure), "below zero absolute pressure");

    EXPECT_CONTAINS(errorOf("-1 kg", Dimension::Mass), "'-1 kg' is negative; a mass cannot be negative");
    EXPECT_CONTAINS(errorOf("-4 t/h", Dimension::MassFlow), "negative");
    EXPECT_CONTAINS(errorOf("-4 kmol/h", Dimension::MolarFlow), "negative");
    EXPECT_CONTAINS(errorOf("-1 kmol", Dimension::Amount), "negative");
    EXPECT_CONTAINS(errorOf("-1 kg/m3", Dimension::Density), "negative");

    EXPECT_CONTAINS(errorOf("1,5 bar", Dimension::Pressure), "decimal separator");
}

TEST(Units, ToAndFromSIRoundTripEveryUnit) {
    const UnitContext c{};
    for (const UnitInfo& u : knownUnits()) {
        for (double v : {-3.5, 0.0, 1.0, 123.456, 1e5}) {
            auto si = toSI(v, u.symbol, u.dimension, c);
            ASSERT_TRUE(si.ok()) << u.symbol;
            auto back = fromSI(*si, u.symbol, u.dimension, c);
            ASSERT_TRUE(back.ok()) << u.symbol;
            EXPECT_NEAR(*back, v, 1e-12 * std::max(1.0, std::fabs(v)) + 1e-9 * std::fabs(u.offset / u.factor))
                << u.symbol;
        }
    }
    // Aliases convert too; gauge units use the context.
    EXPECT_NEAR(*fromSI(373.15, "°F", Dimension::Temperature), 212.0, 1e-12);
    EXPECT_NEAR(*fromSI(10.0, "degF", Dimension::TemperatureDifference), 18.0, 1e-12);
    EXPECT_NEAR(*fromSI(190000.0, "barg", Dimension::Pressure, UnitContext{90000.0}), 1.0, 1e-15);
    EXPECT_NEAR(*toSI(1.0, "barg", Dimension::Pressure, UnitContext{90000.0}), 190000.0, 1e-9);
    EXPECT_FALSE(fromSI(1.0, "bar", Dimension::Temperature).ok());
    EXPECT_CONTAINS(fromSI(1.0, "bar", Dimension::Temperature).error().text(), "is for a pressure");
    EXPECT_CONTAINS(toSI(1.0, "furlong", Dimension::Volume).error().text(), "unknown unit 'furlong'");
}

TEST(Units, TableIsConsistent) {
    // Canonical symbols are unique within a dimension; gauge units are pressures.
    std::set<std::pair<int, std::string>> seen;
    for (const UnitInfo& u : knownUnits()) {
        EXPECT_TRUE(seen.insert({static_cast<int>(u.dimension), std::string(u.symbol)}).second) << u.symbol;
        EXPECT_GT(u.factor, 0.0) << u.symbol;
        if (u.gauge) {
            EXPECT_EQ(u.dimension, Dimension::Pressure) << u.symbol;
        }
        if (u.offset != 0.0) {
            EXPECT_EQ(u.dimension, Dimension::Temperature) << u.symbol;
        }
    }
}

TEST(Units, DisplayUnitsExistForEveryDimensionAndSystem) {
    for (int d = 0; d <= static_cast<int>(kLastDimension); ++d) {
        for (UnitSystem s : {UnitSystem::SI, UnitSystem::MetricEngineering, UnitSystem::USCustomary}) {
            const Dimension dim = static_cast<Dimension>(d);
            const std::string_view unit = displayUnit(dim, s);
            if (dim == Dimension::Dimensionless) {
                EXPECT_TRUE(unit.empty());
                continue;
            }
            EXPECT_TRUE(toSI(1.0, unit, dim).ok()) << dimensionName(dim) << " in " << unitSystemId(s);
        }
    }
    EXPECT_EQ(displayUnit(Dimension::Temperature, UnitSystem::MetricEngineering), "degC");
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::MetricEngineering), "bar");
    EXPECT_EQ(displayUnit(Dimension::Temperature, UnitSystem::USCustomary), "degF");
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::USCustomary), "psia");
    EXPECT_EQ(displayUnit(Dimension::Temperature, UnitSystem::SI), "K");
    EXPECT_EQ(displayUnit(Dimension::Pressure, UnitSystem::SI), "kPa");
}

TEST(Units, FormatAndToDisplay) {
    // 453.15 K = 180 degC (NIST SP 811 4.2.1.1).
    EXPECT_EQ(formatQuantity(453.15, Dimension::Temperature, UnitSystem::MetricEngineering), "180.00 degC");
    EXPECT_EQ(formatQuantity(453.15, Dimension::Temperature, UnitSystem::MetricEngineering, {}, 4), "180.0 degC");
    EXPECT_EQ(formatQuantity(4200.0 / 3600.0, Dimension::MassFlow, UnitSystem::SI), "1.1667 kg/s");
    EXPECT_EQ(formatQuantity(4200.0 / 3600.0, Dimension::MassFlow, UnitSystem::MetricEngineering), "4.2000 t/h");
    EXPECT_EQ(formatQuantity(373.15, Dimension::Temperature, UnitSystem::USCustomary), "212.00 degF");
    EXPECT_EQ(formatQuantity(0.65, Dimension::Dimensionless, UnitSystem::SI, {}, 3), "0.650");
    EXPECT_EQ(formatQuantity(-1e-12, Dimension::Power, UnitSystem::SI, {}, 3), "-1.00e-15 kW");
    EXPECT_EQ(formatQuantity(0.0, Dimension::Power, UnitSystem::SI), "0.0 kW");
    EXPECT_EQ(formatQuantity(-0.0001, Dimension::Power, UnitSystem::SI, {}, 2), "-1.0e-07 kW");
    EXPECT_EQ(formatQuantity(std::nan(""), Dimension::Power, UnitSystem::SI), "NaN kW");
    EXPECT_NEAR(toDisplay(140000.0, Dimension::Pressure, UnitSystem::MetricEngineering), 1.4, 1e-15);
    EXPECT_NEAR(toDisplay(2326.0, Dimension::SpecificEnergy, UnitSystem::USCustomary), 1.0, 1e-15);
}

TEST(Units, UnitSystemIds) {
    for (UnitSystem s : {UnitSystem::SI, UnitSystem::MetricEngineering, UnitSystem::USCustomary}) {
        auto r = parseUnitSystem(unitSystemId(s));
        ASSERT_TRUE(r.ok());
        EXPECT_EQ(*r, s);
    }
    auto bad = parseUnitSystem("imperial");
    ASSERT_FALSE(bad.ok());
    EXPECT_CONTAINS(bad.error().text(), "'imperial'");
    EXPECT_CONTAINS(bad.error().text(), "metric-engineering");
}

}  // namespace
}  // namespace heatchain
