// Matching SCPI command headers the way instruments do: long or short form of each keyword
// (the short form is the keyword's capital letters, "MEASure" -> "MEAS"), any letter case,
// optional nodes in brackets ("SYSTem:ERRor[:NEXT]?"), an optional leading ':'. Used by the
// virtual bench to understand the commands the meters are sent. Pure C++, no Qt.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace sagline {

struct ScpiCommandUnit {
    std::string header;     // e.g. "MEAS:VOLT:AC?" or "*IDN?" as sent (trimmed)
    std::string parameters; // the text after the header (trimmed), e.g. "82.5" or "ON"
};

// Splits one program message ("MEAS:VOLT:AC?;:MEAS:CURR:AC?") into its units at ';' outside
// quotes. A unit starting with ':' restarts at the root; one without it is kept as sent
// (this matcher has no notion of the current subsystem path).
std::vector<ScpiCommandUnit> splitScpiMessage(std::string_view message);

// True when `header` is a spelling of `pattern`. A trailing '?' must match on both sides.
bool scpiHeaderMatches(std::string_view pattern, std::string_view header);

} // namespace sagline
