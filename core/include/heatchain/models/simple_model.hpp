#pragma once
// The two heat-capacity models (ARCHITECTURE.md, models 1 and 2):
//
//   constant-cp               each phase's heat capacity held constant;
//   temperature-dependent-cp  each phase's cp(T) from the substance's correlations.
//
// Both use one thermodynamic design, chosen so that the laws hold to round-off:
//
// * Condensed phases are incompressible with ONE specific volume v shared by
//   solid and liquid (1 / liquid density, else 1 / solid density, else 0 when
//   no density is known):
//       h = h0 + ∫cp dT + v (P − Pref),   s = s0 + ∫cp/T dT,   u = h − P v.
//   Sharing v makes the melting Δh exactly the enthalpy of fusion at every
//   pressure, and the melting temperature independent of pressure (states far
//   from the melting anchor pressure carry WarnMeltingLineApprox).
// * The vapour is an ideal gas: h = h0 + ∫cp dT, s = s0 + ∫cp/T dT − R ln(P/Pref),
//   v = R T / P (R the specific gas constant).
// * Anchors tie the phases together: the solid lies below the liquid by the
//   enthalpy of fusion at the melting anchor (Δs = Δh/T); the vapour above
//   the liquid by the enthalpy of vaporisation at the boiling anchor (or,
//   without boiling data, above the solid by the enthalpy of sublimation at
//   the sublimation anchor).
// * Reference state: h = 0 and s = 0 for the liquid at the melting anchor
//   (T, P); without melting data, the liquid at the boiling anchor; without a
//   liquid, the solid at its melting or sublimation anchor; a vapour-only
//   substance at 298.15 K and 101.325 kPa.
// * Every phase line is where the two phases' Gibbs energies g = h − T s are
//   equal. For an ideal-gas vapour this is the Clausius–Clapeyron equation
//   integrated exactly with the model's own latent heat (Kirchhoff's law:
//   Δh(T) follows from the phase heat capacities), including the condensed
//   volume: so s_v − s_l = Δh/T holds to round-off on the model's own
//   saturation and sublimation lines. The model's triple point is the melting
//   anchor temperature on the vapour-pressure curve.
// * The boiling line ends at the critical temperature when it is known; above
//   Tc and Pc the phase is reported Supercritical (still an ideal gas, with a
//   warning). Vapour whose compressibility factor, estimated by the
//   generalised virial correlation, departs from 1 by more than 2 %, and
//   vapour near the dome where the model's latent heat departs from the
//   Watson relation by more than 5 %, carry WarnIdealGasAtHighPressure.
#include <memory>

#include "heatchain/property_model.hpp"
#include "heatchain/result.hpp"
#include "heatchain/substance.hpp"

namespace heatchain {

// kind is ModelKind::ConstantCp or ModelKind::TemperatureDependentCp. In the
// constant-cp model a phase's cp is the library constant or, for a
// correlation, its value at the phase's anchor temperature: the solid at the
// melting (else sublimation) temperature, the liquid midway between the
// melting and boiling temperatures, the vapour at the boiling (else
// sublimation) temperature.
Result<std::shared_ptr<const PropertyModel>> makeSimpleModel(const Substance& substance, ModelKind kind);

}  // namespace heatchain
