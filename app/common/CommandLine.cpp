#include "CommandLine.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <iostream>
#include <sstream>

namespace sagline {

namespace {

constexpr std::size_t helpWidth = 100;  // columns of --help
constexpr std::size_t nameColumn = 30;  // where option descriptions start

// Columns taken by UTF-8 text: one per code point (enough for Ω, ±, °).
std::size_t displayWidth(const std::string &text)
{
    return static_cast<std::size_t>(
        std::count_if(text.begin(), text.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
}

// `text` wrapped to `width` columns, every line after the first indented by `indent` spaces
// (the first line's indent is the caller's). Explicit line breaks are kept.
std::string wrap(const std::string &text, std::size_t indent, std::size_t firstColumn, std::size_t width = helpWidth)
{
    std::string out;
    std::size_t column = firstColumn;
    std::istringstream lines(text);
    std::string line;
    bool firstLine = true;
    while (std::getline(lines, line)) {
        if (!firstLine) {
            out += '\n' + std::string(indent, ' ');
            column = indent;
        }
        firstLine = false;
        std::istringstream words(line);
        std::string word;
        bool firstWord = true;
        while (words >> word) {
            const std::size_t w = displayWidth(word);
            if (!firstWord && column + 1 + w > width) {
                out += '\n' + std::string(indent, ' ');
                column = indent;
            } else if (!firstWord) {
                out += ' ';
                ++column;
            }
            out += word;
            column += w;
            firstWord = false;
        }
    }
    return out;
}

} // namespace

CommandLine::CommandLine(std::string program, std::string synopsis, std::string summary)
    : m_program(std::move(program)), m_synopsis(std::move(synopsis)), m_summary(std::move(summary))
{
    addFlag({"h", "help"}, "print this help and exit");
}

void CommandLine::addFlag(std::vector<std::string> names, std::string description)
{
    addOption(std::move(names), {}, std::move(description));
}

void CommandLine::addOption(std::vector<std::string> names, std::string valueName, std::string description)
{
    m_options.push_back({std::move(names), std::move(valueName), std::move(description), std::move(m_pendingHeading)});
    m_pendingHeading.clear();
}

void CommandLine::addStandaloneFlag(std::vector<std::string> names, std::string description)
{
    addFlag(std::move(names), std::move(description));
    m_options.back().standalone = true;
}

void CommandLine::addPositional(std::string name, std::string description, Arity arity)
{
    m_positionalSpecs.push_back({std::move(name), std::move(description), arity});
}

void CommandLine::addHeading(std::string title)
{
    m_pendingHeading = std::move(title);
}

void CommandLine::addNote(std::string text)
{
    m_notes.push_back(std::move(text));
}

std::string CommandLine::spelled(const std::string &name) const
{
    return (name.size() == 1 ? "-" : "--") + name;
}

std::optional<int> CommandLine::parse(int argc, char **argv)
{
    return parse(std::vector<std::string>(argv + std::min(argc, 1), argv + argc));
}

const CommandLine::Option *CommandLine::optionNamed(const std::string &name) const
{
    for (const Option &option : m_options)
        if (std::find(option.names.begin(), option.names.end(), name) != option.names.end())
            return &option;
    return nullptr;
}

void CommandLine::record(const Option &option, std::optional<std::string> value)
{
    const std::string &key = option.names.front();
    auto given = std::find_if(m_given.begin(), m_given.end(), [&](const auto &g) { return g.first == key; });
    if (given == m_given.end())
        given = m_given.insert(m_given.end(), {key, {}});
    if (value)
        given->second.push_back(std::move(*value));
}

std::optional<int> CommandLine::parse(const std::vector<std::string> &words)
{
    m_given.clear();
    m_positionals.clear();
    // Help wins over every other mistake on the line: someone asking for it wants the usage.
    const bool helpAsked = std::any_of(words.begin(), words.end(), [](const std::string &w) {
        return w == "-h" || w == "--help" || w == "-help";
    });
    if (helpAsked) {
        std::cout << helpText();
        std::cout.flush();
        return commandLineHelpShown;
    }
    // "--name" and "-name" are the same option ("-json" is "json", never "-j -s -o -n"); its
    // value follows as "--name=VALUE" or as the next word, whatever that word looks like.
    // Options may come after positional arguments; after "--" every word is positional, and a
    // lone "-" is one (standard input, by custom). Nothing is abbreviated.
    std::string unknown;  // the first unknown option as typed
    std::string mistake;  // the first other mistake
    bool onlyPositionals = false;
    for (std::size_t i = 0; i < words.size(); ++i) {
        const std::string &word = words[i];
        if (onlyPositionals || word.size() < 2 || word[0] != '-') {
            m_positionals.push_back(word);
            continue;
        }
        if (word == "--") {
            onlyPositionals = true;
            continue;
        }
        const std::size_t equals = word.find('=');
        const std::string typed = word.substr(0, equals);
        const Option *option = optionNamed(typed.substr(word[1] == '-' ? 2 : 1));
        if (option == nullptr) {
            if (unknown.empty())
                unknown = typed;
        } else if (option->valueName.empty()) {
            if (equals == std::string::npos)
                record(*option, std::nullopt);
            else if (mistake.empty())
                mistake = "unexpected value after '" + typed + "'";
        } else if (equals != std::string::npos) {
            record(*option, word.substr(equals + 1));
        } else if (i + 1 < words.size()) {
            record(*option, words[++i]);
        } else if (mistake.empty()) {
            mistake = "option " + typed + " needs a value";
        }
    }
    if (!unknown.empty())
        return fail("unknown option '" + unknown + "'");
    if (!mistake.empty())
        return fail(mistake);
    for (const Option &option : m_options) {
        if (option.standalone && isSet(option.names.front()))
            return std::nullopt;
    }
    return checkPositionals();
}

std::optional<int> CommandLine::checkPositionals()
{
    std::size_t required = 0;
    bool unbounded = false;
    for (const Positional &p : m_positionalSpecs) {
        required += p.arity == Arity::One || p.arity == Arity::OneOrMore ? 1 : 0;
        unbounded = unbounded || p.arity == Arity::OneOrMore || p.arity == Arity::Any;
    }
    if (m_positionals.size() < required) {
        std::size_t seen = 0;
        for (const Positional &p : m_positionalSpecs) {
            if (p.arity == Arity::One || p.arity == Arity::OneOrMore) {
                if (seen++ == m_positionals.size())
                    return fail((p.arity == Arity::OneOrMore ? "give at least one " : "give ") + p.name);
            }
        }
    }
    std::size_t maximum = 0;
    for (const Positional &p : m_positionalSpecs)
        maximum += p.arity == Arity::One || p.arity == Arity::Optional ? 1 : 0;
    if (!unbounded && m_positionals.size() > maximum) {
        if (maximum == 1)
            return fail("one " + m_positionalSpecs.front().name + " only, got '" + m_positionals[0] + "' and '"
                        + m_positionals[1] + "'");
        return fail("unexpected argument '" + m_positionals[maximum] + "'");
    }
    return std::nullopt;
}

bool CommandLine::isSet(const std::string &name) const
{
    for (const Option &option : m_options) {
        if (std::find(option.names.begin(), option.names.end(), name) == option.names.end())
            continue;
        return std::any_of(m_given.begin(), m_given.end(), [&](const auto &g) { return g.first == option.names.front(); });
    }
    return false;
}

std::vector<std::string> CommandLine::values(const std::string &name) const
{
    for (const Option &option : m_options) {
        if (std::find(option.names.begin(), option.names.end(), name) == option.names.end())
            continue;
        for (const auto &[key, given] : m_given) {
            if (key == option.names.front())
                return given;
        }
    }
    return {};
}

std::string CommandLine::value(const std::string &name) const
{
    const std::vector<std::string> given = values(name);
    return given.empty() ? std::string() : given.back();
}

std::optional<std::string> CommandLine::valueIfSet(const std::string &name) const
{
    if (!isSet(name))
        return std::nullopt;
    return value(name);
}

namespace {

// Shortest text that reads back as `value` ("600000", "0.5", "1e-06").
std::string plain(double value)
{
    char buffer[32];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
    return std::string(buffer, result.ptr);
}

} // namespace

bool CommandLine::number(const std::string &name, double min, double max, std::optional<double> &out) const
{
    const auto text = valueIfSet(name);
    if (!text)
        return true;
    double value = 0.0;
    const auto [end, error] = std::from_chars(text->data(), text->data() + text->size(), value);
    if (text->empty() || error != std::errc() || end != text->data() + text->size() || !std::isfinite(value)
        || value < min || value > max) {
        fail(spelled(name) + ": '" + *text + "' must be a number from " + plain(min) + " to " + plain(max));
        return false;
    }
    out = value;
    return true;
}

bool CommandLine::integer(const std::string &name, std::int64_t min, std::int64_t max, std::optional<std::int64_t> &out) const
{
    const auto text = valueIfSet(name);
    if (!text)
        return true;
    std::int64_t value = 0;
    const auto [end, error] = std::from_chars(text->data(), text->data() + text->size(), value);
    if (text->empty() || error != std::errc() || end != text->data() + text->size() || value < min || value > max) {
        fail(spelled(name) + ": '" + *text + "' must be a whole number from " + std::to_string(min) + " to "
             + std::to_string(max));
        return false;
    }
    out = value;
    return true;
}

bool CommandLine::unsignedInteger(const std::string &name, std::uint64_t max, std::optional<std::uint64_t> &out) const
{
    const auto text = valueIfSet(name);
    if (!text)
        return true;
    std::uint64_t value = 0;
    const auto [end, error] = std::from_chars(text->data(), text->data() + text->size(), value);
    if (text->empty() || error != std::errc() || end != text->data() + text->size() || value > max) {
        fail(spelled(name) + ": '" + *text + "' must be a whole number from 0 to " + std::to_string(max));
        return false;
    }
    out = value;
    return true;
}

int CommandLine::fail(const std::string &message) const
{
    std::cerr << m_program << ": " << message << "\nusage: " << m_program << ' ' << m_synopsis << "\n(" << m_program
              << " --help lists every option)\n";
    std::cerr.flush();
    return commandLineUsageError;
}

std::string CommandLine::helpText() const
{
    std::string out = "usage: " + m_program + ' ' + m_synopsis + "\n\n" + wrap(m_summary, 0, 0) + '\n';
    const auto entry = [&out](const std::string &names, const std::string &description) {
        out += "  " + names;
        const std::size_t used = 2 + displayWidth(names);
        if (used + 2 > nameColumn)
            out += '\n' + std::string(nameColumn, ' ');
        else
            out += std::string(nameColumn - used, ' ');
        out += wrap(description, nameColumn, nameColumn) + '\n';
    };
    if (!m_positionalSpecs.empty()) {
        out += "\narguments:\n";
        for (const Positional &p : m_positionalSpecs)
            entry(p.name, p.description);
    }
    out += "\noptions:\n";
    for (const Option &option : m_options) {
        if (!option.heading.empty())
            out += '\n' + option.heading + ":\n";
        std::string names;
        for (const std::string &name : option.names)
            names += (names.empty() ? "" : ", ") + spelled(name);
        if (!option.valueName.empty())
            names += ' ' + option.valueName;
        entry(names, option.description);
    }
    for (const std::string &note : m_notes)
        out += '\n' + wrap(note, 0, 0) + '\n';
    return out;
}

} // namespace sagline
