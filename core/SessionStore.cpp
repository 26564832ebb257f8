// Opening, creating and copying session files; see SessionStore.h for the durability and
// trust rules this file implements.
#include "SessionStore.h"

#include "AtomicFile.h"
#include "OsAccount.h"
#include "SessionCopies.h"
#include "SessionFileCheck.h"
#include "SessionSchema.h"
#include "SqliteStatement.h"
#include "UtcTime.h"

#include <sqlite3.h>

#include <cerrno>
#include <cmath>
#include <cstdio>
#include <fcntl.h>
#include <filesystem>
#include <unistd.h>

namespace sagline {

namespace {

using StoreOpen = StoreResult<std::unique_ptr<SessionStore>>;

StoreResult<int> pragmaInt(sqlite3 *db, const char *pragma)
{
    SqliteStatement query;
    int rc = query.prepare(db, pragma);
    if (rc == SQLITE_OK)
        rc = query.step();
    if (rc != SQLITE_ROW)
        return StoreResult<int>::failure(sqliteFailure(db, rc, std::string("reading ") + pragma));
    return {static_cast<int>(query.columnInt64(0))};
}

StoreStatus configureForWriting(sqlite3 *db)
{
    // Rollback journal, not WAL: the .sagline file alone is complete after every commit.
    // EXTRA = FULL + directory sync after the journal is deleted, which is the commit point.
    for (const char *pragma : {"PRAGMA journal_mode = DELETE", "PRAGMA synchronous = EXTRA", "PRAGMA foreign_keys = ON"}) {
        const int rc = sqliteExec(db, pragma);
        if (rc != SQLITE_OK)
            return sqliteFailure(db, rc, pragma);
    }
    return StoreStatus::success();
}

StoreStatus migrateInTransaction(sqlite3 *db, int fromVersion)
{
    SqliteTransaction transaction(db);
    if (transaction.beginCode() != SQLITE_OK)
        return sqliteFailure(db, transaction.beginCode(), "upgrading the schema");
    if (StoreStatus status = migrateSessionSchema(db, fromVersion); !status.ok())
        return status;
    if (const int rc = transaction.commit(); rc != SQLITE_OK)
        return sqliteFailure(db, rc, "upgrading the schema");
    return StoreStatus::success();
}

// Gives the complete file at `temporary` the name `path`, unless `path` exists: renameat2 with
// RENAME_NOREPLACE, or a hard link where the file system lacks it; either fails on an existing
// name, so nothing is ever replaced. Then the folder is synced: the name survives a power cut.
StoreStatus publishExclusively(const std::string &temporary, const std::string &path)
{
    int rc = ::renameat2(AT_FDCWD, temporary.c_str(), AT_FDCWD, path.c_str(), RENAME_NOREPLACE);
    if (rc != 0 && (errno == EINVAL || errno == ENOSYS)) {
        rc = ::link(temporary.c_str(), path.c_str());
        if (rc == 0)
            ::unlink(temporary.c_str());
    }
    if (rc != 0) {
        const int error = errno;
        if (error == EEXIST)
            return StoreStatus::failure(StoreCode::FileExists, path + ": created meanwhile by another program; a session "
                                                                      "file is never overwritten");
        return StoreStatus::failure(StoreCode::IoError, path + ": cannot create the session file ("
                                                            + describeFileError(error) + ")");
    }
    std::filesystem::path folder = std::filesystem::path(path).parent_path();
    if (folder.empty())
        folder = ".";
    if (const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC); fd >= 0) {
        ::fsync(fd);
        ::close(fd);
    }
    return StoreStatus::success();
}

} // namespace

const char *toString(TemperatureKind kind)
{
    return kind == TemperatureKind::Winding ? "winding" : "ambient";
}

const char *toString(ReviewDecision verdict)
{
    switch (verdict) {
    case ReviewDecision::Accepted: return "accepted";
    case ReviewDecision::Rejected: return "rejected";
    case ReviewDecision::Retest: return "retest";
    }
    return "accepted";
}

const char *toString(SweepEventKind kind)
{
    switch (kind) {
    case SweepEventKind::Started: return "started";
    case SweepEventKind::Finished: return "finished";
    case SweepEventKind::Stopped: return "stopped";
    case SweepEventKind::Resumed: return "resumed";
    case SweepEventKind::LimitOverride: return "limit-override";
    case SweepEventKind::Truncated: return "truncated";
    case SweepEventKind::ValueConfirmed: return "value-confirmed";
    }
    return "started";
}

std::optional<SweepEventKind> sweepEventKindFromString(const std::string &text)
{
    for (SweepEventKind kind : {SweepEventKind::Started, SweepEventKind::Finished, SweepEventKind::Stopped,
                                SweepEventKind::Resumed, SweepEventKind::LimitOverride, SweepEventKind::Truncated,
                                SweepEventKind::ValueConfirmed}) {
        if (text == toString(kind))
            return kind;
    }
    return std::nullopt;
}

std::optional<ReviewDecision> reviewDecisionFromString(const std::string &text)
{
    for (ReviewDecision verdict : {ReviewDecision::Accepted, ReviewDecision::Rejected, ReviewDecision::Retest}) {
        if (text == toString(verdict))
            return verdict;
    }
    return std::nullopt;
}

SessionStore::SessionStore(std::string path, SqliteHandle db, bool readOnly, int fileVersion)
    : m_path(std::move(path)), m_db(std::move(db)), m_readOnly(readOnly), m_fileVersion(fileVersion), m_clock(utcNow)
{
    m_actor.osAccount = currentOsAccount();
}

SessionStore::~SessionStore() = default;

void SessionStore::setClock(std::function<std::string()> clock)
{
    m_clock = clock ? std::move(clock) : std::function<std::string()>(utcNow);
}

std::string SessionStore::now() const
{
    return m_clock();
}

void SessionStore::setActor(Actor actor)
{
    if (actor.osAccount.empty())
        actor.osAccount = currentOsAccount();
    m_actor = std::move(actor);
}

StoreStatus SessionStore::requireUnsealed() const
{
    if (StoreStatus status = requireWritable(); !status.ok())
        return status;
    if (!m_sealed)
        return StoreStatus::success();
    return StoreStatus::failure(StoreCode::Sealed, m_path + ": signed off; reopen it (with a reason) before changing it; "
                                                            "nothing was recorded");
}

StoreStatus SessionStore::requireWritable() const
{
    if (!m_readOnly)
        return StoreStatus::success();
    return StoreStatus::failure(StoreCode::ReadOnly, m_path + ": opened for review (read-only); nothing was recorded");
}

StoreOpen SessionStore::create(const std::string &path, const NewSession &session,
                               const std::function<StoreStatus(SessionStore &)> &fill)
{
    auto published = buildAndPublish(path, session, fill);
    if (!published.ok())
        return StoreOpen::failure(published.status());
    StoreOpen opened = open(path, true, std::move(published.value));
    if (opened.ok())
        opened.value->setActor(session.createdBy); // as createFile's store had it
    return opened;
}

StoreStatus SessionStore::createClosed(const std::string &path, const NewSession &session,
                                       const std::function<StoreStatus(SessionStore &)> &fill)
{
    return buildAndPublish(path, session, fill).status(); // the lock goes with the result
}

StoreResult<SessionWriterLock> SessionStore::buildAndPublish(const std::string &path, const NewSession &session,
                                                             const std::function<StoreStatus(SessionStore &)> &fill)
{
    using Result = StoreResult<SessionWriterLock>;
    std::error_code error;
    if (std::filesystem::exists(path, error) || std::filesystem::exists(path + "-journal", error))
        return Result::failure(StoreCode::FileExists, path + ": already exists; a session file is never overwritten");
    const std::string temporary = temporarySibling(path);
    const auto named = [&](const std::string &message) {
        // Messages name the file the user asked for, not the temporary one.
        std::string text = message;
        for (std::size_t at = text.find(temporary); at != std::string::npos; at = text.find(temporary, at + path.size()))
            text.replace(at, temporary.size(), path);
        return text;
    };
    auto lock = SessionWriterLock::createAndAcquire(temporary);
    if (!lock.ok())
        return Result::failure(lock.code == StoreCode::FileExists ? StoreCode::IoError : lock.code, named(lock.message));
    // From here on only this call's own temporary file (and its journal) is ever removed.
    struct RemoveTemporary {
        std::string path;
        bool keep = false;
        ~RemoveTemporary()
        {
            if (keep)
                return;
            std::error_code ignored;
            std::filesystem::remove(path + "-journal", ignored);
            std::filesystem::remove(path, ignored);
        }
    } cleanup{temporary};
    {
        StoreOpen built = createFile(temporary, session);
        if (!built.ok())
            return Result::failure(built.code, named(built.message));
        if (fill) {
            built.value->m_path = path;
            if (StoreStatus status = fill(*built.value); !status.ok())
                return Result::failure(status.code, named(status.message));
        }
    } // the connection closes: the file is complete and committed, with no journal
    if (StoreStatus status = publishExclusively(temporary, path); !status.ok())
        return Result::failure(status);
    cleanup.keep = true;
    return std::move(lock.value);
}

StoreOpen SessionStore::createFile(const std::string &path, const NewSession &session)
{
    const std::pair<const std::string *, const char *> required[] = {
        {&session.setupJson, "setup"}, {&session.operatorName, "operator"}, {&session.unitSerial, "unit serial"}};
    for (const auto &[value, name] : required) {
        if (value->empty())
            return StoreOpen::failure(StoreCode::InvalidArgument, std::string(name) + ": required for a new session");
    }
    for (const auto &celsius : {session.ambientTemperatureC, session.windingTemperatureC}) {
        if (celsius && (!std::isfinite(*celsius) || *celsius < -273.15 || *celsius > 1000.0))
            return StoreOpen::failure(StoreCode::InvalidArgument, "temperature: must be between -273.15 and 1000 °C");
    }
    auto db = openHardenedConnection(path, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE);
    if (!db.ok())
        return StoreOpen::failure(db.status());
    sqlite3 *handle = db.value.get();
    if (StoreStatus status = configureForWriting(handle); !status.ok())
        return StoreOpen::failure(status);

    const std::string created = utcNow();
    Actor creator = session.createdBy;
    if (creator.osAccount.empty())
        creator.osAccount = currentOsAccount();
    SqliteTransaction transaction(handle);
    if (transaction.beginCode() != SQLITE_OK)
        return StoreOpen::failure(sqliteFailure(handle, transaction.beginCode(), path + ": cannot write"));
    if (StoreStatus status = createSessionSchema(handle); !status.ok())
        return StoreOpen::failure(status);
    SqliteStatement insert;
    int rc = insert.prepare(handle, "INSERT INTO session (id, created_utc, software_version, operator, unit_serial, "
                                    "setup_json, plan_json, created_by, created_account) VALUES (1, ?, ?, ?, ?, ?, ?, ?, ?)");
    if (rc == SQLITE_OK) {
        insert.bind(1, created).bind(2, session.softwareVersion).bind(3, session.operatorName);
        insert.bind(4, session.unitSerial).bind(5, session.setupJson).bind(6, session.planJson);
        insert.bind(7, creator.person).bind(8, creator.osAccount);
        rc = insert.step();
    }
    if (rc != SQLITE_DONE)
        return StoreOpen::failure(sqliteFailure(handle, rc, path + ": cannot record the session"));
    const std::pair<TemperatureKind, std::optional<double>> temperatures[] = {
        {TemperatureKind::Ambient, session.ambientTemperatureC}, {TemperatureKind::Winding, session.windingTemperatureC}};
    for (const auto &[kind, celsius] : temperatures) {
        if (!celsius)
            continue;
        SqliteStatement temperature;
        rc = temperature.prepare(handle, "INSERT INTO temperature (time_utc, kind, value_c, source, person, os_account) "
                                         "VALUES (?, ?, ?, ?, ?, ?)");
        if (rc == SQLITE_OK) {
            temperature.bind(1, created).bind(2, std::string_view(toString(kind))).bind(3, *celsius);
            temperature.bind(4, std::string_view("entered at start")).bind(5, creator.person).bind(6, creator.osAccount);
            rc = temperature.step();
        }
        if (rc != SQLITE_DONE)
            return StoreOpen::failure(sqliteFailure(handle, rc, path + ": cannot record the temperature"));
    }
    if (rc = transaction.commit(); rc != SQLITE_OK)
        return StoreOpen::failure(sqliteFailure(handle, rc, path + ": cannot commit the new session"));
    std::unique_ptr<SessionStore> store(new SessionStore(path, std::move(db.value), false, sessionSchemaVersion));
    store->m_actor = creator;
    return {std::move(store)};
}

StoreOpen SessionStore::openForWriting(const std::string &path)
{
    if (StoreStatus status = checkSessionFileHeader(path); !status.ok())
        return StoreOpen::failure(status);
    auto lock = SessionWriterLock::acquire(path);
    if (!lock.ok())
        return StoreOpen::failure(lock.status());
    return open(path, true, std::move(lock.value));
}

StoreOpen SessionStore::openForReview(const std::string &path)
{
    return open(path, false);
}

StoreOpen SessionStore::open(const std::string &path, bool forWriting, SessionWriterLock lock)
{
    if (StoreStatus status = checkSessionFileHeader(path); !status.ok())
        return StoreOpen::failure(status);
    // A file in WAL mode (not one of ours) is reviewed from a private copy: reading it in place
    // would leave -wal and -shm files beside it.
    const bool walCopy = !forWriting && isWalModeFile(path);
    auto db = walCopy ? copyFileIntoMemory(path)
                      : openHardenedConnection(path, forWriting ? SQLITE_OPEN_READWRITE : SQLITE_OPEN_READONLY);
    if (!db.ok())
        return StoreOpen::failure(db.status());
    sqlite3 *handle = db.value.get();
    auto fail = [&path](const StoreStatus &status) { return StoreOpen::failure(status.code, path + ": " + status.message); };

    // quick_check first: it also parses the schema, so a damaged schema is caught here.
    StoreStatus checked = quickCheck(handle);
    std::string recoveredNotice;
    std::error_code ignored;
    if (!forWriting && checked.code == StoreCode::ReadOnly && std::filesystem::exists(path + "-journal", ignored)) {
        // A crash left a hot journal; rolling it back would write. Recover a private copy instead.
        auto recovered = recoverIntoMemory(path);
        if (!recovered.ok())
            return fail(recovered.status());
        db.value = std::move(recovered.value);
        handle = db.value.get();
        recoveredNotice = path + ": was left mid-write (the recording program stopped abruptly); shown as recovered "
                                 "in memory, the file itself is unchanged until it is opened for writing";
        checked = quickCheck(handle);
    }
    if (!checked.ok())
        return fail(checked.code == StoreCode::UnexpectedSchema ? StoreStatus::failure(StoreCode::Corrupt, checked.message)
                                                                 : checked);
    const auto applicationId = pragmaInt(handle, "PRAGMA application_id");
    const auto version = pragmaInt(handle, "PRAGMA user_version");
    if (!applicationId.ok() || !version.ok())
        return fail(applicationId.ok() ? version.status() : applicationId.status());
    if (static_cast<std::uint32_t>(applicationId.value) != sessionApplicationId)
        return fail(StoreStatus::failure(StoreCode::NotASession, "not a Sagline session (application id)"));
    if (version.value < 1)
        return fail(StoreStatus::failure(StoreCode::NotASession, "no session schema (version 0)"));
    if (StoreStatus status = verifySessionSchema(handle, version.value); !status.ok())
        return fail(status);

    const bool newer = version.value > sessionSchemaVersion;
    const std::string newerText = "written by a newer Sagline (schema version " + std::to_string(version.value) +
                                  "; this build reads up to " + std::to_string(sessionSchemaVersion) + ")";
    if (forWriting) {
        if (newer)
            return fail(StoreStatus::failure(StoreCode::NewerVersion, newerText + "; open it for review (read-only) or update Sagline"));
        if (StoreStatus status = configureForWriting(handle); !status.ok())
            return fail(status);
        if (version.value < sessionSchemaVersion) {
            if (StoreStatus status = migrateInTransaction(handle, version.value); !status.ok())
                return fail(status);
        }
        std::unique_ptr<SessionStore> store(new SessionStore(path, std::move(db.value), false, version.value));
        store->m_writerLock = std::move(lock);
        if (StoreStatus status = store->loadSealState(); !status.ok())
            return fail(status);
        return {std::move(store)};
    }

    if (version.value < sessionSchemaVersion) {
        // Upgrade a copy in memory: opening for review never writes to the file.
        if (recoveredNotice.empty()) {
            auto copy = copyIntoMemory(handle);
            if (!copy.ok())
                return fail(copy.status());
            db.value = std::move(copy.value);
        }
        if (StoreStatus status = migrateInTransaction(db.value.get(), version.value); !status.ok())
            return fail(status);
    }
    if (walCopy) {
        recoveredNotice = path + ": in write-ahead-log mode (not as Sagline writes sessions); read from a private copy"
                          + (std::filesystem::exists(path + "-wal", ignored) ? ", without what its -wal file holds" : "");
    }
    std::unique_ptr<SessionStore> store(new SessionStore(path, std::move(db.value), true, version.value));
    if (StoreStatus status = store->loadSealState(); !status.ok())
        return fail(status);
    store->m_notice = recoveredNotice;
    if (newer)
        store->m_notice += (recoveredNotice.empty() ? "" : "\n") + path + ": " + newerText +
                           "; shown read-only, parts this build does not know are not shown";
    return {std::move(store)};
}

StoreStatus SessionStore::saveCopyAs(const std::string &newPath) const
{
    std::error_code error;
    if (std::filesystem::exists(newPath, error))
        return StoreStatus::failure(StoreCode::FileExists, newPath + ": already exists; choose a new name");
    // Into a temporary name first, then given its name exclusively: a copy is complete or absent.
    const std::string temporary = temporarySibling(newPath);
    SqliteStatement vacuum;
    int rc = vacuum.prepare(m_db.get(), "VACUUM INTO ?");
    if (rc == SQLITE_OK) {
        vacuum.bind(1, std::string_view(temporary));
        rc = vacuum.step();
    }
    StoreStatus status = rc == SQLITE_DONE ? publishExclusively(temporary, newPath)
                                           : sqliteFailure(m_db.get(), rc, newPath + ": cannot write the copy");
    if (!status.ok())
        std::filesystem::remove(temporary, error);
    return status;
}

StoreStatus SessionStore::integrityCheck() const
{
    return quickCheck(m_db.get(), true);
}

} // namespace sagline
