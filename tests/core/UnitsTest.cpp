#include "Units.h"

#include <gtest/gtest.h>

using sagline::parseQuantity;
using sagline::Unit;

TEST(Units, ReadsPlainNumbersAsSiValues)
{
    const auto q = parseQuantity("0.13", Unit::Ampere);
    ASSERT_TRUE(q.ok) << q.error;
    EXPECT_DOUBLE_EQ(q.value, 0.13);
}

TEST(Units, AppliesSiPrefixesWithOrWithoutSpace)
{
    EXPECT_DOUBLE_EQ(parseQuantity("130 mA", Unit::Ampere).value, 0.130);
    EXPECT_DOUBLE_EQ(parseQuantity("130mA", Unit::Ampere).value, 0.130);
    EXPECT_DOUBLE_EQ(parseQuantity("1.5 kΩ", Unit::Ohm).value, 1500.0);
    EXPECT_DOUBLE_EQ(parseQuantity("2 MΩ", Unit::Ohm).value, 2e6);
    EXPECT_DOUBLE_EQ(parseQuantity("470 µA", Unit::Ampere).value, 470e-6);
    EXPECT_DOUBLE_EQ(parseQuantity("470 uA", Unit::Ampere).value, 470e-6);
    EXPECT_DOUBLE_EQ(parseQuantity("2.2 kVA", Unit::VoltAmpere).value, 2200.0);
    EXPECT_DOUBLE_EQ(parseQuantity("50 Hz", Unit::Hertz).value, 50.0);
    EXPECT_DOUBLE_EQ(parseQuantity("250 ms", Unit::Second).value, 0.25);
}

TEST(Units, AcceptsOhmSpelledOutAndBothOmegaCharacters)
{
    EXPECT_DOUBLE_EQ(parseQuantity("100 ohm", Unit::Ohm).value, 100.0);
    EXPECT_DOUBLE_EQ(parseQuantity("100 ohms", Unit::Ohm).value, 100.0);
    EXPECT_DOUBLE_EQ(parseQuantity("100 \xE2\x84\xA6", Unit::Ohm).value, 100.0); // U+2126 OHM SIGN
    EXPECT_DOUBLE_EQ(parseQuantity("100 \xCE\xA9", Unit::Ohm).value, 100.0);     // U+03A9 GREEK OMEGA
}

TEST(Units, AcceptsCommaAsDecimalSeparator)
{
    EXPECT_DOUBLE_EQ(parseQuantity("13,8 V", Unit::Volt).value, 13.8);
    EXPECT_DOUBLE_EQ(parseQuantity("0,5", Unit::Ampere).value, 0.5);
}

TEST(Units, RefusesACommaThatCouldBeAThousandsSeparator)
{
    // "1,250 V": one thousand two hundred and fifty, or one and a quarter? Refused, never guessed.
    const auto q = parseQuantity("1,250 V", Unit::Volt);
    EXPECT_FALSE(q.ok);
    EXPECT_NE(q.error.find("thousands separator"), std::string::npos) << q.error;
    EXPECT_DOUBLE_EQ(parseQuantity("0,250 V", Unit::Volt).value, 0.25); // no thousands group starts with 0
    EXPECT_DOUBLE_EQ(parseQuantity("1,25 V", Unit::Volt).value, 1.25);
    EXPECT_DOUBLE_EQ(parseQuantity("1.250 V", Unit::Volt).value, 1.25); // '.' is always the decimal point here
}

TEST(Units, RefusesMixedSeparators)
{
    const auto q = parseQuantity("1.234,5 V", Unit::Volt);
    EXPECT_FALSE(q.ok);
    EXPECT_NE(q.error.find("decimal separator"), std::string::npos) << q.error;
}

TEST(Units, RefusesTheWrongUnitAndSaysWhichBelongs)
{
    const auto q = parseQuantity("12 A", Unit::Volt);
    ASSERT_FALSE(q.ok);
    EXPECT_NE(q.error.find("a current"), std::string::npos) << q.error;
    EXPECT_NE(q.error.find("a voltage"), std::string::npos) << q.error;
    EXPECT_FALSE(parseQuantity("60 W", Unit::VoltAmpere).ok);
    EXPECT_FALSE(parseQuantity("60 VA", Unit::Watt).ok);
}

TEST(Units, RefusesNonNumbersAndNonFiniteValues)
{
    EXPECT_FALSE(parseQuantity("", Unit::Volt).ok);
    EXPECT_FALSE(parseQuantity("abc", Unit::Volt).ok);
    EXPECT_FALSE(parseQuantity("nan", Unit::Volt).ok);
    EXPECT_FALSE(parseQuantity("inf V", Unit::Volt).ok);
    EXPECT_FALSE(parseQuantity("1e999 V", Unit::Volt).ok);
    EXPECT_FALSE(parseQuantity("V", Unit::Volt).ok);
    EXPECT_FALSE(parseQuantity("1,2,3", Unit::Volt).ok);
}

TEST(Units, KeepsNegativeSignAndExponent)
{
    EXPECT_DOUBLE_EQ(parseQuantity("-5 V", Unit::Volt).value, -5.0);
    EXPECT_DOUBLE_EQ(parseQuantity("1.5e-3 A", Unit::Ampere).value, 1.5e-3);
}
