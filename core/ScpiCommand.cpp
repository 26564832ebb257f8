#include "ScpiCommand.h"

#include "AsciiText.h"

#include <cstddef>

namespace sagline {

namespace {

struct PatternNode {
    std::string_view keyword; // e.g. "MEASure"
    bool optional = false;
};

std::vector<PatternNode> parsePattern(std::string_view pattern)
{
    // "[SOURce:]RESistance[:LEVel]" -> SOURce (optional), RESistance, LEVel (optional)
    std::vector<PatternNode> nodes;
    std::size_t i = 0;
    while (i < pattern.size()) {
        if (pattern[i] == ':') {
            ++i;
            continue;
        }
        bool optional = false;
        std::size_t end = i;
        if (pattern[i] == '[') {
            optional = true;
            ++i;
            end = pattern.find(']', i);
            if (end == std::string_view::npos)
                end = pattern.size();
        } else {
            while (end < pattern.size() && pattern[end] != ':' && pattern[end] != '[')
                ++end;
        }
        std::string_view group = pattern.substr(i, end - i);
        std::size_t start = 0;
        for (std::size_t k = 0; k <= group.size(); ++k) {
            if (k == group.size() || group[k] == ':') {
                if (k > start)
                    nodes.push_back({group.substr(start, k - start), optional});
                start = k + 1;
            }
        }
        i = (optional && end < pattern.size()) ? end + 1 : end;
    }
    return nodes;
}

bool keywordMatches(std::string_view keyword, std::string_view word)
{
    if (equalsNoCase(keyword, word))
        return true;
    std::string shortForm;
    for (char c : keyword) {
        if ((c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '*')
            shortForm += c;
    }
    return !shortForm.empty() && equalsNoCase(shortForm, word);
}

bool matchNodes(const std::vector<PatternNode> &nodes, std::size_t n, const std::vector<std::string_view> &words,
                std::size_t w)
{
    if (n == nodes.size())
        return w == words.size();
    if (w < words.size() && keywordMatches(nodes[n].keyword, words[w]) && matchNodes(nodes, n + 1, words, w + 1))
        return true;
    return nodes[n].optional && matchNodes(nodes, n + 1, words, w);
}

} // namespace

std::vector<ScpiCommandUnit> splitScpiMessage(std::string_view message)
{
    std::vector<ScpiCommandUnit> units;
    std::size_t start = 0;
    bool quoted = false;
    for (std::size_t i = 0; i <= message.size(); ++i) {
        if (i < message.size() && message[i] == '"')
            quoted = !quoted;
        if (i == message.size() || (!quoted && message[i] == ';')) {
            std::string_view unit = trimSpace(message.substr(start, i - start));
            start = i + 1;
            if (unit.empty())
                continue;
            std::size_t space = 0;
            while (space < unit.size() && unit[space] != ' ' && unit[space] != '\t')
                ++space;
            units.push_back({std::string(unit.substr(0, space)), std::string(trimSpace(unit.substr(space)))});
        }
    }
    return units;
}

bool scpiHeaderMatches(std::string_view pattern, std::string_view header)
{
    header = trimSpace(header);
    const bool patternQuery = !pattern.empty() && pattern.back() == '?';
    const bool headerQuery = !header.empty() && header.back() == '?';
    if (patternQuery != headerQuery)
        return false;
    if (patternQuery) {
        pattern.remove_suffix(1);
        header.remove_suffix(1);
    }
    if (!pattern.empty() && pattern.front() == '*')
        return equalsNoCase(pattern, header);
    if (!header.empty() && header.front() == ':')
        header.remove_prefix(1);
    std::vector<std::string_view> words;
    std::size_t start = 0;
    for (std::size_t i = 0; i <= header.size(); ++i) {
        if (i == header.size() || header[i] == ':') {
            if (i == start)
                return false; // "MEAS::VOLT" or a trailing ':'
            words.push_back(header.substr(start, i - start));
            start = i + 1;
        }
    }
    return matchNodes(parsePattern(pattern), 0, words, 0);
}

} // namespace sagline
