#include "NumberFormat.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

TEST(NumberFormat, RoundsToSignificantDigits)
{
    EXPECT_EQ(formatSignificant(2.08333, 4), "2.083");
    EXPECT_EQ(formatSignificant(0.416667, 4), "0.4167");
    EXPECT_EQ(formatSignificant(1152.3, 4), "1152");
    EXPECT_EQ(formatSignificant(123456.0, 3), "123456"); // never drops integer digits
    EXPECT_EQ(formatSignificant(9.99996, 4), "10.00");
    EXPECT_EQ(formatSignificant(-0.00001, 2), "-0.000010");
    EXPECT_EQ(formatSignificant(0.0, 4), "0");
    EXPECT_EQ(formatSignificant(std::nan(""), 4), "n/a");
}

TEST(NumberFormat, ChoosesAnSiPrefix)
{
    EXPECT_EQ(formatQuantity(0.145, "A", 3), "145 mA");
    EXPECT_EQ(formatQuantity(1250.0, "Ω", 3), "1.25 kΩ");
    EXPECT_EQ(formatQuantity(0.99996, "A", 4), "1.000 A");
    EXPECT_EQ(formatQuantity(12.0, "V", 4), "12.00 V");
    EXPECT_EQ(formatQuantity(8.5, "%", 3), "8.50 %");
    EXPECT_EQ(formatQuantity(-0.002, "V", 2), "-2.0 mV");
}

TEST(NumberFormat, FixedDecimalsNeverShowNegativeZero)
{
    EXPECT_EQ(formatFixed(-0.0001, 3), "0.000");
    EXPECT_EQ(formatFixed(12.3456, 2), "12.35");
}
