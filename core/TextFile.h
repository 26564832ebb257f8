// Reading a whole text file (a setup, lab-sheet JSON or readings CSV) for a parser that takes the text.
#pragma once

#include "FieldError.h"

#include <optional>
#include <string>

namespace sagline {

// The file's bytes without a leading UTF-8 byte-order mark (Windows editors write one);
// nothing when it cannot be opened or read.
std::optional<std::string> readTextFile(const std::string &path);

// The error a loader reports for a file that readTextFile could not open.
FieldError unreadableFileError(const std::string &path);

} // namespace sagline
