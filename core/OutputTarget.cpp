#include "OutputTarget.h"

#include "SessionSchema.h"

#include <array>
#include <cstring>
#include <fstream>
#include <sys/stat.h>

namespace sagline {

namespace {

bool sameFile(const struct stat &a, const std::string &other)
{
    struct stat b {};
    return ::stat(other.c_str(), &b) == 0 && a.st_dev == b.st_dev && a.st_ino == b.st_ino;
}

} // namespace

bool isSessionFile(const std::string &path)
{
    std::array<unsigned char, 72> header{};
    std::ifstream in(path, std::ios::binary);
    if (!in.read(reinterpret_cast<char *>(header.data()), static_cast<std::streamsize>(header.size())))
        return false;
    static constexpr char magic[] = "SQLite format 3"; // with its NUL: bytes 0-15
    if (std::memcmp(header.data(), magic, sizeof magic) != 0)
        return false;
    const std::uint32_t id = (std::uint32_t{header[68]} << 24) | (std::uint32_t{header[69]} << 16)
                             | (std::uint32_t{header[70]} << 8) | std::uint32_t{header[71]};
    return id == sessionApplicationId;
}

StoreStatus checkOutputPath(const std::string &path, const std::vector<std::string> &inputs, bool replaceExisting)
{
    if (path == "-")
        return StoreStatus::success();
    const auto refuse = [&path](const std::string &rule) {
        return StoreStatus::failure(StoreCode::InvalidArgument, path + ": " + rule + "; nothing was written");
    };
    if (path.empty())
        return refuse("no file name");
    struct stat target {};
    if (::stat(path.c_str(), &target) != 0)
        return StoreStatus::success(); // a new file; the writer reports a missing or read-only folder
    if (S_ISDIR(target.st_mode))
        return refuse("is a folder; give a file name");
    for (const std::string &input : inputs) {
        if (sameFile(target, input))
            return refuse("is the file this command reads (" + input + "); write the output to another file");
    }
    if (!S_ISREG(target.st_mode))
        return refuse("is not a regular file (a device or a pipe); give a file name, or - for standard output");
    if (isSessionFile(path))
        return refuse("is a Sagline session; a session is never written over (choose another name)");
    if (!replaceExisting)
        return refuse("already exists; give --force to replace it");
    return StoreStatus::success();
}

} // namespace sagline
