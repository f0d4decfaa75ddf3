#pragma once
// The report's heat recovery section (a worksheet of several streams): the
// targets at the worksheet's required minimum approach beside today's
// utility use, the pinch, the utility levels, the streams left out and why,
// the caveat of time-averaged batches, the composite curves, the grand
// composite curve, the targets against ΔTmin and the problem table.
// Every number is core's (worksheetRecovery, worksheetDTminSweep).
#include <vector>

#include "heatchain/solver.hpp"
#include "heatchain/streams.hpp"
#include "report_layout.hpp"

namespace heatchain::report_detail {

// Writes the section numbered `section`; returns the next section number.
int heatRecoverySection(Layout& L, const StreamSet& set, const std::vector<SequenceResult>& results, int section);

// The overview of the streams: one row per stream with its material,
// system, basis, steps and heating and cooling.
int streamsSection(Layout& L, const StreamSet& set, const std::vector<SequenceResult>& results, int section);

}  // namespace heatchain::report_detail
