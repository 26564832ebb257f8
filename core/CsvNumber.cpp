#include "CsvNumber.h"

#include "AsciiText.h"

#include <algorithm>
#include <charconv>
#include <cmath>

namespace sagline {

namespace {

bool allDigits(std::string_view s)
{
    return std::all_of(s.begin(), s.end(), [](char c) { return c >= '0' && c <= '9'; });
}

std::string_view withoutSign(std::string_view s)
{
    if (!s.empty() && (s.front() == '+' || s.front() == '-'))
        s.remove_prefix(1);
    return s;
}

std::optional<double> fromChars(std::string_view text)
{
    if (!text.empty() && text.front() == '+')
        text.remove_prefix(1);
    if (text.empty() || text.front() == '+')
        return std::nullopt;
    double value = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

constexpr std::string_view notThousands = "thousands separators are not accepted";

} // namespace

char toChar(DecimalMark mark)
{
    return mark == DecimalMark::Comma ? ',' : '.';
}

MarkEvidence markEvidence(std::string_view cell)
{
    const std::string_view s = withoutSign(cell);
    const auto commas = std::count(s.begin(), s.end(), ',');
    const auto points = std::count(s.begin(), s.end(), '.');
    if (commas + points == 0)
        return MarkEvidence::None;
    if (commas + points > 1)
        return MarkEvidence::Grouped;
    const std::size_t at = s.find_first_of(",.");
    const std::string_view before = s.substr(0, at);
    const std::string_view after = s.substr(at + 1);
    // A thousands group: 1 to 3 leading digits (not starting with 0), then exactly 3 digits.
    if (!before.empty() && before.size() <= 3 && before.front() != '0' && allDigits(before) && after.size() == 3
        && allDigits(after))
        return MarkEvidence::Ambiguous;
    return commas ? MarkEvidence::Comma : MarkEvidence::Point;
}

DecimalMarkStatement parseDecimalMarkComment(std::string_view line)
{
    DecimalMarkStatement statement;
    line = trimSpace(line);
    if (line.empty() || line.front() != '#')
        return statement;
    line = trimSpace(line.substr(1));
    constexpr std::string_view key = "decimal_mark";
    if (line.substr(0, key.size()) != key)
        return statement;
    line = trimSpace(line.substr(key.size()));
    if (line.empty() || (line.front() != ':' && line.front() != '='))
        return statement;
    statement.isStatement = true;
    std::string_view value = trimSpace(line.substr(1));
    // A spreadsheet may pad the comment line with empty cells: "# decimal_mark: ,;;".
    while (!value.empty() && (value.back() == ';' || value.back() == '\t' || value.back() == ' '))
        value.remove_suffix(1);
    if (value.size() >= 2 && (value.front() == '"' || value.front() == '\'') && value.back() == value.front())
        value = value.substr(1, value.size() - 2);
    if (value == "," || value == "comma")
        statement.mark = DecimalMark::Comma;
    else if (value == "." || value == "point")
        statement.mark = DecimalMark::Point;
    else
        statement.problem = "the decimal mark must be ',' or '.', got '" + std::string(value) + "'";
    return statement;
}

std::optional<double> parseCsvNumber(std::string_view cell, DecimalMark mark, std::string &problem)
{
    if (mark == DecimalMark::Point) {
        if (const auto value = fromChars(cell))
            return value;
        problem = cell.find(',') != std::string_view::npos
                      ? "has a ',' (a thousands separator or a decimal comma?): this file's decimal mark is '.' and "
                            + std::string(notThousands)
                      : "is not a finite number (decimal mark '.', SI units)";
        return std::nullopt;
    }
    if (cell.find('.') != std::string_view::npos) {
        problem = "has a '.': this file's decimal mark is ',' and " + std::string(notThousands);
        return std::nullopt;
    }
    if (std::count(cell.begin(), cell.end(), ',') > 1) {
        problem = "has more than one ',': this file's decimal mark is ',' and " + std::string(notThousands);
        return std::nullopt;
    }
    std::string text(cell);
    std::replace(text.begin(), text.end(), ',', '.');
    if (const auto value = fromChars(text))
        return value;
    problem = "is not a finite number (decimal mark ',', SI units)";
    return std::nullopt;
}

} // namespace sagline
