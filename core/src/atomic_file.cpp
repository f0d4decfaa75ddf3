// Atomic file save: a temporary file in the same folder, written in full and
// flushed, the previous version kept as "<name>.bak", then a rename over the
// target, so a failure at any stage leaves the user's file as it was.
#include "heatchain/project_file.hpp"  // declares writeFileAtomically

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <cerrno>
#include <cstring>
#include <string>

#include "atomic_save_faults.hpp"

namespace heatchain {

namespace detail {
AtomicSaveFaults& atomicSaveFaultsForTests() {
    static AtomicSaveFaults faults;
    return faults;
}
}  // namespace detail

namespace {
std::string osReason(int error) { return std::strerror(error); }
}  // namespace

Status writeFileAtomically(const std::filesystem::path& file, std::string_view bytes, bool keepBackup) {
    namespace fs = std::filesystem;
    const detail::AtomicSaveFaults& faults = detail::atomicSaveFaultsForTests();
    const std::string name = file.string();
    std::error_code ec;

    // Saving through a symbolic link replaces the file it points to, not the link.
    fs::path target = file;
    if (fs::is_symlink(target, ec)) {
        const fs::path resolved = fs::weakly_canonical(target, ec);
        if (!ec) target = resolved;
    }
    if (target.filename().empty()) return makeError("cannot save: no file name", name);
    if (fs::is_directory(target, ec)) return makeError("cannot save: this is a folder", name);
    fs::path folder = target.parent_path();
    if (folder.empty()) folder = ".";
    if (!fs::is_directory(folder, ec))
        return makeError("cannot save: the folder " + folder.string() + " does not exist", name);

    static std::atomic<unsigned> counter{0};
    const fs::path temp = folder / ("." + target.filename().string() + ".saving-" + std::to_string(::getpid()) + "-" +
                                    std::to_string(counter++));
    const int fd = ::open(temp.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
    if (fd < 0)
        return makeError("cannot save: cannot create a temporary file in " + folder.string() + ": " +
                             osReason(errno),
                         name);

    auto abandon = [&](const std::string& what, int error) -> Status {
        ::close(fd);
        ::unlink(temp.c_str());
        return makeError("cannot save: " + what + ": " + osReason(error) + "; the file on disk is unchanged", name);
    };

    // Keep the previous file's permissions.
    struct stat previous {};
    const bool hadFile = ::stat(target.c_str(), &previous) == 0;
    if (hadFile) (void)::fchmod(fd, previous.st_mode & 07777);

    std::size_t done = 0;
    int interruptions = 0;
    while (done < bytes.size()) {
        std::size_t chunk = bytes.size() - done;
        if (faults.failWriteAfterBytes >= 0) {
            const auto limit = static_cast<std::size_t>(faults.failWriteAfterBytes);
            if (done >= limit) return abandon("writing the temporary file failed", ENOSPC);
            chunk = std::min(chunk, limit - done);
        }
        const ssize_t written = ::write(fd, bytes.data() + done, chunk);
        if (written < 0) {
            if (errno == EINTR && ++interruptions < 100) continue;
            return abandon("writing the temporary file failed", errno);
        }
        if (written == 0) return abandon("writing the temporary file made no progress", EIO);
        done += static_cast<std::size_t>(written);
    }
    if (faults.failSync) return abandon("flushing the temporary file to disk failed", EIO);
    if (::fsync(fd) != 0) return abandon("flushing the temporary file to disk failed", errno);
    if (::close(fd) != 0) {
        const int error = errno;
        ::unlink(temp.c_str());
        return makeError("cannot save: closing the temporary file failed: " + osReason(error) +
                             "; the file on disk is unchanged",
                         name);
    }

    auto discard = [&](const std::string& what, int error) -> Status {
        ::unlink(temp.c_str());
        return makeError("cannot save: " + what + ": " + osReason(error) + "; the file on disk is unchanged", name);
    };
    if (keepBackup && hadFile) {
        fs::path backup = target;
        backup += ".bak";
        if (faults.failBackup) return discard("cannot keep the previous version as " + backup.string(), EACCES);
        fs::copy_file(target, backup, fs::copy_options::overwrite_existing, ec);
        if (ec) return discard("cannot keep the previous version as " + backup.string(), ec.value());
    }
    if (faults.failRename) return discard("cannot replace the file with the new version", EACCES);
    if (::rename(temp.c_str(), target.c_str()) != 0)
        return discard("cannot replace the file with the new version", errno);

    // Make the rename itself durable (best effort: some file systems refuse).
    const int dirFd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
    if (dirFd >= 0) {
        (void)::fsync(dirFd);
        ::close(dirFd);
    }
    return Ok{};
}

}  // namespace heatchain
