#pragma once
// The Watson relation for the temperature dependence of the enthalpy of
// vaporisation, written once: K. M. Watson, Ind. Eng. Chem. 35 (1943) 398,
// with the exponent 0.38 as recommended in Poling, Prausnitz & O'Connell,
// The Properties of Gases and Liquids, 5th ed. (2001), ch. 7 (from memory).
#include <cmath>

namespace heatchain {

inline constexpr double kWatsonExponent = 0.38;

// Latent heat at T from its value dh1 at T1, both below the critical
// temperature Tc: dh(T) = dh1 ((Tc − T)/(Tc − T1))^0.38. Zero at and above Tc.
inline double watsonLatentHeat(double dh1, double T1, double T, double Tc) {
    if (T >= Tc) return 0.0;
    return dh1 * std::pow((Tc - T) / (Tc - T1), kWatsonExponent);
}

}  // namespace heatchain
