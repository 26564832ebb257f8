#include "LargePageHeap.h"

#include <malloc.h>
#include <sys/mman.h>
#include <unistd.h>

#include <cstdint>
#include <cstdlib>
#include <limits>

namespace sagline {

void adviseLargePagesForHeap()
{
#if defined(__GLIBC__) && defined(MADV_HUGEPAGE)
    if (const char *off = std::getenv("SAGLINE_NO_LARGE_PAGES"); off != nullptr && *off != '\0')
        return; // to compare, or where compaction stalls would hurt more than faults
    // The advice belongs to a mapping, so the heap is grown once to its working size, advised,
    // and handed back to malloc: the memory stays virtual until touched. Large blocks then come
    // from this advised heap instead of separate mmaps (glibc's default from 128 KiB; none here), and the
    // heap's top is not returned to the kernel between commands.
    constexpr std::size_t reserve = std::size_t{1} << 30; // virtual only; 1e6 readings need ~0.4 GiB
    constexpr std::uintptr_t largePage = std::uintptr_t{2} << 20;
    if (mallopt(M_MMAP_MAX, 0) == 0 || mallopt(M_TRIM_THRESHOLD, std::numeric_limits<int>::max()) == 0)
        return;
    const auto start = reinterpret_cast<std::uintptr_t>(sbrk(0));
    void *block = std::malloc(reserve);
    if (block == nullptr)
        return; // strict overcommit, or no room: the default pages then
    const auto end = reinterpret_cast<std::uintptr_t>(sbrk(0));
    const std::uintptr_t from = (start + largePage - 1) & ~(largePage - 1);
    if (end > from)
        madvise(reinterpret_cast<void *>(from), end - from, MADV_HUGEPAGE); // refused: default pages
    std::free(block);
#endif
}

} // namespace sagline
