// SessionStore: one load-test session in one SQLite file (.sagline), written as it happens.
//
// Durability: the file uses SQLite's rollback journal (journal_mode=DELETE) with
// synchronous=EXTRA, i.e. FULL plus a sync of the directory after the journal is removed
// (sqlite.org pragma.html#pragma_synchronous). Every append is its own transaction, and a
// call returns only after SQLite reported the commit, so a reading whose id was returned
// survives an application crash, an OS crash and a power loss (given disks that honour fsync),
// and the .sagline file by itself always holds every recorded reading: there is no WAL side
// file to forget. A user who wants a copy of an open session uses saveCopyAs (VACUUM INTO),
// never a raw file copy.
//
// Trust: every open treats the file as untrusted (a lab lead opens a student's file):
// the header is checked before SQLite sees the file, then SQLITE_DBCONFIG_DEFENSIVE, trusted
// schema off, triggers and views disabled, cell_size_check on, mmap off, PRAGMA quick_check,
// and a schema check that rejects triggers, views, virtual tables and unknown tables.
// openForReview never writes to the file: it opens it read-only; an older schema is upgraded
// in an in-memory copy, a newer schema is read as far as this build understands it.
//
// History: nothing is updated or deleted. An exclusion, a restore or a correction is a new row.
// Not thread-safe: use one SessionStore from one thread.
#pragma once

#include "Reading.h"
#include "SessionRecords.h"
#include "SessionWriterLock.h"
#include "SqliteHandle.h"
#include "StoreResult.h"

#include <cstdint>
#include <functional>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace sagline {

class SessionStore {
public:
    // Creates a new session file at `path` (refuses to overwrite; FileExists) and records the
    // setup, plan, operator, unit serial and starting temperatures in one transaction.
    // Atomic: the file is built under a hidden temporary name in the same folder, `fill` (if
    // given) adds to it (an import's readings), and only then does it appear under `path`,
    // by an exclusive rename or link, so a kill at any moment leaves no file or a complete
    // session under that name, and of two programs creating the same path one wins and the
    // other gets FileExists. Nothing but this call's own temporary file is ever removed.
    // The returned store holds the writer lock (SessionWriterLock).
    static StoreResult<std::unique_ptr<SessionStore>>
    create(const std::string &path, const NewSession &session,
           const std::function<StoreStatus(SessionStore &)> &fill = {});
    // The same for a caller that only writes the file (an import): it is published and
    // closed, not opened again, which would run the integrity check over all of it.
    static StoreStatus createClosed(const std::string &path, const NewSession &session,
                                    const std::function<StoreStatus(SessionStore &)> &fill);
    // Opens an existing session to continue it (resume a sweep, add notes, exclusions, a
    // sign-off). Takes the writer lock: Busy, naming the holder's host and process, while
    // another program writes it. An older schema is upgraded in place, in one transaction. A
    // newer schema fails with NewerVersion (open it for review instead).
    static StoreResult<std::unique_ptr<SessionStore>> openForWriting(const std::string &path);
    // Opens a session read-only for review. The file is never modified. A file from a newer
    // version opens read-only with notice() saying so.
    static StoreResult<std::unique_ptr<SessionStore>> openForReview(const std::string &path);

    ~SessionStore();
    SessionStore(const SessionStore &) = delete;
    SessionStore &operator=(const SessionStore &) = delete;

    const std::string &path() const { return m_path; }
    bool isReadOnly() const { return m_readOnly; }
    int fileSchemaVersion() const { return m_fileVersion; } // user_version found on disk
    const std::string &notice() const { return m_notice; }  // e.g. newer-version warning; "" if none

    // Replaces the clock that stamps records (tests); returns ISO 8601 UTC text.
    void setClock(std::function<std::string()> clock);
    // Who is making changes through this store: stamped on every record written from now on.
    // The OS account starts as currentOsAccount(), the person as "" (not given) until set.
    void setActor(Actor actor);
    const Actor &actor() const { return m_actor; }
    // A sign-off not lifted by a reopen seals the session: every write but reopen() is refused
    // (Sealed). See SessionSeal.h.
    bool isSealed() const { return m_sealed; }

    // --- writing (each call is one durable transaction; ReadOnly on a review store) ---

    // Records one reading and returns its row id, only after the commit returned. An empty
    // reading.timeUtc is stamped now; reading.id and reading.excluded are ignored. Current
    // and voltage must be finite unless flags carry flagOverload or flagNotANumber (then a
    // non-finite value is stored as "no value"); uncertainties, when given, finite and ≥ 0.
    StoreResult<std::int64_t> appendReading(const Reading &reading);
    // Records several readings in one transaction (an import): all or none. Returns their ids.
    // With `marked`, each reading whose `excluded` is set also gets its exclusion row in that
    // transaction (an import's marks); without, reading.excluded is ignored.
    StoreResult<std::vector<std::int64_t>> appendReadings(const std::vector<Reading> &readings,
                                                          const MarkedExclusions *marked = nullptr);
    // Excludes a reading from the fit, or restores it; reason required. NotFound for an
    // unknown reading id.
    StoreResult<std::int64_t> excludeReading(std::int64_t readingId, const std::string &reason, const std::string &author);
    StoreResult<std::int64_t> restoreReading(std::int64_t readingId, const std::string &reason, const std::string &author);
    StoreResult<std::int64_t> recordTemperature(TemperatureKind kind, double celsius, const std::string &source);
    StoreResult<std::int64_t> recordInstrument(const std::string &role, const std::string &identity, const std::string &accuracy);
    StoreResult<std::int64_t> addNote(const std::string &author, const std::string &text);
    StoreResult<std::int64_t> recordSafetyStop(const SafetyStopRecord &stop); // id and timeUtc are set by the store
    // Signs off and seals: stores the SHA-256 digest of the session's content as it is now
    // (SessionSeal.h). Refused while an earlier sign-off is still in force.
    StoreResult<std::int64_t> addSignOff(const std::string &reviewer, ReviewDecision verdict, const std::string &comment);
    // Lifts the sign-off in force so the session can be changed again, recording who
    // (actor().person, required) and why (required). Only on a sealed session.
    StoreResult<std::int64_t> reopen(const std::string &reason);
    // A retake of a step: records `reading` and marks reading `supersededId` superseded by it,
    // with the reason, in one transaction (nothing is deleted). Returns the new reading's id.
    StoreResult<std::int64_t> appendRetake(const Reading &reading, std::int64_t supersededId, const std::string &reason);
    StoreResult<std::int64_t> recordSweepEvent(SweepEventKind kind, int step, const std::string &detail);

    // --- reading (any mode) ---

    StoreResult<SessionInfo> info() const;
    // Every reading in recording order, with `excluded` from the latest exclusion row.
    StoreResult<std::vector<Reading>> readings() const;
    // The readings that go to the fit: readings() without the excluded ones. Flag-based
    // omissions (overload, not-a-number) are the fit's business and are kept here.
    StoreResult<std::vector<Reading>> includedReadings() const;
    StoreResult<std::int64_t> readingCount() const;
    StoreResult<std::vector<ExclusionRecord>> exclusions() const; // all rows, oldest first
    StoreResult<std::vector<TemperatureRecord>> temperatures() const;
    StoreResult<std::vector<InstrumentRecord>> instruments() const;
    StoreResult<std::vector<NoteRecord>> notes() const;
    StoreResult<std::vector<SafetyStopRecord>> safetyStops() const;
    StoreResult<std::vector<SignOffRecord>> signOffs() const;
    // Who recorded each reading, in the order of readings() (for reports and exports).
    StoreResult<ReadingRecorders> readingRecorders() const;
    StoreResult<std::vector<SupersessionRecord>> supersessions() const;
    StoreResult<std::vector<SweepEventRecord>> sweepEvents() const;
    StoreResult<std::vector<ReopenRecord>> reopens() const;

    // --- seal (SessionSeal.cpp) ---

    // The last row id of every content table now, as stored with a sign-off.
    StoreResult<std::string> currentContentMarks() const;
    // The digest a sign-off should carry, recomputed from the file: the content up to the
    // sign-off's marks, then the sign-off's own fields. Compare with record.digest.
    StoreResult<std::string> recomputeSealDigest(const SignOffRecord &record) const;

    // --- whole file ---

    // Writes a complete, compact copy to `newPath` with VACUUM INTO (works on an open, even
    // read-only, session; never a raw copy). FileExists if newPath exists.
    StoreStatus saveCopyAs(const std::string &newPath) const;
    // PRAGMA integrity_check (O(N log N)); ok, or Corrupt with SQLite's first finding.
    StoreStatus integrityCheck() const;

private:
    SessionStore(std::string path, SqliteHandle db, bool readOnly, int fileVersion);
    // create's work up to the file under its name; returns the writer lock still held.
    static StoreResult<SessionWriterLock> buildAndPublish(const std::string &path, const NewSession &session,
                                                          const std::function<StoreStatus(SessionStore &)> &fill);
    static StoreResult<std::unique_ptr<SessionStore>> open(const std::string &path, bool forWriting,
                                                           SessionWriterLock lock = {});
    static StoreResult<std::unique_ptr<SessionStore>> createFile(const std::string &path, const NewSession &session);
    StoreStatus requireWritable() const;
    StoreStatus requireUnsealed() const; // writable and not sealed by a sign-off
    StoreStatus loadSealState();          // sets m_sealed from the file
    StoreResult<std::int64_t> insertExclusion(std::int64_t readingId, bool excluded, const std::string &reason,
                                              const std::string &author);
    std::string now() const;
    StoreStatus checkReading(const Reading &reading) const;
    // appendReadings' primary sides (readings that have one) inside its transaction; an SQLite code.
    int insertPrimarySides(const std::vector<Reading> &readings, const std::vector<std::int64_t> &ids);
    // Fills each reading's primary side from the primary_reading table (readings sorted by id).
    StoreStatus attachPrimarySides(std::vector<Reading> &readings) const;
    // appendReadings' exclusions (readings index, reason) inside its transaction; an SQLite code.
    int insertExclusions(const std::vector<std::pair<std::size_t, std::string>> &exclusions,
                         const std::vector<std::int64_t> &ids, const std::string &author, const std::string &stamp);

    std::string m_path;
    SessionWriterLock m_writerLock; // before m_db: released only after the connection has closed
    SqliteHandle m_db;        // the file, or an upgraded in-memory copy for review of an old file
    bool m_readOnly = false;
    int m_fileVersion = 0;
    std::string m_notice;
    std::function<std::string()> m_clock;
    Actor m_actor;
    bool m_sealed = false;
};

} // namespace sagline
