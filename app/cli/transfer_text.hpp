#pragma once
// The heat-transfer section of the plain-text ledger (heatchain-cli compute):
// the area or time of each step with an exchanger, jacket or coil, its zones,
// and the total area and cycle time.
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain::cli {

// Empty when no step has heat transfer or a time.
std::string transferText(const Project& project, const SequenceResult& result);

}  // namespace heatchain::cli
