// Text from files, sessions and instruments on its way out (a terminal, a message, a JSON
// document): always valid UTF-8 (a byte that is not becomes U+FFFD), control characters shown
// as escapes and never obeyed (ESC [ ... in a setup string would recolour or rewrite a
// terminal), and long text cut on a character boundary with "…".
#pragma once

#include <nlohmann/json.hpp>

#include <cstddef>
#include <string>
#include <string_view>

namespace sagline {

// `text` with every invalid UTF-8 sequence replaced by U+FFFD; valid text unchanged.
std::string validUtf8(std::string_view text);

// For a terminal or a message: valid UTF-8, C0 and C1 control characters and DEL written as
// \t, \n, \r or \xHH, and cut to at most about `maxBytes` bytes (then "…" follows).
std::string printableText(std::string_view text, std::size_t maxBytes = std::string::npos);

// A JSON document as text that is always valid JSON: strings that are not UTF-8 are repaired
// (U+FFFD) instead of throwing, control characters escaped (\u001b).
std::string jsonText(const nlohmann::json &value, int indent = -1);

// A JSON object's key as a message names it: printable, cut, and "" when it is empty.
std::string printableKey(std::string_view key);

// One JSON string literal, quotes included (for writers that stream JSON without a tree).
std::string jsonQuoted(std::string_view text);

} // namespace sagline
