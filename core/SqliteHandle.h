// RAII ownership of an sqlite3 connection, and the mapping from SQLite result codes to StoreCode.
#pragma once

#include "StoreResult.h"

#include <memory>
#include <string>

struct sqlite3;

namespace sagline {

struct SqliteCloser {
    void operator()(sqlite3 *db) const noexcept; // sqlite3_close_v2: finalizes lazily, never leaks
};
using SqliteHandle = std::unique_ptr<sqlite3, SqliteCloser>;

// Maps an SQLite primary/extended result code to the store's code (IOERR/FULL -> IoError, ...).
StoreCode storeCodeFromSqlite(int rc);
// A failed status from an SQLite result code: "<what>: <sqlite message> (<code name>)".
StoreStatus sqliteFailure(sqlite3 *db, int rc, const std::string &what);
// Runs SQL without results (pragmas, DDL, BEGIN/COMMIT); SQLITE_OK or the error code.
int sqliteExec(sqlite3 *db, const char *sql);

// BEGIN IMMEDIATE ... COMMIT; rolls back in the destructor unless commit() succeeded.
class SqliteTransaction {
public:
    explicit SqliteTransaction(sqlite3 *db);
    ~SqliteTransaction();
    SqliteTransaction(const SqliteTransaction &) = delete;
    SqliteTransaction &operator=(const SqliteTransaction &) = delete;

    int beginCode() const { return m_beginCode; } // SQLITE_OK when the transaction is open
    int commit();                                 // SQLITE_OK when durably committed

private:
    sqlite3 *m_db;
    int m_beginCode;
    bool m_open = false;
};

} // namespace sagline
