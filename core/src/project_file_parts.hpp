#pragma once
// The pieces of the project file's reader and writer (format version 1):
// project_file.cpp reads the file's frame and its top-level sections,
// project_file_steps.cpp the steps, utilities and heat-transfer fields,
// project_writer.cpp writes it all back in the same order.
#include <filesystem>
#include <set>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "heatchain/json.hpp"
#include "heatchain/project.hpp"
#include "json_reader.hpp"
#include "project_rules.hpp"

namespace heatchain::detail {

// A rule of project_rules.hpp broken by what was read fails the reading there.
inline void enforce(const JsonReader& r, const RuleCheck& check) {
    if (check) r.fail(check->path, check->message);
}

inline constexpr std::string_view kProjectFormatName = "heatchain-project";
// Deeper nesting than this is refused before any parser sees it; a project
// file needs about 8 levels (a custom substance's cp table is the deepest).
inline constexpr int kMaxJsonDepth = 64;
// Limits that keep a broken or hostile file from exhausting the machine,
// each far above what a worksheet needs: steps in one stream (a step costs
// about 10 kB solved, with its curves), and JSON values in a file (about a
// dozen a step).
inline constexpr std::size_t kMaxSteps = 250'000;
inline constexpr std::size_t kMaxJsonValues = 8'000'000;

// The text fields of "meta" in the file's order, for the reader and the writer.
struct MetaField {
    std::string_view key;
    std::string Meta::*member;
};
inline constexpr MetaField kMetaFields[] = {{"title", &Meta::title},       {"author", &Meta::author},
                                            {"revision", &Meta::revision}, {"created", &Meta::created},
                                            {"modified", &Meta::modified}, {"notes", &Meta::notes}};
inline constexpr std::string_view kMetaKeys[] = {"title", "author", "revision", "created", "modified", "notes"};

// The bytes of a project file of either format version, refused with a
// reason when it is a folder, unreadable or larger than a project can be.
Result<std::string> readProjectText(const std::filesystem::path& file);

// One step of "steps" (whether its id is unique is checkStepIds').
Step readStep(const JsonReader& r, const Json& v, long index, const Project& p);
// "minApproach" and "utilities".
void readUtilities(const JsonReader& r, const Json& root, Project& p);
// "heatLoss" (checkHeatLoss says whether it may be there).
HeatLossSpec readHeatLoss(const JsonReader& r, const Json& v, const JsonPath& path);

}  // namespace heatchain::detail
