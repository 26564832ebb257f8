#include "PlainDecimal.h"

#include <cstdint>

namespace sagline {

namespace {

// 10^k for k = 0..15, each exactly representable (10^22 is the largest that is).
constexpr double exactPowersOfTen[] = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7,
                                       1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15};
constexpr int maxDigits = 15; // 10^15 - 1 < 2^53: every such integer is an exact double

} // namespace

std::optional<double> readPlainDecimal(std::string_view text)
{
    std::size_t at = 0;
    const bool negative = !text.empty() && text[0] == '-';
    if (negative)
        ++at;
    std::uint64_t digits = 0;
    int fractionDigits = 0;
    const auto readDigits = [&](int &counted) {
        const std::size_t start = at;
        while (at < text.size() && text[at] >= '0' && text[at] <= '9') {
            digits = digits * 10 + static_cast<std::uint64_t>(text[at] - '0');
            ++at;
            ++counted;
        }
        return at > start;
    };
    int integerDigits = 0;
    if (!readDigits(integerDigits))
        return std::nullopt;
    if (at < text.size() && text[at] == '.') {
        ++at;
        if (!readDigits(fractionDigits))
            return std::nullopt;
    }
    if (at != text.size() || integerDigits + fractionDigits > maxDigits)
        return std::nullopt;
    // Both operands exact: the one rounding of the division is the correct rounding.
    const double value = static_cast<double>(digits) / exactPowersOfTen[fractionDigits];
    return negative ? -value : value;
}

} // namespace sagline
