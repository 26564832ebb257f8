#include "OutputText.h"

#include <cstdio>

namespace sagline {

namespace {

constexpr std::string_view replacement = "\xEF\xBF\xBD"; // U+FFFD

// Length of the valid UTF-8 sequence at text[i], or 0 when it is not one (RFC 3629: no
// overlong forms, no surrogates, nothing above U+10FFFF).
std::size_t sequenceLength(std::string_view text, std::size_t i)
{
    const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
    const unsigned char c = byte(i);
    if (c < 0x80)
        return 1;
    std::size_t length = 0;
    unsigned char low = 0x80, high = 0xBF;
    if (c >= 0xC2 && c <= 0xDF) {
        length = 2;
    } else if (c >= 0xE0 && c <= 0xEF) {
        length = 3;
        if (c == 0xE0)
            low = 0xA0;
        if (c == 0xED)
            high = 0x9F;
    } else if (c >= 0xF0 && c <= 0xF4) {
        length = 4;
        if (c == 0xF0)
            low = 0x90;
        if (c == 0xF4)
            high = 0x8F;
    } else {
        return 0;
    }
    if (i + length > text.size())
        return 0;
    if (byte(i + 1) < low || byte(i + 1) > high)
        return 0;
    for (std::size_t k = 2; k < length; ++k) {
        if (byte(i + k) < 0x80 || byte(i + k) > 0xBF)
            return 0;
    }
    return length;
}

} // namespace

std::string validUtf8(std::string_view text)
{
    std::string out;
    out.reserve(text.size());
    for (std::size_t i = 0; i < text.size();) {
        const std::size_t length = sequenceLength(text, i);
        if (length == 0) {
            out += replacement;
            ++i;
        } else {
            out.append(text, i, length);
            i += length;
        }
    }
    return out;
}

std::string printableText(std::string_view text, std::size_t maxBytes)
{
    std::string out;
    for (std::size_t i = 0; i < text.size();) {
        if (out.size() >= maxBytes) {
            out += "…";
            break;
        }
        const std::size_t length = sequenceLength(text, i);
        if (length == 0) {
            out += replacement;
            ++i;
            continue;
        }
        const auto c = static_cast<unsigned char>(text[i]);
        // C1 controls are U+0080..U+009F: 0xC2 0x80..0x9F in UTF-8.
        const bool c1 = length == 2 && c == 0xC2 && static_cast<unsigned char>(text[i + 1]) <= 0x9F;
        if (c < 0x20 || c == 0x7F || c1) {
            const unsigned code = c1 ? static_cast<unsigned char>(text[i + 1]) : c;
            if (code == '\t')
                out += "\\t";
            else if (code == '\n')
                out += "\\n";
            else if (code == '\r')
                out += "\\r";
            else {
                char escaped[8];
                std::snprintf(escaped, sizeof escaped, "\\x%02X", code);
                out += escaped;
            }
        } else {
            out.append(text, i, length);
        }
        i += length;
    }
    return out;
}

std::string jsonText(const nlohmann::json &value, int indent)
{
    return value.dump(indent, ' ', false, nlohmann::json::error_handler_t::replace);
}

std::string jsonQuoted(std::string_view text)
{
    return jsonText(nlohmann::json(validUtf8(text)));
}

std::string printableKey(std::string_view key)
{
    return key.empty() ? std::string("\"\"") : printableText(key, 60);
}

} // namespace sagline
