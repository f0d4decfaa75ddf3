#pragma once
// The machine-readable results of `heatchain-cli compute --json` (fixed keys,
// SI numbers), and the CSV ledger. Shared by the CLI and the GUI's exports.
#include <iosfwd>
#include <string>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"

namespace heatchain {

Json stateToJson(const State& s);
Json resultsToJson(const Project& project, const SequenceResult& result);
// The same text as resultsToJson(...) with `more`'s members appended, dumped
// with an indent of 2, written one step at a time: memory stays that of one
// step's tree, not the whole document's (for long worksheets).
void writeResultsJson(std::ostream& out, const Project& project, const SequenceResult& result, const Json& more);
// Ledger as CSV: one row per step and per segment, units in the header row.
std::string resultsToCsv(const Project& project, const SequenceResult& result);
// One CSV field: quoted (with its quotes doubled) when it holds a comma, a
// quote or a line break; a number with ten significant digits. The ledger
// and the CLI's sweep table both write through them.
std::string csvField(const std::string& s);
std::string csvNumber(double v);

}  // namespace heatchain
