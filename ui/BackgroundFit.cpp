#include "BackgroundFit.h"

#include <memory>

namespace sagline {

BackgroundFit::BackgroundFit(QObject *parent) : QObject(parent) { m_pool.setMaxThreadCount(1); }

BackgroundFit::~BackgroundFit() { m_pool.waitForDone(); }

bool BackgroundFit::start(ReadingColumns columns, std::uint64_t tag)
{
    if (m_running)
        return false;
    m_running = true;
    auto inputs = std::make_shared<ReadingColumns>(std::move(columns));
    m_pool.start([this, inputs, tag] {
        auto summary = std::make_shared<FitSummary>(fitReadings(*inputs, FitMethod::Ols));
        // Back on this object's thread. The destructor waits for this job, so `this` is alive
        // here; a call still queued when it is destroyed is dropped by Qt.
        QMetaObject::invokeMethod(
            this,
            [this, summary, tag] {
                m_running = false;
                emit finished(tag, *summary);
            },
            Qt::QueuedConnection);
    });
    return true;
}

} // namespace sagline
