// Finds the session files a review should open: files named on the command line or picked in a
// dialog are taken as they are, folders are walked recursively for *.sagline files. A path that
// does not exist, or a folder that cannot be read, is listed with its reason; the walk goes on.
// Pure filesystem work: nothing is opened as a database here.
#pragma once

#include <cstddef>
#include <functional>
#include <string>
#include <vector>

namespace sagline {

inline constexpr const char *sessionFileExtension = ".sagline";

struct ScanProblem {
    std::string path;
    std::string reason;             // e.g. "does not exist", "cannot be read: Permission denied"
};

struct SessionFileList {
    std::vector<std::string> files; // in a stable order: inputs in the order given, each folder sorted by path
    std::vector<ScanProblem> problems;
    bool cancelled = false;         // the walk stopped because `keepGoing` returned false
};

// `keepGoing` is called once per directory entry with the count of session files found so far;
// returning false stops the walk (what was found is kept). A file found twice is listed once.
SessionFileList findSessionFiles(const std::vector<std::string> &inputs,
                                 const std::function<bool(std::size_t found)> &keepGoing = {});

} // namespace sagline
