// One argument parser for the three programs (each sagline-cli command, sagline-sim, sagline):
// options and positional arguments are declared once, `--help`/`-h` prints every one of them,
// and bad usage is refused with exit code 2 and a message that names the option and the rule.
// Plain C++ (no Qt, so sagline-cli loads no Qt at all); arguments are byte strings (a file name
// need not be UTF-8).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace sagline {

// The exit codes a parse can end with: help printed, or a usage error.
constexpr int commandLineHelpShown = 0;
constexpr int commandLineUsageError = 2;

enum class Arity {
    One,       // exactly one
    Optional,  // zero or one
    OneOrMore, // at least one
    Any,       // zero or more
};

class CommandLine {
public:
    // `program`: the name used in messages ("sagline-cli plan"); `synopsis`: the usage after it
    // ("SETUP.json [--json]"); `summary`: a sentence or two on what it does.
    CommandLine(std::string program, std::string synopsis, std::string summary);

    // names: short and/or long names without dashes ({"o", "output"}); a one-letter name is
    // written -o, a longer one --output. Options are listed in --help in the order declared.
    void addFlag(std::vector<std::string> names, std::string description);
    void addOption(std::vector<std::string> names, std::string valueName, std::string description);
    // A flag that is a whole request on its own (--version): given it, the positional arguments
    // are not required.
    void addStandaloneFlag(std::vector<std::string> names, std::string description);
    void addPositional(std::string name, std::string description, Arity arity = Arity::One);
    // The options declared after this are listed under `title` in --help.
    void addHeading(std::string title);
    // A paragraph printed after the options (address forms, exit codes).
    void addNote(std::string text);

    // Parses the words after the program or command name. Returns nothing when the program
    // should go on; otherwise the exit code to return at once: 0 after printing the help on
    // standard output (for -h or --help), 2 after a message on standard error.
    std::optional<int> parse(const std::vector<std::string> &words);
    std::optional<int> parse(int argc, char **argv); // argv[1] onwards

    bool isSet(const std::string &name) const;
    // The value of an option (the last one when given more than once); "" when absent.
    std::string value(const std::string &name) const;
    std::optional<std::string> valueIfSet(const std::string &name) const;
    std::vector<std::string> values(const std::string &name) const;
    const std::vector<std::string> &positionals() const { return m_positionals; }

    // A number option's value, range-checked before use: nothing when the option is absent;
    // false after a message naming the option and the range when its value is not a finite
    // number from `min` to `max`.
    bool number(const std::string &name, double min, double max, std::optional<double> &out) const;
    // The same for a whole number.
    bool integer(const std::string &name, std::int64_t min, std::int64_t max, std::optional<std::int64_t> &out) const;
    bool unsignedInteger(const std::string &name, std::uint64_t max, std::optional<std::uint64_t> &out) const;

    // Prints "PROGRAM: message", the usage line and where the help is, on standard error;
    // returns 2 (a usage error).
    int fail(const std::string &message) const;

    std::string helpText() const;
    const std::string &program() const { return m_program; }

private:
    struct Option {
        std::vector<std::string> names;
        std::string valueName; // empty for a flag
        std::string description;
        std::string heading;   // set on the first option under a heading
        bool standalone = false;
    };
    struct Positional {
        std::string name;
        std::string description;
        Arity arity;
    };
    std::string spelled(const std::string &name) const; // "-o" or "--output"
    const Option *optionNamed(const std::string &name) const; // by any of its names; null if none
    void record(const Option &option, std::optional<std::string> value); // given once more
    std::optional<int> checkPositionals();

    std::string m_program;
    std::string m_synopsis;
    std::string m_summary;
    std::vector<Option> m_options;
    std::vector<Positional> m_positionalSpecs;
    std::vector<std::string> m_notes;
    std::string m_pendingHeading;

    std::vector<std::pair<std::string, std::vector<std::string>>> m_given; // canonical name, values
    std::vector<std::string> m_positionals;
};

} // namespace sagline
