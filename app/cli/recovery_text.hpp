#pragma once
// Worksheets of several streams and heat recovery targets on the command
// line: `heatchain-cli targets`, and `compute` of a version-2 worksheet.
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "heatchain/recovery.hpp"
#include "heatchain/streams.hpp"

namespace heatchain::cli {

// PROJECT from its file, or from standard input when it is "-".
Result<StreamSet> loadWorksheetInput(const std::string& file);

// --dtmin: a temperature difference ("15 K", "27 degF" as a difference); a
// bare number is kelvin. None when the option is absent.
Result<std::optional<double>> dTminOption(const std::map<std::string, std::string>& options);

// The targets as a table for people, in the worksheet's display units; the
// problem table's intervals too when asked (one per piece: long for real fluids).
std::string targetsText(const StreamSet& set, const Recovery& r, bool problemTable);
// The composite and grand composite curves, one row per point, SI units.
std::string targetsCsv(const Recovery& r);

// `compute` of a worksheet with several streams: the text ledger of each
// stream (or JSON, or CSV with a stream column) and every stream's first error.
struct WorksheetAnswer {
    std::string text;
    std::vector<std::string> errors;  // `stream "feed": step "h1": ...`
    std::size_t steps = 0, warnings = 0;
};
WorksheetAnswer computeWorksheet(const StreamSet& set, bool json, bool csv);

}  // namespace heatchain::cli
