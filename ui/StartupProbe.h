// Cold-start measurement for the desktop app (`sagline --startup-probe [SESSION]`): the time
// from the process's start, as the kernel recorded it, to the end of the first painted frame
// of the main window (with the session open and drawn when one is given), printed on stdout,
// then the program quits. A benchmark aid, not used in normal runs.
#pragma once

#include <optional>

class QElapsedTimer;

namespace sagline {

// Milliseconds since this process started: the start time the kernel keeps in field 22 of
// /proc/self/stat (clock ticks since boot, usually 10 ms each) against CLOCK_BOOTTIME now.
// This counts what happens before main(): loading and relocating the shared libraries and
// their static constructors. Nothing when /proc cannot be read.
std::optional<double> millisecondsSinceProcessStart();

class MainWindow;

// `sinceMain` was started first thing in main(). With a session open, the line also says how
// many readings it holds and how many points the V–I chart drew.
void quitAfterFirstPaint(MainWindow &window, const QElapsedTimer &sinceMain);

} // namespace sagline
