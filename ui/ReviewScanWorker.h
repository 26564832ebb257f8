// Finds and loads sessions off the GUI thread: lives in a QThread (Qt Concurrent is not a
// dependency), walks the inputs with core's findSessionFiles, opens each file with
// loadSessionRow and hands the rows over in small batches, so the table fills while the window
// stays responsive. cancel() may be called from any thread; what was loaded is kept.
#pragma once

#include "SessionComparison.h"
#include "SessionScan.h"

#include <QMetaType>
#include <QObject>
#include <QStringList>

#include <atomic>
#include <vector>

Q_DECLARE_METATYPE(std::vector<sagline::SessionRow>)
Q_DECLARE_METATYPE(std::vector<sagline::ScanProblem>)

namespace sagline {

class ReviewScanWorker : public QObject {
    Q_OBJECT
public:
    explicit ReviewScanWorker(ComparisonOptions options, QObject *parent = nullptr);

    void cancel() { m_cancelled.store(true); }
    bool isCancelled() const { return m_cancelled.load(); }

public slots:
    // Runs the whole scan in the worker's thread; emits progress, rowsLoaded, then finished.
    void scan(const QStringList &inputs);

signals:
    void filesFound(int count);                             // the walk is over; loading starts
    void progress(int done, int total);
    void rowsLoaded(const std::vector<sagline::SessionRow> &rows);
    void finished(const std::vector<sagline::ScanProblem> &problems, bool cancelled);

private:
    ComparisonOptions m_options;
    std::atomic<bool> m_cancelled{false};
};

} // namespace sagline
