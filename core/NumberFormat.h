// Numbers for people: a sensible count of significant digits, with the unit and SI prefix.
#pragma once

#include <string>

namespace sagline {

// `value` rounded to `digits` significant digits in plain decimal notation ("2.083",
// "0.4167", "1152", "-0.05"). Non-finite values print as "n/a".
std::string formatSignificant(double value, int digits = 4);

// `value` (SI units) with an SI prefix chosen so the mantissa lies in [1, 1000), then the
// unit: formatQuantity(0.145, "A") == "145 mA", formatQuantity(1250, "Ω", 3) == "1.25 kΩ".
std::string formatQuantity(double value, const std::string &unit, int digits = 4);

// `value` with a fixed count of decimals ("12.50"), for aligned table columns.
std::string formatFixed(double value, int decimals);

} // namespace sagline
