// Large pages for the heap, where the kernel offers them on request. Sessions and CSV files
// of 1e5-1e6 readings need tens to hundreds of MB of fresh memory; with 4 KiB pages every page
// is a separate fault, and on a virtual machine those faults were a third of `fit SESSION`'s
// time (perf, DEVELOPERS.md "Speed, measured"). 2 MiB pages cut the fault count ~10x
// (`fit SESSION` of 1e5 readings: 14 850 faults, 0.30 s -> 1 400 faults, 0.14 s).
#pragma once

namespace sagline {

// Call first thing in main(), before any large allocation; later calls do nothing. Best
// effort: on a kernel or C library that cannot do it, nothing changes. Never affects results,
// only page faults. The heap then keeps what it has grown to until the process ends.
// SAGLINE_NO_LARGE_PAGES=1 in the environment leaves the C library's defaults.
void adviseLargePagesForHeap();

} // namespace sagline
