#pragma once
// The report's heat-transfer section: each step's area or batch time, the
// zone table of every sized step (why one LMTD over a phase change would be
// wrong), and, for a batch, the time chart.
#include "heatchain/project.hpp"
#include "heatchain/solver.hpp"
#include "report_layout.hpp"

namespace heatchain::report_detail {

// Writes the section numbered `section` when a step has heat transfer or a
// time; returns the next section number.
int heatTransferSection(Layout& L, const Project& p, const SequenceResult& r, int section);

}  // namespace heatchain::report_detail
