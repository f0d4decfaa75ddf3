#pragma once
// The machine-readable results of `heatchain-cli compute --json` (fixed keys,
// SI numbers), and the CSV ledger. Shared by the CLI and the GUI's exports.
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain {

Json stateToJson(const State& s);
Json resultsToJson(const Project& project, const SequenceResult& result);
// Ledger as CSV: one row per step and per segment, units in the header row.
std::string resultsToCsv(const Project& project, const SequenceResult& result);

}  // namespace heatchain
