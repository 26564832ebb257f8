#include "Clock.h"

#include <QAbstractEventDispatcher>
#include <QDateTime>
#include <QPointer>
#include <QThread>
#include <QTimer>

namespace sagline {

namespace {

QString isoMs(const QDateTime &time)
{
    return time.toUTC().toString(QStringLiteral("yyyy-MM-ddTHH:mm:ss.zzzZ"));
}

} // namespace

SystemClock::SystemClock(QObject *parent) : QObject(parent)
{
    m_elapsed.start();
}

std::int64_t SystemClock::nowMs() const
{
    return m_elapsed.elapsed();
}

QString SystemClock::utcNowIso() const
{
    return isoMs(QDateTime::currentDateTimeUtc());
}

int SystemClock::callAfter(std::int64_t delayMs, QObject *context, std::function<void()> callback)
{
    const int id = m_nextId++;
    auto *timer = new QTimer(this);
    timer->setSingleShot(true);
    timer->setTimerType(Qt::PreciseTimer);
    QPointer<QObject> guard(context);
    const bool hasContext = context != nullptr;
    connect(timer, &QTimer::timeout, this, [this, id, timer, guard, hasContext, callback = std::move(callback)] {
        m_timers.erase(id);
        timer->deleteLater();
        if (!hasContext || guard)
            callback();
    });
    m_timers[id] = timer;
    timer->start(static_cast<int>(std::max<std::int64_t>(0, delayMs)));
    return id;
}

void SystemClock::cancel(int id)
{
    auto it = m_timers.find(id);
    if (it == m_timers.end())
        return;
    it->second->deleteLater();
    static_cast<QTimer *>(it->second)->stop();
    m_timers.erase(it);
}

VirtualClock::VirtualClock(std::int64_t startUtcMs, QObject *parent) : QObject(parent), m_startUtcMs(startUtcMs) {}

QString VirtualClock::utcNowIso() const
{
    return isoMs(QDateTime::fromMSecsSinceEpoch(m_startUtcMs + m_nowMs, Qt::UTC));
}

int VirtualClock::callAfter(std::int64_t delayMs, QObject *context, std::function<void()> callback)
{
    const int id = m_nextId++;
    const std::int64_t due = m_nowMs + std::max<std::int64_t>(0, delayMs);
    m_pending[id] = Pending{due, context, context != nullptr, std::move(callback), {}};
    m_order.emplace(due, id);
    if (context) {
        // Forget the callback if its owner goes away first.
        m_pending[id].contextGone = connect(context, &QObject::destroyed, this, [this, id] { cancel(id); });
    }
    return id;
}

void VirtualClock::cancel(int id)
{
    auto it = m_pending.find(id);
    if (it == m_pending.end())
        return;
    auto range = m_order.equal_range(it->second.dueMs);
    for (auto o = range.first; o != range.second; ++o) {
        if (o->second == id) {
            m_order.erase(o);
            break;
        }
    }
    disconnect(it->second.contextGone);
    m_pending.erase(it);
}

void VirtualClock::fireDue()
{
    while (!m_order.empty() && m_order.begin()->first <= m_nowMs) {
        const int id = m_order.begin()->second;
        m_order.erase(m_order.begin());
        auto it = m_pending.find(id);
        if (it == m_pending.end())
            continue;
        auto callback = std::move(it->second.callback);
        disconnect(it->second.contextGone);
        m_pending.erase(it);
        callback();
    }
}

void VirtualClock::advance(std::int64_t ms)
{
    const std::int64_t target = m_nowMs + std::max<std::int64_t>(0, ms);
    while (!m_order.empty() && m_order.begin()->first <= target) {
        m_nowMs = std::max(m_nowMs, m_order.begin()->first);
        fireDue();
    }
    m_nowMs = target;
}

bool VirtualClock::advanceToNext()
{
    if (m_order.empty())
        return false;
    m_nowMs = std::max(m_nowMs, m_order.begin()->first);
    fireDue();
    return true;
}

void VirtualClock::setAutoAdvance(bool on)
{
    disconnect(m_autoConnection);
    if (!on)
        return;
    auto *dispatcher = QAbstractEventDispatcher::instance(thread());
    if (dispatcher) {
        m_autoConnection = connect(dispatcher, &QAbstractEventDispatcher::aboutToBlock, this,
                                   &VirtualClock::handleAboutToBlock);
    }
}

void VirtualClock::handleAboutToBlock()
{
    // Nothing else to do right now: let simulated time run to the next timer. Queued, so the
    // callbacks run as ordinary events and not inside the dispatcher's own bookkeeping.
    if (m_advanceQueued || m_order.empty())
        return;
    m_advanceQueued = true;
    QMetaObject::invokeMethod(
        this,
        [this] {
            m_advanceQueued = false;
            advanceToNext();
        },
        Qt::QueuedConnection);
}

} // namespace sagline
