// Runs a program (the CLI under test) and captures its exit code, stdout and stderr.
#pragma once

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>
#include <vector>

namespace sagline::testing {

struct ProgramResult {
    int exitCode = -1; // -1 when it did not exit normally (a crash)
    std::string out;
    std::string err;
};

inline std::string readWholeFile(const std::filesystem::path &path)
{
    std::ifstream in(path, std::ios::binary);
    std::ostringstream buffer;
    buffer << in.rdbuf();
    return buffer.str();
}

// Runs `program` with `args`, stdin from `input` (empty: an empty file). No shell is involved.
inline ProgramResult runProgram(const std::string &program, const std::vector<std::string> &args,
                                const std::string &input = {})
{
    namespace fs = std::filesystem;
    char dirTemplate[] = "/tmp/sagline-run-XXXXXX";
    const fs::path dir = mkdtemp(dirTemplate);
    const fs::path outPath = dir / "out", errPath = dir / "err", inPath = dir / "in";
    {
        std::ofstream in(inPath, std::ios::binary);
        in << input;
    }
    ProgramResult result;
    const pid_t pid = fork();
    if (pid == 0) {
        if (!freopen(inPath.c_str(), "r", stdin) || !freopen(outPath.c_str(), "w", stdout)
            || !freopen(errPath.c_str(), "w", stderr))
            _exit(127);
        std::vector<char *> argv;
        argv.push_back(const_cast<char *>(program.c_str()));
        for (const auto &arg : args)
            argv.push_back(const_cast<char *>(arg.c_str()));
        argv.push_back(nullptr);
        execv(program.c_str(), argv.data());
        _exit(127);
    }
    int status = 0;
    waitpid(pid, &status, 0);
    if (WIFEXITED(status))
        result.exitCode = WEXITSTATUS(status);
    result.out = readWholeFile(outPath);
    result.err = readWholeFile(errPath);
    fs::remove_all(dir);
    return result;
}

} // namespace sagline::testing
