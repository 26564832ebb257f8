// Core's full batch fit (residuals, studentized residuals, outliers, curvature) on a worker
// thread, for large sessions: at 100 000 points it takes several milliseconds, which on the
// window's thread would make the refresh that carries it miss a frame. One fit at a time; the
// result comes back on the window's thread with the tag it was started with, so a caller can
// drop a result that no longer matches its readings.
#pragma once

#include "FitSummary.h"

#include <QObject>
#include <QThreadPool>

#include <cstdint>

namespace sagline {

class BackgroundFit : public QObject {
    Q_OBJECT
public:
    explicit BackgroundFit(QObject *parent = nullptr);
    ~BackgroundFit() override; // waits for a fit in progress

    bool isRunning() const { return m_running; }
    // Starts fitReadings(columns, OLS) unless one is running (then false, nothing started).
    // Columns (core's columnsToFit): what the fit reads of each reading, 33 bytes a reading, so
    // the copy handed to the worker is cheap to make on the window's thread.
    bool start(ReadingColumns columns, std::uint64_t tag);

signals:
    void finished(std::uint64_t tag, const sagline::FitSummary &summary);

private:
    QThreadPool m_pool;
    bool m_running = false;
};

} // namespace sagline
