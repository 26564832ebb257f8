// Scalars written in the layout nlohmann::json's dump() uses, for output that streams a large
// JSON array instead of building a tree of it (fit --json's per-point array: a tree of a million
// points took 1.5 GB). Integers and booleans are the tree's text byte for byte; a double is the
// shortest text that reads back to it, which is dump()'s text except where dump()'s Grisu2 gives
// more digits than needed (tests/core/JsonNumberTextTest.cpp checks both against dump()).
#pragma once

#include <cstdint>
#include <optional>
#include <string>

namespace sagline {

// A finite double as the shortest text that reads back to it exactly, laid out as dump() lays
// it out ("1.0" for whole numbers, fixed from 1e-4 to 1e15, "1e-05" style beyond); NaN and
// infinities as null, as dump() does.
void appendJsonNumber(std::string &out, double value);
// The value, or null when there is none.
void appendJsonNumber(std::string &out, const std::optional<double> &value);
void appendJsonInteger(std::string &out, std::int64_t value);
void appendJsonUnsigned(std::string &out, std::uint64_t value);
void appendJsonBool(std::string &out, bool value);

} // namespace sagline
