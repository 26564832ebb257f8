// The heap advice must survive malloc's own bookkeeping: a first version advised the heap and
// then, freeing the reserve, let malloc trim it away again, so nothing changed (strace showed
// the brk shrink). Checked in a child process (the advice changes malloc for the whole process).
#include "LargePageHeap.h"

#include <gtest/gtest.h>

#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <sstream>
#include <string>

namespace {

std::string transparentHugePageMode()
{
    std::ifstream in("/sys/kernel/mm/transparent_hugepage/enabled");
    std::string line;
    std::getline(in, line);
    return line;
}

// The VmFlags of the mapping holding `address`, from /proc/self/smaps ("" if not found).
std::string vmFlagsAt(const void *address)
{
    const auto at = reinterpret_cast<std::uintptr_t>(address);
    std::ifstream smaps("/proc/self/smaps");
    std::string line;
    bool inside = false;
    while (std::getline(smaps, line)) {
        std::uintptr_t from = 0, to = 0;
        char dash = 0;
        std::istringstream head(line);
        if (head >> std::hex >> from >> dash >> to && dash == '-' && line.find(':') > line.find(' ')) {
            inside = from <= at && at < to;
            continue;
        }
        if (inside && line.rfind("VmFlags:", 0) == 0)
            return line;
    }
    return {};
}

} // namespace

TEST(LargePageHeap, ALargeAllocationAfterwardsLiesInAnAdvisedMapping)
{
    const std::string mode = transparentHugePageMode();
    if (mode.find("[never]") != std::string::npos || mode.empty())
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
