#pragma once
// A PDF read back as text with poppler's pdftotext (HEATCHAIN_PDFTOTEXT, set
// for the report tests), for the tests that check a report as a reader sees
// it.
#include <cctype>
#include <filesystem>
#include <regex>
#include <sstream>
#include <string>

#include "support/run_command.hpp"

namespace heatchain::testing {

// The text of every page; `layout` keeps the columns of tables on one line.
inline std::string pdfText(const std::filesystem::path& pdf, bool layout) {
    return runCommand(std::string(HEATCHAIN_PDFTOTEXT) + (layout ? " -layout " : " ") + pdf.string() + " -").out;
}

// All runs of whitespace as one space, so wrapped lines read as one text.
inline std::string squeeze(const std::string& s) {
    std::string o;
    bool space = false;
    for (char c : s) {
        if (std::isspace(static_cast<unsigned char>(c))) {
            space = true;
            continue;
        }
        if (space && !o.empty()) o += ' ';
        space = false;
        o += c;
    }
    return o;
}

// The line of a layout text that begins with `label` (empty if none).
inline std::string lineStarting(const std::string& text, const std::string& label) {
    std::istringstream in(text);
    std::string line;
    const std::regex re("^\\s*" + label + "\\s");
    while (std::getline(in, line))
        if (std::regex_search(line, re)) return line;
    return {};
}

}  // namespace heatchain::testing
