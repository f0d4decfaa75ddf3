#include "heatchain/result.hpp"

namespace heatchain {

std::string Error::text() const {
    std::string out;
    if (!where.empty()) out += where;
    if (line > 0) {
        out += out.empty() ? "" : " ";
        out += "(line " + std::to_string(line);
        if (column > 0) out += ", column " + std::to_string(column);
        out += ")";
    }
    if (!out.empty()) out += ": ";
    out += message;
    return out;
}

}  // namespace heatchain
