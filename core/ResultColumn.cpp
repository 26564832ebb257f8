#include "ResultColumn.h"

#include <cstdlib>

#include <sys/mman.h>

namespace sagline {

namespace {

constexpr std::size_t hugePage = std::size_t{2} << 20; // x86-64's transparent huge page

} // namespace

void *allocateResultBlock(std::size_t bytes)
{
    if (bytes < hugePage)
        return ::operator new(bytes);
    const std::size_t rounded = (bytes + hugePage - 1) / hugePage * hugePage;
    void *block = std::aligned_alloc(hugePage, rounded);
    if (!block)
        throw std::bad_alloc();
    madvise(block, rounded, MADV_HUGEPAGE); // advice only: where it is refused, 4 KiB pages
    return block;
}

void freeResultBlock(void *block, std::size_t bytes) noexcept
{
    if (bytes < hugePage)
        ::operator delete(block);
    else
        std::free(block);
}

} // namespace sagline
