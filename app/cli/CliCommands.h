// The sagline-cli commands. Each lives in its own .cpp and returns a process exit code.
#pragma once

#include <string>
#include <vector>

namespace sagline::cli {

// Exit codes of DESIGN.md: scripts rely on them.
enum ExitCode : int {
    exitSuccess = 0,
    exitRuntimeFailure = 1, // I/O, instrument, disk
    exitInvalidInput = 2,   // usage, validation, unreadable file
    exitSafetyStop = 3,     // a sweep stopped by a safety limit
    exitGaveUp = 4,         // run: a pause nobody resolved within --give-up-after
};

using Arguments = std::vector<std::string>; // the words after the command name

// The last paragraph of every command's --help.
inline constexpr const char *exitCodesNote =
    "Exit codes: 0 success; 1 runtime failure (I/O, instrument, disk); 2 invalid input (the message names\n"
    "the field or the line and the rule); 3 sweep stopped by a safety limit; 4 run gave up waiting (a pause\n"
    "nobody resolved within --give-up-after).";

int runPlan(const Arguments &args);
int runFit(const Arguments &args);
int runRun(const Arguments &args);
int runImport(const Arguments &args);
int runExport(const Arguments &args);
int runReport(const Arguments &args);
int runCompare(const Arguments &args);
int runExclude(const Arguments &args);
int runRestore(const Arguments &args);
int runNote(const Arguments &args);
int runTemperature(const Arguments &args);
int runSignOff(const Arguments &args);
int runReopen(const Arguments &args);
int runVerify(const Arguments &args);
int runLabSheet(const Arguments &args);

} // namespace sagline::cli
