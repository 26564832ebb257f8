#include "TextFile.h"

#include <fstream>
#include <sstream>

namespace sagline {

std::optional<std::string> readTextFile(const std::string &path)
{
    std::ifstream in(path, std::ios::binary);
    if (!in)
        return std::nullopt;
    std::ostringstream buffer;
    buffer << in.rdbuf();
    std::string text = buffer.str();
    if (text.size() >= 3 && text.compare(0, 3, "\xEF\xBB\xBF") == 0)
        text.erase(0, 3);
    return text;
}

FieldError unreadableFileError(const std::string &path)
{
    return {path, "cannot be read (missing file or no permission)"};
}

} // namespace sagline
