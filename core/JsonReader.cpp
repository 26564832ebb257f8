#include "JsonReader.h"

#include "OutputText.h"

#include <set>
#include <vector>

namespace sagline {

namespace {

using nlohmann::json;

// "line 3, column 14" for a byte offset.
std::string positionText(std::string_view text, std::size_t byte)
{
    std::size_t line = 1, column = 1;
    for (std::size_t i = 0; i < byte && i < text.size(); ++i) {
        if (text[i] == '\n') {
            ++line;
            column = 1;
        } else {
            ++column;
        }
    }
    return "line " + std::to_string(line) + ", column " + std::to_string(column);
}

// Walks the document as SAX events without building it: depth, duplicate keys, syntax. The
// first problem stops the walk (a handler returning false ends nlohmann's parser).
class Checker final : public nlohmann::json_sax<json> {
public:
    Checker(std::string_view text, std::size_t maxDepth) : m_text(text), m_maxDepth(maxDepth) {}

    const std::string &error() const { return m_error; }

    bool null() override { return value(); }
    bool boolean(bool) override { return value(); }
    bool number_integer(number_integer_t) override { return value(); }
    bool number_unsigned(number_unsigned_t) override { return value(); }
    bool number_float(number_float_t, const string_t &) override { return value(); }
    bool string(string_t &) override { return value(); }
    bool binary(binary_t &) override { return value(); }
    bool start_object(std::size_t) override { return open(true); }
    bool end_object() override { return close(); }
    bool start_array(std::size_t) override { return open(false); }
    bool end_array() override { return close(); }

    bool key(string_t &name) override
    {
        Frame &frame = m_frames.back();
        if (!frame.keys.insert(name).second) {
            m_error = "the key \"" + printableText(name, 60) + "\" appears twice in " + where()
                      + "; give each key once (the last one would silently win)";
            return false;
        }
        frame.current = name;
        return true;
    }

    bool parse_error(std::size_t position, const std::string &, const nlohmann::detail::exception &e) override
    {
        if (e.id == 406) // a number nlohmann cannot hold in a double (1e999)
            m_error = "has a number too large to be a finite number at " + positionText(m_text, position);
        else
            m_error = "is not valid JSON at " + positionText(m_text, position);
        return false;
    }

private:
    struct Frame {
        bool isObject = false;
        std::set<std::string> keys;
        std::string current; // the key whose value comes next
        std::size_t index = 0;
    };

    bool value()
    {
        if (!m_frames.empty() && !m_frames.back().isObject)
            ++m_frames.back().index;
        return true;
    }

    bool open(bool isObject)
    {
        if (m_frames.size() >= m_maxDepth) {
            m_error = "is nested more than " + std::to_string(m_maxDepth) + " levels deep at " + where()
                      + "; no document of ours is";
            return false;
        }
        value();
        m_frames.push_back({isObject, {}, {}, 0});
        return true;
    }

    bool close()
    {
        m_frames.pop_back();
        return true;
    }

    // "the top level", "nameplate", "bench.rheostat", "steps[3]"
    std::string where() const
    {
        std::string path;
        for (std::size_t i = 0; i + 1 < m_frames.size(); ++i) {
            const Frame &frame = m_frames[i];
            if (frame.isObject)
                path += (path.empty() ? "" : ".") + printableText(frame.current, 40);
            else
                path += "[" + std::to_string(frame.index - 1) + "]";
            if (path.size() > 200) {
                path += "…";
                break;
            }
        }
        return path.empty() ? std::string("the top level") : "\"" + path + "\"";
    }

    std::string_view m_text;
    std::size_t m_maxDepth;
    std::vector<Frame> m_frames;
    std::string m_error;
};

} // namespace

JsonRead readJson(std::string_view text, std::size_t maxDepth)
{
    JsonRead read;
    Checker checker(text, maxDepth);
    bool passed = false;
    try {
        passed = json::sax_parse(text.begin(), text.end(), &checker);
    } catch (const json::exception &e) {
        read.error = std::string("is not valid JSON: ") + e.what();
        return read;
    }
    if (!passed) {
        read.error = checker.error().empty() ? "is not valid JSON" : checker.error();
        return read;
    }
    try {
        read.document = json::parse(text.begin(), text.end());
    } catch (const json::exception &e) { // not expected after the check; never across the API
        read.error = std::string("is not valid JSON: ") + e.what();
    }
    return read;
}

std::string shortJson(const json &value, std::size_t maxBytes)
{
    const std::string text = value.dump(-1, ' ', false, json::error_handler_t::replace);
    return printableText(text, maxBytes);
}

} // namespace sagline
