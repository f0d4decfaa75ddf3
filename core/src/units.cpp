// Longer than most files (about 650 lines) on purpose: more than half of it
// is the one table of units and aliases (kUnits, kAliases) with the source of
// each factor beside it; parsing and formatting read that table and belong
// beside it.
//
// Units at the edges: text in, SI out; SI in, display text out.
//
// Decisions (the header leaves them open; they are fixed here):
// - Limits checked by parseQuantity: a temperature must be above absolute
//   zero (0 K itself is refused: every model divides by T); an absolute
//   pressure must be above zero (a gauge reading that lands at or below
//   vacuum is refused and the message shows the atmosphere used). Masses,
//   amounts, flows, volumes, specific volumes, densities and molar masses
//   must not be negative; zero passes here and callers that need strictly
//   positive values (a project's basis) check that themselves. Energies,
//   powers, entropies, temperature differences and dimensionless numbers may
//   have either sign.
// - A dimensionless quantity is a bare number or a percentage: "65 %" is 0.65.
// - Unit spelling is case-sensitive ("mbar" and "Mbar" differ). Inside a unit
//   spaces, '*', '·' and '⋅' are ignored and '³' reads as '3', so
//   "kJ/(kg K)", "kJ/(kg*K)" and "kJ/(kg·K)" are one unit.
// - Display systems:
//     SI                 K, kPa, kg, mol, kg/s, mol/s, kJ, kW, kJ/K, kW/K,
//                        kJ/kg, kJ/(kg K), J/(mol K), kJ/mol, g/mol, m3,
//                        m3/kg, kg/m3, m3/s; temperature differences in K.
//                        (kJ and kPa rather than J and Pa: the base units
//                        give six-digit numbers for everyday process values.)
//     metric-engineering degC, bar, kg, kmol, t/h, kmol/h, kJ, kW, kJ/K, kW/K,
//                        kJ/kg, kJ/(kg K), kJ/(kmol K), kJ/kmol, kg/kmol, m3,
//                        m3/kg, kg/m3, m3/h; temperature differences in K.
//     US-customary       degF, psia, lb, lbmol, lb/h, lbmol/h, Btu, Btu/h,
//                        Btu/degR, Btu/(h degR), Btu/lb, Btu/(lb degF),
//                        Btu/(lbmol degF), Btu/lbmol, lb/lbmol, ft3, ft3/lb,
//                        lb/ft3, ft3/min; temperature differences in delta_degF.
#include "heatchain/units.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <string>

namespace heatchain {
namespace {

// ---- Conversion constants, each defined once -------------------------------
// Exact by definition unless noted.
constexpr double kHour_s = 3600.0;                  // NIST SP 811 (2008), Appendix B.8: hour = 3.6 E+03 s
constexpr double kMinute_s = 60.0;                  // NIST SP 811 (2008), Appendix B.8: minute = 6.0 E+01 s
constexpr double kCelsiusZero_K = 273.15;           // NIST SP 811 (2008), 4.2.1.1: t/°C = T/K - 273.15
constexpr double kRankine_K = 5.0 / 9.0;            // NIST SP 811 (2008), Appendix B.8: degree Rankine = (5/9) K
constexpr double kFahrenheitZero_R = 459.67;        // NIST SP 811 (2008), B.9: T/°R = t/°F + 459.67
constexpr double kBar_Pa = 1.0e5;                   // NIST SP 811 (2008), Appendix B.8: bar = 1.0 E+05 Pa
constexpr double kAtmosphere_Pa = 101325.0;         // NIST SP 811 (2008), Appendix B.8: atmosphere, standard
constexpr double kPound_kg = 0.45359237;            // NIST SP 811 (2008), Appendix B.8: pound (avoirdupois)
constexpr double kStandardGravity_m_s2 = 9.80665;   // NIST SP 811 (2008), Appendix B.8 note (standard acceleration of gravity)
constexpr double kInch_m = 0.0254;                  // NIST SP 811 (2008), Appendix B.8: inch = 2.54 E-02 m
constexpr double kFoot_m = 0.3048;                  // NIST SP 811 (2008), Appendix B.8: foot = 3.048 E-01 m
constexpr double kLitre_m3 = 1.0e-3;                // NIST SP 811 (2008), Appendix B.8: liter = 1.0 E-03 m3
// International Table Btu (Btu_IT), 1 Btu_IT = 1055.05585262 J, NIST SP 811
// (2008), Appendix B.8 "British thermal unit_IT". Defined so that
// 1 Btu_IT/lb = 2.326 kJ/kg exactly (Fifth International Conference on the
// Properties of Steam, 1956). Not the thermochemical nor the ISO 31-4 Btu.
constexpr double kBtu_J = 1055.05585262;
constexpr double kKilowattHour_J = 3.6e6;           // NIST SP 811 (2008), Appendix B.8: kilowatt hour = 3.6 E+06 J
// Derived: pound-force per square inch = lbf / in2, with lbf = lb * g_n
// (NIST SP 811 (2008), Appendix B.8: 6.894 757 E+03 Pa).
constexpr double kPsi_Pa = kPound_kg * kStandardGravity_m_s2 / (kInch_m * kInch_m);
constexpr double kCubicFoot_m3 = kFoot_m * kFoot_m * kFoot_m;
constexpr double kPoundMole_mol = kPound_kg * 1000.0;  // lbmol: a pound of substance per its molar mass in g/mol

using D = Dimension;

// ---- The unit table: SI = value * factor + offset ---------------------------
constexpr std::array kUnits = std::to_array<UnitInfo>({
    {"%", D::Dimensionless, 0.01, 0.0, false},

    {"K", D::Temperature, 1.0, 0.0, false},
    {"degC", D::Temperature, 1.0, kCelsiusZero_K, false},
    {"degF", D::Temperature, kRankine_K, kFahrenheitZero_R * kRankine_K, false},
    {"degR", D::Temperature, kRankine_K, 0.0, false},

    {"K", D::TemperatureDifference, 1.0, 0.0, false},
    {"delta_degC", D::TemperatureDifference, 1.0, 0.0, false},
    {"delta_degF", D::TemperatureDifference, kRankine_K, 0.0, false},

    {"Pa", D::Pressure, 1.0, 0.0, false},
    {"kPa", D::Pressure, 1.0e3, 0.0, false},
    {"MPa", D::Pressure, 1.0e6, 0.0, false},
    {"bar", D::Pressure, kBar_Pa, 0.0, false},
    {"mbar", D::Pressure, kBar_Pa * 1.0e-3, 0.0, false},
    {"atm", D::Pressure, kAtmosphere_Pa, 0.0, false},
    {"psia", D::Pressure, kPsi_Pa, 0.0, false},
    {"barg", D::Pressure, kBar_Pa, 0.0, true},
    {"kPag", D::Pressure, 1.0e3, 0.0, true},
    {"psig", D::Pressure, kPsi_Pa, 0.0, true},
    {"MPag", D::Pressure, 1.0e6, 0.0, true},
    // Kilogram-force per square centimetre (the technical atmosphere), still
    // on older plants' gauges: 1 kgf/cm2 = 9.806 65 E+04 Pa (NIST SP 811
    // (2008), Appendix B.8), here as g_n * 1 kg / 1 cm2.
    {"kgf/cm2", D::Pressure, kStandardGravity_m_s2 * 1.0e4, 0.0, false},
    {"kgf/cm2g", D::Pressure, kStandardGravity_m_s2 * 1.0e4, 0.0, true},

    {"kg", D::Mass, 1.0, 0.0, false},
    {"g", D::Mass, 1.0e-3, 0.0, false},
    {"t", D::Mass, 1.0e3, 0.0, false},
    {"lb", D::Mass, kPound_kg, 0.0, false},

    {"mol", D::Amount, 1.0, 0.0, false},
    {"kmol", D::Amount, 1.0e3, 0.0, false},
    {"lbmol", D::Amount, kPoundMole_mol, 0.0, false},

    {"kg/s", D::MassFlow, 1.0, 0.0, false},
    {"kg/h", D::MassFlow, 1.0 / kHour_s, 0.0, false},
    {"t/h", D::MassFlow, 1.0e3 / kHour_s, 0.0, false},
    {"lb/h", D::MassFlow, kPound_kg / kHour_s, 0.0, false},

    {"mol/s", D::MolarFlow, 1.0, 0.0, false},
    {"kmol/h", D::MolarFlow, 1.0e3 / kHour_s, 0.0, false},
    {"lbmol/h", D::MolarFlow, kPoundMole_mol / kHour_s, 0.0, false},

    {"J", D::Energy, 1.0, 0.0, false},
    {"kJ", D::Energy, 1.0e3, 0.0, false},
    {"MJ", D::Energy, 1.0e6, 0.0, false},
    {"kWh", D::Energy, kKilowattHour_J, 0.0, false},
    {"Btu", D::Energy, kBtu_J, 0.0, false},

    {"W", D::Power, 1.0, 0.0, false},
    {"kW", D::Power, 1.0e3, 0.0, false},
    {"MW", D::Power, 1.0e6, 0.0, false},
    {"Btu/h", D::Power, kBtu_J / kHour_s, 0.0, false},

    {"J/K", D::Entropy, 1.0, 0.0, false},
    {"kJ/K", D::Entropy, 1.0e3, 0.0, false},
    {"Btu/degR", D::Entropy, kBtu_J / kRankine_K, 0.0, false},

    {"W/K", D::EntropyRate, 1.0, 0.0, false},
    {"kW/K", D::EntropyRate, 1.0e3, 0.0, false},
    {"Btu/(h degR)", D::EntropyRate, kBtu_J / kHour_s / kRankine_K, 0.0, false},

    {"J/kg", D::SpecificEnergy, 1.0, 0.0, false},
    {"kJ/kg", D::SpecificEnergy, 1.0e3, 0.0, false},
    {"MJ/kg", D::SpecificEnergy, 1.0e6, 0.0, false},
    {"Btu/lb", D::SpecificEnergy, kBtu_J / kPound_kg, 0.0, false},

    {"J/(kg K)", D::SpecificEntropy, 1.0, 0.0, false},
    {"kJ/(kg K)", D::SpecificEntropy, 1.0e3, 0.0, false},
    {"Btu/(lb degF)", D::SpecificEntropy, kBtu_J / kPound_kg / kRankine_K, 0.0, false},

    {"J/(mol K)", D::MolarEntropy, 1.0, 0.0, false},
    {"kJ/(kmol K)", D::MolarEntropy, 1.0, 0.0, false},
    {"J/(kmol K)", D::MolarEntropy, 1.0e-3, 0.0, false},
    {"Btu/(lbmol degF)", D::MolarEntropy, kBtu_J / kPoundMole_mol / kRankine_K, 0.0, false},

    {"J/mol", D::MolarEnergy, 1.0, 0.0, false},
    {"kJ/mol", D::MolarEnergy, 1.0e3, 0.0, false},
    {"kJ/kmol", D::MolarEnergy, 1.0, 0.0, false},
    {"Btu/lbmol", D::MolarEnergy, kBtu_J / kPoundMole_mol, 0.0, false},

    {"kg/mol", D::MolarMass, 1.0, 0.0, false},
    {"g/mol", D::MolarMass, 1.0e-3, 0.0, false},
    {"kg/kmol", D::MolarMass, 1.0e-3, 0.0, false},
    {"lb/lbmol", D::MolarMass, kPound_kg / kPoundMole_mol, 0.0, false},

    {"m3", D::Volume, 1.0, 0.0, false},
    {"L", D::Volume, kLitre_m3, 0.0, false},
    {"ft3", D::Volume, kCubicFoot_m3, 0.0, false},

    {"m3/kg", D::SpecificVolume, 1.0, 0.0, false},
    {"L/kg", D::SpecificVolume, kLitre_m3, 0.0, false},
    {"ft3/lb", D::SpecificVolume, kCubicFoot_m3 / kPound_kg, 0.0, false},

    {"kg/m3", D::Density, 1.0, 0.0, false},
    {"g/cm3", D::Density, 1.0e3, 0.0, false},
    {"lb/ft3", D::Density, kPound_kg / kCubicFoot_m3, 0.0, false},

    {"m3/s", D::VolumeFlow, 1.0, 0.0, false},
    {"m3/h", D::VolumeFlow, 1.0 / kHour_s, 0.0, false},
    {"L/s", D::VolumeFlow, kLitre_m3, 0.0, false},
    {"L/min", D::VolumeFlow, kLitre_m3 / kMinute_s, 0.0, false},
    {"ft3/min", D::VolumeFlow, kCubicFoot_m3 / kMinute_s, 0.0, false},

    {"m2", D::Area, 1.0, 0.0, false},
    {"cm2", D::Area, 1.0e-4, 0.0, false},
    {"ft2", D::Area, kFoot_m * kFoot_m, 0.0, false},

    {"W/(m2 K)", D::HeatTransferCoefficient, 1.0, 0.0, false},
    {"kW/(m2 K)", D::HeatTransferCoefficient, 1.0e3, 0.0, false},
    {"Btu/(h ft2 degF)", D::HeatTransferCoefficient, kBtu_J / kHour_s / (kFoot_m * kFoot_m) / kRankine_K, 0.0, false},

    {"W/K", D::ThermalConductance, 1.0, 0.0, false},
    {"kW/K", D::ThermalConductance, 1.0e3, 0.0, false},
    {"Btu/(h degF)", D::ThermalConductance, kBtu_J / kHour_s / kRankine_K, 0.0, false},

    {"s", D::Time, 1.0, 0.0, false},
    {"min", D::Time, kMinute_s, 0.0, false},
    {"h", D::Time, kHour_s, 0.0, false},
});

// Other spellings of a canonical unit. Looked up after normalising both sides
// (see normaliseUnit), so "kJ/(kg K)" needs no separate "kJ/(kg*K)" entry.
struct Alias {
    std::string_view alias;
    Dimension dimension;
    std::string_view canonical;
};
constexpr std::array kAliases = std::to_array<Alias>({
    {"percent", D::Dimensionless, "%"},
    {"°C", D::Temperature, "degC"},
    {"℃", D::Temperature, "degC"},
    {"C", D::Temperature, "degC"},
    {"°F", D::Temperature, "degF"},
    {"℉", D::Temperature, "degF"},
    {"F", D::Temperature, "degF"},
    {"°R", D::Temperature, "degR"},
    {"R", D::Temperature, "degR"},
    // A difference written as "10 degC" is 10 K (the unit, not the scale).
    {"degC", D::TemperatureDifference, "delta_degC"},
    {"°C", D::TemperatureDifference, "delta_degC"},
    {"C", D::TemperatureDifference, "delta_degC"},
    {"degF", D::TemperatureDifference, "delta_degF"},
    {"°F", D::TemperatureDifference, "delta_degF"},
    {"F", D::TemperatureDifference, "delta_degF"},
    {"psi", D::Pressure, "psia"},
    {"W/m2K", D::HeatTransferCoefficient, "W/(m2 K)"},
    {"kW/m2K", D::HeatTransferCoefficient, "kW/(m2 K)"},
    // The written forms of absolute and gauge on data sheets and P&IDs. Spaces
    // are dropped before the lookup, so "bar g" reads as "barg" and
    // "bar(a)" as "bar(a)".
    {"bara", D::Pressure, "bar"},
    {"bar(a)", D::Pressure, "bar"},
    {"bar(abs)", D::Pressure, "bar"},
    {"bar(g)", D::Pressure, "barg"},
    {"kPaa", D::Pressure, "kPa"},
    {"kPa(a)", D::Pressure, "kPa"},
    {"kPa(g)", D::Pressure, "kPag"},
    {"MPaa", D::Pressure, "MPa"},
    {"MPa(a)", D::Pressure, "MPa"},
    {"MPa(g)", D::Pressure, "MPag"},
    {"psi(a)", D::Pressure, "psia"},
    {"psi(g)", D::Pressure, "psig"},
    {"kg/cm2", D::Pressure, "kgf/cm2"},
    {"kg/cm2a", D::Pressure, "kgf/cm2"},
    {"kg/cm2(a)", D::Pressure, "kgf/cm2"},
    {"kgf/cm2a", D::Pressure, "kgf/cm2"},
    {"kgf/cm2(a)", D::Pressure, "kgf/cm2"},
    {"kg/cm2g", D::Pressure, "kgf/cm2g"},
    {"kg/cm2(g)", D::Pressure, "kgf/cm2g"},
    {"kgf/cm2(g)", D::Pressure, "kgf/cm2g"},
    {"tonne", D::Mass, "t"},
    {"kg/hr", D::MassFlow, "kg/h"},
    {"lb/hr", D::MassFlow, "lb/h"},
    {"Btu/hr", D::Power, "Btu/h"},
    {"kJ/kgK", D::SpecificEntropy, "kJ/(kg K)"},
    {"kJ/kg/K", D::SpecificEntropy, "kJ/(kg K)"},
    {"J/kgK", D::SpecificEntropy, "J/(kg K)"},
    {"J/kg/K", D::SpecificEntropy, "J/(kg K)"},
    {"Btu/(lb F)", D::SpecificEntropy, "Btu/(lb degF)"},
    {"Btu/lb/F", D::SpecificEntropy, "Btu/(lb degF)"},
    {"Btu/lb/degF", D::SpecificEntropy, "Btu/(lb degF)"},
    {"Btu/(lb degR)", D::SpecificEntropy, "Btu/(lb degF)"},
    {"Btu/(lb R)", D::SpecificEntropy, "Btu/(lb degF)"},
    {"J/molK", D::MolarEntropy, "J/(mol K)"},
    {"J/mol/K", D::MolarEntropy, "J/(mol K)"},
    {"kJ/kmolK", D::MolarEntropy, "kJ/(kmol K)"},
    {"kJ/kmol/K", D::MolarEntropy, "kJ/(kmol K)"},
    {"Btu/R", D::Entropy, "Btu/degR"},
    {"l", D::Volume, "L"},
    {"l/kg", D::SpecificVolume, "L/kg"},
    {"l/s", D::VolumeFlow, "L/s"},
    {"l/min", D::VolumeFlow, "L/min"},
});

// Removes what does not change a unit's meaning: spaces, multiplication
// signs ('*', U+00B7 '·', U+22C5 '⋅'); reads '³' (U+00B3) as '3'.
std::string normaliseUnit(std::string_view u) {
    std::string out;
    out.reserve(u.size());
    for (size_t i = 0; i < u.size(); ++i) {
        const unsigned char c = static_cast<unsigned char>(u[i]);
        if (c == ' ' || c == '\t' || c == '*') continue;
        if (c == 0xC2 && i + 1 < u.size()) {
            const unsigned char n = static_cast<unsigned char>(u[i + 1]);
            if (n == 0xB7) { ++i; continue; }                 // '·'
            if (n == 0xB3) { ++i; out.push_back('3'); continue; }  // '³'
            if (n == 0xB2) { ++i; out.push_back('2'); continue; }  // '²'
        }
        if (c == 0xE2 && i + 2 < u.size() && static_cast<unsigned char>(u[i + 1]) == 0x8B &&
            static_cast<unsigned char>(u[i + 2]) == 0x85) {  // '⋅'
            i += 2;
            continue;
        }
        out.push_back(static_cast<char>(c));
    }
    return out;
}

// The unit of the given dimension spelled `unit` (canonical or alias).
const UnitInfo* findIn(std::string_view unit, Dimension d) {
    const std::string key = normaliseUnit(unit);
    for (const UnitInfo& u : kUnits)
        if (u.dimension == d && normaliseUnit(u.symbol) == key) return &u;
    for (const Alias& a : kAliases)
        if (a.dimension == d && normaliseUnit(a.alias) == key)
            for (const UnitInfo& u : kUnits)
                if (u.dimension == d && u.symbol == a.canonical) return &u;
    return nullptr;
}

// Any unit spelled `unit`, whatever its dimension (for "is a pressure" errors).
const UnitInfo* findAny(std::string_view unit) {
    for (const UnitInfo& u : kUnits)
        if (const UnitInfo* hit = findIn(unit, u.dimension)) return hit;
    return nullptr;
}

std::string_view example(Dimension d) {
    switch (d) {
        case D::Dimensionless: return "0.85";
        case D::Temperature: return "25 degC";
        case D::TemperatureDifference: return "10 K";
        case D::Pressure: return "5 bar";
        case D::Mass: return "1 kg";
        case D::Amount: return "1 kmol";
        case D::MassFlow: return "2 kg/s";
        case D::MolarFlow: return "1 kmol/h";
        case D::Energy: return "100 kJ";
        case D::Power: return "50 kW";
        case D::Entropy: return "1 kJ/K";
        case D::EntropyRate: return "1 kW/K";
        case D::SpecificEnergy: return "2257 kJ/kg";
        case D::SpecificEntropy: return "4.18 kJ/(kg K)";
        case D::MolarEntropy: return "29.1 J/(mol K)";
        case D::MolarEnergy: return "40.7 kJ/mol";
        case D::MolarMass: return "18.015 g/mol";
        case D::Volume: return "1 m3";
        case D::SpecificVolume: return "0.001 m3/kg";
        case D::Density: return "1000 kg/m3";
        case D::VolumeFlow: return "10 m3/h";
        case D::Area: return "12 m2";
        case D::HeatTransferCoefficient: return "450 W/(m2 K)";
        case D::ThermalConductance: return "2.4 kW/K";
        case D::Time: return "45 min";
    }
    return "";
}

// "a pressure", "an energy".
std::string withArticle(Dimension d) {
    const std::string_view name = dimensionName(d);
    const bool vowel = !name.empty() && std::string_view("aeiou").find(name[0]) != std::string_view::npos;
    return std::string(vowel ? "an " : "a ") + std::string(name);
}

std::string unitList(Dimension d) {
    std::string out;
    for (const UnitInfo& u : kUnits) {
        if (u.dimension != d) continue;
        if (!out.empty()) out += ", ";
        out += u.symbol;
    }
    return out;
}

std::string quoted(std::string_view text) { return "'" + std::string(text) + "'"; }

bool mustNotBeNegative(Dimension d) {
    switch (d) {
        case D::Mass: case D::Amount: case D::MassFlow: case D::MolarFlow:
        case D::Volume: case D::SpecificVolume: case D::Density: case D::MolarMass:
        case D::VolumeFlow: case D::Area: case D::HeatTransferCoefficient: case D::ThermalConductance:
        case D::Time:
            return true;
        default:
            return false;
    }
}

std::string_view trim(std::string_view s) {
    auto space = [](char c) { return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\v' || c == '\f'; };
    while (!s.empty() && space(s.front())) s.remove_prefix(1);
    while (!s.empty() && space(s.back())) s.remove_suffix(1);
    return s;
}

// A short number for error messages ("-26.85").
std::string shortNumber(double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    return buf;
}

Result<const UnitInfo*> lookup(std::string_view unit, Dimension d) {
    if (const UnitInfo* u = findIn(unit, d)) return u;
    if (const UnitInfo* other = findAny(unit))
        return makeError("unit " + quoted(unit) + " is for " + withArticle(other->dimension) + "; " +
                         withArticle(d) + " unit is expected (" + unitList(d) + ")");
    return makeError("unknown unit " + quoted(unit) + "; " + std::string(dimensionName(d)) +
                     " units are " + unitList(d));
}

double offsetOf(const UnitInfo& u, const UnitContext& c) { return u.gauge ? c.atmosphere_Pa : u.offset; }

}  // namespace

std::string_view dimensionName(Dimension d) {
    switch (d) {
        case D::Dimensionless: return "dimensionless number";
        case D::Temperature: return "temperature";
        case D::TemperatureDifference: return "temperature difference";
        case D::Pressure: return "pressure";
        case D::Mass: return "mass";
        case D::Amount: return "amount of substance";
        case D::MassFlow: return "mass flow";
        case D::MolarFlow: return "molar flow";
        case D::Energy: return "energy";
        case D::Power: return "power";
        case D::Entropy: return "entropy";
        case D::EntropyRate: return "entropy rate";
        case D::SpecificEnergy: return "specific energy";
        case D::SpecificEntropy: return "specific entropy";
        case D::MolarEntropy: return "molar entropy";
        case D::MolarEnergy: return "molar energy";
        case D::MolarMass: return "molar mass";
        case D::Volume: return "volume";
        case D::SpecificVolume: return "specific volume";
        case D::Density: return "density";
        case D::VolumeFlow: return "volume flow";
        case D::Area: return "area";
        case D::HeatTransferCoefficient: return "overall coefficient";
        case D::ThermalConductance: return "thermal conductance";
        case D::Time: return "time";
    }
    return "unknown dimension";
}

std::string_view unitSystemId(UnitSystem s) {
    switch (s) {
        case UnitSystem::SI: return "SI";
        case UnitSystem::MetricEngineering: return "metric-engineering";
        case UnitSystem::USCustomary: return "US-customary";
    }
    return "SI";
}

Result<UnitSystem> parseUnitSystem(std::string_view id) {
    for (UnitSystem s : {UnitSystem::SI, UnitSystem::MetricEngineering, UnitSystem::USCustomary})
        if (unitSystemId(s) == id) return s;
    return makeError("unknown unit system " + quoted(id) +
                     "; valid ones are SI, metric-engineering, US-customary");
}

std::span<const UnitInfo> knownUnits() { return kUnits; }

Result<double> parseQuantity(std::string_view text, Dimension expected, const UnitContext& context) {
    const std::string_view t = trim(text);
    const std::string what = std::string(withArticle(expected)) + " is expected, e.g. " +
                             std::string(example(expected));
    if (t.empty()) return makeError("empty text; " + what);

    // Sign: '+', '-' or the Unicode minus U+2212 (typed by word processors).
    std::string_view rest = t;
    bool negative = false;
    if (rest.front() == '+' || rest.front() == '-') {
        negative = rest.front() == '-';
        rest.remove_prefix(1);
    } else if (rest.size() >= 3 && rest.substr(0, 3) == "\xE2\x88\x92") {
        negative = true;
        rest.remove_prefix(3);
    }
    double number = 0.0;
    const auto [end, ec] = std::from_chars(rest.data(), rest.data() + rest.size(), number,
                                           std::chars_format::general);
    if (ec == std::errc::invalid_argument)
        return makeError(quoted(t) + " does not start with a number; " + what);
    if (ec == std::errc::result_out_of_range || !std::isfinite(number))
        return makeError(quoted(t) + " is not a finite number; " + what);
    if (negative) number = -number;

    const std::string_view unitText = trim(std::string_view(end, rest.data() + rest.size() - end));
    double si = number;
    if (unitText.empty()) {
        if (expected != D::Dimensionless)
            return makeError(quoted(t) + " needs a unit, e.g. " + std::string(example(expected)));
    } else {
        if (unitText.front() == ',')
            return makeError(quoted(t) + ": write the decimal separator as a point, e.g. " +
                             std::string(example(expected)));
        const UnitInfo* unit = findIn(unitText, expected);
        if (!unit) {
            if (const UnitInfo* other = findAny(unitText))
                return makeError(quoted(t) + " is " + withArticle(other->dimension) + "; " +
                                 withArticle(expected) + " is expected here");
            return makeError(quoted(t) + ": unknown unit " + quoted(unitText) + "; " +
                             std::string(dimensionName(expected)) + " units are " + unitList(expected));
        }
        si = number * unit->factor + offsetOf(*unit, context);
        if (!std::isfinite(si)) return makeError(quoted(t) + " is not a finite number; " + what);
        if (expected == D::Pressure && !(si > 0.0)) {
            std::string msg = quoted(t) + " is at or below zero absolute pressure (" + shortNumber(si) + " Pa)";
            if (unit->gauge)
                msg += "; gauge readings are relative to the atmosphere, " +
                       shortNumber(context.atmosphere_Pa) + " Pa";
            return makeError(msg);
        }
    }
    if (expected == D::Temperature && !(si > 0.0))
        return makeError(quoted(t) + " is at or below absolute zero (" + shortNumber(si) +
                         " K); a temperature must be above 0 K");
    if (mustNotBeNegative(expected) && si < 0.0)
        return makeError(quoted(t) + " is negative; " + withArticle(expected) + " cannot be negative");
    return si;
}

Result<double> toSI(double value, std::string_view unit, Dimension dimension, const UnitContext& context) {
    auto u = lookup(unit, dimension);
    if (!u) return u.error();
    return value * (*u)->factor + offsetOf(**u, context);
}

Result<double> fromSI(double si, std::string_view unit, Dimension dimension, const UnitContext& context) {
    auto u = lookup(unit, dimension);
    if (!u) return u.error();
    return (si - offsetOf(**u, context)) / (*u)->factor;
}

std::string_view displayUnit(Dimension d, UnitSystem system, const UnitContext& context) {
    if (d == D::Pressure && context.gaugeDisplay) {
        switch (system) {
            case UnitSystem::SI: return "kPag";
            case UnitSystem::MetricEngineering: return "barg";
            case UnitSystem::USCustomary: return "psig";
        }
    }
    return displayUnit(d, system);
}

std::string_view displayUnit(Dimension d, UnitSystem system) {
    const int s = static_cast<int>(system);  // SI, MetricEngineering, USCustomary
    auto pick = [s](std::string_view si, std::string_view metric, std::string_view us) {
        return s == 0 ? si : s == 1 ? metric : us;
    };
    switch (d) {
        case D::Dimensionless: return "";
        case D::Temperature: return pick("K", "degC", "degF");
        case D::TemperatureDifference: return pick("K", "K", "delta_degF");
        case D::Pressure: return pick("kPa", "bar", "psia");
        case D::Mass: return pick("kg", "kg", "lb");
        case D::Amount: return pick("mol", "kmol", "lbmol");
        case D::MassFlow: return pick("kg/s", "t/h", "lb/h");
        case D::MolarFlow: return pick("mol/s", "kmol/h", "lbmol/h");
        case D::Energy: return pick("kJ", "MJ", "Btu");
        case D::Power: return pick("kW", "kW", "Btu/h");
        case D::Entropy: return pick("kJ/K", "kJ/K", "Btu/degR");
        case D::EntropyRate: return pick("kW/K", "kW/K", "Btu/(h degR)");
        case D::SpecificEnergy: return pick("kJ/kg", "kJ/kg", "Btu/lb");
        case D::SpecificEntropy: return pick("kJ/(kg K)", "kJ/(kg K)", "Btu/(lb degF)");
        case D::MolarEntropy: return pick("J/(mol K)", "kJ/(kmol K)", "Btu/(lbmol degF)");
        case D::MolarEnergy: return pick("kJ/mol", "kJ/kmol", "Btu/lbmol");
        case D::MolarMass: return pick("g/mol", "kg/kmol", "lb/lbmol");
        case D::Volume: return pick("m3", "m3", "ft3");
        case D::SpecificVolume: return pick("m3/kg", "m3/kg", "ft3/lb");
        case D::Density: return pick("kg/m3", "kg/m3", "lb/ft3");
        case D::VolumeFlow: return pick("m3/s", "m3/h", "ft3/min");
        case D::Area: return pick("m2", "m2", "ft2");
        case D::HeatTransferCoefficient: return pick("W/(m2 K)", "W/(m2 K)", "Btu/(h ft2 degF)");
        case D::ThermalConductance: return pick("kW/K", "kW/K", "Btu/(h degF)");
        case D::Time: return pick("min", "min", "min");
    }
    return "";
}

std::string unitLabel(std::string_view symbol) {
    // Typographic spellings for people; the ASCII symbols stay the ones parsed and saved.
    static constexpr std::pair<std::string_view, std::string_view> swaps[] = {
        {"delta_degF", "°F"}, {"degC", "°C"}, {"degF", "°F"}, {"degR", "°R"},
        {"m3", "m³"}, {"m2", "m²"}, {"ft2", "ft²"}, {"(kg K)", "(kg·K)"}, {"(m2 K)", "(m²·K)"}, {"(mol K)", "(mol·K)"}, {"(kmol K)", "(kmol·K)"},
        {"(lb degF)", "(lb·°F)"}, {"(lbmol degF)", "(lbmol·°F)"}, {"(h degR)", "(h·°R)"}, {"ft3", "ft³"},
    };
    std::string out(symbol);
    for (const auto& [from, to] : swaps) {
        for (auto pos = out.find(from); pos != std::string::npos; pos = out.find(from, pos + to.size()))
            out.replace(pos, from.size(), to);
    }
    return out;
}

double toDisplay(double si, Dimension d, UnitSystem system, const UnitContext& context) {
    // The display unit of every (dimension, system), looked up once: views
    // format thousands of numbers per edit, and a lookup by spelling
    // normalises every table entry. Every display unit is in the table (tested).
    constexpr int kDims = static_cast<int>(kLastDimension) + 1;
    constexpr int kSystems = static_cast<int>(UnitSystem::USCustomary) + 1;
    static const auto table = [] {
        std::array<std::array<const UnitInfo*, kSystems>, kDims> t{};
        for (int i = 0; i < kDims; ++i)
            for (int s = 0; s < kSystems; ++s) {
                const auto dim = static_cast<Dimension>(i);
                const std::string_view unit = displayUnit(dim, static_cast<UnitSystem>(s));
                t[std::size_t(i)][std::size_t(s)] = unit.empty() ? nullptr : findIn(unit, dim);
            }
        return t;
    }();
    const UnitInfo* u = table[std::size_t(static_cast<int>(d))][std::size_t(static_cast<int>(system))];
    if (d == D::Pressure && context.gaugeDisplay) {
        static const auto gauge = [] {
            std::array<const UnitInfo*, kSystems> g{};
            for (int s = 0; s < kSystems; ++s)
                g[std::size_t(s)] = findIn(displayUnit(D::Pressure, static_cast<UnitSystem>(s), UnitContext{101325.0, true}),
                                           D::Pressure);
            return g;
        }();
        u = gauge[std::size_t(static_cast<int>(system))];
    }
    if (!u) return si;
    return (si - offsetOf(*u, context)) / u->factor;
}

std::string formatQuantity(double si, Dimension d, UnitSystem system, const UnitContext& context,
                           int significant) {
    const double v = toDisplay(si, d, system, context);
    const std::string_view unit = displayUnit(d, system, context);
    std::string number;
    if (!std::isfinite(v)) {
        number = std::isnan(v) ? "NaN" : (v > 0 ? "inf" : "-inf");
    } else {
        if (significant < 1) significant = 1;
        if (significant > 17) significant = 17;
        char buf[64];
        const double mag = std::fabs(v);
        if (mag == 0.0) {
            std::snprintf(buf, sizeof buf, "%.*f", significant > 1 ? 1 : 0, 0.0);
        } else if (mag >= 1e-3 && mag < 1e9) {
            // Fixed notation with `significant` digits; an engineer reads
            // "180.00 degC" faster than "1.8000e+02 degC".
            int exponent = static_cast<int>(std::floor(std::log10(mag)));
            int decimals = significant - 1 - exponent;
            if (decimals < 0) decimals = 0;
            std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
        } else {
            std::snprintf(buf, sizeof buf, "%.*e", significant - 1, v);
        }
        number = buf;
        if (number == "-0" || number.rfind("-0.", 0) == 0) {
            // A value that rounds to zero shows without a sign.
            bool allZero = number.find_first_not_of("-0.") == std::string::npos;
            if (allZero) number.erase(0, 1);
        }
    }
    if (unit.empty()) return number;
    return number + " " + std::string(unit);
}

}  // namespace heatchain
