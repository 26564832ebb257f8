// The filter passes plain lines through in bulk; whatever it writes must be what printableText
// makes of each line, for any mix of plain, control and non-UTF-8 bytes and any way the text
// arrives (whole, in pieces, a character at a time).
#include "OutputText.h"
#include "PrintableOutput.h"

#include <gtest/gtest.h>

#include <initializer_list>
#include <random>
#include <sstream>
#include <string>

using namespace sagline;

namespace {

// What the filter must produce: printableText of every line, the line breaks kept.
std::string expected(const std::string &text)
{
    std::string out;
    std::size_t start = 0;
    for (std::size_t end = text.find('\n'); end != std::string::npos; end = text.find('\n', start)) {
        out += printableText(std::string_view(text).substr(start, end - start)) + '\n';
        start = end + 1;
    }
    if (start < text.size())
        out += printableText(std::string_view(text).substr(start));
    return out;
}

std::string filtered(const std::string &text, std::size_t piece)
{
    std::ostringstream sink;
    {
        PrintableOutput filter(sink);
        for (std::size_t at = 0; at < text.size(); at += piece)
            sink << text.substr(at, piece);
    }
    return sink.str();
}

} // namespace

TEST(PrintableOutput, PlainLinesPassUnchangedAndOthersAsPrintableTextMakesThem)
{
    const std::string text = "{\n  \"a\": 1.5,\n  \"name\": \"caf\xC3\xA9\"\n}\nred \x1B[31m\n\tx\r\nbad \xFF byte\nlast";
    EXPECT_EQ(filtered(text, text.size()), expected(text));
    EXPECT_EQ(filtered(text, 1), expected(text));
    EXPECT_EQ(filtered(text, 7), expected(text));
    EXPECT_EQ(filtered("plain\n", 6), "plain\n");
    EXPECT_EQ(filtered("\x1B[2J\n", 5), "\\x1B[2J\n");
}

TEST(PrintableOutput, RandomTextMatchesLineByLine)
{
    std::mt19937 random(11);
    // Mostly plain text and line breaks, with control bytes, UTF-8 and stray high bytes.
    const std::string alphabet = std::string("abc {}:,.\"0123456789\n\n\n\t\r\x1B\x7F") + "\xC3\xA9\xE2\x82\xAC\xFF\x80";
    std::uniform_int_distribution<std::size_t> pick(0, alphabet.size() - 1);
    for (int round = 0; round < 200; ++round) {
        std::string text;
        const std::size_t length = 1 + round * 37 % 3000;
        for (std::size_t i = 0; i < length; ++i)
            text += alphabet[pick(random)];
        for (std::size_t piece : {std::size_t{1}, std::size_t{13}, std::size_t{4096}})
            ASSERT_EQ(filtered(text, piece), expected(text)) << "round " << round << ", pieces of " << piece;
    }
}

TEST(PrintableOutput, LargeWritesOfPlainLinesPassWithoutACopyAndAControlByteInOneIsStillShown)
{
    // Megabytes of plain lines (a streamed JSON array) pass from the writer's buffer; a line with
    // an escape, a UTF-8 name or a stray byte among them, or a partial line before them, is still
    // made printable.
    std::string plain;
    for (int i = 0; i < 40000; ++i)
        plain += "    {\n      \"residual_v\": -0.0012345678901234567,\n    },\n";
    const std::string tainted = plain.substr(0, 1000000) + "name \x1B[2J caf\xC3\xA9 \xFF\n" + plain.substr(1000000);
    const std::string partialFirst = "\x1B]0;title" + plain;
    for (const std::string *text : std::initializer_list<const std::string *>{&plain, &tainted, &partialFirst}) {
        for (std::size_t piece : {text->size(), std::size_t{70000}, std::size_t{65536}, std::size_t{100}})
            ASSERT_EQ(filtered(*text, piece), expected(*text)) << "pieces of " << piece;
    }
    EXPECT_EQ(filtered(plain, plain.size()), plain);
}
