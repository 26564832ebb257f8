// `run` and `report` in sagline-cli: handed to sagline-cli-full, which holds them. They need the
// instrument links (Qt SerialPort, Network) and the PDF writer (Qt Gui); loading those libraries
// took 14 of the 22 ms every other command spent starting (perf stat, DEVELOPERS.md "Speed,
// measured"), so the program people call for fit, import, export and compare no longer loads them.
// The process is replaced (execv): arguments, standard streams, exit code and signals are the
// full program's own.
#include "CliCommands.h"

#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <iostream>
#include <system_error>

#ifndef SAGLINE_CLI_FULL_FROM_BINDIR
#define SAGLINE_CLI_FULL_FROM_BINDIR "../libexec"
#endif

namespace sagline::cli {

namespace {

constexpr const char *fullProgramName = "sagline-cli-full";

int forward(const char *command, const Arguments &args)
{
    std::error_code error;
    const std::filesystem::path self = std::filesystem::read_symlink("/proc/self/exe", error);
    const std::filesystem::path folder = error ? std::filesystem::path() : self.parent_path();
    // Beside this program in the build tree; in the libexec folder once installed.
    const std::filesystem::path candidates[] = {folder / fullProgramName,
                                                (folder / SAGLINE_CLI_FULL_FROM_BINDIR / fullProgramName).lexically_normal()};
    std::vector<std::string> words = {"sagline-cli", command};
    words.insert(words.end(), args.begin(), args.end());
    std::vector<char *> argv;
    for (std::string &word : words)
        argv.push_back(word.data());
    argv.push_back(nullptr);
    std::string tried;
    int lastError = ENOENT;
    for (const std::filesystem::path &candidate : candidates) {
        if (folder.empty())
            break;
        ::execv(candidate.c_str(), argv.data()); // returns only on failure
        lastError = errno;
        tried += (tried.empty() ? "" : ", ") + candidate.string();
    }
    std::cerr << "sagline-cli " << command << ": cannot start " << fullProgramName << ", which holds this command ("
              << (tried.empty() ? std::string("this program's own location is unknown") : "tried " + tried) << "): "
              << std::strerror(lastError) << "; reinstall the package\n";
    return exitRuntimeFailure;
}

} // namespace

int runRun(const Arguments &args) { return forward("run", args); }

int runReport(const Arguments &args) { return forward("report", args); }

} // namespace sagline::cli
