#include "heatchain/state.hpp"

#include <array>

namespace heatchain {

std::string_view phaseId(Phase p) {
    switch (p) {
        case Phase::Solid: return "solid";
        case Phase::Liquid: return "liquid";
        case Phase::Vapor: return "vapor";
        case Phase::Supercritical: return "supercritical";
        case Phase::SolidLiquid: return "solid-liquid";
        case Phase::LiquidVapor: return "liquid-vapor";
        case Phase::SolidVapor: return "solid-vapor";
    }
    return "unknown";
}

std::string_view phaseLabel(Phase p) {
    switch (p) {
        case Phase::Solid: return "solid";
        case Phase::Liquid: return "liquid";
        case Phase::Vapor: return "vapour";
        case Phase::Supercritical: return "supercritical";
        case Phase::SolidLiquid: return "solid + liquid";
        case Phase::LiquidVapor: return "liquid + vapour";
        case Phase::SolidVapor: return "solid + vapour";
    }
    return "unknown";
}

bool isTwoPhase(Phase p) {
    return p == Phase::SolidLiquid || p == Phase::LiquidVapor || p == Phase::SolidVapor;
}

std::string describeWarnings(std::uint32_t flags) {
    struct Text {
        std::uint32_t flag;
        const char* text;
    };
    static constexpr std::array<Text, 10> texts{{
        {WarnBelowTemperatureRange, "temperature below the model's stated range"},
        {WarnAboveTemperatureRange, "temperature above the model's stated range"},
        {WarnAbovePressureRange, "pressure above the model's stated range"},
        {WarnBelowPressureRange, "pressure below the model's stated range"},
        {WarnCpExtrapolated, "a heat-capacity correlation is used outside its fitted range"},
        {WarnMetastable, "metastable state (beyond the equilibrium phase boundary)"},
        {WarnNearCritical, "near the critical point, where this model is least accurate"},
        {WarnIdealGasAtHighPressure,
         "ideal-gas vapour where real-gas effects exceed about 2 % (compressibility factor from the generalised "
         "virial correlation, or a latent heat off Watson's relation by over 5 %); consider the real-fluid model"},
        {WarnCubicFallback, "the cubic equation of state had no root for this phase; a fallback was used"},
        {WarnMeltingLineApprox, "melting temperature taken as independent of pressure"},
    }};
    std::string out;
    for (const auto& t : texts) {
        if (flags & t.flag) {
            if (!out.empty()) out += "; ";
            out += t.text;
        }
    }
    return out;
}

}  // namespace heatchain
