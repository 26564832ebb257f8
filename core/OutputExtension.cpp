#include "OutputExtension.h"

#include <algorithm>
#include <cctype>

namespace sagline {

namespace {

std::string lower(std::string text)
{
    std::transform(text.begin(), text.end(), text.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return text;
}

} // namespace

OutputName outputNameFor(const std::string &path, const std::string &formatName, const std::vector<std::string> &extensions)
{
    if (path.empty() || extensions.empty())
        return {path, "no file name given"};
    const std::size_t slash = path.find_last_of('/');
    const std::string name = slash == std::string::npos ? path : path.substr(slash + 1);
    if (name.empty() || name == "." || name == "..")
        return {path, path + ": not a file name"};
    const std::size_t dot = name.find_last_of('.');
    if (dot == std::string::npos || dot == 0)
        return {path + '.' + extensions.front(), {}};
    const std::string extension = lower(name.substr(dot + 1));
    for (const std::string &allowed : extensions) {
        if (extension == lower(allowed))
            return {path, {}};
    }
    std::string expected;
    for (const std::string &allowed : extensions)
        expected += (expected.empty() ? "." : " or .") + allowed;
    return {path, path + ": a " + formatName + " file must end in " + expected + " (not ." + name.substr(dot + 1) +
                      "); nothing was written"};
}

} // namespace sagline
