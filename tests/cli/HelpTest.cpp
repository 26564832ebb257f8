// --help and -h on every sagline-cli command, `sagline-cli help COMMAND`, sagline-sim and the
// desktop program (also without a display): the command's usage with every option, exit 0.
#include "CliTestSupport.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <regex>
#include <set>
#include <sstream>

using namespace sagline::testing;

namespace {

const std::string sim = SAGLINE_SIM_PATH;
const std::string gui = SAGLINE_GUI_PATH;

// The commands `sagline-cli --help` lists (the lines "  NAME ..." under "commands:").
std::vector<std::string> listedCommands()
{
    const auto r = runProgram(cli, {"--help"});
    std::vector<std::string> names;
    std::istringstream lines(r.out.substr(r.out.find("commands:")));
    std::string line;
    std::getline(lines, line);
    const std::regex entry("^  ([a-z][a-z-]*) .*");
    while (std::getline(lines, line) && !line.empty()) {
        std::smatch m;
        if (std::regex_match(line, m, entry) && m[1] != "help")
            names.push_back(m[1]);
    }
    return names;
}

// The options a help text lists: every "--name" at the start of an entry.
std::set<std::string> listedOptions(const std::string &help)
{
    std::set<std::string> names;
    const std::regex entry("^  (?:-[a-z], )?(--[a-z][a-z0-9-]*)");
    std::istringstream lines(help.substr(help.find("options:")));
    std::string line;
    while (std::getline(lines, line)) {
        std::smatch m;
        if (std::regex_search(line, m, entry))
            names.insert(m[1]);
    }
    return names;
}

// Unsets an environment variable for the life of the guard.
class WithoutVariable {
public:
    explicit WithoutVariable(const char *name) : m_name(name)
    {
        if (const char *value = std::getenv(name))
            m_value = value;
        ::unsetenv(name);
    }
    ~WithoutVariable()
    {
        if (m_value)
            ::setenv(m_name, m_value->c_str(), 1);
    }

private:
    const char *m_name;
    std::optional<std::string> m_value;
};

} // namespace

TEST(Help, EveryCommandPrintsItsUsageWithHelpAndH)
{
    const auto commands = listedCommands();
    ASSERT_GE(commands.size(), 7u);
    for (const std::string &command : commands) {
        const auto longForm = runProgram(cli, {command, "--help"});
        EXPECT_EQ(longForm.exitCode, 0) << command << ": " << longForm.err;
        EXPECT_EQ(longForm.out.rfind("usage: sagline-cli " + command + ' ', 0), 0u) << longForm.out;
        EXPECT_NE(longForm.out.find("options:"), std::string::npos) << command;
        EXPECT_NE(longForm.out.find("Exit codes:"), std::string::npos) << command;
        EXPECT_TRUE(longForm.err.empty()) << longForm.err;
        const auto shortForm = runProgram(cli, {command, "-h"});
        EXPECT_EQ(shortForm.exitCode, 0) << command;
        EXPECT_EQ(shortForm.out, longForm.out) << command;
        const auto helpCommand = runProgram(cli, {"help", command});
        EXPECT_EQ(helpCommand.exitCode, 0) << command;
        EXPECT_EQ(helpCommand.out, longForm.out) << command;
    }
}

TEST(Help, EveryListedOptionIsAccepted)
{
    // An option --help lists is never "unknown" to the command (the help and the parser agree).
    for (const std::string &command : listedCommands()) {
        const auto help = runProgram(cli, {command, "--help"});
        const auto options = listedOptions(help.out);
        EXPECT_GE(options.size(), 2u) << command;
        for (const std::string &option : options) {
            if (option == "--help")
                continue;
            const auto r = runProgram(cli, {command, option, "x"});
            EXPECT_EQ(r.err.find("unknown option"), std::string::npos) << command << ' ' << option << ": " << r.err;
        }
    }
}

TEST(Help, RunListsEveryOptionItTakes)
{
    const auto help = runProgram(cli, {"run", "--help"});
    const auto options = listedOptions(help.out);
    for (const char *option : {"--output", "--sim", "--voltmeter", "--ammeter", "--meter", "--load", "--timeout-ms",
                               "--reset", "--operator", "--serial", "--ambient", "--dwell", "--read-interval", "--seed",
                               "--sim-realtime", "--sim-single-meter", "--sim-fuse-rating"})
        EXPECT_TRUE(options.count(option)) << option;
}

TEST(Help, HelpWithoutACommandOrWithAnUnknownOne)
{
    const auto plain = runProgram(cli, {"help"});
    EXPECT_EQ(plain.exitCode, 0);
    EXPECT_NE(plain.out.find("commands:"), std::string::npos);
    const auto unknown = runProgram(cli, {"help", "frobnicate"});
    EXPECT_EQ(unknown.exitCode, 2);
    EXPECT_NE(unknown.err.find("unknown command 'frobnicate'"), std::string::npos) << unknown.err;
}

TEST(Help, AnUnknownOptionIsAUsageErrorOnEveryCommand)
{
    for (const std::string &command : listedCommands()) {
        const auto r = runProgram(cli, {command, "--no-such-option"});
        EXPECT_EQ(r.exitCode, 2) << command;
        EXPECT_NE(r.err.find("unknown option '--no-such-option'"), std::string::npos) << command << ": " << r.err;
        EXPECT_NE(r.err.find("usage: sagline-cli " + command), std::string::npos) << r.err;
    }
}

TEST(Help, SimulatorPrintsEveryOptionWithHelpAndH)
{
    const auto r = runProgram(sim, {"--help"});
    EXPECT_EQ(r.exitCode, 0) << r.err;
    EXPECT_EQ(r.out.rfind("usage: sagline-sim ", 0), 0u) << r.out;
    const auto options = listedOptions(r.out);
    for (const char *option : {"--seed", "--serial-suffix", "--tcp-port", "--no-tcp", "--no-pty", "--link-dir",
                               "--series-resistance", "--no-load-voltage", "--magnetizing-current", "--thermal-tau",
                               "--rated-rise", "--ambient", "--fuse-rating", "--noise-v", "--noise-a", "--drop",
                               "--garbage", "--slow", "--slow-ms", "--overload", "--vanish-every", "--vanish-for",
                               "--version", "--help-all"})
        EXPECT_TRUE(options.count(option)) << option;
    EXPECT_EQ(runProgram(sim, {"-h"}).out, r.out);
    const auto version = runProgram(sim, {"--version"});
    EXPECT_EQ(version.exitCode, 0);
    EXPECT_EQ(version.out.rfind("sagline-sim ", 0), 0u);
}

TEST(Help, SimulatorRefusesAnOptionOutOfRangeWithExitTwo)
{
    const auto r = runProgram(sim, {demoSetup, "--drop", "1.5"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--drop: '1.5' must be a number from 0 to 1"), std::string::npos) << r.err;
    const auto port = runProgram(sim, {demoSetup, "--tcp-port", "70000"});
    EXPECT_EQ(port.exitCode, 2);
    EXPECT_NE(port.err.find("--tcp-port"), std::string::npos) << port.err;
}

TEST(Help, DesktopProgramAnswersHelpAndVersionWithoutADisplay)
{
    WithoutVariable noPlatform("QT_QPA_PLATFORM"), noDisplay("DISPLAY"), noWayland("WAYLAND_DISPLAY");
    for (const char *flag : {"--help", "-h"}) {
        const auto r = runProgram(gui, {flag});
        EXPECT_EQ(r.exitCode, 0) << flag << ": " << r.err;
        EXPECT_EQ(r.out.rfind("usage: sagline ", 0), 0u) << r.out;
        for (const char *option : {"--session-folder", "--demo", "--screenshot", "--dark", "--typed-demo",
                                   "--startup-probe", "--version"})
            EXPECT_NE(r.out.find(option), std::string::npos) << option;
    }
    const auto version = runProgram(gui, {"--version"});
    EXPECT_EQ(version.exitCode, 0);
    EXPECT_EQ(version.out.rfind("sagline ", 0), 0u);
    const auto bogus = runProgram(gui, {"--bogus"});
    EXPECT_EQ(bogus.exitCode, 2);
    const auto window = runProgram(gui, {});
    EXPECT_EQ(window.exitCode, 1);
    EXPECT_NE(window.err.find("no display"), std::string::npos);
}
