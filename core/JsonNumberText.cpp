#include "JsonNumberText.h"

#include <nlohmann/json.hpp>

#include <charconv>
#include <cmath>
#include <cstring>
#include <limits>

namespace sagline {

void appendJsonNumber(std::string &out, double value)
{
    if (!std::isfinite(value)) {
        out += "null";
        return;
    }
    // The digits: std::to_chars' shortest text that reads back to the same double (C++17
    // [charconv.to.chars]; Ryu in libstdc++), about twice as fast as the Grisu2 dump() runs and
    // never longer. The layout: dump()'s own (nlohmann/detail/conversions/to_chars.hpp,
    // format_buffer: fixed from 1e-4 up to 1e15, "1.0" for whole numbers, "1e-05" beyond), so
    // the text differs from the tree's only where Grisu2 gives more digits than needed.
    char scientific[32];
    const auto written = std::to_chars(scientific, scientific + sizeof scientific, value, std::chars_format::scientific);
    // "-d.ddde+XX": sign, digits around the point, exponent.
    const char *p = scientific;
    char buffer[64];
    char *digits = buffer;
    if (*p == '-') {
        *digits++ = '-';
        ++p;
    }
    if (value == 0.0) {
        std::memcpy(digits, "0.0", 3);
        out.append(buffer, digits + 3);
        return;
    }
    int length = 0;
    for (; *p != 'e'; ++p)
        if (*p != '.')
            digits[length++] = *p;
    int exponent = 0;
    std::from_chars(p + (p[1] == '+' ? 2 : 1), written.ptr, exponent);
    constexpr int minExponent = -4; // dump()'s kMinExp and kMaxExp for a double
    constexpr int maxExponent = std::numeric_limits<double>::digits10;
    char *end = nlohmann::detail::dtoa_impl::format_buffer(digits, length, exponent - (length - 1), minExponent, maxExponent);
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
