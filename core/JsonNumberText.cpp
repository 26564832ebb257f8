#include "JsonNumberText.h"

#include <nlohmann/json.hpp>

#include <charconv>
#include <cmath>

namespace sagline {

void appendJsonNumber(std::string &out, double value)
{
    if (!std::isfinite(value)) {
        out += "null";
        return;
    }
    // The formatter dump() itself calls for a double (nlohmann/detail/conversions/to_chars.hpp,
    // Grisu2 with a ".0" for whole numbers), so the text cannot drift from the tree's.
    char buffer[64];
    char *end = nlohmann::detail::to_chars(buffer, buffer + sizeof buffer, value);
    out.append(buffer, end);
}

void appendJsonNumber(std::string &out, const std::optional<double> &value)
{
    if (value)
        appendJsonNumber(out, *value);
    else
        out += "null";
}

void appendJsonInteger(std::string &out, std::int64_t value)
{
    char buffer[24];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
    out.append(buffer, result.ptr);
}

void appendJsonUnsigned(std::string &out, std::uint64_t value)
{
    char buffer[24];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
    out.append(buffer, result.ptr);
}

void appendJsonBool(std::string &out, bool value)
{
    out += value ? "true" : "false";
}

} // namespace sagline
