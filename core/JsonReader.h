// The one reader for every JSON document the programs take in: setups and lab sheets from files,
// the setup and plan stored in a session, the machine-written records in a session's notes. A
// hostile document is refused before any tree is built: nesting deeper than a limit (a value
// nested 50 000 arrays deep once crashed every command on the stack), a key given twice in one
// object (the last would silently win), a number too large for a double, text that is not
// UTF-8. The message names where: the path of keys, or the line and column of a syntax error.
#pragma once

#include <nlohmann/json.hpp>

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace sagline {

// Deeper than any document of ours (a setup is 3 levels) by far, and shallow enough for every
// recursive walk over the tree.
inline constexpr std::size_t maxJsonDepth = 32;

struct JsonRead {
    std::optional<nlohmann::json> document;
    std::string error; // when there is no document: "key 'bench' appears twice in the top level", ...

    bool ok() const { return document.has_value(); }
};

JsonRead readJson(std::string_view text, std::size_t maxDepth = maxJsonDepth);

// A value for a message: its JSON text, cut (on a UTF-8 boundary) to about `maxBytes` with "…",
// so a megabyte-long string in a hostile file is not echoed whole.
std::string shortJson(const nlohmann::json &value, std::size_t maxBytes = 60);

} // namespace sagline
