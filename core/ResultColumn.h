// A column of per-row fit results (residuals, studentized residuals): a std::vector<double>
// whose large blocks come 2 MiB-aligned and advised for transparent huge pages. A million-row
// fit writes 16 MB of such columns; from glibc's default heap (a process whose heap is not the
// programs' large-page heap, app/common/LargePageHeap) each 4 KiB page of them was a page fault,
// 43 % of the fit's time. Blocks under 2 MiB are plain operator new. Pure C++ and POSIX.
#pragma once

#include <cstddef>
#include <new>
#include <vector>

namespace sagline {

// Blocks for LargeBlockAllocator (ResultColumn.cpp): at least `bytes`, aligned for T; throws
// std::bad_alloc when there is no memory. Free with the same byte count.
void *allocateResultBlock(std::size_t bytes);
void freeResultBlock(void *block, std::size_t bytes) noexcept;

template <typename T>
struct LargeBlockAllocator {
    using value_type = T;

    LargeBlockAllocator() = default;
    template <typename U>
    LargeBlockAllocator(const LargeBlockAllocator<U> &) noexcept
    {
    }

    T *allocate(std::size_t n)
    {
        if (n > static_cast<std::size_t>(-1) / sizeof(T))
            throw std::bad_array_new_length();
        return static_cast<T *>(allocateResultBlock(n * sizeof(T)));
    }
    void deallocate(T *p, std::size_t n) noexcept { freeResultBlock(p, n * sizeof(T)); }
    template <typename U>
    bool operator==(const LargeBlockAllocator<U> &) const noexcept
    {
        return true;
    }
};

using ResultColumn = std::vector<double, LargeBlockAllocator<double>>;

} // namespace sagline
