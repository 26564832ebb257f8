// Where the sweep controller commits what it records. The session store implements it
// (SessionStoreSink); tests use an in-memory one. A reading is reported as recorded only
// after commitReading() returned ok, i.e. after the store's durable commit.
#pragma once

#include "Reading.h"
#include "SafetyLimits.h"
#include "SessionRecords.h"

#include <QString>

#include <cstdint>

namespace sagline {

struct CommitResult {
    bool ok = false;
    std::int64_t id = 0; // the store's id of the committed row
    QString error;       // when !ok: what failed (disk full, file gone...)
};

struct InstrumentIdentityRecord {
    QString roleKeys;     // "secondary_voltage,secondary_current"
    QString identity;     // the *IDN? reply, four fields
    QString address;      // link description
    QString accuracyText; // "secondary_voltage: ±(0.5 % + 3 counts), resolution 0.001 V; ..."
};

class PointSink {
public:
    virtual ~PointSink() = default;
    virtual CommitResult commitReading(const Reading &reading) = 0;
    virtual CommitResult recordSafetyStop(const SafetyTrip &trip, std::int64_t readingId, int step,
                                          const QString &timeUtc) = 0;
    virtual CommitResult recordInstrument(const InstrumentIdentityRecord &instrument) = 0;
    // A reading kept in the session but left out of fits (e.g. the one that tripped a safety stop).
    virtual CommitResult excludeReading(std::int64_t readingId, const QString &reason) = 0;
    // Link lost/restored, instrument errors, operator stop: kept with the session as notes.
    virtual CommitResult recordEvent(const QString &timeUtc, const QString &text) = 0;
    // The sweep's own course (started, finished, stopped, resumed), which tells a complete
    // session from an interrupted one. Sinks that do not keep it need not override.
    virtual CommitResult recordSweepEvent(SweepEventKind kind, int step, const QString &detail)
    {
        Q_UNUSED(kind) Q_UNUSED(step) Q_UNUSED(detail)
        return {true, 0, {}};
    }
    // A retake of a step: the new reading, and the earlier one marked superseded by it with the
    // reason, in one commit. Sinks without that history record the reading alone.
    virtual CommitResult commitRetake(const Reading &reading, std::int64_t supersededId, const QString &reason)
    {
        Q_UNUSED(supersededId) Q_UNUSED(reason)
        return commitReading(reading);
    }
};

} // namespace sagline
