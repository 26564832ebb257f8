// Finds Sagline's read-only data files (the demo setup, ...) both for an installed program
// (<prefix>/share/sagline, beside <prefix>/bin) and for a program run from its build tree.
#pragma once

#include <filesystem>
#include <string>

namespace sagline {

// Where to look. findDataDirectory() fills this from the running process; tests build their own.
struct DataDirectorySearch {
    std::string environmentOverride;           // value of $SAGLINE_DATA_DIR, empty when unset
    std::filesystem::path executablePath;      // the running program, e.g. /usr/bin/sagline-cli
    std::filesystem::path sourceDataDirectory; // resources/ of the source tree this build came from; may be empty
};

struct DataDirectoryResult {
    std::filesystem::path path; // absolute, meaningful only when ok()
    std::string message;        // empty when ok; otherwise names every place searched

    bool ok() const { return message.empty(); }
};

// Searches, in this order, and returns the first that is an existing directory:
//  1. the override (an explicit choice: when it is set but missing, that is the answer, a failure);
//  2. <executable's folder>/../share/sagline (an installed program under any prefix);
//  3. the source tree's resources/ folder (a build-tree run; absent once the tree is gone).
DataDirectoryResult locateDataDirectory(const DataDirectorySearch &search);

// locateDataDirectory() for this process: $SAGLINE_DATA_DIR, /proc/self/exe, and the source
// tree recorded at build time.
DataDirectoryResult findDataDirectory();

// The name of the override variable, for messages and help texts.
inline constexpr const char *dataDirectoryVariable = "SAGLINE_DATA_DIR";

} // namespace sagline
