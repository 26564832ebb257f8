// What the kernel says about this process's memory, for tests of large-page advice.
#pragma once

#include <cstdint>
#include <fstream>
#include <sstream>
#include <string>

namespace sagline::testing {

// The first line of /sys/kernel/mm/transparent_hugepage/enabled, e.g. "always [madvise] never".
inline std::string transparentHugePageMode()
{
    std::ifstream in("/sys/kernel/mm/transparent_hugepage/enabled");
    std::string line;
    std::getline(in, line);
    return line;
}

inline bool transparentHugePagesOffered()
{
    const std::string mode = transparentHugePageMode();
    return !mode.empty() && mode.find("[never]") == std::string::npos;
}

// The VmFlags of the mapping holding `address`, from /proc/self/smaps ("" if not found).
inline std::string vmFlagsAt(const void *address)
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

} // namespace sagline::testing
