// Checks made on a session file before and right after SQLite opens it: the 100-byte header
// read by hand (so a file that is not ours is rejected before SQLite parses anything), and the
// hardening of a connection to an untrusted file (sqlite.org security.html).
#pragma once

#include "SqliteHandle.h"
#include "StoreResult.h"

#include <string>

struct sqlite3;

namespace sagline {

// Reads the SQLite header of `path`: magic string, page size, application_id, and the page
// count against the file size (a truncated file is Corrupt). A hot journal beside the file
// makes the size check wait for SQLite's recovery.
StoreStatus checkSessionFileHeader(const std::string &path);

// Defensive mode, trusted_schema off, triggers and views off, cell_size_check on, mmap off,
// a length limit and a busy timeout. Every call's result is checked.
StoreStatus hardenConnection(sqlite3 *db);

// sqlite3_open_v2 with `flags` (SQLITE_OPEN_*), then hardenConnection.
StoreResult<SqliteHandle> openHardenedConnection(const std::string &path, int flags);

// PRAGMA quick_check: ok, or Corrupt naming SQLite's first finding.
StoreStatus quickCheck(sqlite3 *db, bool full = false);

} // namespace sagline
