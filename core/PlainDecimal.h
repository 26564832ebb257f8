// The quick reading of a plain decimal number ("19.607495", "-0.000854", "230"): at most 15
// digits and no exponent, so the digits form an integer below 2^53 and the power of ten is
// exact, and one correctly rounded division gives the nearest double, the same double
// std::from_chars gives (Clinger, "How to read floating point numbers accurately", PLDI 1990,
// the exact-operand case (from memory)). A million-row CSV holds millions of such cells.
#pragma once

#include <optional>
#include <string_view>

namespace sagline {

// The value of [-]digits[.digits] with 1 to 15 digits in all; nothing for any other text
// (exponents, a '+', more digits, "1." or ".5"), which the full reader then takes.
std::optional<double> readPlainDecimal(std::string_view text);

} // namespace sagline
