#pragma once
// The real-fluid model: the Peng–Robinson cubic equation of state with its
// departure (residual) functions added to the substance's ideal-gas cp(T).
//
//   h(T,P) = h_ig(T) + h_res(T,P) + h_offset
//   s(T,P) = s_ig(T) - R ln(P/P0) + s_res(T,P) + s_offset
//
// Equation of state: Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976)
// 59–64; alpha function with the high-omega kappa of Robinson & Peng (1978,
// GPA Research Report RR-28); Twu et al., Fluid Phase Equilib. 69 (1991)
// 33–50 alpha where the substance gives L, M, N; Péneloux, Rauzy & Fréze,
// Fluid Phase Equilib. 8 (1982) 7–23 volume translation where it gives c.
//
// Reference state (the same choice as the simple models): the liquid at the
// substance's melting anchor (melting.T, melting.P) has h = 0 and s = 0.
// Without melting data the saturated liquid at the normal boiling point
// temperature (at the model's own vapour pressure) is the zero; without
// that, the saturated liquid at the library triple point.
//
// Phases: liquid and vapour are the smallest and largest admissible roots of
// the cubic; "supercritical" when T > Tc and P > Pc. A solid exists when the
// substance has melting data and a solid cp; see models/fluid_with_solid.hpp for how it
// is made so that melting and sublimation are exactly reversible
// (g_solid = g_fluid on the model's own lines).
#include <memory>

#include "heatchain/property_model.hpp"

namespace heatchain {

// Needs the substance's critical point (T, P, acentric factor), molar mass
// and ideal-gas heat capacity; says which is missing otherwise.
Result<std::shared_ptr<const PropertyModel>> makePengRobinsonModel(const Substance& substance);

}  // namespace heatchain
