// Helpers shared by the commands that read a session and write files (import, export, report,
// compare): exit codes for store failures, which outputs may be written, and writing one.
#pragma once

#include "CliCommands.h"
#include "StoreResult.h"

#include <optional>
#include <string>
#include <vector>

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

// Checks every output before anything is written: none may be a session file (by content),
// one of `inputs`, a folder or a device, or another output of the same call; an existing file
// only with `force`. Prints the refusal ("sagline-cli COMMAND: PATH: ...") and returns 2, or
// nothing when all may be written. Empty paths are skipped.
std::optional<int> refuseOutputs(const std::string &command, const std::vector<std::string> &outputs,
                                 const std::vector<std::string> &inputs, bool force);

// Writes `text` to `path` atomically (core/AtomicFile), or to stdout for "-". Returns "" or
// the reason it failed; nothing partial is left under `path`.
std::string writeOutput(const std::string &path, const std::string &text);

} // namespace sagline::cli
