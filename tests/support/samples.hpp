#pragma once
// Where the demo worksheets live, for tests and benchmarks (every test
// target defines HEATCHAIN_SOURCE_DIR).
#include <string>

namespace heatchain::testing {

// sample-projects/<name>.hchain in the source tree.
inline std::string samplePath(const std::string& name) {
    return std::string(HEATCHAIN_SOURCE_DIR) + "/sample-projects/" + name + ".hchain";
}

}  // namespace heatchain::testing
