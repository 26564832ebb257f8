// Reading a whole input file (a setup, a lab sheet, a readings CSV) for a parser that takes the
// text: only a regular file within a size cap is read, so a folder, a device (/dev/zero) or a
// huge file is refused with a reason instead of being parsed or read for ever.
#pragma once

#include "FieldError.h"

#include <cstddef>
#include <memory>
#include <optional>
#include <string>
#include <string_view>

namespace sagline {

// Size caps (common practice: far above any real file of the kind, far below what would
// exhaust memory).
inline constexpr std::size_t maxSetupFileBytes = 1024 * 1024;       // setups and lab sheets
inline constexpr std::size_t maxReadingsFileBytes = 512u * 1024 * 1024; // readings CSV

// A file's bytes, read straight into a buffer the size of the file: no zero-filled string to
// write first (a 1e6-row CSV is 40 MB), no copy to drop a byte-order mark.
class FileText {
public:
    FileText(std::unique_ptr<char[]> bytes, std::size_t begin, std::size_t end)
        : m_bytes(std::move(bytes)), m_begin(begin), m_end(end) {}
    std::string_view view() const { return {m_bytes.get() + m_begin, m_end - m_begin}; }
    operator std::string_view() const { return view(); }

private:
    std::unique_ptr<char[]> m_bytes;
    std::size_t m_begin = 0;
    std::size_t m_end = 0;
};

struct TextFileRead {
    std::optional<FileText> text; // the bytes, a leading UTF-8 byte-order mark left out
    std::string error;            // when there is no text: "is a folder, not a file", ...
};

TextFileRead readTextFile(const std::string &path, std::size_t maxBytes);

// The error a loader reports for a file readTextFile refused, on the field "file".
FieldError unreadableFileError(const std::string &path, const std::string &reason);

} // namespace sagline
