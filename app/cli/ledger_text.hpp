#pragma once
// The ledger as a plain-text table for people (heatchain-cli compute).
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/sweep.hpp"

namespace heatchain::cli {

std::string ledgerText(const Project& project, const SequenceResult& result);
// A sweep as a table in the project's display units, errors listed below it.
std::string sweepText(const Project& project, const SweepResult& sweep);

}  // namespace heatchain::cli
