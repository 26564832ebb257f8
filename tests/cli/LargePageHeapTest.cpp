// The heap advice must survive malloc's own bookkeeping: a first version advised the heap and
// then, freeing the reserve, let malloc trim it away again, so nothing changed (strace showed
// the brk shrink). Checked in a child process (the advice changes malloc for the whole process).
#include "LargePageHeap.h"
#include "MemoryMappings.h"

#include <gtest/gtest.h>

#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <string>

using sagline::testing::transparentHugePagesOffered;
using sagline::testing::vmFlagsAt;

TEST(LargePageHeap, ALargeAllocationAfterwardsLiesInAnAdvisedMapping)
{
    if (!transparentHugePagesOffered())
        GTEST_SKIP() << "this kernel offers no transparent huge pages";
    if (const char *off = std::getenv("SAGLINE_NO_LARGE_PAGES"); off != nullptr && *off != '\0')
        GTEST_SKIP() << "SAGLINE_NO_LARGE_PAGES is set";
    EXPECT_EXIT(
        {
            sagline::adviseLargePagesForHeap();
            constexpr std::size_t bytes = std::size_t{64} << 20; // as 2e5 readings
            auto *block = static_cast<char *>(std::malloc(bytes));
            std::memset(block, 1, bytes);
            const std::string flags = vmFlagsAt(block + bytes / 2);
            std::free(block);
            std::exit(flags.find(" hg") != std::string::npos ? 0 : 1);
        },
        ::testing::ExitedWithCode(0), "");
}
