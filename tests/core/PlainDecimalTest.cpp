// The quick reader of plain decimals must give, bit for bit, the double the full readers give:
// std::from_chars (correctly rounded, C++17 [charconv]) and glibc's strtod (correctly rounded,
// IEEE 754-2008 §5.12.2 conversions from decimal character sequences). Any text it does not
// take must be left to them.
#include "PlainDecimal.h"

#include <gtest/gtest.h>

#include <bit>
#include <charconv>
#include <cstdint>
#include <cstdlib>
#include <random>
#include <string>

using namespace sagline;

namespace {

double fromChars(const std::string &text)
{
    double value = 0.0;
    const auto result = std::from_chars(text.data(), text.data() + text.size(), value);
    EXPECT_EQ(result.ec, std::errc()) << text;
    EXPECT_EQ(result.ptr, text.data() + text.size()) << text;
    return value;
}

void expectSameDouble(const std::string &text)
{
    const std::optional<double> quick = readPlainDecimal(text);
    ASSERT_TRUE(quick) << text;
    const double reference = fromChars(text);
    EXPECT_EQ(std::bit_cast<std::uint64_t>(*quick), std::bit_cast<std::uint64_t>(reference)) << text;
    EXPECT_EQ(std::bit_cast<std::uint64_t>(*quick), std::bit_cast<std::uint64_t>(std::strtod(text.c_str(), nullptr)))
        << text;
}

} // namespace

TEST(PlainDecimal, ReadsTheSameDoubleAsTheFullReaders)
{
    for (const char *text : {"0", "-0", "230", "19.607495", "0.000854", "-0.417", "0.1", "0.3", "2.675",
                             "999999999999999", "0.00000000000001", "12345.6789012345", "1.00000000000000"})
        expectSameDouble(text);
    // Random cells of every length and split the reader takes: 1 to 15 digits, the point anywhere.
    std::mt19937_64 random(20261204);
    for (int trial = 0; trial < 200000; ++trial) {
        const int digits = 1 + static_cast<int>(random() % 15);
        std::string text = random() % 4 == 0 ? "-" : "";
        std::string number;
        for (int k = 0; k < digits; ++k)
            number += static_cast<char>('0' + random() % 10);
        const int point = static_cast<int>(random() % static_cast<std::uint64_t>(digits)); // digits before it, 1..digits
        if (point > 0)
            number.insert(static_cast<std::size_t>(point), ".");
        text += number;
        expectSameDouble(text);
        if (HasFailure())
            return;
    }
}

TEST(PlainDecimal, LeavesEveryOtherTextToTheFullReader)
{
    // Exponents, a '+', 16 or more digits, a missing digit on either side of the point, spaces,
    // a decimal comma, words: none is read here (the CSV reader then applies its full rules).
    for (const char *text : {"", "-", ".", "1.", ".5", "-.5", "+1", "1e3", "1E-3", "1.5e2", "1234567890123456",
                             "0.1234567890123456", " 1", "1 ", "1,5", "1.2.3", "inf", "nan", "--1", "0x1p3", "1.5V"})
        EXPECT_FALSE(readPlainDecimal(text)) << '"' << text << '"';
}
