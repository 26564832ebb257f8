#include "TextFile.h"

#include <cerrno>
#include <cstring>
#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

namespace sagline {

namespace {

std::string sizeText(std::size_t bytes)
{
    return bytes >= 1024 * 1024 ? std::to_string(bytes / (1024 * 1024)) + " MB" : std::to_string(bytes / 1024) + " kB";
}

} // namespace

TextFileRead readTextFile(const std::string &path, std::size_t maxBytes)
{
    TextFileRead read;
    struct stat info {};
    if (::stat(path.c_str(), &info) != 0) {
        read.error = errno == ENOENT ? "no such file" : errno == EACCES ? "permission denied" : std::strerror(errno);
        return read;
    }
    if (S_ISDIR(info.st_mode)) {
        read.error = "is a folder, not a file";
        return read;
    }
    if (!S_ISREG(info.st_mode)) {
        read.error = "is not a regular file (a device, a pipe or a socket); give a file";
        return read;
    }
    const auto tooLarge = [&] {
        return TextFileRead{std::nullopt, "is larger than the " + sizeText(maxBytes) + " such a file may be"};
    };
    if (static_cast<std::uintmax_t>(info.st_size) > maxBytes)
        return tooLarge();
    const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
    if (fd < 0) {
        read.error = "cannot be opened (permission?)";
        return read;
    }
    // At most one byte more than allowed is read: a file that grew meanwhile is still refused.
    // new char[] leaves the bytes unset: read() writes every one that is kept.
    const std::size_t capacity = static_cast<std::size_t>(info.st_size) + 1;
    std::unique_ptr<char[]> bytes(new char[capacity]);
    std::size_t size = 0;
    bool failed = false;
    while (size < capacity) {
        const ssize_t got = ::read(fd, bytes.get() + size, capacity - size);
        if (got < 0 && errno == EINTR)
            continue;
        if (got < 0)
            failed = true;
        if (got <= 0)
            break;
        size += static_cast<std::size_t>(got);
    }
    ::close(fd);
    if (failed) {
        read.error = "read error";
        return read;
    }
    if (size > maxBytes)
        return tooLarge();
    const std::size_t begin = size >= 3 && std::memcmp(bytes.get(), "\xEF\xBB\xBF", 3) == 0 ? 3 : 0;
    read.text.emplace(std::move(bytes), begin, size);
    return read;
}

FieldError unreadableFileError(const std::string &path, const std::string &reason)
{
    return {path, reason};
}

} // namespace sagline
