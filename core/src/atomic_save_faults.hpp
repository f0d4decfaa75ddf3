#pragma once
// Test seam for writeFileAtomically: lets a test make one stage of a save
// fail as the operating system would (a full disk mid-write, a failing
// fsync, a refused rename) and check that the user's file is untouched.
// Production code never sets these; they default to "no fault".
#include <cstddef>

namespace heatchain::detail {

struct AtomicSaveFaults {
    // Write this many bytes of the temporary file, then fail as if the disk
    // were full (ENOSPC). Negative: no fault.
    long long failWriteAfterBytes = -1;
    bool failSync = false;    // fsync of the temporary file fails (EIO)
    bool failBackup = false;  // copying the previous version to "<file>.bak" fails
    bool failRename = false;  // the final rename fails (EACCES)
};

// The faults the next saves will simulate (a process-wide setting for tests).
AtomicSaveFaults& atomicSaveFaultsForTests();

}  // namespace heatchain::detail
