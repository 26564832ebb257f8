#include "Units.h"

#include "AsciiText.h"
#include "CsvNumber.h"

#include <array>
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <utility>

namespace sagline {

std::string unitSymbol(Unit unit)
{
    switch (unit) {
    case Unit::Volt: return "V";
    case Unit::Ampere: return "A";
    case Unit::VoltAmpere: return "VA";
    case Unit::Watt: return "W";
    case Unit::Ohm: return "Ω";
    case Unit::Hertz: return "Hz";
    case Unit::Percent: return "%";
    case Unit::Second: return "s";
    case Unit::Celsius: return "°C";
    case Unit::None: return "";
    }
    return "";
}

std::string unitQuantityName(Unit unit)
{
    switch (unit) {
    case Unit::Volt: return "a voltage";
    case Unit::Ampere: return "a current";
    case Unit::VoltAmpere: return "an apparent power";
    case Unit::Watt: return "a power";
    case Unit::Ohm: return "a resistance";
    case Unit::Hertz: return "a frequency";
    case Unit::Percent: return "a percentage";
    case Unit::Second: return "a time";
    case Unit::Celsius: return "a temperature";
    case Unit::None: return "a plain number";
    }
    return "a number";
}

namespace {

std::string_view trim(std::string_view s)
{
    s = trimSpace(s);
    // A no-break space (U+00A0, UTF-8 C2 A0) between number and unit is common in pasted text.
    while (s.size() >= 2 && static_cast<unsigned char>(s[0]) == 0xC2 && static_cast<unsigned char>(s[1]) == 0xA0)
        s.remove_prefix(2);
    while (s.size() >= 2 && static_cast<unsigned char>(s[s.size() - 2]) == 0xC2
           && static_cast<unsigned char>(s.back()) == 0xA0)
        s.remove_suffix(2);
    return s;
}

struct UnitSpelling {
    std::string_view text;
    Unit unit;
};

// Longest spellings first so "VA" is not read as "V" plus junk and "ohm" before "m".
constexpr std::array<UnitSpelling, 13> unitSpellings{{
    // "\xCE\xA9" is the Greek capital omega (U+03A9), "\xE2\x84\xA6" the ohm sign (U+2126).
    {"ohms", Unit::Ohm},    {"ohm", Unit::Ohm},        {"\xCE\xA9", Unit::Ohm}, {"\xE2\x84\xA6", Unit::Ohm},
    {"\xC2\xB0" "C", Unit::Celsius}, {"VA", Unit::VoltAmpere}, {"Hz", Unit::Hertz},   {"V", Unit::Volt},
    {"A", Unit::Ampere},    {"W", Unit::Watt},         {"%", Unit::Percent}, {"s", Unit::Second},
    {"C", Unit::Celsius},
}};

struct PrefixSpelling {
    std::string_view text;
    double factor;
};

constexpr std::array<PrefixSpelling, 8> prefixSpellings{{
    // micro sign (U+00B5), Greek mu (U+03BC), and the ASCII stand-in.
    {"\xC2\xB5", 1e-6}, {"\xCE\xBC", 1e-6}, {"u", 1e-6}, {"n", 1e-9}, {"p", 1e-12}, {"m", 1e-3}, {"k", 1e3}, {"M", 1e6},
}};

bool endsWith(std::string_view s, std::string_view suffix)
{
    return s.size() >= suffix.size() && s.substr(s.size() - suffix.size()) == suffix;
}

QuantityParse failure(std::string message)
{
    QuantityParse result;
    result.error = std::move(message);
    return result;
}

} // namespace

QuantityParse parseQuantity(std::string_view text, Unit expected)
{
    std::string_view s = trim(text);
    if (s.empty())
        return failure("is empty; expected " + unitQuantityName(expected));

    // Split the trailing unit (and prefix) from the number.
    Unit found = Unit::None;
    double factor = 1.0;
    for (const auto &spelling : unitSpellings) {
        if (endsWith(s, spelling.text)) {
            found = spelling.unit;
            s.remove_suffix(spelling.text.size());
            break;
        }
    }
    if (found != Unit::None && found != Unit::Percent && found != Unit::Celsius) {
        for (const auto &prefix : prefixSpellings) {
            if (endsWith(s, prefix.text)) {
                std::string_view before = s.substr(0, s.size() - prefix.text.size());
                std::string_view trimmedBefore = trim(before);
                // A prefix sits right after a digit or separator-free number: "130m", "130 m".
                if (!trimmedBefore.empty()) {
                    factor = prefix.factor;
                    s = before;
                }
                break;
            }
        }
    }
    s = trim(s);
    if (s.empty())
        return failure("has a unit but no number; expected " + unitQuantityName(expected));

    std::string number(s);
    const bool hasComma = number.find(',') != std::string::npos;
    const bool hasDot = number.find('.') != std::string::npos;
    if (hasComma && hasDot)
        return failure("'" + std::string(text) + "' mixes ',' and '.'; use one decimal separator and no thousands separator");
    if (hasComma) {
        if (number.find(',') != number.rfind(','))
            return failure("'" + std::string(text) + "' has more than one ','");
        // "1,250" may be a thousands separator or a decimal comma: never guessed (core/CsvNumber.h).
        if (markEvidence(number) == MarkEvidence::Ambiguous)
            return failure("'" + std::string(text) + "' could have a thousands separator or a decimal comma; write it "
                           "without a thousands separator, with '.' or ',' as the decimal mark (such as 1250 or 1.25)");
        number[number.find(',')] = '.';
    }
    for (char c : number) {
        const bool allowed = (c >= '0' && c <= '9') || c == '.' || c == '-' || c == '+' || c == 'e' || c == 'E';
        if (!allowed)
            return failure("'" + std::string(text) + "' is not a number with a unit; expected " + unitQuantityName(expected)
                           + " such as 12.5 " + unitSymbol(expected));
    }
    errno = 0;
    char *end = nullptr;
    const double parsed = std::strtod(number.c_str(), &end);
    if (end == number.c_str() || *end != '\0')
        return failure("'" + std::string(text) + "' is not a number; expected " + unitQuantityName(expected));
    if (errno == ERANGE || !std::isfinite(parsed))
        return failure("'" + std::string(text) + "' is out of range; it must be a finite number");

    if (found != Unit::None && found != expected) {
        // "C" alone is ambiguous with nothing else we accept, but "s" after a number might be seconds.
        return failure("'" + std::string(text) + "' is " + unitQuantityName(found) + " (" + unitSymbol(found)
                       + "), but " + unitQuantityName(expected) + " in " + unitSymbol(expected) + " belongs here");
    }
    const double value = parsed * factor;
    if (!std::isfinite(value))
        return failure("'" + std::string(text) + "' is out of range; it must be a finite number");
    QuantityParse result;
    result.ok = true;
    result.value = value;
    return result;
}

} // namespace sagline
