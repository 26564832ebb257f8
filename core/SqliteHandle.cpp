#include "SqliteHandle.h"

#include <sqlite3.h>

namespace sagline {

void SqliteCloser::operator()(sqlite3 *db) const noexcept
{
    sqlite3_close_v2(db);
}

const char *toString(StoreCode code)
{
    switch (code) {
    case StoreCode::Ok: return "ok";
    case StoreCode::InvalidArgument: return "invalid argument";
    case StoreCode::FileExists: return "file exists";
    case StoreCode::CannotOpen: return "cannot open";
    case StoreCode::NotASession: return "not a session";
    case StoreCode::Corrupt: return "corrupt";
    case StoreCode::NewerVersion: return "newer version";
    case StoreCode::UnexpectedSchema: return "unexpected schema";
    case StoreCode::ReadOnly: return "read-only";
    case StoreCode::NotFound: return "not found";
    case StoreCode::Busy: return "busy";
    case StoreCode::IoError: return "I/O error";
    case StoreCode::Sealed: return "signed off";
    }
    return "unknown";
}

StoreCode storeCodeFromSqlite(int rc)
{
    switch (rc & 0xff) {
    case SQLITE_OK:
    case SQLITE_ROW:
    case SQLITE_DONE: return StoreCode::Ok;
    case SQLITE_FULL:
    case SQLITE_IOERR:
    case SQLITE_NOMEM:
    case SQLITE_NOLFS: return StoreCode::IoError;
    case SQLITE_CANTOPEN:
    case SQLITE_PERM:
    case SQLITE_AUTH: return StoreCode::CannotOpen;
    case SQLITE_READONLY: return StoreCode::ReadOnly;
    case SQLITE_CORRUPT:
    case SQLITE_FORMAT:
    case SQLITE_TOOBIG: return StoreCode::Corrupt;
    case SQLITE_NOTADB: return StoreCode::NotASession;
    case SQLITE_BUSY:
    case SQLITE_LOCKED: return StoreCode::Busy;
    case SQLITE_CONSTRAINT:
    case SQLITE_MISMATCH:
    case SQLITE_RANGE: return StoreCode::InvalidArgument;
    case SQLITE_ERROR:
    case SQLITE_SCHEMA: return StoreCode::UnexpectedSchema;
    default: return StoreCode::IoError;
    }
}

StoreStatus sqliteFailure(sqlite3 *db, int rc, const std::string &what)
{
    std::string detail = db != nullptr && sqlite3_errcode(db) == rc ? sqlite3_errmsg(db) : sqlite3_errstr(rc);
    return StoreStatus::failure(storeCodeFromSqlite(rc), what + ": " + detail);
}

int sqliteExec(sqlite3 *db, const char *sql)
{
    return sqlite3_exec(db, sql, nullptr, nullptr, nullptr);
}

SqliteTransaction::SqliteTransaction(sqlite3 *db)
    : m_db(db), m_beginCode(sqliteExec(db, "BEGIN IMMEDIATE"))
{
    m_open = m_beginCode == SQLITE_OK;
}

SqliteTransaction::~SqliteTransaction()
{
    // A failed statement may already have rolled back; ROLLBACK then reports "no transaction".
    if (m_open && sqlite3_get_autocommit(m_db) == 0)
        sqliteExec(m_db, "ROLLBACK");
}

int SqliteTransaction::commit()
{
    if (!m_open)
        return m_beginCode != SQLITE_OK ? m_beginCode : SQLITE_MISUSE;
    const int rc = sqliteExec(m_db, "COMMIT");
    if (rc == SQLITE_OK)
        m_open = false;
    return rc;
}

} // namespace sagline
