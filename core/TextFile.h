// Reading a whole input file (a setup, a lab sheet, a readings CSV) for a parser that takes the
// text: only a regular file within a size cap is read, so a folder, a device (/dev/zero) or a
// huge file is refused with a reason instead of being parsed or read for ever.
#pragma once

#include "FieldError.h"

#include <cstddef>
#include <optional>
#include <string>

namespace sagline {

// Size caps (common practice: far above any real file of the kind, far below what would
// exhaust memory).
inline constexpr std::size_t maxSetupFileBytes = 1024 * 1024;       // setups and lab sheets
inline constexpr std::size_t maxReadingsFileBytes = 512u * 1024 * 1024; // readings CSV

struct TextFileRead {
    std::optional<std::string> text; // the bytes, a leading UTF-8 byte-order mark removed
    std::string error;               // when there is no text: "is a folder, not a file", ...
};

TextFileRead readTextFile(const std::string &path, std::size_t maxBytes);

// The error a loader reports for a file readTextFile refused, on the field "file".
FieldError unreadableFileError(const std::string &path, const std::string &reason);

} // namespace sagline
