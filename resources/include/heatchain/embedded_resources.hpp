#pragma once
// Files of resources/ compiled into the binaries (see resources/cmake/embed.cmake).
#include <span>
#include <string_view>

namespace heatchain::resources {

struct EmbeddedFile {
    std::string_view path;     // relative to resources/, e.g. "substances/water.json"
    std::string_view content;  // the file's bytes
};

std::span<const EmbeddedFile> embeddedFiles();

}  // namespace heatchain::resources
