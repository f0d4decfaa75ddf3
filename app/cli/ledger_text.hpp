#pragma once
// The ledger as a plain-text table for people (heatchain-cli compute).
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain::cli {

std::string ledgerText(const Project& project, const SequenceResult& result);

}  // namespace heatchain::cli
