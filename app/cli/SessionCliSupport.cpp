#include "SessionCliSupport.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iostream>

namespace sagline::cli {

std::string writeOutput(const std::string &path, const std::string &text)
{
    if (path == "-") {
        std::cout << text;
        std::cout.flush();
        return std::cout ? std::string() : std::string("cannot write to standard output");
    }
    const std::string temporary = path + ".partial";
    {
        std::ofstream out(temporary, std::ios::binary | std::ios::trunc);
        out.write(text.data(), static_cast<std::streamsize>(text.size()));
        out.flush();
        if (!out) {
            std::error_code ignored;
            std::filesystem::remove(temporary, ignored);
            return path + ": cannot write (" + std::string(std::strerror(errno)) + ")";
        }
    }
    std::error_code error;
    std::filesystem::rename(temporary, path, error);
    if (error) {
        std::filesystem::remove(temporary, error);
        return path + ": cannot write (" + error.message() + ")";
    }
    return {};
}

} // namespace sagline::cli
