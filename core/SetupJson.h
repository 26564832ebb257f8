// Reads and writes the setup file of DESIGN.md (JSON). Numbers are SI base units; a string
// with a unit ("130 mA", "13,8 V", "1.5 kΩ") is accepted wherever a number is.
#pragma once

#include "FieldError.h"
#include "Setup.h"

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace sagline {

// The longest design name a setup may carry ("design": "PT-60 rev B"), in bytes of UTF-8.
inline constexpr std::size_t maxDesignNameBytes = 80;

// A fuse's rating, wherever it is given (setup or lab sheet): below 10 mA no catalogue fuse
// protects a mains transformer (common practice), above 100 A it is not a small transformer's.
inline constexpr double minFuseRatingA = 0.01;
inline constexpr double maxFuseRatingA = 100.0;

struct SetupParse {
    std::optional<Setup> setup;            // set when errors is empty
    FieldErrors errors;                    // every invalid field, each naming the field and the rule
    std::vector<std::string> defaultsUsed; // setup-file names of fields that took their default
};

SetupParse parseSetupJson(std::string_view text);
// Reads the file; an unreadable file is an error on the field "file".
SetupParse loadSetupFile(const std::string &path);
// Canonical JSON of a setup (all fields present, SI numbers), for storing in a session.
std::string setupToJson(const Setup &setup);

} // namespace sagline
