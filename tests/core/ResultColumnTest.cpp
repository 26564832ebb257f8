// Per-row result columns (core/ResultColumn.h): a block of 2 MiB or more is aligned to 2 MiB and
// lies in a mapping advised for huge pages, so a million-row fit on glibc's default heap does
// not take a page fault per 4 KiB of its results; small columns are ordinary vectors.
#include "MemoryMappings.h"
#include "ResultColumn.h"

#include <gtest/gtest.h>

#include <cstdint>
#include <numeric>

using sagline::ResultColumn;

TEST(ResultColumn, ALargeColumnIsAlignedAndAdvisedForHugePages)
{
    ResultColumn column(1000000); // a million-row fit's residuals, 8 MB
    std::iota(column.begin(), column.end(), 0.0);
    EXPECT_EQ(reinterpret_cast<std::uintptr_t>(column.data()) % (std::uintptr_t{2} << 20), 0u);
    EXPECT_EQ(column[999999], 999999.0);
    if (!sagline::testing::transparentHugePagesOffered())
        GTEST_SKIP() << "this kernel offers no transparent huge pages";
    const std::string flags = sagline::testing::vmFlagsAt(column.data() + column.size() / 2);
    EXPECT_NE(flags.find(" hg"), std::string::npos) << flags;
}

TEST(ResultColumn, SmallColumnsAndGrowthBehaveAsVectors)
{
    ResultColumn column;
    for (int i = 0; i < 300000; ++i) // grows through the 2 MiB threshold and past it
        column.push_back(0.5 * i);
    ASSERT_EQ(column.size(), 300000u);
    EXPECT_EQ(column[1], 0.5);
    EXPECT_EQ(column[299999], 149999.5);
    ResultColumn moved = std::move(column);
    EXPECT_EQ(moved.back(), 149999.5);
    ResultColumn copy(moved.begin(), moved.begin() + 10);
    EXPECT_EQ(copy.size(), 10u);
    EXPECT_EQ(copy[9], 4.5);
}
