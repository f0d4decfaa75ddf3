#pragma once
// A worksheet of several streams (project-format.md, "Several streams",
// format version 2). Each stream is a whole Project — its own material,
// model, basis, start state and steps — with the worksheet's shared fields
// (title and metadata, display units, atmosphere, surroundings, utilities,
// required minimum approach) copied in, so the solver, the results JSON and
// the views work on one stream exactly as on a version-1 worksheet.
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "heatchain/project.hpp"
#include "heatchain/result.hpp"
#include "heatchain/solver.hpp"

namespace heatchain {

inline constexpr int kStreamsFormatVersion = 2;

struct Stream {
    std::string id;                             // unique within the worksheet
    std::optional<std::string> name;            // free text for people
    std::optional<Quantity> dTminContribution;  // K; none: half the required minimum approach
    // s; a closed (batch) stream repeats every cycleTime: its heat recovery
    // targets take its duties averaged over that time. None: left out.
    std::optional<Quantity> cycleTime;
    UnknownFields extra;                        // unknown stream fields, kept
    Project project;                            // the stream as a one-stream worksheet
};

struct StreamSet {
    int version = 1;            // 1: read from (and written as) a one-stream file
    Project shared;             // the shared fields (and unknown top-level fields in `extra`);
                                // its own material and steps are not used
    std::vector<Stream> streams;

    const Stream* find(std::string_view id) const;
    // Copies the shared fields into every stream's project (after an edit of `shared`).
    void shareFields();
    // Takes the shared fields of `from` (a stream's project after an edit of
    // its title, units, utilities, …) as the set's, and shares them.
    void takeShared(const Project& from);
    // One stream written as version 1 unless it carries what version 1 cannot
    // hold (a name, a ΔTmin contribution or a cycle time).
    bool writesAsVersion1() const;
};

// Reads a version-1 file (one stream, id "main") or a version-2 file.
// Errors name the stream and the step: `stream "feed", step "h1" (steps[2]).to.T`,
// with the line:column in the file.
Result<StreamSet> parseStreamSet(std::string_view text, std::string_view fileName = {});
Result<StreamSet> loadStreamSet(const std::filesystem::path& file);

// Version 1 byte for byte (writeProject) when writesAsVersion1(), else
// version 2: fixed key order, 2-space indent, quantities and numbers as typed.
std::string writeStreamSet(const StreamSet& set);
Status saveStreamSet(const StreamSet& set, const std::filesystem::path& file);

// A one-stream set around a version-1 project.
StreamSet streamSetOf(Project project);

// Every stream solved, in order.
std::vector<SequenceResult> solveStreams(const StreamSet& set, const SolveOptions& options = {});

}  // namespace heatchain
