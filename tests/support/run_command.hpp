#pragma once
// Runs a shell command for the command-line and report tests: exit status,
// stdout, and stderr (through a temporary file).
#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>

namespace heatchain::testing {

struct CommandRun {
    int exit = -1;
    std::string out, err;
};

inline std::string readWholeFile(const std::filesystem::path& p) {
    std::ifstream f(p, std::ios::binary);
    std::stringstream ss;
    ss << f.rdbuf();
    return ss.str();
}

inline CommandRun runCommand(const std::string& command) {
    static int counter = 0;
    const auto errFile = std::filesystem::temp_directory_path() /
                         ("heatchain-test-err-" + std::to_string(::getpid()) + "-" + std::to_string(++counter));
    const std::string cmd = command + " 2>" + errFile.string();
    CommandRun r;
    FILE* p = popen(cmd.c_str(), "r");
    if (!p) return r;
    std::array<char, 4096> buf{};
    std::size_t n;
    while ((n = std::fread(buf.data(), 1, buf.size(), p)) > 0) r.out.append(buf.data(), n);
    const int status = pclose(p);
    r.exit = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    r.err = readWholeFile(errFile);
    std::filesystem::remove(errFile);
    return r;
}

}  // namespace heatchain::testing
