#pragma once
// The `reference` model of ammonia: the fundamental equation of state of
// R. Tillner-Roth, F. Harms-Watzenberg and H. D. Baehr, "Eine neue
// Fundamentalgleichung für Ammoniak", DKV-Tagungsbericht 20 (1993) 167–181,
// a Helmholtz energy in density and temperature, for liquid, vapour and
// supercritical fluid (stated range 195.495–700 K, up to 1000 MPa).
//
// Reference state: the PR model's convention (peng_robinson.hpp), so a
// worksheet switched between `real-fluid` and `reference` shows comparable
// absolute numbers: the liquid at the library's melting anchor (melting.T,
// melting.P) has h = 0 and s = 0.
//
// Solid: built from the library's solid cp and enthalpy of fusion the same
// way as the real-fluid model's solid (g_solid = g_fluid on the model's own
// melting and sublimation lines, so both are exactly reversible); its
// pressure dependence is the liquid's at the melting temperature. The
// melting line is vertical at melting.T (195.42 K), 0.075 K below the
// equation's triple point, and the model's triple point is that temperature
// with the equation's vapour pressure there.
#include <memory>

#include "heatchain/property_model.hpp"
#include "heatchain/result.hpp"
#include "heatchain/substance.hpp"

namespace heatchain {

// Fails unless `ammonia` is the library's (non-custom) ammonia: the equation
// is for NH3 only.
Result<std::shared_ptr<const PropertyModel>> makeAmmoniaReferenceModel(const Substance& ammonia);

}  // namespace heatchain
