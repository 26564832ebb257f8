#include "CsvField.h"

#include <charconv>

namespace sagline {

namespace {

bool isPlainNumber(const std::string &text)
{
    double value = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
    return !text.empty() && error == std::errc() && end == text.data() + text.size();
}

bool startsLikeAFormula(const std::string &text)
{
    if (text.empty())
        return false;
    const char first = text.front();
    return (first == '=' || first == '+' || first == '-' || first == '@' || first == '\t' || first == '\r')
           && !isPlainNumber(text);
}

} // namespace

std::string csvField(const std::string &text)
{
    const bool formula = startsLikeAFormula(text);
    if (!formula && text.find_first_of(",\"\r\n") == std::string::npos)
        return text;
    std::string quoted = formula ? "\"'" : "\"";
    for (char c : text) {
        if (c == '"')
            quoted += '"';
        quoted += c;
    }
    return quoted + "\"";
}

} // namespace sagline
