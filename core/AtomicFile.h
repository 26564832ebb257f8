// Writing an output file (report, CSV and JSON exports, lab sheets) so that a failure can never
// leave a partial file under the requested name: the bytes go to a temporary file in the same
// folder, which is flushed to disk (fsync), checked and renamed over the name; the folder is
// synced after. Disk full, a read-only folder or a permission problem gives the reason, and the
// temporary file is removed.
//
// FileSystemCalls is the seam under it: tests replace any call with one that fails (ENOSPC on
// the k-th write, a failing fsync or rename), as SQLite's test VFS does for its own writes.
#pragma once

#include "StoreResult.h"

#include <cstddef>
#include <functional>
#include <string>
#include <string_view>
#include <sys/types.h>

namespace sagline {

struct FileSystemCalls {
    std::function<int(const char *path, int flags, mode_t mode)> open;
    std::function<ssize_t(int fd, const void *data, std::size_t size)> write;
    std::function<int(int fd)> fsync;
    std::function<int(int fd)> close;
    std::function<int(const char *from, const char *to)> rename;
    std::function<int(const char *path)> unlink;

    static const FileSystemCalls &system(); // the real POSIX calls
};

// Writes `bytes` to `path` atomically (see above). `path` may already exist: it is replaced
// only by a complete file; callers decide beforehand whether replacing is allowed
// (checkOutputPath). Errors: IoError with "PATH: cannot write (reason)"; nothing is left under
// `path` that was not there before, and no temporary file is left.
StoreStatus writeFileAtomically(const std::string &path, std::string_view bytes,
                                const FileSystemCalls &calls = FileSystemCalls::system());

// What an errno means for someone saving a file: "the disk is full", "permission denied (is the
// folder writable?)", ...
std::string describeFileError(int error);

// A temporary name beside `path` in the same folder: ".NAME.XXXXXXXX.partial", hidden and
// never ending in .sagline, so folder scans and the file type never take it for the output.
std::string temporarySibling(const std::string &path);

} // namespace sagline
