// Waiting inside a Qt event loop, for tests of code that works through signals and timers.
#pragma once

#include <QElapsedTimer>
#include <QEventLoop>
#include <QTimer>

#include <functional>

namespace sagline::test {

// Runs the event loop (so a VirtualClock on auto-advance moves on whenever it would block,
// which QTest::qWaitFor's processEvents never does) until `done()` or `timeoutMs` of wall
// time; returns done(). Each layer's test support wraps it with its own default limit.
inline bool runEventsUntil(const std::function<bool()> &done, int timeoutMs)
{
    QElapsedTimer elapsed;
    elapsed.start();
    while (!done()) {
        if (elapsed.elapsed() > timeoutMs)
            return done();
        QEventLoop loop;
        QTimer::singleShot(2, &loop, &QEventLoop::quit);
        loop.exec();
    }
    return true;
}

// Runs the event loop for `ms` of wall time.
inline void runFor(int ms)
{
    QEventLoop loop;
    QTimer::singleShot(ms, &loop, &QEventLoop::quit);
    loop.exec();
}

} // namespace sagline::test
