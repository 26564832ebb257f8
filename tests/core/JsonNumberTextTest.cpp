// The streamed scalars against nlohmann::json's own dump() of the same value: integers and
// booleans byte for byte; a double reads back to itself, in dump()'s layout, and differs from
// dump() only where dump()'s Grisu2 digits are not the shortest (C++17 [charconv.to.chars]:
// std::to_chars gives the shortest text that reads back exactly, the closest of those).
#include "JsonNumberText.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstring>
#include <limits>
#include <random>

using namespace sagline;

namespace {

std::string streamed(double value)
{
    std::string out;
    appendJsonNumber(out, value);
    return out;
}

// Digits of a number's text without sign, point, leading zeros or exponent ("-0.0120" -> "12").
std::string significantDigits(const std::string &text)
{
    std::string digits;
    for (char c : text.substr(0, text.find_first_of("eE"))) {
        if (c >= '0' && c <= '9' && !(digits.empty() && c == '0'))
            digits += c;
    }
    while (!digits.empty() && digits.back() == '0')
        digits.pop_back();
    return digits;
}

// Where the tree writes `v` as `tree`, the stream must write the same double, laid out the same
// way (fixed or exponent, ".0" on whole numbers) and with no more significant digits.
void expectSameDoubleNoLonger(double v, int &textsDiffering)
{
    const std::string text = streamed(v);
    const std::string tree = nlohmann::json(v).dump();
    if (text == tree)
        return;
    ++textsDiffering;
    const nlohmann::json back = nlohmann::json::parse(text);
    ASSERT_TRUE(back.is_number_float()) << text;
    const double read = back.get<double>();
    ASSERT_EQ(std::memcmp(&read, &v, sizeof v), 0) << text << " does not read back to " << tree;
    ASSERT_EQ(text.find('e') == std::string::npos, tree.find('e') == std::string::npos) << text << " vs " << tree;
    ASSERT_LE(significantDigits(text).size(), significantDigits(tree).size()) << text << " vs " << tree;
}

} // namespace

TEST(JsonNumberText, DoublesAreTheTreesTextOrAShorterOneForTheSameDouble)
{
    const double edges[] = {0.0, -0.0, 1.0, -1.0, 0.1, 1e-5, 1e-4, 123456789012345.0, 1e15, 1e16, 1e17, 1e21,
                            -1.9, 26.4, 5e-324, std::numeric_limits<double>::min(),
                            std::numeric_limits<double>::max(), std::numeric_limits<double>::lowest(),
                            std::numeric_limits<double>::epsilon(), 2.0 / 3.0, -1e-300, 1e5, 0.0001234, 1e-4 * 0.99};
    for (double v : edges)
        EXPECT_EQ(streamed(v), nlohmann::json(v).dump()) << v;
    // Random bit patterns cover every exponent and digit count; residuals of a few mV and
    // values spread over decades cover what a fit writes.
    std::mt19937_64 random(7);
    int compared = 0;
    int differing = 0;
    for (int i = 0; i < 200000; ++i) {
        const std::uint64_t bits = random();
        double v;
        std::memcpy(&v, &bits, sizeof v);
        if (!std::isfinite(v))
            continue;
        expectSameDoubleNoLonger(v, differing);
        ++compared;
    }
    std::normal_distribution<double> residual(0.0, 0.01);
    std::uniform_real_distribution<double> decade(-12.0, 12.0);
    for (int i = 0; i < 200000; ++i)
        expectSameDoubleNoLonger(residual(random) * std::pow(10.0, decade(random)), differing);
    EXPECT_GT(compared, 190000);
    // Grisu2 is shortest for nearly every double: a difference is the exception.
    EXPECT_LT(differing, 400000 / 100) << "texts that differ from dump()";
}

TEST(JsonNumberText, ADoubleWithMoreDigitsThanNeededFromTheTreeIsWrittenShorter)
{
    // 0.3652212948894 reads back to the double dump() writes as 0.36522129488940003 (found in a
    // 1e6-reading fit's residuals): the stream writes the 13 digits, the tree 17.
    const double v = 0.3652212948894;
    EXPECT_EQ(nlohmann::json(v).dump(), "0.36522129488940003");
    EXPECT_EQ(streamed(v), "0.3652212948894");
}

TEST(JsonNumberText, NonFiniteAndMissingAreNull)
{
    EXPECT_EQ(streamed(std::nan("")), nlohmann::json(std::nan("")).dump());
    EXPECT_EQ(streamed(std::numeric_limits<double>::infinity()), "null");
    std::string out;
    appendJsonNumber(out, std::optional<double>());
    appendJsonNumber(out, std::optional<double>(2.5));
    EXPECT_EQ(out, "null2.5");
}

TEST(JsonNumberText, IntegersAndBooleansAreWrittenAsTheTreeDumpsThem)
{
    for (std::int64_t v : {std::int64_t{0}, std::int64_t{-1}, std::int64_t{42}, std::numeric_limits<std::int64_t>::min(),
                           std::numeric_limits<std::int64_t>::max()}) {
        std::string out;
        appendJsonInteger(out, v);
        EXPECT_EQ(out, nlohmann::json(v).dump());
    }
    for (std::uint64_t v : {std::uint64_t{0}, std::uint64_t{999999}, std::numeric_limits<std::uint64_t>::max()}) {
        std::string out;
        appendJsonUnsigned(out, v);
        EXPECT_EQ(out, nlohmann::json(v).dump());
    }
    std::string out;
    appendJsonBool(out, true);
    appendJsonBool(out, false);
    EXPECT_EQ(out, "truefalse");
}
