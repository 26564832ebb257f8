#include "AtomicFile.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fcntl.h>
#include <filesystem>
#include <random>
#include <unistd.h>

namespace sagline {

std::string describeFileError(int error)
{
    switch (error) {
    case ENOSPC: return "the disk is full";
    case EDQUOT: return "the disk quota is used up";
    case EFBIG: return "the file is larger than this system allows";
    case EROFS: return "the file system is read-only";
    case EACCES:
    case EPERM: return "permission denied (is the folder writable?)";
    case ENOENT: return "the folder does not exist";
    case ENOTDIR: return "a part of the path is not a folder";
    case EISDIR: return "it is a folder";
    case EIO: return "input/output error";
    default: return std::strerror(error);
    }
}

namespace {

// Syncs the folder that holds `path`, so the rename survives a power cut (fsync(2)).
void syncFolder(const std::string &path, const FileSystemCalls &calls)
{
    std::filesystem::path folder = std::filesystem::path(path).parent_path();
    if (folder.empty())
        folder = ".";
    const int fd = calls.open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC, 0);
    if (fd < 0)
        return;
    calls.fsync(fd);
    calls.close(fd);
}

} // namespace

const FileSystemCalls &FileSystemCalls::system()
{
    static const FileSystemCalls calls{
        [](const char *path, int flags, mode_t mode) { return ::open(path, flags, mode); },
        [](int fd, const void *data, std::size_t size) { return ::write(fd, data, size); },
        [](int fd) { return ::fsync(fd); },
        [](int fd) { return ::close(fd); },
        [](const char *from, const char *to) { return ::rename(from, to); },
        [](const char *path) { return ::unlink(path); },
    };
    return calls;
}

std::string temporarySibling(const std::string &path)
{
    const std::filesystem::path target(path);
    // The process id keeps the names of two processes apart even when one was forked from the
    // other after the generator was seeded (a child inherits the parent's generator state).
    static thread_local std::mt19937_64 random(std::random_device{}());
    char suffix[40];
    std::snprintf(suffix, sizeof suffix, "%ld-%08x", static_cast<long>(::getpid()),
                  static_cast<unsigned>(random() & 0xFFFFFFFFu));
    return (target.parent_path() / ("." + target.filename().string() + "." + suffix + ".partial")).string();
}

StoreStatus writeFileAtomically(const std::string &path, std::string_view bytes, const FileSystemCalls &calls)
{
    const auto failure = [&path](int error) {
        return StoreStatus::failure(StoreCode::IoError, path + ": cannot write (" + describeFileError(error) + "); nothing was written");
    };
    std::string temporary;
    int fd = -1;
    for (int attempt = 0; attempt < 8 && fd < 0; ++attempt) {
        temporary = temporarySibling(path);
        fd = calls.open(temporary.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
        if (fd < 0 && errno != EEXIST)
            return failure(errno);
    }
    if (fd < 0)
        return failure(EEXIST);

    int error = 0;
    std::size_t written = 0;
    while (written < bytes.size() && error == 0) {
        const ssize_t n = calls.write(fd, bytes.data() + written, bytes.size() - written);
        if (n < 0 && errno == EINTR)
            continue;
        if (n <= 0)
            error = n < 0 ? errno : ENOSPC; // a write of 0 bytes to a regular file: no room
        else
            written += static_cast<std::size_t>(n);
    }
    // Flushed and checked before the name changes: a delayed write error shows up in fsync
    // or close, never after the rename.
    if (error == 0 && calls.fsync(fd) != 0)
        error = errno;
    if (calls.close(fd) != 0 && error == 0)
        error = errno;
    if (error == 0) {
        std::error_code sizeError;
        const auto size = std::filesystem::file_size(temporary, sizeError);
        if (sizeError || size != bytes.size())
            error = sizeError ? sizeError.value() : EIO;
    }
    if (error == 0 && calls.rename(temporary.c_str(), path.c_str()) != 0)
        error = errno;
    if (error != 0) {
        calls.unlink(temporary.c_str());
        return failure(error);
    }
    syncFolder(path, calls);
    return StoreStatus::success();
}

} // namespace sagline
