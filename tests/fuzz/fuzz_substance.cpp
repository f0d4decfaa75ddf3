// libFuzzer driver for heatchain::fuzz::substanceInput (see fuzz_inputs.hpp).
#include <cstdio>
#include <cstdlib>

#include "fuzz_inputs.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    if (auto broken = heatchain::fuzz::substanceInput(data, size)) {
        std::fprintf(stderr, "%s\n", broken->c_str());
        std::abort();
    }
    return 0;
}
