#pragma once
// JSON where it is the product or the input of an API: the results of
// compute --json, the recovery and uncertainty reports, a project's diff.
// The worksheet itself (project.hpp) holds no JSON; the file's reader and
// writer do.
#include <nlohmann/json.hpp>

namespace heatchain {

using Json = nlohmann::ordered_json;

}  // namespace heatchain
