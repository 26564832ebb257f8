// CommandLine, the argument parser of the three programs: help, usage errors (exit 2, the option
// named), range-checked numbers, byte-exact values, positional counts.
#include "CommandLine.h"

#include <gtest/gtest.h>

#include <string>
#include <vector>

using sagline::Arity;
using sagline::CommandLine;

namespace {

CommandLine sample()
{
    CommandLine line("prog sub", "INPUT [options]", "Does one thing.");
    line.addPositional("INPUT", "the input");
    line.addOption({"o", "output"}, "FILE", "where it goes");
    line.addFlag({"json"}, "as JSON");
    line.addOption({"dwell"}, "S", "seconds");
    line.addOption({"count"}, "N", "how many");
    line.addStandaloneFlag({"version"}, "the version");
    return line;
}

} // namespace

TEST(CommandLine, HelpListsEveryOptionAndExitsZero)
{
    CommandLine line = sample();
    ::testing::internal::CaptureStdout();
    const auto exit = line.parse({"--help"});
    const std::string out = ::testing::internal::GetCapturedStdout();
    ASSERT_TRUE(exit.has_value());
    EXPECT_EQ(*exit, 0);
    EXPECT_EQ(out, line.helpText());
    for (const char *text : {"usage: prog sub INPUT [options]", "-o, --output FILE", "--json", "--dwell S", "--count N",
                             "--version", "-h, --help", "INPUT", "Does one thing."})
        EXPECT_NE(out.find(text), std::string::npos) << text;
}

TEST(CommandLine, ShortHelpWinsOverOtherMistakes)
{
    CommandLine line = sample();
    ::testing::internal::CaptureStdout();
    const auto exit = line.parse({"--bogus", "-h"});
    ::testing::internal::GetCapturedStdout();
    ASSERT_TRUE(exit.has_value());
    EXPECT_EQ(*exit, 0);
}

TEST(CommandLine, UnknownOptionIsAUsageErrorNamingIt)
{
    CommandLine line = sample();
    ::testing::internal::CaptureStderr();
    const auto exit = line.parse({"in", "--bogus=3"});
    const std::string err = ::testing::internal::GetCapturedStderr();
    ASSERT_TRUE(exit.has_value());
    EXPECT_EQ(*exit, 2);
    EXPECT_NE(err.find("prog sub: unknown option '--bogus'"), std::string::npos) << err;
    EXPECT_NE(err.find("usage: prog sub INPUT [options]"), std::string::npos) << err;
}

TEST(CommandLine, MissingValueNamesTheOption)
{
    CommandLine line = sample();
    ::testing::internal::CaptureStderr();
    const auto exit = line.parse({"in", "-o"});
    const std::string err = ::testing::internal::GetCapturedStderr();
    ASSERT_TRUE(exit.has_value());
    EXPECT_EQ(*exit, 2);
    EXPECT_NE(err.find("option -o needs a value"), std::string::npos) << err;
}

TEST(CommandLine, ValuesComeBackByteForByteUnderEveryName)
{
    CommandLine line = sample();
    const std::string notUtf8 = "caf\xe9-\xff.csv"; // Latin-1 bytes: not valid UTF-8
    ASSERT_FALSE(line.parse({notUtf8, "--output", "-", "--json"}).has_value());
    ASSERT_EQ(line.positionals().size(), 1u);
    EXPECT_EQ(line.positionals()[0], notUtf8);
    EXPECT_EQ(line.value("o"), "-");
    EXPECT_EQ(line.value("output"), "-");
    EXPECT_TRUE(line.isSet("json"));
    EXPECT_FALSE(line.isSet("dwell"));
    EXPECT_FALSE(line.valueIfSet("dwell").has_value());
}

TEST(CommandLine, AValueMayStartWithADash)
{
    CommandLine line = sample();
    ASSERT_FALSE(line.parse({"in", "--dwell", "-5", "-o", "--weird"}).has_value());
    EXPECT_EQ(line.value("dwell"), "-5");
    EXPECT_EQ(line.value("output"), "--weird");
}

TEST(CommandLine, LastValueOfARepeatedOptionWins)
{
    CommandLine line = sample();
    ASSERT_FALSE(line.parse({"in", "-o", "a", "--output=b"}).has_value());
    EXPECT_EQ(line.value("output"), "b");
    EXPECT_EQ(line.values("o"), (std::vector<std::string>{"a", "b"}));
}

TEST(CommandLine, NumbersAreRangeCheckedBeforeUse)
{
    for (const char *bad : {"1e300", "inf", "nan", "-1", "86401", "12s", "", "0x10"}) {
        CommandLine line = sample();
        ASSERT_FALSE(line.parse({"in", "--dwell", bad}).has_value()) << bad;
        std::optional<double> dwell;
        ::testing::internal::CaptureStderr();
        EXPECT_FALSE(line.number("dwell", 0.0, 86400.0, dwell)) << bad;
        const std::string err = ::testing::internal::GetCapturedStderr();
        EXPECT_NE(err.find("--dwell: '" + std::string(bad) + "' must be a number from 0 to 86400"), std::string::npos) << err;
        EXPECT_FALSE(dwell.has_value());
    }
    CommandLine line = sample();
    ASSERT_FALSE(line.parse({"in", "--dwell", "2.5"}).has_value());
    std::optional<double> dwell;
    EXPECT_TRUE(line.number("dwell", 0.0, 86400.0, dwell));
    EXPECT_EQ(dwell, 2.5);
    std::optional<double> absent;
    EXPECT_TRUE(line.number("count", 0.0, 1.0, absent));
    EXPECT_FALSE(absent.has_value());
}

TEST(CommandLine, WholeNumbersRefuseFractionsAndOverflow)
{
    for (const char *bad : {"3e9", "2.5", "9223372036854775808", "-1"}) {
        CommandLine line = sample();
        ASSERT_FALSE(line.parse({"in", "--count", bad}).has_value());
        std::optional<std::int64_t> count;
        ::testing::internal::CaptureStderr();
        EXPECT_FALSE(line.integer("count", 0, 600000, count)) << bad;
        EXPECT_NE(::testing::internal::GetCapturedStderr().find("must be a whole number from 0 to 600000"), std::string::npos);
    }
    CommandLine line = sample();
    ASSERT_FALSE(line.parse({"in", "--count", "18446744073709551615"}).has_value());
    std::optional<std::uint64_t> count;
    EXPECT_TRUE(line.unsignedInteger("count", UINT64_MAX, count));
    EXPECT_EQ(count, UINT64_MAX);
}

TEST(CommandLine, PositionalCountsAreChecked)
{
    {
        CommandLine line = sample();
        ::testing::internal::CaptureStderr();
        EXPECT_EQ(line.parse({}), 2);
        EXPECT_NE(::testing::internal::GetCapturedStderr().find("give INPUT"), std::string::npos);
    }
    {
        CommandLine line = sample();
        ::testing::internal::CaptureStderr();
        EXPECT_EQ(line.parse({"a", "b"}), 2);
        EXPECT_NE(::testing::internal::GetCapturedStderr().find("one INPUT only, got 'a' and 'b'"), std::string::npos);
    }
    {
        CommandLine line("many", "FILES...", "Takes many.");
        line.addPositional("FILES...", "files", Arity::OneOrMore);
        EXPECT_FALSE(line.parse({"a", "b", "c"}).has_value());
        EXPECT_EQ(line.positionals().size(), 3u);
    }
    {
        // A lone "-" is standard output or input, a positional like any other.
        CommandLine line = sample();
        EXPECT_FALSE(line.parse({"-"}).has_value());
        EXPECT_EQ(line.positionals(), std::vector<std::string>{"-"});
    }
}

TEST(CommandLine, AStandaloneFlagNeedsNoPositional)
{
    CommandLine line = sample();
    EXPECT_FALSE(line.parse({"--version"}).has_value());
    EXPECT_TRUE(line.isSet("version"));
}

// The rules the parser owns since it no longer stands on Qt's: "-name" is "--name"; after "--"
// every word is positional; options may follow positionals; a flag takes no "=value".
TEST(CommandLine, OneDashOrTwoNameTheSameOptionAndDoubleDashEndsOptions)
{
    CommandLine line = sample();
    ASSERT_FALSE(line.parse({"-json", "-output=x", "in"}).has_value());
    EXPECT_TRUE(line.isSet("json"));
    EXPECT_EQ(line.value("o"), "x");
    EXPECT_EQ(line.positionals(), std::vector<std::string>{"in"});

    CommandLine after = sample();
    ASSERT_FALSE(after.parse({"--", "--json"}).has_value());
    EXPECT_FALSE(after.isSet("json"));
    EXPECT_EQ(after.positionals(), std::vector<std::string>{"--json"}); // a file so named

    CommandLine trailing = sample();
    ASSERT_FALSE(trailing.parse({"in", "--json", "-o", "a", "--output", "b"}).has_value());
    EXPECT_EQ(trailing.values("output"), (std::vector<std::string>{"a", "b"}));
    EXPECT_EQ(trailing.positionals(), std::vector<std::string>{"in"});
    EXPECT_FALSE(trailing.isSet("dwell"));
    EXPECT_EQ(trailing.valueIfSet("dwell"), std::nullopt);
}

TEST(CommandLine, AFlagGivenAValueAndAnAbbreviationAreRefused)
{
    CommandLine line = sample();
    ::testing::internal::CaptureStderr();
    EXPECT_EQ(line.parse({"in", "--json=yes"}), 2);
    std::string err = ::testing::internal::GetCapturedStderr();
    EXPECT_NE(err.find("prog sub: unexpected value after '--json'"), std::string::npos) << err;

    CommandLine abbreviated = sample();
    ::testing::internal::CaptureStderr();
    EXPECT_EQ(abbreviated.parse({"in", "--out", "x"}), 2); // never read as --output
    err = ::testing::internal::GetCapturedStderr();
    EXPECT_NE(err.find("unknown option '--out'"), std::string::npos) << err;

    // An unknown option is named before any other mistake on the line.
    CommandLine both = sample();
    ::testing::internal::CaptureStderr();
    EXPECT_EQ(both.parse({"in", "--json=1", "-q"}), 2);
    err = ::testing::internal::GetCapturedStderr();
    EXPECT_NE(err.find("unknown option '-q'"), std::string::npos) << err;
}
