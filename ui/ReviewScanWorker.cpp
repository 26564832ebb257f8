#include "ReviewScanWorker.h"

#include <QElapsedTimer>

namespace sagline {

namespace {

struct MetaTypes {
    MetaTypes()
    {
        qRegisterMetaType<std::vector<sagline::SessionRow>>();
        qRegisterMetaType<std::vector<sagline::ScanProblem>>();
    }
} const registerOnce;

} // namespace

ReviewScanWorker::ReviewScanWorker(ComparisonOptions options, QObject *parent)
    : QObject(parent), m_options(std::move(options))
{
}

void ReviewScanWorker::scan(const QStringList &inputs)
{
    std::vector<std::string> paths;
    for (const QString &input : inputs)
        paths.push_back(input.toStdString());
    const SessionFileList found = findSessionFiles(paths, [this](std::size_t) { return !isCancelled(); });
    emit filesFound(static_cast<int>(found.files.size()));

    // Batches go out at most every 100 ms (or every 50 rows), so the table model is not
    // reset for every file and the GUI thread keeps up with painting and input.
    std::vector<SessionRow> batch;
    QElapsedTimer sinceLast;
    sinceLast.start();
    const int total = static_cast<int>(found.files.size());
    int done = 0;
    for (const std::string &path : found.files) {
        if (isCancelled())
            break;
        batch.push_back(loadSessionRow(path, m_options));
        ++done;
        if (batch.size() >= 50 || sinceLast.elapsed() >= 100) {
            emit rowsLoaded(batch);
            emit progress(done, total);
            batch.clear();
            sinceLast.restart();
        }
    }
    if (!batch.empty())
        emit rowsLoaded(batch);
    emit progress(done, total);
    emit finished(found.problems, isCancelled() || found.cancelled);
}

} // namespace sagline
