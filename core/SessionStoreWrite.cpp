// Appending records to a session: one INSERT, one durable commit per call (autocommit with
// synchronous=EXTRA), the row id returned only after the commit returned.
#include "SessionStore.h"

#include "SessionStoreRows.h"
#include "SqliteStatement.h"

#include <sqlite3.h>

#include <cmath>

namespace sagline {

namespace {

bool isFiniteOrAbsent(const std::optional<double> &value)
{
    return !value || (std::isfinite(*value) && *value >= 0.0);
}

// Runs a prepared INSERT whose parameters `bindAll` sets; returns the new row id.
template <typename Bind>
StoreResult<std::int64_t> insertRow(sqlite3 *db, const char *sql, const std::string &what, Bind bindAll)
{
    SqliteStatement insert;
    int rc = insert.prepare(db, sql);
    if (rc == SQLITE_OK) {
        bindAll(insert);
        rc = insert.step();
    }
    if (rc != SQLITE_DONE)
        return StoreResult<std::int64_t>::failure(sqliteFailure(db, rc, "cannot record the " + what + "; nothing was recorded"));
    return {sqlite3_last_insert_rowid(db)};
}

} // namespace

StoreStatus SessionStore::checkReading(const Reading &reading) const
{
    const bool mayLackValue = (reading.flags & (flagOverload | flagNotANumber)) != 0;
    if (!mayLackValue && (!std::isfinite(reading.currentA) || !std::isfinite(reading.voltageV)))
        return StoreStatus::failure(StoreCode::InvalidArgument,
                                    "reading: current and voltage must be finite numbers unless the reading is flagged "
                                    "overload or not-a-number");
    if (!isFiniteOrAbsent(reading.uCurrentA) || !isFiniteOrAbsent(reading.uVoltageV))
        return StoreStatus::failure(StoreCode::InvalidArgument, "reading: standard uncertainties must be finite and not negative");
    const PrimaryReading &p = reading.primary;
    for (const auto &[value, name] : {std::pair{&p.voltageV, "primary voltage"}, std::pair{&p.uVoltageV, "u(primary voltage)"},
                                      std::pair{&p.currentA, "primary current"}, std::pair{&p.uCurrentA, "u(primary current)"},
                                      std::pair{&p.powerW, "primary power"}, std::pair{&p.uPowerW, "u(primary power)"},
                                      std::pair{&p.powerFactor, "primary power factor"},
                                      std::pair{&p.uPowerFactor, "u(primary power factor)"},
                                      std::pair{&p.reactivePowerVar, "primary reactive power"},
                                      std::pair{&p.uReactivePowerVar, "u(primary reactive power)"}}) {
        if (!isFiniteOrAbsent(*value))
            return StoreStatus::failure(StoreCode::InvalidArgument,
                                        std::string("reading: ") + name + " must be a finite number, zero or above");
    }
    if (p.powerFactor && *p.powerFactor > 1.0)
        return StoreStatus::failure(StoreCode::InvalidArgument, "reading: primary power factor must be between 0 and 1");
    return StoreStatus::success();
}

namespace {

using storerows::isBlank;

const std::string insertReadingSql = std::string("INSERT INTO reading (") + storerows::readingColumns
                                     + ") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)";

} // namespace

StoreResult<std::int64_t> SessionStore::appendReading(const Reading &reading)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    if (StoreStatus status = checkReading(reading); !status.ok())
        return Result::failure(status);
    const std::string time = reading.timeUtc.empty() ? now() : reading.timeUtc;
    if (!reading.primary.hasAny())
        return insertRow(m_db.get(), insertReadingSql.c_str(), "reading",
                         [&](SqliteStatement &insert) { storerows::bindReading(insert, 1, reading, time, m_actor); });
    // With its primary side: both rows in one durable transaction, or neither.
    SqliteTransaction transaction(m_db.get());
    if (transaction.beginCode() != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), transaction.beginCode(), "cannot record the reading; nothing was recorded"));
    auto id = insertRow(m_db.get(), insertReadingSql.c_str(), "reading",
                        [&](SqliteStatement &insert) { storerows::bindReading(insert, 1, reading, time, m_actor); });
    if (!id.ok())
        return id;
    auto primary = insertRow(m_db.get(), storerows::insertPrimarySql, "reading's primary side",
                             [&](SqliteStatement &insert) { storerows::bindPrimary(insert, id.value, reading.primary); });
    if (!primary.ok())
        return primary;
    if (const int rc = transaction.commit(); rc != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the reading; nothing was recorded"));
    return id;
}

StoreResult<std::int64_t> SessionStore::insertExclusion(std::int64_t readingId, bool excluded, const std::string &reason,
                                                        const std::string &author)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    if (isBlank(reason))
        return Result::failure(StoreCode::InvalidArgument,
                               std::string(excluded ? "exclusion" : "restore") + ": a reason is required");
    if (isBlank(author))
        return Result::failure(StoreCode::InvalidArgument,
                               std::string(excluded ? "exclusion" : "restore") + ": the name of the person is required");
    SqliteStatement exists;
    int rc = exists.prepare(m_db.get(), "SELECT 1 FROM reading WHERE id = ?");
    if (rc == SQLITE_OK) {
        exists.bind(1, readingId);
        rc = exists.step();
    }
    if (rc == SQLITE_DONE)
        return Result::failure(StoreCode::NotFound, "reading " + std::to_string(readingId) + " does not exist in this session");
    if (rc != SQLITE_ROW)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot look up the reading"));
    const std::string time = now();
    return insertRow(m_db.get(), storerows::insertExclusionSql, excluded ? "exclusion" : "restore", [&](SqliteStatement &insert) {
                         insert.bind(1, readingId).bind(2, excluded ? 1 : 0).bind(3, reason).bind(4, author).bind(5, time);
                         insert.bind(6, m_actor.osAccount);
                     });
}

StoreResult<std::int64_t> SessionStore::excludeReading(std::int64_t readingId, const std::string &reason, const std::string &author)
{
    return insertExclusion(readingId, true, reason, author);
}

StoreResult<std::int64_t> SessionStore::restoreReading(std::int64_t readingId, const std::string &reason, const std::string &author)
{
    return insertExclusion(readingId, false, reason, author);
}

StoreResult<std::int64_t> SessionStore::recordTemperature(TemperatureKind kind, double celsius, const std::string &source)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    // Below absolute zero or above any insulation class is a typing error, not a temperature.
    if (!std::isfinite(celsius) || celsius < -273.15 || celsius > 1000.0)
        return Result::failure(StoreCode::InvalidArgument,
                               std::string(toString(kind)) + " temperature: must be between -273.15 and 1000 °C");
    const std::string time = now();
    return insertRow(m_db.get(),
                     "INSERT INTO temperature (time_utc, kind, value_c, source, person, os_account) VALUES (?, ?, ?, ?, ?, ?)",
                     "temperature", [&](SqliteStatement &insert) {
                         insert.bind(1, time).bind(2, std::string_view(toString(kind))).bind(3, celsius).bind(4, source);
                         insert.bind(5, m_actor.person).bind(6, m_actor.osAccount);
                     });
}

StoreResult<std::int64_t> SessionStore::recordInstrument(const std::string &role, const std::string &identity,
                                                         const std::string &accuracy)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    if (role.empty())
        return Result::failure(StoreCode::InvalidArgument, "instrument role: required (e.g. voltmeter, ammeter)");
    const std::string time = now();
    return insertRow(m_db.get(),
                     "INSERT INTO instrument (time_utc, role, identity, accuracy, person, os_account) VALUES (?, ?, ?, ?, ?, ?)",
                     "instrument", [&](SqliteStatement &insert) {
                         insert.bind(1, time).bind(2, role).bind(3, identity).bind(4, accuracy);
                         insert.bind(5, m_actor.person).bind(6, m_actor.osAccount);
                     });
}

StoreResult<std::int64_t> SessionStore::addNote(const std::string &author, const std::string &text)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    if (text.empty())
        return Result::failure(StoreCode::InvalidArgument, "note: the text is empty");
    const std::string time = now();
    return insertRow(m_db.get(), "INSERT INTO note (time_utc, author, text, person, os_account) VALUES (?, ?, ?, ?, ?)",
                     "note", [&](SqliteStatement &insert) {
                         insert.bind(1, time).bind(2, author).bind(3, text).bind(4, m_actor.person).bind(5, m_actor.osAccount);
                     });
}

StoreResult<std::int64_t> SessionStore::appendRetake(const Reading &reading, std::int64_t supersededId,
                                                     const std::string &reason)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    if (StoreStatus status = checkReading(reading); !status.ok())
        return Result::failure(status);
    if (isBlank(reason))
        return Result::failure(StoreCode::InvalidArgument, "retake: a reason is required (why the step is taken again)");
    SqliteTransaction transaction(m_db.get());
    if (transaction.beginCode() != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), transaction.beginCode(), "cannot record the retake"));
    SqliteStatement check;
    int rc = check.prepare(m_db.get(), "SELECT (SELECT count(*) FROM reading WHERE id = ?1), "
                                       "(SELECT count(*) FROM supersession WHERE reading_id = ?1)");
    if (rc == SQLITE_OK) {
        check.bind(1, supersededId);
        rc = check.step();
    }
    if (rc != SQLITE_ROW)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot look up the reading"));
    if (check.columnInt64(0) == 0)
        return Result::failure(StoreCode::NotFound, "reading " + std::to_string(supersededId) + " does not exist in this session");
    if (check.columnInt64(1) != 0)
        return Result::failure(StoreCode::InvalidArgument,
                               "retake: reading " + std::to_string(supersededId) + " was already superseded by a retake");
    const std::string time = reading.timeUtc.empty() ? now() : reading.timeUtc;
    SqliteStatement insert;
    rc = insert.prepare(m_db.get(), insertReadingSql);
    if (rc == SQLITE_OK) {
        storerows::bindReading(insert, 1, reading, time, m_actor);
        rc = insert.step();
    }
    if (rc != SQLITE_DONE)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the retake; nothing was recorded"));
    const std::int64_t newId = sqlite3_last_insert_rowid(m_db.get());
    SqliteStatement mark;
    rc = mark.prepare(m_db.get(), "INSERT INTO supersession (reading_id, replacement_id, reason, person, os_account, time_utc) "
                                  "VALUES (?, ?, ?, ?, ?, ?)");
    if (rc == SQLITE_OK) {
        mark.bind(1, supersededId).bind(2, newId).bind(3, reason).bind(4, m_actor.person).bind(5, m_actor.osAccount);
        mark.bind(6, time);
        rc = mark.step();
    }
    if (rc == SQLITE_DONE)
        rc = transaction.commit();
    if (rc != SQLITE_OK && rc != SQLITE_DONE)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the retake; nothing was recorded"));
    return newId;
}

StoreResult<std::int64_t> SessionStore::recordSweepEvent(SweepEventKind kind, int step, const std::string &detail)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    const std::string time = now();
    return insertRow(m_db.get(),
                     "INSERT INTO sweep_event (time_utc, kind, step, detail, person, os_account) VALUES (?, ?, ?, ?, ?, ?)",
                     "sweep event", [&](SqliteStatement &insert) {
                         insert.bind(1, time).bind(2, std::string_view(toString(kind))).bind(3, step).bind(4, detail);
                         insert.bind(5, m_actor.person).bind(6, m_actor.osAccount);
                     });
}

StoreResult<std::int64_t> SessionStore::recordSafetyStop(const SafetyStopRecord &stop)
{
    using Result = StoreResult<std::int64_t>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    if (stop.rule.empty())
        return Result::failure(StoreCode::InvalidArgument, "safety stop: the rule that stopped the sweep is required");
    const std::string time = now();
    return insertRow(m_db.get(),
                     "INSERT INTO safety_stop (time_utc, step, rule, message, measured, limit_value, person, os_account) "
                     "VALUES (?, ?, ?, ?, ?, ?, ?, ?)",
                     "safety stop", [&](SqliteStatement &insert) {
                         insert.bind(1, time).bind(2, stop.step).bind(3, stop.rule).bind(4, stop.message);
                         insert.bind(5, stop.measured).bind(6, stop.limitValue);
                         insert.bind(7, m_actor.person).bind(8, m_actor.osAccount);
                     });
}

} // namespace sagline
