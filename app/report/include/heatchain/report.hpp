#pragma once
#include "heatchain/uncertainty.hpp"
// The PDF step report and the exports of a solved project. Plain C++ face
// (no Qt types), so the CLI can call it; inside it draws with Qt. Every call
// creates the Qt application it needs when the process has none (headless,
// offscreen platform), and writes its file atomically.
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"
#include "heatchain/streams.hpp"

namespace heatchain {

enum class PageSize { A4, Letter };
Result<PageSize> parsePageSize(std::string_view id);  // "A4", "letter" (any case)

struct ReportOptions {
    PageSize pageSize = PageSize::A4;
    // How the report's uncertainty section propagates the worksheet's
    // tolerances (first order unless asked; the section is left out when
    // nothing carries a tolerance).
    UncertaintyOptions uncertainty;
};

// Writes the step report of `result` (solved from `project`) to `out`.
// `projectFile` names the project file; its bytes are checksummed (SHA-256)
// into the title block. When it cannot be read (an unsaved project), the
// checksum is taken of the project as it would be saved, and says so.
Status writeReportPdf(const Project& project, const SequenceResult& result,
                      std::string_view projectFile, const std::filesystem::path& out);
Status writeReportPdf(const Project& project, const SequenceResult& result,
                      std::string_view projectFile, const std::filesystem::path& out,
                      const ReportOptions& options);
// A worksheet of several streams (`results` solved from it, one a stream):
// the title block and cautions once, an overview of the streams, the heat
// recovery section (targets, composite and grand composite curves, targets
// against ΔTmin, problem table), then each stream as the one-stream report
// has it, its sections numbered under the stream's. One stream: exactly the
// one-stream report.
Status writeReportPdf(const StreamSet& worksheet, const std::vector<SequenceResult>& results,
                      std::string_view projectFile, const std::filesystem::path& out,
                      const ReportOptions& options = {});

// TemperatureTime: a batch's temperature and duty against time (closed
// systems with batch times; otherwise a chart that says there are none).
enum class ChartKind { TemperatureEntropy, TemperatureDuty, TemperatureTime };
enum class ImageFormat { Png, Svg };

struct ChartImageOptions {
    int width = 1100;   // pixels (PNG) or SVG user units
    int height = 720;
    bool legend = true;  // step colours under the plot
};

// The image format from the file name's extension (".png", ".svg").
Result<ImageFormat> imageFormatFor(const std::filesystem::path& file);

// One chart as an SVG document or PNG bytes.
Result<std::string> renderChart(const Project& project, const SequenceResult& result, ChartKind kind,
                                ImageFormat format, const ChartImageOptions& options = {});
// Same, written atomically to `out` in the format its extension names.
Status exportChart(const Project& project, const SequenceResult& result, ChartKind kind,
                   const std::filesystem::path& out, const ChartImageOptions& options = {});

// The ledger as CSV (units in the header row) and the results as JSON (the
// `compute --json` contract), written atomically.
Status exportLedgerCsv(const Project& project, const SequenceResult& result,
                       const std::filesystem::path& out);
Status exportResultsJson(const Project& project, const SequenceResult& result,
                         const std::filesystem::path& out);

}  // namespace heatchain
