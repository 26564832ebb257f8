// Time as the sweep controller and the virtual bench see it, injected so tests and simulated
// sweeps do not sleep through dwell times. SystemClock is wall time with QTimer;
// VirtualClock is advanced explicitly (tests) or jumps to the next timer whenever the event
// loop would otherwise wait (a simulated sweep that runs as fast as the machine allows).
#pragma once

#include <QObject>
#include <QString>

#include <QElapsedTimer>
#include <cstdint>
#include <functional>
#include <map>

namespace sagline {

class Clock {
public:
    virtual ~Clock() = default;
    virtual std::int64_t nowMs() const = 0;  // monotonic milliseconds since an arbitrary start
    virtual QString utcNowIso() const = 0;   // "2026-12-02T10:15:03.250Z"
    // Calls `callback` once, `delayMs` from now, in the thread that owns the clock; returns an
    // id for cancel(). `context` bounds the callback's lifetime: if it is destroyed first, the
    // callback is not called.
    virtual int callAfter(std::int64_t delayMs, QObject *context, std::function<void()> callback) = 0;
    virtual void cancel(int id) = 0;
};

class SystemClock final : public QObject, public Clock {
    Q_OBJECT
public:
    explicit SystemClock(QObject *parent = nullptr);
    std::int64_t nowMs() const override;
    QString utcNowIso() const override;
    int callAfter(std::int64_t delayMs, QObject *context, std::function<void()> callback) override;
    void cancel(int id) override;

private:
    QElapsedTimer m_elapsed;
    int m_nextId = 1;
    std::map<int, QObject *> m_timers; // id -> its QTimer
};

class VirtualClock final : public QObject, public Clock {
    Q_OBJECT
public:
    // `startUtcMs`: the wall time (ms since the epoch) virtual time 0 corresponds to.
    explicit VirtualClock(std::int64_t startUtcMs, QObject *parent = nullptr);
    std::int64_t nowMs() const override { return m_nowMs; }
    QString utcNowIso() const override;
    int callAfter(std::int64_t delayMs, QObject *context, std::function<void()> callback) override;
    void cancel(int id) override;

    // Moves time forward by `ms`, firing every timer that falls due, in order.
    void advance(std::int64_t ms);
    // Jumps to the next pending timer and fires it (and any due at the same time); false if none.
    bool advanceToNext();
    bool hasPending() const { return !m_pending.empty(); }
    // Runs time forward automatically whenever the Qt event loop is about to wait.
    void setAutoAdvance(bool on);

private:
    struct Pending {
        std::int64_t dueMs;
        QObject *context;
        bool hasContext;
        std::function<void()> callback;
        QMetaObject::Connection contextGone; // dropped with the callback: a long run keeps none
    };
    void fireDue();
    void handleAboutToBlock();

    std::int64_t m_startUtcMs;
    std::int64_t m_nowMs = 0;
    int m_nextId = 1;
    std::multimap<std::int64_t, int> m_order; // due time -> id
    std::map<int, Pending> m_pending;
    QMetaObject::Connection m_autoConnection;
    bool m_advanceQueued = false;
};

} // namespace sagline
