#include "SessionStoreSink.h"

#include "SessionStore.h"

namespace sagline {

namespace {

template <typename T>
CommitResult toCommit(const StoreResult<T> &result)
{
    CommitResult commit;
    commit.ok = result.ok();
    if (commit.ok)
        commit.id = result.value;
    else
        commit.error = QString::fromStdString(result.status().message);
    return commit;
}

} // namespace

SessionStoreSink::SessionStoreSink(SessionStore *store, const QString &author) : m_store(store), m_author(author) {}

CommitResult SessionStoreSink::commitReading(const Reading &reading)
{
    return toCommit(m_store->appendReading(reading));
}

CommitResult SessionStoreSink::recordSafetyStop(const SafetyTrip &trip, std::int64_t readingId, int step,
                                                const QString &timeUtc)
{
    Q_UNUSED(timeUtc) // the store stamps its own time
    SafetyStopRecord record;
    record.step = step;
    record.rule = toString(trip.limit);
    record.message = trip.message;
    if (readingId > 0)
        record.message += " (reading " + std::to_string(readingId) + ")";
    if (trip.limit != SafetyLimit::MeterOverload) {
        record.measured = trip.measured;
        record.limitValue = trip.limitValue;
    }
    return toCommit(m_store->recordSafetyStop(record));
}

CommitResult SessionStoreSink::recordInstrument(const InstrumentIdentityRecord &instrument)
{
    const std::string accuracy = (instrument.address + QStringLiteral("; ") + instrument.accuracyText).toStdString();
    return toCommit(m_store->recordInstrument(instrument.roleKeys.toStdString(), instrument.identity.toStdString(), accuracy));
}

CommitResult SessionStoreSink::excludeReading(std::int64_t readingId, const QString &reason)
{
    return toCommit(m_store->excludeReading(readingId, reason.toStdString(), m_author.toStdString()));
}

CommitResult SessionStoreSink::recordEvent(const QString &timeUtc, const QString &text)
{
    return toCommit(m_store->addNote(m_author.toStdString(), (timeUtc + QStringLiteral(" ") + text).toStdString()));
}

CommitResult SessionStoreSink::commitRetake(const Reading &reading, std::int64_t supersededId, const QString &reason)
{
    return toCommit(m_store->appendRetake(reading, supersededId, reason.toStdString()));
}

CommitResult SessionStoreSink::recordSweepEvent(SweepEventKind kind, int step, const QString &detail)
{
    return toCommit(m_store->recordSweepEvent(kind, step, detail.toStdString()));
}

} // namespace sagline
