#include "NumberFormat.h"

#include <array>
#include <cmath>
#include <cstdio>
#include <utility>

namespace sagline {

std::string formatSignificant(double value, int digits)
{
    if (!std::isfinite(value))
        return "n/a";
    if (value == 0.0)
        return "0";
    const int magnitude = static_cast<int>(std::floor(std::log10(std::fabs(value))));
    int decimals = digits - 1 - magnitude;
    if (decimals < 0)
        decimals = 0;
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
    // Rounding can carry into a new digit (9.9996 -> "10.000"); drop the extra decimal.
    std::string text = buffer;
    const double rounded = std::atof(buffer);
    if (rounded != 0.0 && static_cast<int>(std::floor(std::log10(std::fabs(rounded)))) > magnitude && decimals > 0) {
        std::snprintf(buffer, sizeof buffer, "%.*f", decimals - 1, value);
        text = buffer;
    }
    if (text == "-0" || text.find_first_not_of("-0.") == std::string::npos)
        text = text[0] == '-' ? text.substr(1) : text;
    return text;
}

std::string formatQuantity(double value, const std::string &unit, int digits)
{
    if (!std::isfinite(value))
        return "n/a " + unit;
    static constexpr std::array<std::pair<double, const char *>, 7> prefixes{{
        {1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1.0, ""}, {1e-3, "m"}, {1e-6, "\xC2\xB5"}, {1e-9, "n"},
    }};
    const double magnitude = std::fabs(value);
    if (magnitude == 0.0 || unit == "%" || unit.empty() || unit == "\xC2\xB0" "C")
        return formatSignificant(value, digits) + (unit.empty() ? "" : " " + unit);
    for (const auto &[factor, prefix] : prefixes) {
        // Round first so 0.99996 A shows as "1.000 A", not "1000 mA".
        const double scaled = std::stod(formatSignificant(magnitude / factor, digits));
        if (scaled >= 1.0 || factor == 1e-9)
            return formatSignificant(value / factor, digits) + " " + prefix + unit;
    }
    return formatSignificant(value, digits) + " " + unit;
}

std::string formatFixed(double value, int decimals)
{
    if (!std::isfinite(value))
        return "n/a";
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
    std::string text = buffer;
    if (text.find_first_not_of("-0.") == std::string::npos && text[0] == '-')
        text.erase(0, 1); // no "-0.00"
    return text;
}

} // namespace sagline
