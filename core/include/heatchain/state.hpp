#pragma once
// The thermodynamic state of the material, per kilogram, in SI.
#include <cstdint>
#include <limits>
#include <optional>
#include <string>
#include <string_view>

namespace heatchain {

enum class Phase {
    Solid,
    Liquid,
    Vapor,
    Supercritical,
    SolidLiquid,   // on the melting line; meltFraction = liquid share
    LiquidVapor,   // on the saturation line; quality = vapour share
    SolidVapor,    // on the sublimation line; quality = vapour share
};

std::string_view phaseId(Phase p);     // "solid", "liquid", "vapor", "supercritical",
                                       // "solid-liquid", "liquid-vapor", "solid-vapor"
std::string_view phaseLabel(Phase p);  // "solid", "liquid", "vapour", ... for people
bool isTwoPhase(Phase p);

// Range and quality flags a model attaches to a state. A state outside a
// model's stated range is still returned, but always with a flag.
enum StateWarning : std::uint32_t {
    WarnNone = 0,
    WarnBelowTemperatureRange = 1u << 0,
    WarnAboveTemperatureRange = 1u << 1,
    WarnAbovePressureRange = 1u << 2,
    WarnBelowPressureRange = 1u << 3,
    WarnCpExtrapolated = 1u << 4,       // a heat-capacity correlation used outside its range
    WarnMetastable = 1u << 5,           // e.g. IF97 metastable vapour, superheated liquid
    WarnNearCritical = 1u << 6,         // model accuracy degraded near the critical point
    WarnIdealGasAtHighPressure = 1u << 7,
    WarnCubicFallback = 1u << 8,        // Peng–Robinson had no valid root for the phase
    WarnMeltingLineApprox = 1u << 9,    // melting temperature taken as pressure-independent
};

// One sentence per flag set, joined with "; ".
std::string describeWarnings(std::uint32_t flags);

struct State {
    double T = 0;  // K
    double P = 0;  // Pa
    Phase phase = Phase::Liquid;
    std::optional<double> quality;       // vapour mass fraction on a liquid–vapour or solid–vapour line
    std::optional<double> meltFraction;  // liquid mass fraction on the melting line
    double h = 0;  // J/kg
    double s = 0;  // J/(kg K)
    double u = 0;  // J/kg
    double v = 0;  // m3/kg
    // Optional derived properties; NaN when the model does not give them.
    double cp = std::numeric_limits<double>::quiet_NaN();  // J/(kg K)
    double cv = std::numeric_limits<double>::quiet_NaN();
    double w = std::numeric_limits<double>::quiet_NaN();   // speed of sound, m/s
    // Which model and part of it produced the state ("IAPWS-IF97 region 2");
    // points to static storage owned by the model.
    std::string_view source;
    std::uint32_t warnings = WarnNone;
};

}  // namespace heatchain
