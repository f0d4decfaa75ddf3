#pragma once
// Runs a reference library (python3-iapws, python3-pint) live through
// Debian's /usr/bin/python3 and returns what the script printed. Reference
// checks use it as an oracle from outside the project.
#include <array>
#include <cstdio>
#include <map>
#include <memory>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace heatchain::testing {

inline std::string runPython(const std::string& script) {
    // The script goes through a temporary file so quoting never matters.
    char name[] = "/tmp/heatchain-oracle-XXXXXX.py";
    int fd = mkstemps(name, 3);
    if (fd < 0) throw std::runtime_error("cannot create a temporary script");
    FILE* f = fdopen(fd, "w");
    std::fputs(script.c_str(), f);
    std::fclose(f);
    std::string cmd = std::string(HEATCHAIN_PYTHON) + " " + name + " 2>&1";
    std::unique_ptr<FILE, int (*)(FILE*)> pipe(popen(cmd.c_str(), "r"), pclose);
    if (!pipe) throw std::runtime_error("cannot start " HEATCHAIN_PYTHON);
    std::string out;
    std::array<char, 4096> buf{};
    size_t n;
    while ((n = std::fread(buf.data(), 1, buf.size(), pipe.get())) > 0) out.append(buf.data(), n);
    std::remove(name);
    return out;
}

// An oracle script's output read as rows: each line a key, then numbers.
using OracleRows = std::multimap<std::string, std::vector<double>>;

inline OracleRows parseOracleRows(const std::string& out) {
    OracleRows t;
    std::istringstream in(out);
    std::string line;
    while (std::getline(in, line)) {
        std::istringstream ls(line);
        std::string key;
        ls >> key;
        std::vector<double> v;
        double x;
        while (ls >> x) v.push_back(x);
        if (!key.empty()) t.emplace(key, v);
    }
    return t;
}

}  // namespace heatchain::testing
