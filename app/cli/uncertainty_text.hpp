#pragma once
// The command line's side of uncertainty: the --uncertainty, --samples and
// --seed options of compute, and the text shown under the ledger.
#include <map>
#include <optional>
#include <string>

#include "heatchain/project.hpp"
#include "heatchain/uncertainty.hpp"

namespace heatchain::cli {

bool isUncertaintyOption(const std::string& option);
// None when --uncertainty was not given; an error for a bad method, count or seed.
Result<std::optional<UncertaintyOptions>> uncertaintyOptions(const std::map<std::string, std::string>& options);
// Each step's duty, work and end temperature with ±, the totals, and the
// ranked contributions.
std::string uncertaintyText(const Project& project, const UncertaintyResult& result);

}  // namespace heatchain::cli
