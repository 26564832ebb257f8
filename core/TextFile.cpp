#include "TextFile.h"

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sys/stat.h>

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
        read.text.reset();
        read.error = "is larger than the " + sizeText(maxBytes) + " such a file may be";
        return read;
    };
    if (static_cast<std::uintmax_t>(info.st_size) > maxBytes)
        return tooLarge();
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        read.error = "cannot be opened (permission?)";
        return read;
    }
    // At most one byte more than allowed is read: a file that grew meanwhile is still refused.
    std::string text(static_cast<std::size_t>(info.st_size) + 1, '\0');
    in.read(text.data(), static_cast<std::streamsize>(text.size()));
    if (in.bad()) {
        read.error = "read error";
        return read;
    }
    text.resize(static_cast<std::size_t>(in.gcount()));
    if (text.size() > maxBytes)
        return tooLarge();
    if (text.size() >= 3 && text.compare(0, 3, "\xEF\xBB\xBF") == 0)
        text.erase(0, 3);
    read.text = std::move(text);
    return read;
}

FieldError unreadableFileError(const std::string &path, const std::string &reason)
{
    return {path, reason};
}

} // namespace sagline
