#include "ScpiResponse.h"

#include "AsciiText.h"

#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <system_error>

namespace sagline {

namespace {

bool isDigit(char c)
{
    return c >= '0' && c <= '9';
}

ScpiNumber invalid(std::string error)
{
    ScpiNumber n;
    n.error = std::move(error);
    return n;
}

ScpiNumber classify(double value)
{
    ScpiNumber n;
    if (!std::isfinite(value) || std::fabs(value) >= 9.89e37) {
        // 9.91E37 (NAN) is told apart from 9.9E37 (INF) by a tolerance half-way between them.
        n.kind = (value > 9.905e37 && value < 9.915e37) ? ScpiNumberKind::NotANumber : ScpiNumberKind::Overload;
        return n;
    }
    n.kind = ScpiNumberKind::Value;
    n.value = value;
    return n;
}

// IEEE 488.2 non-decimal numeric: #H (hex), #Q (octal), #B (binary) unsigned integers.
ScpiNumber parseNonDecimal(std::string_view s)
{
    if (s.size() < 3)
        return invalid("a '#' number needs a base letter (H, Q or B) and digits");
    int base = 0;
    switch (toUpperAscii(s[1])) {
    case 'H': base = 16; break;
    case 'Q': base = 8; break;
    case 'B': base = 2; break;
    default: return invalid("a '#' number needs the base letter H, Q or B");
    }
    unsigned long long value = 0;
    const char *first = s.data() + 2;
    const char *last = s.data() + s.size();
    auto [ptr, ec] = std::from_chars(first, last, value, base);
    if (ec != std::errc() || ptr != last)
        return invalid("not a valid base-" + std::to_string(base) + " integer");
    return classify(static_cast<double>(value));
}

// Unit suffixes some meters append to readings.
constexpr std::array<std::string_view, 10> unitSuffixes{"V", "A", "VAC", "VDC", "AAC", "ADC", "VRMS", "ARMS", "OHM", "W"};

} // namespace

ScpiNumber parseScpiNumber(std::string_view text)
{
    std::string_view s = trimSpace(text);
    if (s.empty())
        return invalid("empty reply where a number was expected");
    if (s.front() == '#')
        return parseNonDecimal(s);

    for (auto [word, value] : std::array<std::pair<std::string_view, double>, 5>{{
             {"INF", scpiOverloadValue},
             {"+INF", scpiOverloadValue},
             {"NINF", -scpiOverloadValue},
             {"-INF", -scpiOverloadValue},
             {"NAN", scpiNotANumberValue},
         }}) {
        if (equalsNoCase(s, word))
            return classify(value);
    }

    // Grammar check first (from_chars alone would accept "inf", hex floats and such).
    std::size_t i = 0;
    bool negative = false;
    if (s[i] == '+' || s[i] == '-') {
        negative = s[i] == '-';
        ++i;
    }
    const std::size_t mantissaStart = i;
    std::size_t digits = 0;
    while (i < s.size() && isDigit(s[i])) {
        ++i;
        ++digits;
    }
    if (i < s.size() && s[i] == '.') {
        ++i;
        while (i < s.size() && isDigit(s[i])) {
            ++i;
            ++digits;
        }
    }
    if (digits == 0)
        return invalid("not a number");
    if (i < s.size() && (s[i] == 'E' || s[i] == 'e')) {
        std::size_t j = i + 1;
        if (j < s.size() && (s[j] == '+' || s[j] == '-'))
            ++j;
        std::size_t expDigits = 0;
        while (j < s.size() && isDigit(s[j])) {
            ++j;
            ++expDigits;
        }
        if (expDigits == 0)
            return invalid("the exponent after 'E' has no digits");
        i = j;
    }
    const std::string_view number = s.substr(mantissaStart, i - mantissaStart);
    std::string_view rest = trimSpace(s.substr(i));
    if (!rest.empty()) {
        bool known = false;
        for (auto suffix : unitSuffixes)
            known = known || equalsNoCase(rest, suffix);
        if (!known) {
            if (rest.front() == ',' || rest.front() == ';')
                return invalid("more than one value in the reply where one number was expected");
            return invalid("unexpected text after the number");
        }
    }

    double value = 0.0;
    auto [ptr, ec] = std::from_chars(number.data(), number.data() + number.size(), value);
    if (ptr != number.data() + number.size())
        return invalid("not a number");
    if (ec == std::errc::result_out_of_range) {
        // Too large for a double is an overload; too small is zero for any meter.
        bool large = false;
        for (std::size_t k = 0; k < number.size(); ++k) {
            if ((number[k] == 'E' || number[k] == 'e') && k + 1 < number.size())
                large = number[k + 1] != '-';
        }
        if (large)
            return classify(negative ? -HUGE_VAL : HUGE_VAL);
        value = 0.0;
    } else if (ec != std::errc()) {
        return invalid("not a number");
    }
    return classify(negative ? -value : value);
}

std::string ScpiIdentity::text() const
{
    return manufacturer + "," + model + "," + serialNumber + "," + firmwareVersion;
}

ScpiIdentity parseScpiIdentity(std::string_view text)
{
    ScpiIdentity id;
    std::string_view s = trimSpace(text);
    std::array<std::string_view, 4> fields{};
    std::size_t count = 0;
    std::size_t start = 0;
    for (std::size_t i = 0; i <= s.size(); ++i) {
        if (i == s.size() || s[i] == ',') {
            if (count < fields.size())
                fields[count] = trimSpace(s.substr(start, i - start));
            ++count;
            start = i + 1;
        }
    }
    if (s.empty() || count != 4) {
        id.error = "an *IDN? reply has four comma-separated fields (manufacturer, model, serial number, firmware), got "
                   + std::to_string(s.empty() ? 0 : count);
        return id;
    }
    if (fields[0].empty() || fields[1].empty()) {
        id.error = "an *IDN? reply needs a manufacturer and a model";
        return id;
    }
    id.ok = true;
    id.manufacturer = fields[0];
    id.model = fields[1];
    id.serialNumber = fields[2].empty() ? "0" : std::string(fields[2]);
    id.firmwareVersion = fields[3].empty() ? "0" : std::string(fields[3]);
    return id;
}

ScpiError parseScpiError(std::string_view text)
{
    ScpiError e;
    std::string_view s = trimSpace(text);
    std::size_t i = 0;
    bool negative = false;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) {
        negative = s[i] == '-';
        ++i;
    }
    const std::size_t digitsStart = i;
    while (i < s.size() && isDigit(s[i]))
        ++i;
    if (i == digitsStart) {
        e.error = "an error-queue reply starts with an integer code";
        return e;
    }
    int code = 0;
    auto [ptr, ec] = std::from_chars(s.data() + digitsStart, s.data() + i, code);
    if (ec != std::errc() || ptr != s.data() + i) {
        e.error = "the error code is out of range";
        return e;
    }
    std::string_view rest = trimSpace(s.substr(i));
    if (!rest.empty() && rest.front() != ',') {
        e.error = "the error code must be followed by ',' and the text";
        return e;
    }
    if (!rest.empty())
        rest = trimSpace(rest.substr(1));
    std::string message;
    if (!rest.empty() && rest.front() == '"') {
        std::size_t k = 1;
        bool closed = false;
        while (k < rest.size()) {
            if (rest[k] == '"') {
                if (k + 1 < rest.size() && rest[k + 1] == '"') { // "" is a quote inside the text
                    message += '"';
                    k += 2;
                    continue;
                }
                closed = true;
                break;
            }
            message += rest[k++];
        }
        if (!closed) {
            e.error = "the error text has no closing quote";
            return e;
        }
    } else {
        message = std::string(rest);
    }
    e.ok = true;
    e.code = negative ? -code : code;
    e.message = std::move(message);
    return e;
}

std::string printableReply(std::string_view raw, std::size_t maxLength)
{
    std::string out;
    for (std::size_t i = 0; i < raw.size(); ++i) {
        if (out.size() >= maxLength) {
            out += "...";
            break;
        }
        const auto c = static_cast<unsigned char>(raw[i]);
        if (c >= 0x20 && c < 0x7f) {
            out += static_cast<char>(c);
        } else {
            char buffer[8];
            std::snprintf(buffer, sizeof buffer, "\\x%02X", static_cast<unsigned>(c));
            out += buffer;
        }
    }
    return out;
}

} // namespace sagline
