#include "SessionCliSupport.h"

#include "AtomicFile.h"
#include "OutputTarget.h"

#include <iostream>
#include <sys/stat.h>

namespace sagline::cli {

namespace {

bool sameFile(const std::string &a, const std::string &b)
{
    if (a == b)
        return true;
    struct stat x {}, y {};
    return ::stat(a.c_str(), &x) == 0 && ::stat(b.c_str(), &y) == 0 && x.st_dev == y.st_dev && x.st_ino == y.st_ino;
}

} // namespace

std::optional<int> refuseOutputs(const std::string &command, const std::vector<std::string> &outputs,
                                 const std::vector<std::string> &inputs, bool force)
{
    for (std::size_t i = 0; i < outputs.size(); ++i) {
        const std::string &path = outputs[i];
        if (path.empty())
            continue;
        for (std::size_t j = 0; j < i; ++j) {
            if (path != "-" && !outputs[j].empty() && sameFile(path, outputs[j])) {
                std::cerr << "sagline-cli " << command << ": " << path
                          << ": given for two outputs; each output needs its own file\n";
                return exitInvalidInput;
            }
        }
        if (const StoreStatus status = checkOutputPath(path, inputs, force); !status.ok()) {
            std::cerr << "sagline-cli " << command << ": " << status.message << '\n';
            return exitInvalidInput;
        }
    }
    return std::nullopt;
}

std::string writeOutput(const std::string &path, const std::string &text)
{
    if (path == "-") {
        std::cout << text;
        std::cout.flush();
        return std::cout ? std::string() : std::string("cannot write to standard output");
    }
    const StoreStatus status = writeFileAtomically(path, text);
    return status.ok() ? std::string() : status.message;
}

} // namespace sagline::cli
