// A demo sweep for screenshots, the benchmark and first-time users: fills in the session
// details, accepts the plan and records one reading per planned step through the same path
// as a person typing them in (controller, store, fit). The readings come from an invented
// transformer of our own (V0 and R near the plan's, a little noise): demo data only.
#pragma once

#include <QPalette>

#include <QString>

namespace sagline {

class MainWindow;

struct DemoResult {
    bool ok = false;
    QString message; // what failed, or where the session went
    int points = 0;
};

// `leaveOut` last steps are not recorded, so the window shows a sweep in progress.
DemoResult runTypedDemoSweep(MainWindow &window, int leaveOut = 0,
                             const QString &operatorName = QStringLiteral("Demo operator"),
                             const QString &unitSerial = QStringLiteral("DEMO-0001"));

// The same on the virtual bench (simulated time, so it takes well under a second), paused
// after `pauseAfter` points so the window shows a sweep in progress (0: run to the end).
DemoResult runVirtualBenchDemo(MainWindow &window, int pauseAfter = 0);

// Saves the main window as PNG (light, and dark when `dark`) into `folder`; returns the paths.
QStringList saveScreenshots(MainWindow &window, const QString &folder, bool dark);

// The dark palette of `--screenshot --dark` and the screenshot tests (every role the window
// uses, placeholder and muted text included, so notes stay readable).
QPalette darkPalette();

} // namespace sagline
