// Private in-memory copies of a session, so that reviewing a file never writes to it: one for
// upgrading an older schema, one for recovering a file a crash left with a hot journal.
#pragma once

#include "SqliteHandle.h"
#include "StoreResult.h"

#include <string>

namespace sagline {

// Copies the whole database behind `source` into a new, hardened in-memory connection (backup API).
StoreResult<SqliteHandle> copyIntoMemory(sqlite3 *source);

// For a file with a hot journal beside it: copies file and journal into a private temporary
// folder, lets SQLite roll the copy back, checks it, and returns it in memory. The original
// file and journal are only read.
StoreResult<SqliteHandle> recoverIntoMemory(const std::string &path);

// True when the file's header says write-ahead-log mode (bytes 18 and 19 are 2). Sagline never
// writes such files; reading one in place would leave -wal and -shm files beside it.
bool isWalModeFile(const std::string &path);

// The whole file read into a private, hardened in-memory database, its header switched to the
// rollback journal, so nothing is created beside the file. A -wal file beside it is not read.
StoreResult<SqliteHandle> copyFileIntoMemory(const std::string &path);

} // namespace sagline
