#include "UncertaintyFormat.h"

#include "NumberFormat.h"
#include "UncertaintyBudget.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace sagline {

namespace {

struct Prefix {
    double factor;
    const char *symbol;
};

// The SI prefix that puts `magnitude` in [1, 1000); none for dimensionless or percent units.
Prefix prefixFor(double magnitude, const std::string &unit)
{
    static constexpr Prefix prefixes[] = {{1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1.0, ""},
                                          {1e-3, "m"}, {1e-6, "µ"}, {1e-9, "n"}};
    if (unit.empty() || unit == "%" || !(magnitude > 0.0) || !std::isfinite(magnitude))
        return {1.0, ""};
    for (const auto &p : prefixes)
        if (magnitude >= p.factor)
            return p;
    return prefixes[std::size(prefixes) - 1];
}

std::string fixed(double value, int decimals)
{
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
    std::string text = buffer;
    if (text.find_first_not_of("-0.") == std::string::npos && text.front() == '-')
        text.erase(0, 1); // no "-0.00"
    return text;
}

} // namespace

std::string formatWithUncertainty(double value, double uncertainty, const std::string &unit)
{
    const std::string space = unit.empty() ? "" : " ";
    if (!std::isfinite(value))
        return "n/a";
    if (!std::isfinite(uncertainty) || !(uncertainty > 0.0))
        return formatQuantity(value, unit, 4);
    const Prefix p = prefixFor(std::max(std::fabs(value), uncertainty), unit);
    const double v = value / p.factor;
    const double u = uncertainty / p.factor;
    // Two significant digits of u decide the decimal place.
    const int decimals = std::clamp(1 - static_cast<int>(std::floor(std::log10(u))), 0, 12);
    const std::string symbol = std::string(p.symbol) + unit;
    return fixed(v, decimals) + space + symbol + " ± " + fixed(u, decimals) + space + symbol;
}

std::string formatWithCoverage(double value, std::optional<double> expanded, std::optional<double> k,
                               const std::string &unit)
{
    const std::string text = formatWithUncertainty(value, expanded.value_or(0.0), unit);
    if (!expanded || !(*expanded > 0.0) || !k || !std::isfinite(*k) || !std::isfinite(value))
        return text;
    return text + " (" + coverageFactorText(*k) + ")";
}

} // namespace sagline
