#pragma once
// The heat recovery charts as image files (heatchain-cli chart --composite,
// --grand-composite). Plain C++ face; draws with heatchain_view.
#include <filesystem>

#include "heatchain/recovery.hpp"
#include "heatchain/report.hpp"
#include "heatchain/streams.hpp"

namespace heatchain {

enum class RecoveryChartKind { Composite, GrandComposite };

// Writes the chart as PNG or SVG (by the file's extension), atomically.
Status exportRecoveryChart(const StreamSet& set, const Recovery& recovery, RecoveryChartKind kind,
                           const std::filesystem::path& out, const ChartImageOptions& options = {});

}  // namespace heatchain
