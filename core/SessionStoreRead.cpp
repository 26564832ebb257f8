// Reading a session back. Values from the file are checked as they are read: the file may come
// from someone else, so a crafted value becomes a clear Corrupt status, never a silent NaN.
#include "SessionStore.h"

#include "SqliteStatement.h"

#include <sqlite3.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <unordered_map>

namespace sagline {

namespace {

// Runs a SELECT and calls `readRow` for each row; `readRow` returns "" or a reason to reject.
// `expectedRows` reserves the vector up front: growing a vector of 1e5 readings by doubling moved
// each one about twice and touched twice the memory (45 % of `fit SESSION` before, perf).
template <typename T, typename ReadRow>
StoreResult<std::vector<T>> selectAll(sqlite3 *db, const char *sql, const char *what, ReadRow readRow,
                                      std::int64_t expectedRows = 0)
{
    using Result = StoreResult<std::vector<T>>;
    SqliteStatement query;
    int rc = query.prepare(db, sql);
    if (rc != SQLITE_OK)
        return Result::failure(sqliteFailure(db, rc, std::string("cannot read the ") + what));
    Result result;
    result.value.reserve(static_cast<std::size_t>(std::max<std::int64_t>(expectedRows, 0)));
    while ((rc = query.step()) == SQLITE_ROW) {
        T record{};
        if (std::string problem = readRow(query, record); !problem.empty())
            return Result::failure(StoreCode::Corrupt, std::string(what) + " row " + std::to_string(query.columnInt64(0)) +
                                                           ": " + problem);
        result.value.push_back(std::move(record));
    }
    if (rc != SQLITE_DONE)
        return Result::failure(sqliteFailure(db, rc, std::string("cannot read the ") + what));
    return result;
}

std::optional<double> checkedUncertainty(const SqliteStatement &row, int column, std::string &problem)
{
    std::optional<double> value = row.columnOptionalDouble(column);
    if (value && (!std::isfinite(*value) || *value < 0.0))
        problem = "a standard uncertainty is not a finite, non-negative number";
    return value;
}

int checkedInt(const SqliteStatement &row, int column, std::string &problem)
{
    const std::int64_t value = row.columnInt64(column);
    if (value < std::numeric_limits<int>::min() || value > std::numeric_limits<int>::max())
        problem = "an integer field is out of range";
    return static_cast<int>(value);
}

} // namespace

StoreResult<SessionInfo> SessionStore::info() const
{
    SqliteStatement query;
    int rc = query.prepare(m_db.get(), "SELECT created_utc, software_version, operator, unit_serial, setup_json, plan_json, "
                                       "created_by, created_account FROM session WHERE id = 1");
    if (rc == SQLITE_OK)
        rc = query.step();
    if (rc == SQLITE_DONE)
        return StoreResult<SessionInfo>::failure(StoreCode::Corrupt, m_path + ": the session record is missing");
    if (rc != SQLITE_ROW)
        return StoreResult<SessionInfo>::failure(sqliteFailure(m_db.get(), rc, "cannot read the session record"));
    SessionInfo info;
    info.createdUtc = query.columnText(0);
    info.softwareVersion = query.columnText(1);
    info.operatorName = query.columnText(2);
    info.unitSerial = query.columnText(3);
    info.setupJson = query.columnText(4);
    info.planJson = query.columnText(5);
    info.createdBy = {query.columnText(6), query.columnText(7)};
    info.schemaVersion = m_fileVersion;
    return {std::move(info)};
}

StoreResult<std::vector<Reading>> SessionStore::readings() const
{
    // The latest exclusion row per reading decides (ids grow with time; nothing is deleted).
    // Exclusions are few: read them once rather than a subquery per reading.
    std::unordered_map<std::int64_t, bool> excludedById;
    {
        SqliteStatement query;
        int rc = query.prepare(m_db.get(), "SELECT reading_id, excluded FROM exclusion ORDER BY id");
        while (rc == SQLITE_OK && (rc = query.step()) == SQLITE_ROW) {
            excludedById[query.columnInt64(0)] = query.columnInt64(1) != 0;
            rc = SQLITE_OK;
        }
        if (rc != SQLITE_DONE)
            return StoreResult<std::vector<Reading>>::failure(sqliteFailure(m_db.get(), rc, "cannot read the exclusions"));
    }
    std::unordered_map<std::int64_t, bool> supersededById;
    {
        SqliteStatement query;
        int rc = query.prepare(m_db.get(), "SELECT reading_id FROM supersession");
        while (rc == SQLITE_OK && (rc = query.step()) == SQLITE_ROW) {
            supersededById[query.columnInt64(0)] = true;
            rc = SQLITE_OK;
        }
        if (rc != SQLITE_DONE)
            return StoreResult<std::vector<Reading>>::failure(sqliteFailure(m_db.get(), rc, "cannot read the retakes"));
    }
    const auto count = readingCount();
    if (!count.ok())
        return StoreResult<std::vector<Reading>>::failure(count.status());
    auto result = selectAll<Reading>(
        m_db.get(),
        "SELECT id, time_utc, step, current_a, voltage_v, u_current_a, u_voltage_v, flags, raw_text FROM reading ORDER BY id",
        "reading", [&excludedById, &supersededById](const SqliteStatement &row, Reading &reading) {
            std::string problem;
            reading.id = row.columnInt64(0);
            reading.timeUtc = row.columnText(1);
            reading.step = checkedInt(row, 2, problem);
            const std::int64_t flags = row.columnInt64(7);
            if (flags < 0 || flags > std::numeric_limits<std::uint32_t>::max())
                return std::string("flags out of range");
            reading.flags = static_cast<std::uint32_t>(flags);
            const bool mayLackValue = (reading.flags & (flagOverload | flagNotANumber)) != 0;
            // SQLite would read text in a numeric column as 0: a crafted "12 A" must not become 0 A.
            for (const auto &[column, name] : {std::pair{3, "current_a"}, std::pair{4, "voltage_v"},
                                               std::pair{5, "u_current_a"}, std::pair{6, "u_voltage_v"}}) {
                const int type = row.columnType(column);
                if (type != SQLITE_INTEGER && type != SQLITE_FLOAT && type != SQLITE_NULL)
                    return std::string(name) + " holds text or bytes, not a number";
            }
            const auto current = row.columnOptionalDouble(3);
            const auto voltage = row.columnOptionalDouble(4);
            const bool finite = current && voltage && std::isfinite(*current) && std::isfinite(*voltage);
            if (!finite && !mayLackValue)
                return std::string("current or voltage missing or not finite, and not flagged overload or not-a-number");
            reading.currentA = current && std::isfinite(*current) ? *current : std::numeric_limits<double>::quiet_NaN();
            reading.voltageV = voltage && std::isfinite(*voltage) ? *voltage : std::numeric_limits<double>::quiet_NaN();
            reading.uCurrentA = checkedUncertainty(row, 5, problem);
            reading.uVoltageV = checkedUncertainty(row, 6, problem);
            reading.rawText = row.columnText(8);
            const auto exclusion = excludedById.find(reading.id);
            reading.superseded = supersededById.count(reading.id) != 0;
            reading.excluded = (exclusion != excludedById.end() && exclusion->second) || reading.superseded;
            return problem;
        },
        count.value);
    if (result.ok()) {
        if (StoreStatus status = attachPrimarySides(result.value); !status.ok())
            return StoreResult<std::vector<Reading>>::failure(status);
    }
    return result;
}

StoreStatus SessionStore::attachPrimarySides(std::vector<Reading> &readings) const
{
    SqliteStatement query;
    int rc = query.prepare(m_db.get(), "SELECT id, voltage_v, u_voltage_v, current_a, u_current_a, power_w, u_power_w, "
                                       "power_factor, u_power_factor, reactive_power_var, u_reactive_power_var "
                                       "FROM primary_reading ORDER BY id");
    if (rc != SQLITE_OK)
        return sqliteFailure(m_db.get(), rc, "cannot read the primary-side readings");
    std::size_t next = 0; // both lists ascend by id: one merge walk
    while ((rc = query.step()) == SQLITE_ROW) {
        const std::int64_t id = query.columnInt64(0);
        const std::string where = "primary_reading row " + std::to_string(id) + ": ";
        while (next < readings.size() && readings[next].id < id)
            ++next;
        if (next == readings.size() || readings[next].id != id)
            return StoreStatus::failure(StoreCode::Corrupt, where + "belongs to no reading");
        PrimaryReading &p = readings[next].primary;
        std::optional<double> *fields[] = {&p.voltageV, &p.uVoltageV, &p.currentA, &p.uCurrentA, &p.powerW,
                                           &p.uPowerW, &p.powerFactor, &p.uPowerFactor, &p.reactivePowerVar,
                                           &p.uReactivePowerVar};
        for (int column = 1; column <= 10; ++column) {
            const int type = query.columnType(column);
            if (type != SQLITE_INTEGER && type != SQLITE_FLOAT && type != SQLITE_NULL)
                return StoreStatus::failure(StoreCode::Corrupt, where + "holds text or bytes, not a number");
            const auto value = query.columnOptionalDouble(column);
            // Every primary value is an RMS quantity, a power drawn, or its uncertainty: >= 0.
            if (value && (!std::isfinite(*value) || *value < 0.0))
                return StoreStatus::failure(StoreCode::Corrupt, where + "a value is not a finite number, zero or above");
            *fields[column - 1] = value;
        }
        if (p.powerFactor && *p.powerFactor > 1.0)
            return StoreStatus::failure(StoreCode::Corrupt, where + "a power factor above 1");
    }
    if (rc != SQLITE_DONE)
        return sqliteFailure(m_db.get(), rc, "cannot read the primary-side readings");
    return StoreStatus::success();
}

StoreResult<std::vector<Reading>> SessionStore::includedReadings() const
{
    auto all = readings();
    if (!all.ok())
        return all;
    std::erase_if(all.value, [](const Reading &reading) { return reading.excluded; });
    return all;
}

StoreResult<std::int64_t> SessionStore::readingCount() const
{
    SqliteStatement query;
    int rc = query.prepare(m_db.get(), "SELECT count(*) FROM reading");
    if (rc == SQLITE_OK)
        rc = query.step();
    if (rc != SQLITE_ROW)
        return StoreResult<std::int64_t>::failure(sqliteFailure(m_db.get(), rc, "cannot count the readings"));
    return {query.columnInt64(0)};
}

StoreResult<std::vector<ExclusionRecord>> SessionStore::exclusions() const
{
    return selectAll<ExclusionRecord>(m_db.get(),
                                      "SELECT id, reading_id, excluded, reason, author, time_utc, os_account FROM exclusion ORDER BY id",
                                      "exclusion", [](const SqliteStatement &row, ExclusionRecord &record) {
                                          record.id = row.columnInt64(0);
                                          record.readingId = row.columnInt64(1);
                                          record.excluded = row.columnInt64(2) != 0;
                                          record.reason = row.columnText(3);
                                          record.author = row.columnText(4);
                                          record.timeUtc = row.columnText(5);
                                          record.osAccount = row.columnText(6);
                                          return std::string();
                                      });
}

StoreResult<std::vector<TemperatureRecord>> SessionStore::temperatures() const
{
    return selectAll<TemperatureRecord>(m_db.get(), "SELECT id, time_utc, kind, value_c, source, person, os_account FROM temperature ORDER BY id",
                                        "temperature", [](const SqliteStatement &row, TemperatureRecord &record) {
                                            record.id = row.columnInt64(0);
                                            record.timeUtc = row.columnText(1);
                                            const std::string kind = row.columnText(2);
                                            if (kind != "ambient" && kind != "winding")
                                                return "unknown kind '" + kind + "'";
                                            record.kind = kind == "winding" ? TemperatureKind::Winding : TemperatureKind::Ambient;
                                            record.celsius = row.columnDouble(3);
                                            if (!std::isfinite(record.celsius))
                                                return std::string("the temperature is not a finite number");
                                            record.source = row.columnText(4);
                                            record.actor = {row.columnText(5), row.columnText(6)};
                                            return std::string();
                                        });
}

StoreResult<std::vector<InstrumentRecord>> SessionStore::instruments() const
{
    return selectAll<InstrumentRecord>(m_db.get(), "SELECT id, time_utc, role, identity, accuracy, person, os_account FROM instrument ORDER BY id",
                                       "instrument", [](const SqliteStatement &row, InstrumentRecord &record) {
                                           record.id = row.columnInt64(0);
                                           record.timeUtc = row.columnText(1);
                                           record.role = row.columnText(2);
                                           record.identity = row.columnText(3);
                                           record.accuracy = row.columnText(4);
                                           record.actor = {row.columnText(5), row.columnText(6)};
                                           return std::string();
                                       });
}

StoreResult<std::vector<NoteRecord>> SessionStore::notes() const
{
    return selectAll<NoteRecord>(m_db.get(), "SELECT id, time_utc, author, text, person, os_account FROM note ORDER BY id", "note",
                                 [](const SqliteStatement &row, NoteRecord &record) {
                                     record.id = row.columnInt64(0);
                                     record.timeUtc = row.columnText(1);
                                     record.author = row.columnText(2);
                                     record.text = row.columnText(3);
                                     record.actor = {row.columnText(4), row.columnText(5)};
                                     return std::string();
                                 });
}

StoreResult<std::vector<SafetyStopRecord>> SessionStore::safetyStops() const
{
    return selectAll<SafetyStopRecord>(
        m_db.get(), "SELECT id, time_utc, step, rule, message, measured, limit_value, person, os_account FROM safety_stop ORDER BY id",
        "safety stop",
        [](const SqliteStatement &row, SafetyStopRecord &record) {
            std::string problem;
            record.id = row.columnInt64(0);
            record.timeUtc = row.columnText(1);
            record.step = checkedInt(row, 2, problem);
            record.rule = row.columnText(3);
            record.message = row.columnText(4);
            record.measured = row.columnOptionalDouble(5);
            record.limitValue = row.columnOptionalDouble(6);
            record.actor = {row.columnText(7), row.columnText(8)};
            return problem;
        });
}

StoreResult<std::vector<SignOffRecord>> SessionStore::signOffs() const
{
    return selectAll<SignOffRecord>(m_db.get(), "SELECT id, time_utc, reviewer, verdict, comment, os_account, digest, content_marks FROM sign_off ORDER BY id",
                                    "sign-off", [](const SqliteStatement &row, SignOffRecord &record) {
                                        record.id = row.columnInt64(0);
                                        record.timeUtc = row.columnText(1);
                                        record.reviewer = row.columnText(2);
                                        const std::string verdict = row.columnText(3);
                                        const auto parsed = reviewDecisionFromString(verdict);
                                        if (!parsed)
                                            return "unknown verdict '" + verdict + "'";
                                        record.decision = *parsed;
                                        record.comment = row.columnText(4);
                                        record.osAccount = row.columnText(5);
                                        record.digest = row.columnText(6);
                                        record.contentMarks = row.columnText(7);
                                        return std::string();
                                    });
}

StoreResult<ReadingRecorders> SessionStore::readingRecorders() const
{
    using Result = StoreResult<ReadingRecorders>;
    SqliteStatement query;
    int rc = query.prepare(m_db.get(), "SELECT person, os_account FROM reading ORDER BY id");
    Result result;
    ReadingRecorders &recorders = result.value; // 4 bytes a reading: growing is cheap, no count needed
    // Readings come in runs by one person: the previous reading's recorder is tried first, the
    // map only on a change (a hostile file with a new name on every row stays linear).
    std::unordered_map<std::string, std::uint32_t> indexOf;
    while (rc == SQLITE_OK && (rc = query.step()) == SQLITE_ROW) {
        const std::string_view person = query.columnTextView(0);
        const std::string_view account = query.columnTextView(1);
        std::uint32_t index = recorders.byReading.empty() ? 0 : recorders.byReading.back();
        if (recorders.distinct.empty() || recorders.distinct[index].person != person
            || recorders.distinct[index].osAccount != account) {
            // The person's length first, so that no two (person, account) pairs share a key.
            std::string key = std::to_string(person.size()) + ':';
            key.append(person).append(account);
            const auto [at, added] = indexOf.try_emplace(std::move(key), static_cast<std::uint32_t>(recorders.distinct.size()));
            if (added)
                recorders.distinct.push_back({std::string(person), std::string(account)});
            index = at->second;
        }
        recorders.byReading.push_back(index);
        rc = SQLITE_OK;
    }
    if (rc != SQLITE_DONE)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot read who recorded the readings"));
    return result;
}

StoreResult<std::vector<SupersessionRecord>> SessionStore::supersessions() const
{
    return selectAll<SupersessionRecord>(
        m_db.get(), "SELECT id, reading_id, replacement_id, reason, person, os_account, time_utc FROM supersession ORDER BY id",
        "retake", [](const SqliteStatement &row, SupersessionRecord &record) {
            record.id = row.columnInt64(0);
            record.readingId = row.columnInt64(1);
            record.replacementId = row.columnInt64(2);
            record.reason = row.columnText(3);
            record.actor = {row.columnText(4), row.columnText(5)};
            record.timeUtc = row.columnText(6);
            return std::string();
        });
}

StoreResult<std::vector<SweepEventRecord>> SessionStore::sweepEvents() const
{
    return selectAll<SweepEventRecord>(
        m_db.get(), "SELECT id, time_utc, kind, step, detail, person, os_account FROM sweep_event ORDER BY id", "sweep event",
        [](const SqliteStatement &row, SweepEventRecord &record) {
            std::string problem;
            record.id = row.columnInt64(0);
            record.timeUtc = row.columnText(1);
            const std::string kind = row.columnText(2);
            const auto parsed = sweepEventKindFromString(kind);
            if (!parsed)
                return "unknown kind '" + kind + "'";
            record.kind = *parsed;
            record.step = checkedInt(row, 3, problem);
            record.detail = row.columnText(4);
            record.actor = {row.columnText(5), row.columnText(6)};
            return problem;
        });
}

StoreResult<std::vector<ReopenRecord>> SessionStore::reopens() const
{
    return selectAll<ReopenRecord>(m_db.get(),
                                   "SELECT id, time_utc, sign_off_id, reason, person, os_account FROM reopen ORDER BY id",
                                   "reopen", [](const SqliteStatement &row, ReopenRecord &record) {
                                       record.id = row.columnInt64(0);
                                       record.timeUtc = row.columnText(1);
                                       record.signOffId = row.columnInt64(2);
                                       record.reason = row.columnText(3);
                                       record.actor = {row.columnText(4), row.columnText(5)};
                                       return std::string();
                                   });
}

} // namespace sagline
