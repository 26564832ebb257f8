// Data directory lookup: installed layout first, build tree as the fallback.
#include "DataDirectory.h"

#include <cstdlib>
#include <system_error>

// Set by packaging/CMakeLists.txt to the source tree's resources/ folder, so that programs run
// from the build tree find the data without being installed.
#ifndef SAGLINE_SOURCE_DATA_DIR
#define SAGLINE_SOURCE_DATA_DIR ""
#endif

namespace sagline {

namespace {

bool isDirectory(const std::filesystem::path &path)
{
    std::error_code error;
    return !path.empty() && std::filesystem::is_directory(path, error);
}

std::filesystem::path normalized(const std::filesystem::path &path)
{
    std::error_code error;
    auto canonical = std::filesystem::weakly_canonical(path, error);
    return error ? path.lexically_normal() : canonical;
}

} // namespace

DataDirectoryResult locateDataDirectory(const DataDirectorySearch &search)
{
    if (!search.environmentOverride.empty()) {
        const std::filesystem::path chosen(search.environmentOverride);
        if (isDirectory(chosen))
            return {normalized(chosen), {}};
        return {{}, std::string(dataDirectoryVariable) + ": '" + search.environmentOverride
                        + "' is not a directory (unset it to use the installed data)"};
    }

    std::string searched;
    if (!search.executablePath.empty()) {
        const auto installed = search.executablePath.parent_path() / ".." / "share" / "sagline";
        if (isDirectory(installed))
            return {normalized(installed), {}};
        searched += " '" + installed.lexically_normal().string() + "'";
    }
    if (isDirectory(search.sourceDataDirectory))
        return {normalized(search.sourceDataDirectory), {}};
    if (!search.sourceDataDirectory.empty())
        searched += " '" + search.sourceDataDirectory.string() + "'";

    return {{}, "Sagline's data directory was not found (searched" + (searched.empty() ? std::string(" nothing") : searched)
                    + "); reinstall the package or set " + dataDirectoryVariable};
}

DataDirectoryResult findDataDirectory()
{
    DataDirectorySearch search;
    if (const char *value = std::getenv(dataDirectoryVariable))
        search.environmentOverride = value;
    std::error_code error;
    search.executablePath = std::filesystem::read_symlink("/proc/self/exe", error);
    if (error)
        search.executablePath.clear();
    search.sourceDataDirectory = SAGLINE_SOURCE_DATA_DIR;
    return locateDataDirectory(search);
}

} // namespace sagline
