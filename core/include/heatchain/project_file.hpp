#pragma once
// Reading and writing *.hchain project files (format version 1).
#include <filesystem>
#include <string>
#include <string_view>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"

namespace heatchain {

inline constexpr int kProjectFormatVersion = 1;

// Parses and validates project text. Errors carry the JSON path or step id
// and the line:column of the offending value. `fileName` only labels errors.
Result<Project> parseProject(std::string_view text, std::string_view fileName = {});
Result<Project> loadProject(const std::filesystem::path& file);

// A project edited in code (a settings dialog, the step panel, a utilities
// table) as the file's reader would hold it: every quantity's SI value worked
// out again from its text under the project's own atmosphere (a new
// atmosphere moves every gauge pressure), the substance resolved, and every
// rule a file is held to (project_rules.hpp, which the reader applies too)
// checked; the error names the field ("step \"pump\" (steps[2]).to.ratio").
Result<Project> resolveProject(const Project& project);

// Writes the project: fixed key order, 2-space indent, quantities as typed,
// unknown fields kept. Same project, same bytes.
std::string writeProject(const Project& project);

// Atomic save: writes a temporary file in the same folder, flushes, keeps the
// previous version as "<name>.bak", then renames over the target. On any
// failure the original file is left untouched.
Status saveProject(const Project& project, const std::filesystem::path& file);
Status writeFileAtomically(const std::filesystem::path& file, std::string_view bytes,
                           bool keepBackup = true);

}  // namespace heatchain
