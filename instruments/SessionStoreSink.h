// The controller's PointSink on a session file: every call is one durable SessionStore
// transaction, so a reading is reported as recorded only after it is on disk.
#pragma once

#include "PointSink.h"

#include <QString>

namespace sagline {

class SessionStore;

class SessionStoreSink final : public PointSink {
public:
    // `store` is not owned. `author` is written on exclusions and notes ("sagline-cli run").
    SessionStoreSink(SessionStore *store, const QString &author);
    CommitResult commitReading(const Reading &reading) override;
    CommitResult recordSafetyStop(const SafetyTrip &trip, std::int64_t readingId, int step, const QString &timeUtc) override;
    CommitResult recordInstrument(const InstrumentIdentityRecord &instrument) override;
    CommitResult excludeReading(std::int64_t readingId, const QString &reason) override;
    CommitResult recordEvent(const QString &timeUtc, const QString &text) override;
    CommitResult recordSweepEvent(SweepEventKind kind, int step, const QString &detail) override;
    CommitResult commitRetake(const Reading &reading, std::int64_t supersededId, const QString &reason) override;

private:
    SessionStore *m_store;
    QString m_author;
};

} // namespace sagline
