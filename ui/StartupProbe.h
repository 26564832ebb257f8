// Cold-start measurement for the desktop app (`sagline --startup-probe`): the time from the
// program's start to the end of the first painted frame of the main window, printed on
// stdout, then the program quits. A benchmark aid, not used in normal runs.
#pragma once

class QElapsedTimer;
class QWidget;

namespace sagline {

void quitAfterFirstPaint(QWidget &window, const QElapsedTimer &sinceStart);

} // namespace sagline
