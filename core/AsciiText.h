// Small ASCII text helpers for the parsers of instrument replies, CSV and units. SCPI
// (IEEE 488.2) headers and mnemonics are ASCII and case-insensitive, so no locale is involved.
#pragma once

#include <string_view>

namespace sagline {

// `s` without leading and trailing spaces, tabs, carriage returns and line feeds.
std::string_view trimSpace(std::string_view s);

// 'a'..'z' to 'A'..'Z'; every other byte unchanged.
char toUpperAscii(char c);

// Equal but for the case of ASCII letters.
bool equalsNoCase(std::string_view a, std::string_view b);

} // namespace sagline
