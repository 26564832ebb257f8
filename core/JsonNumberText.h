// Scalars written as nlohmann::json's dump() writes them, for output that streams a large JSON
// array instead of building a tree of it (fit --json's per-point array: a tree of a million
// points took 1.5 GB). Byte for byte the tree's text, so a streamed document equals the dump of
// the tree it replaces (tests/core/JsonNumberTextTest.cpp checks it against dump()).
#pragma once

#include <cstdint>
#include <optional>
#include <string>

namespace sagline {

// A finite double as dump() writes it (shortest text that reads back exactly, "1.0" for whole
// numbers, "1e-05" style exponents); NaN and infinities as null, as dump() does.
void appendJsonNumber(std::string &out, double value);
// The value, or null when there is none.
void appendJsonNumber(std::string &out, const std::optional<double> &value);
void appendJsonInteger(std::string &out, std::int64_t value);
void appendJsonUnsigned(std::string &out, std::uint64_t value);
void appendJsonBool(std::string &out, bool value);

} // namespace sagline
