// Physical quantities typed by people: "130 mA", "13,8 V", "1.5 kΩ", "0.13".
#pragma once

#include <string>
#include <string_view>

namespace sagline {

enum class Unit { Volt, Ampere, VoltAmpere, Watt, Ohm, Hertz, Percent, Second, Celsius, None };

// The unit's symbol as shown to users ("V", "A", "VA", "W", "Ω", "Hz", "%", "s", "°C", "").
std::string unitSymbol(Unit unit);
// A plain name for messages: "a voltage", "a current", ...
std::string unitQuantityName(Unit unit);

struct QuantityParse {
    bool ok = false;
    double value = 0.0; // in SI base units (A, V, Ω...), never NaN or infinite when ok
    std::string error;  // the rule the text broke, without the field name
};

// Parses a number with an optional SI prefix and unit. Accepts a space or none between
// number and unit, '.' or ',' as the decimal separator (not both), prefixes p n µ/u m k M G,
// units V A VA W Ω/ohm Hz % s °C. A bare number is taken as already in SI units. A unit other
// than `expected` (for example "12 A" where a voltage belongs) is an error, as are NaN and
// infinities.
QuantityParse parseQuantity(std::string_view text, Unit expected);

} // namespace sagline
