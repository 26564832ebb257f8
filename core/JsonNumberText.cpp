#include "JsonNumberText.h"

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
    // [charconv.to.chars]; Ryu in libstdc++), never longer than the Grisu2 digits dump() writes.
    // The layout: dump()'s own (nlohmann/detail/conversions/to_chars.hpp, format_buffer with
    // kMinExp -4 and kMaxExp 15): fixed when the point falls within 15 digits left of the first
    // digit and 4 right of it, with ".0" on whole numbers; otherwise d.ddde-XX as to_chars
    // writes it. So the text differs from the tree's only where Grisu2 gives more digits.
    char scientific[32]; // "-d.dddddddddddddddde-308" at most
    const char *const end = std::to_chars(scientific, scientific + sizeof scientific, value,
                                          std::chars_format::scientific).ptr;
    const bool negative = scientific[0] == '-';
    const char *const first = scientific + (negative ? 1 : 0); // the first digit
    const char *e = end - 1;
    while (*e != 'e')
        --e;
    int exponent = 0;
    for (const char *p = e + 2; p < end; ++p)
        exponent = exponent * 10 + (*p - '0');
    if (e[1] == '-')
        exponent = -exponent;
    const int point = exponent + 1; // digits before the decimal point
    if (point > std::numeric_limits<double>::digits10 || point <= -4) {
        out.append(scientific, static_cast<std::size_t>(end - scientific));
        return;
    }
    const int digits = e - first == 1 ? 1 : static_cast<int>(e - first) - 1;
    const char *const rest = first + 2; // the digits after the first, when there are any
    char text[40];
    char *o = text;
    if (negative)
        *o++ = '-';
    const auto copy = [&o](const char *from, int count) {
        std::memcpy(o, from, static_cast<std::size_t>(count));
        o += count;
    };
    const auto zeros = [&o](int count) {
        std::memset(o, '0', static_cast<std::size_t>(count));
        o += count;
    };
    if (digits <= point) { // ddd000.0
        *o++ = *first;
        copy(rest, digits - 1);
        zeros(point - digits);
        copy(".0", 2);
    } else if (point > 0) { // dd.ddd
        *o++ = *first;
        copy(rest, point - 1);
        *o++ = '.';
        copy(rest + point - 1, digits - point);
    } else { // 0.000ddd
        copy("0.", 2);
        zeros(-point);
        *o++ = *first;
        copy(rest, digits - 1);
    }
    out.append(text, static_cast<std::size_t>(o - text));
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
