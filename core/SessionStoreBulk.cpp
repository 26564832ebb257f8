// Appending many readings at once (the import of a long log): one transaction, INSERTs of up
// to 64 readings each with the ids assigned here (so each reading's id is known without
// asking SQLite row by row), every text bound without a copy, and the exclusions the file
// marked written in the same transaction. A million readings: one commit, about 0.6 s of
// SQLite's time on the development machine instead of 0.8 s one row per step.
#include "SessionStore.h"

#include "SessionStoreRows.h"
#include "SqliteStatement.h"

#include <sqlite3.h>

#include <algorithm>
#include <limits>

namespace sagline {

namespace {

constexpr std::size_t readingsPerInsert = 64; // 704 parameters, far below SQLite's limit
constexpr int parametersPerReading = 1 + storerows::readingParameters; // the id, then the columns

std::string insertReadingsSql(std::size_t rows)
{
    std::string sql = std::string("INSERT INTO reading (id, ") + storerows::readingColumns + ") VALUES ";
    for (std::size_t row = 0; row < rows; ++row)
        sql += row ? ", (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)" : "(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)";
    return sql;
}

} // namespace

StoreResult<std::vector<std::int64_t>> SessionStore::appendReadings(const std::vector<Reading> &readings,
                                                                    const MarkedExclusions *marked)
{
    using Result = StoreResult<std::vector<std::int64_t>>;
    if (StoreStatus status = requireUnsealed(); !status.ok())
        return Result::failure(status);
    for (std::size_t i = 0; i < readings.size(); ++i) {
        if (StoreStatus status = checkReading(readings[i]); !status.ok())
            return Result::failure(status.code, "reading " + std::to_string(i + 1) + " of " +
                                                    std::to_string(readings.size()) + ": " + status.message);
    }
    // The marked exclusions with their reasons, checked before anything is written.
    std::vector<std::pair<std::size_t, std::string>> exclusions;
    if (marked && storerows::isBlank(marked->author))
        return Result::failure(StoreCode::InvalidArgument, "exclusion: the name of the person is required");
    for (std::size_t i = 0; marked && i < readings.size(); ++i) {
        if (!readings[i].excluded)
            continue;
        exclusions.emplace_back(i, marked->reason(i));
        if (storerows::isBlank(exclusions.back().second))
            return Result::failure(StoreCode::InvalidArgument,
                                   "reading " + std::to_string(i + 1) + ": exclusion: a reason is required");
    }
    SqliteTransaction transaction(m_db.get());
    if (transaction.beginCode() != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), transaction.beginCode(), "cannot record the readings"));

    // The ids SQLite would give, one after the largest so far, assigned here.
    SqliteStatement largest;
    int rc = largest.prepare(m_db.get(), "SELECT coalesce(max(id), 0) FROM reading");
    if (rc == SQLITE_OK)
        rc = largest.step();
    if (rc != SQLITE_ROW)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the readings"));
    const std::int64_t first = largest.columnInt64(0) + 1;
    if (first <= 0 || std::numeric_limits<std::int64_t>::max() - first < static_cast<std::int64_t>(readings.size()))
        return Result::failure(StoreCode::Corrupt, "cannot record the readings: the reading ids are used up");

    const std::string stamp = now();
    std::vector<std::int64_t> ids(readings.size());
    SqliteStatement insert;
    std::size_t preparedRows = 0;
    rc = SQLITE_OK;
    for (std::size_t start = 0; start < readings.size() && rc == SQLITE_OK; start += readingsPerInsert) {
        const std::size_t rows = std::min(readingsPerInsert, readings.size() - start);
        if (rows != preparedRows) { // the first batch, and a shorter last one
            rc = insert.prepare(m_db.get(), insertReadingsSql(rows));
            preparedRows = rows;
            if (rc != SQLITE_OK)
                break;
        }
        for (std::size_t row = 0; row < rows; ++row) {
            const std::size_t i = start + row;
            const Reading &reading = readings[i];
            const int at = static_cast<int>(row) * parametersPerReading + 1;
            ids[i] = first + static_cast<std::int64_t>(i);
            insert.bind(at, ids[i]);
            storerows::bindReading(insert, at + 1, reading, reading.timeUtc.empty() ? stamp : reading.timeUtc, m_actor);
        }
        rc = insert.step();
        if (rc == SQLITE_DONE)
            rc = SQLITE_OK;
        insert.resetKeepingBindings();
    }
    if (rc == SQLITE_OK)
        rc = insertPrimarySides(readings, ids);
    if (rc == SQLITE_OK && !exclusions.empty())
        rc = insertExclusions(exclusions, ids, marked->author, stamp);
    if (rc == SQLITE_OK)
        rc = transaction.commit();
    if (rc != SQLITE_OK)
        return Result::failure(sqliteFailure(m_db.get(), rc, "cannot record the readings; none was recorded"));
    return ids;
}

int SessionStore::insertPrimarySides(const std::vector<Reading> &readings, const std::vector<std::int64_t> &ids)
{
    SqliteStatement insert;
    for (std::size_t i = 0; i < readings.size(); ++i) {
        if (!readings[i].primary.hasAny())
            continue;
        if (!insert.isValid()) {
            if (const int rc = insert.prepare(m_db.get(), storerows::insertPrimarySql); rc != SQLITE_OK)
                return rc;
        }
        storerows::bindPrimary(insert, ids[i], readings[i].primary);
        if (const int rc = insert.step(); rc != SQLITE_DONE)
            return rc;
        insert.resetKeepingBindings();
    }
    return SQLITE_OK;
}

int SessionStore::insertExclusions(const std::vector<std::pair<std::size_t, std::string>> &exclusions,
                                   const std::vector<std::int64_t> &ids, const std::string &author,
                                   const std::string &stamp)
{
    SqliteStatement exclude;
    int rc = exclude.prepare(m_db.get(), storerows::insertExclusionSql);
    if (rc != SQLITE_OK)
        return rc;
    exclude.bind(2, 1).bindUncopied(4, author).bindUncopied(5, stamp).bindUncopied(6, m_actor.osAccount);
    for (const auto &[index, reason] : exclusions) {
        exclude.bind(1, ids[index]).bindUncopied(3, reason);
        rc = exclude.step();
        if (rc != SQLITE_DONE)
            return rc;
        exclude.resetKeepingBindings();
    }
    return SQLITE_OK;
}

} // namespace sagline
