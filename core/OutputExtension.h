// The file name of an output must say what is inside it: a CSV export named "report.pdf"
// would be opened by the wrong program. A name without an extension gets the format's own.
#pragma once

#include <string>
#include <vector>

namespace sagline {

struct OutputName {
    std::string path;  // the name to write, with its extension added when it had none
    std::string error; // "" or why the name is refused (naming the file and the rule)
    bool ok() const { return error.empty(); }
};

// `extensions`: the format's extensions without the dot, the first being the one added
// ({"csv"}, {"png"}, {"svg"}); compared without regard to case. The extension is the part of
// the last path component after its last dot (a leading dot, as in ".hidden", is no extension).
OutputName outputNameFor(const std::string &path, const std::string &formatName,
                         const std::vector<std::string> &extensions);

} // namespace sagline
