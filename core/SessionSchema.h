// The session file's schema: its identity (application_id), version (user_version), the
// baseline of version 1 and the forward migrations to the current version, and the check
// that an opened file carries only what this schema expects.
//
// A new file is built exactly like an old one is upgraded: baseline, then every migration in
// order, so the migration path is exercised by every session ever created.
#pragma once

#include "StoreResult.h"

#include <cstdint>

struct sqlite3;

namespace sagline {

// "SGLN" in the database header at offset 68, so file(1) and our opener can tell a session.
inline constexpr std::uint32_t sessionApplicationId = 0x53474C4Eu;
// The schema version this build writes. History:
//   1  session, temperature, instrument, reading, exclusion, note, safety_stop
//   2  sign_off (review sign-offs); index on exclusion(reading_id)
//   3  person and OS account on every record; sealed sign-offs (digest, content marks);
//      supersession (retakes), sweep_event, reopen
//   4  primary_reading (primary voltage, current, active power, power factor, reactive power,
//      each nullable with its standard uncertainty)
inline constexpr int sessionSchemaVersion = 4;

// Creates the current schema in an empty database, inside the caller's transaction.
StoreStatus createSessionSchema(sqlite3 *db);
// Creates only the version-1 baseline (tests build old files with it).
StoreStatus createBaselineSchema(sqlite3 *db);
// Upgrades from `fromVersion` (1 ≤ fromVersion < current) to the current version, inside the
// caller's transaction; sets user_version.
StoreStatus migrateSessionSchema(sqlite3 *db, int fromVersion);

// Checks sqlite_schema against the version's expectations: no triggers, no views, no virtual
// tables, and (for versions this build knows) no tables or indexes it did not create, and all
// of its tables present. Newer versions may add tables and indexes, so only the first three
// rules apply to them.
StoreStatus verifySessionSchema(sqlite3 *db, int version);

} // namespace sagline
