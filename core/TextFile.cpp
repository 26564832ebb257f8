#include "TextFile.h"

#include <fstream>
#include <sstream>

namespace sagline {

std::optional<std::string> readTextFile(const std::string &path)
{
    std::ifstream in(path, std::ios::binary | std::ios::ate);
    if (!in)
        return std::nullopt;
    std::string text;
    // A regular file is read in one go into a buffer of its size (a 30 MB readings CSV is
    // not copied twice); a pipe has no size and is streamed.
    if (const std::streamoff size = in.tellg(); size > 0) {
        text.resize(static_cast<std::size_t>(size));
        in.seekg(0);
        in.read(text.data(), size);
        if (in.gcount() != size)
            return std::nullopt;
    } else {
        in.clear();
        in.seekg(0);
        std::ostringstream buffer;
        buffer << in.rdbuf();
        text = buffer.str();
    }
    if (text.size() >= 3 && text.compare(0, 3, "\xEF\xBB\xBF") == 0)
        text.erase(0, 3);
    return text;
}

FieldError unreadableFileError(const std::string &path)
{
    return {path, "cannot be read (missing file or no permission)"};
}

} // namespace sagline
