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

} // namespace sagline
