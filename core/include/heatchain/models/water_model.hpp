#pragma once
// The `reference` model of water: IAPWS-IF97 (IAPWS R7-97(2012)) for liquid,
// vapour and supercritical fluid, IAPWS R10-06(2009) for ice Ih, and the
// IAPWS R14-08(2011) melting and sublimation curves.
#include <memory>

#include "heatchain/property_model.hpp"
#include "heatchain/result.hpp"
#include "heatchain/substance.hpp"

namespace heatchain {

// Fails when `water` is not the library's water (the equations are for H2O only).
Result<std::shared_ptr<const PropertyModel>> makeWaterReferenceModel(const Substance& water);

}  // namespace heatchain
