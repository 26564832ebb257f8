// Helpers shared by the session commands (import, export, report): exit codes for store
// failures and writing an output file or stdout ("-").
#pragma once

#include "CliCommands.h"
#include "StoreResult.h"

#include <optional>
#include <string>

namespace sagline::cli {

// A file that cannot be read as a session is invalid input (2); disk and I/O trouble is a
// runtime failure (1).
inline int exitCodeFor(StoreCode code)
{
    switch (code) {
    case StoreCode::Ok: return exitSuccess;
    case StoreCode::IoError:
    case StoreCode::Busy: return exitRuntimeFailure;
    default: return exitInvalidInput;
    }
}

// Writes `text` to `path` through a temporary file and a rename, or to stdout for "-".
// Returns "" or the reason it failed.
std::string writeOutput(const std::string &path, const std::string &text);

} // namespace sagline::cli
