#pragma once
// Numbers in the models' messages, for people: "126.19", not
// "126.190000" (six significant digits).
#include <cstdio>
#include <string>

namespace heatchain::detail {

inline std::string numberText(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    return buf;
}

}  // namespace heatchain::detail
