#pragma once
// Units live only at the edges: user text is parsed into SI here, and SI
// values are formatted for display here. Conversion factors follow
// NIST SP 811 (2008), Appendix B; each is defined once in units.cpp.
#include <span>
#include <string>
#include <string_view>

#include "heatchain/result.hpp"

namespace heatchain {

// What a quantity measures. An absolute temperature and a temperature
// difference are different kinds: "10 degC" is 283.15 K as a temperature but
// 10 K as a difference.
enum class Dimension {
    Dimensionless,
    Temperature,             // K
    TemperatureDifference,   // K
    Pressure,                // Pa (absolute; gauge units are offset by the atmosphere)
    Mass,                    // kg
    Amount,                  // mol
    MassFlow,                // kg/s
    MolarFlow,               // mol/s
    Energy,                  // J
    Power,                   // W
    Entropy,                 // J/K          (extensive, closed system)
    EntropyRate,             // W/K          (extensive, steady flow)
    SpecificEnergy,          // J/kg         (enthalpy, latent heat)
    SpecificEntropy,         // J/(kg K)     (also specific heat capacity)
    MolarEntropy,            // J/(mol K)    (also molar heat capacity)
    MolarEnergy,             // J/mol
    MolarMass,               // kg/mol
    Volume,                  // m3
    SpecificVolume,          // m3/kg
    Density,                 // kg/m3
    VolumeFlow,              // m3/s
    Area,                    // m2           (heat-transfer area)
    HeatTransferCoefficient, // W/(m2 K)     (overall coefficient U)
    ThermalConductance,      // W/K          (UA, of an exchanger or of a heat loss)
    Time,                    // s
};
// The last Dimension, for tables indexed by dimension.
inline constexpr Dimension kLastDimension = Dimension::Time;

std::string_view dimensionName(Dimension d);  // "temperature", "pressure", ...

enum class UnitSystem { SI, MetricEngineering, USCustomary };

std::string_view unitSystemId(UnitSystem s);  // "SI", "metric-engineering", "US-customary"
Result<UnitSystem> parseUnitSystem(std::string_view id);

// Context a parse needs: gauge pressures are relative to the atmosphere.
// For display, `gaugeDisplay` shows pressures as gauge readings (barg, kPag,
// psig) instead of absolute ones; parsing ignores it.
struct UnitContext {
    double atmosphere_Pa = 101325.0;
    bool gaugeDisplay = false;
};

// One unit: SI = value * factor + offset.
struct UnitInfo {
    std::string_view symbol;   // canonical spelling, e.g. "degC", "kJ/(kg K)"
    Dimension dimension;
    double factor;
    double offset;             // nonzero for degC, degF (absolute), and handled for gauge
    bool gauge;                // barg, psig, kPag: offset is the context's atmosphere
};

// All units known to the parser (canonical spellings; aliases such as "°C",
// "C", "kJ/kgK" are accepted by parseQuantity).
std::span<const UnitInfo> knownUnits();

// Parses "<number> <unit>" (space optional) into SI. The unit must have the
// expected dimension; a Dimensionless quantity may be a bare number.
// Temperatures below absolute zero and non-finite numbers are errors.
// Errors name the text and say what dimension or unit was expected.
Result<double> parseQuantity(std::string_view text, Dimension expected,
                             const UnitContext& context = {});

// Converts an SI value into the given unit (symbol or alias).
Result<double> fromSI(double si, std::string_view unit, Dimension dimension,
                      const UnitContext& context = {});
Result<double> toSI(double value, std::string_view unit, Dimension dimension,
                    const UnitContext& context = {});

// The unit a display system uses for a dimension ("degC" and "bar" in
// metric-engineering, "degF" and "psia" in US customary, "K" and "kPa" in SI).
std::string_view displayUnit(Dimension d, UnitSystem system);
// The same, and for pressures the gauge unit ("barg", "kPag", "psig") when the
// context asks for gauge display.
std::string_view displayUnit(Dimension d, UnitSystem system, const UnitContext& context);

// The unit as people read it: "degC" → "°C", "m3" → "m³", "kJ/(kg K)" → "kJ/(kg·K)".
std::string unitLabel(std::string_view symbol);

// Formats an SI value in the display system, with a sensible number of
// significant digits, e.g. "180.0 degC", "4.2 t/h" → "1.1667 kg/s" in SI.
std::string formatQuantity(double si, Dimension d, UnitSystem system,
                           const UnitContext& context = {}, int significant = 5);

// The number alone, in displayUnit(d, system, context).
double toDisplay(double si, Dimension d, UnitSystem system, const UnitContext& context = {});

}  // namespace heatchain
