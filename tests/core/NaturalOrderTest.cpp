// Design names in the order people read the numbers in them.
#include "NaturalOrder.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <string>
#include <vector>

using namespace sagline;

TEST(NaturalOrder, NumbersInTextCompareByValue)
{
    EXPECT_TRUE(naturalLess("20 VA 230/24 V", "100 VA 230/24 V"));
    EXPECT_FALSE(naturalLess("100 VA 230/24 V", "20 VA 230/24 V"));
    EXPECT_TRUE(naturalLess("60 VA 230/18 V", "60 VA 230/24 V")) << "the first difference decides";
    EXPECT_TRUE(naturalLess("unit2", "unit10"));
    EXPECT_FALSE(naturalLess("unit007", "unit7")) << "leading zeros: equal values";
    EXPECT_FALSE(naturalLess("unit7", "unit007"));
    EXPECT_TRUE(naturalLess("PT-60", "PT-60 rev B")) << "a prefix comes first";
    EXPECT_FALSE(naturalLess("same", "same"));
    EXPECT_TRUE(naturalLess("A 5", "B 1")) << "text before numbers decides";

    std::vector<std::string> designs = {"100 VA 230/24 V 50 Hz laminated copper", "20 VA 230/12 V 50 Hz laminated copper",
                                        "60 VA 230/18 V 50 Hz laminated copper"};
    std::sort(designs.begin(), designs.end(), [](const std::string &x, const std::string &y) { return naturalLess(x, y); });
    EXPECT_EQ(designs.front().substr(0, 5), "20 VA");
    EXPECT_EQ(designs.back().substr(0, 6), "100 VA");
}
