#include "LargePageHeap.h"

#include <malloc.h>
#include <sys/mman.h>
#include <unistd.h>

#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <limits>

namespace sagline {

namespace {

#if defined(__GLIBC__) && defined(MADV_HUGEPAGE)
// "always" or "madvise" selected (the kernel shows the choice in brackets); not "never".
bool kernelOffersLargePagesOnRequest()
{
    std::FILE *file = std::fopen("/sys/kernel/mm/transparent_hugepage/enabled", "re");
    if (file == nullptr)
        return false;
    char line[128] = {};
    const bool read = std::fgets(line, sizeof line, file) != nullptr;
    std::fclose(file);
    return read && (std::strstr(line, "[always]") != nullptr || std::strstr(line, "[madvise]") != nullptr);
}

// glibc's own starting values (malloc/malloc.c: DEFAULT_MMAP_MAX, DEFAULT_TRIM_THRESHOLD).
void restoreMallocDefaults()
{
    mallopt(M_MMAP_MAX, 65536);
    mallopt(M_TRIM_THRESHOLD, 128 * 1024);
}
#endif

} // namespace

void adviseLargePagesForHeap()
{
#if defined(__GLIBC__) && defined(MADV_HUGEPAGE)
    static bool called = false; // once per process: a second reserve would carve up the first
    if (called)
        return;
    called = true;
    if (const char *off = std::getenv("SAGLINE_NO_LARGE_PAGES"); off != nullptr && *off != '\0')
        return; // to compare, or where compaction stalls would hurt more than faults
    // The advice belongs to a mapping, so the heap is grown once to its working size, advised,
    // and handed back to malloc: the memory stays virtual until touched. Large blocks then come
    // from this advised heap instead of separate mmaps (glibc's default from 128 KiB; none here), and the
    // heap's top is not returned to the kernel between commands.
    constexpr std::size_t reserve = std::size_t{1} << 30; // virtual only; 1e6 readings need ~0.4 GiB
    constexpr std::uintptr_t largePage = std::uintptr_t{2} << 20;
    if (!kernelOffersLargePagesOnRequest())
        return; // change nothing in malloc for no gain
    if (mallopt(M_MMAP_MAX, 0) == 0 || mallopt(M_TRIM_THRESHOLD, std::numeric_limits<int>::max()) == 0)
        return restoreMallocDefaults();
    const auto start = reinterpret_cast<std::uintptr_t>(sbrk(0));
    void *block = std::malloc(reserve);
    if (block == nullptr)
        return restoreMallocDefaults(); // strict overcommit, or no room
    const auto end = reinterpret_cast<std::uintptr_t>(sbrk(0));
    const std::uintptr_t from = (start + largePage - 1) & ~(largePage - 1);
    const bool advised = end > from && madvise(reinterpret_cast<void *>(from), end - from, MADV_HUGEPAGE) == 0;
    std::free(block);
    if (!advised)
        restoreMallocDefaults();
#endif
}

} // namespace sagline
