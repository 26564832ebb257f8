// Runs a program (the CLI under test) and captures its exit code, stdout and stderr.
#pragma once

#include <csignal>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <optional>
#include <poll.h>
#include <sstream>
#include <string>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>
#include <vector>

namespace sagline::testing {

// How to start the program under test beyond its arguments.
struct RunOptions {
    // RLIMIT_FSIZE for the child: writing a file past this many bytes fails (EFBIG), as on a
    // full disk at that point. SIGXFSZ is ignored so the write returns an error instead of
    // killing it; stdout and stderr then come through pipes.
    std::optional<rlim_t> fileSizeLimit;
    // Leave SIGXFSZ as a shell leaves it (default: kill), to check the program copes by itself.
    bool defaultFileSizeSignal = false;
};

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
                                const std::string &input = {}, const RunOptions &options = {})
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
    // Under a file size limit stdout and stderr are pipes: the limit applies to files only, and
    // the messages about the failed write must come through whole.
    const bool piped = options.fileSizeLimit.has_value();
    int outPipe[2] = {-1, -1}, errPipe[2] = {-1, -1};
    if (piped && (pipe(outPipe) != 0 || pipe(errPipe) != 0))
        return result;
    const pid_t pid = fork();
    if (pid == 0) {
        if (!freopen(inPath.c_str(), "r", stdin))
            _exit(127);
        if (piped) {
            if (dup2(outPipe[1], STDOUT_FILENO) < 0 || dup2(errPipe[1], STDERR_FILENO) < 0)
                _exit(127);
            for (int fd : {outPipe[0], outPipe[1], errPipe[0], errPipe[1]})
                close(fd);
            // a write past the limit fails with EFBIG instead
            std::signal(SIGXFSZ, options.defaultFileSizeSignal ? SIG_DFL : SIG_IGN);
            const rlimit limit{*options.fileSizeLimit, *options.fileSizeLimit};
            if (setrlimit(RLIMIT_FSIZE, &limit) != 0)
                _exit(127);
        } else if (!freopen(outPath.c_str(), "w", stdout) || !freopen(errPath.c_str(), "w", stderr)) {
            _exit(127);
        }
        std::vector<char *> argv;
        argv.push_back(const_cast<char *>(program.c_str()));
        for (const auto &arg : args)
            argv.push_back(const_cast<char *>(arg.c_str()));
        argv.push_back(nullptr);
        execv(program.c_str(), argv.data());
        _exit(127);
    }
    if (piped) {
        close(outPipe[1]);
        close(errPipe[1]);
        pollfd fds[2] = {{outPipe[0], POLLIN, 0}, {errPipe[0], POLLIN, 0}};
        std::string *sinks[2] = {&result.out, &result.err};
        int remaining = 2;
        while (remaining > 0 && poll(fds, 2, -1) > 0) {
            for (int i = 0; i < 2; ++i) {
                if (fds[i].fd < 0 || fds[i].revents == 0)
                    continue;
                char buffer[4096];
                const ssize_t got = read(fds[i].fd, buffer, sizeof buffer);
                if (got > 0) {
                    sinks[i]->append(buffer, static_cast<std::size_t>(got));
                } else {
                    close(fds[i].fd);
                    fds[i].fd = -1;
                    --remaining;
                }
            }
        }
    }
    int status = 0;
    waitpid(pid, &status, 0);
    if (WIFEXITED(status))
        result.exitCode = WEXITSTATUS(status);
    if (!piped) {
        result.out = readWholeFile(outPath);
        result.err = readWholeFile(errPath);
    }
    fs::remove_all(dir);
    return result;
}

} // namespace sagline::testing
