#include "SessionSchema.h"

#include "SqliteHandle.h"
#include "SqliteStatement.h"

#include <sqlite3.h>

#include <algorithm>
#include <array>
#include <string>
#include <vector>

namespace sagline {

namespace {

// Version 1. Append-only by design: the store issues INSERT and SELECT only; an exclusion, a
// restore or a correction is a new row. Times are ISO 8601 UTC text; values are SI units.
constexpr const char *baselineSql = R"sql(
CREATE TABLE session (
    id INTEGER PRIMARY KEY CHECK (id = 1),
    created_utc TEXT NOT NULL,
    software_version TEXT NOT NULL,
    operator TEXT NOT NULL,
    unit_serial TEXT NOT NULL,
    setup_json TEXT NOT NULL,
    plan_json TEXT NOT NULL
);
CREATE TABLE temperature (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    kind TEXT NOT NULL CHECK (kind IN ('ambient', 'winding')),
    value_c REAL NOT NULL,
    source TEXT NOT NULL
);
CREATE TABLE instrument (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    role TEXT NOT NULL,
    identity TEXT NOT NULL,
    accuracy TEXT NOT NULL
);
CREATE TABLE reading (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    step INTEGER NOT NULL,
    current_a REAL,
    voltage_v REAL,
    u_current_a REAL,
    u_voltage_v REAL,
    flags INTEGER NOT NULL,
    raw_text TEXT NOT NULL
);
CREATE TABLE exclusion (
    id INTEGER PRIMARY KEY,
    reading_id INTEGER NOT NULL REFERENCES reading(id),
    excluded INTEGER NOT NULL CHECK (excluded IN (0, 1)),
    reason TEXT NOT NULL,
    author TEXT NOT NULL,
    time_utc TEXT NOT NULL
);
CREATE TABLE note (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    author TEXT NOT NULL,
    text TEXT NOT NULL
);
CREATE TABLE safety_stop (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    step INTEGER NOT NULL,
    rule TEXT NOT NULL,
    message TEXT NOT NULL,
    measured REAL,
    limit_value REAL
);
)sql";

struct Migration {
    int toVersion;
    const char *sql;
};

constexpr std::array<Migration, 3> migrations{{
    {2, R"sql(
CREATE TABLE sign_off (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    reviewer TEXT NOT NULL,
    verdict TEXT NOT NULL,
    comment TEXT NOT NULL
);
CREATE INDEX exclusion_by_reading ON exclusion(reading_id);
)sql"},
    // Who did what (person and OS account on every record), sealed sign-offs, retakes, the
    // sweep's own events and reopening a signed session. Old rows get "" (not recorded).
    {3, R"sql(
ALTER TABLE session ADD COLUMN created_by TEXT NOT NULL DEFAULT '';
ALTER TABLE session ADD COLUMN created_account TEXT NOT NULL DEFAULT '';
ALTER TABLE temperature ADD COLUMN person TEXT NOT NULL DEFAULT '';
ALTER TABLE temperature ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE instrument ADD COLUMN person TEXT NOT NULL DEFAULT '';
ALTER TABLE instrument ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE reading ADD COLUMN person TEXT NOT NULL DEFAULT '';
ALTER TABLE reading ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE exclusion ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE note ADD COLUMN person TEXT NOT NULL DEFAULT '';
ALTER TABLE note ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE safety_stop ADD COLUMN person TEXT NOT NULL DEFAULT '';
ALTER TABLE safety_stop ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE sign_off ADD COLUMN os_account TEXT NOT NULL DEFAULT '';
ALTER TABLE sign_off ADD COLUMN digest TEXT NOT NULL DEFAULT '';
ALTER TABLE sign_off ADD COLUMN content_marks TEXT NOT NULL DEFAULT '';
CREATE TABLE supersession (
    id INTEGER PRIMARY KEY,
    reading_id INTEGER NOT NULL REFERENCES reading(id),
    replacement_id INTEGER NOT NULL REFERENCES reading(id),
    reason TEXT NOT NULL,
    person TEXT NOT NULL,
    os_account TEXT NOT NULL,
    time_utc TEXT NOT NULL
);
CREATE TABLE sweep_event (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    kind TEXT NOT NULL,
    step INTEGER NOT NULL,
    detail TEXT NOT NULL,
    person TEXT NOT NULL,
    os_account TEXT NOT NULL
);
CREATE TABLE reopen (
    id INTEGER PRIMARY KEY,
    time_utc TEXT NOT NULL,
    sign_off_id INTEGER NOT NULL REFERENCES sign_off(id),
    reason TEXT NOT NULL,
    person TEXT NOT NULL,
    os_account TEXT NOT NULL
);
)sql"},
    // The primary side as data: what the supply-side meters read with a reading, each nullable,
    // with its standard uncertainty. `id` is the reading's id (one row per reading at most).
    {4, R"sql(
CREATE TABLE primary_reading (
    id INTEGER PRIMARY KEY REFERENCES reading(id),
    voltage_v REAL,
    u_voltage_v REAL,
    current_a REAL,
    u_current_a REAL,
    power_w REAL,
    u_power_w REAL,
    power_factor REAL,
    u_power_factor REAL,
    reactive_power_var REAL,
    u_reactive_power_var REAL
);
)sql"},
}};

struct SchemaObject {
    const char *type;
    const char *name;
    int sinceVersion;
};

constexpr std::array<SchemaObject, 13> expectedObjects{{
    {"table", "session", 1},
    {"table", "temperature", 1},
    {"table", "instrument", 1},
    {"table", "reading", 1},
    {"table", "exclusion", 1},
    {"table", "note", 1},
    {"table", "safety_stop", 1},
    {"table", "sign_off", 2},
    {"index", "exclusion_by_reading", 2},
    {"table", "supersession", 3},
    {"table", "sweep_event", 3},
    {"table", "reopen", 3},
    {"table", "primary_reading", 4},
}};

StoreStatus setUserVersion(sqlite3 *db, int version)
{
    const std::string sql = "PRAGMA user_version = " + std::to_string(version);
    const int rc = sqliteExec(db, sql.c_str());
    return rc == SQLITE_OK ? StoreStatus::success() : sqliteFailure(db, rc, "setting the schema version");
}

} // namespace

StoreStatus createBaselineSchema(sqlite3 *db)
{
    int rc = sqliteExec(db, baselineSql);
    if (rc != SQLITE_OK)
        return sqliteFailure(db, rc, "creating the session tables");
    const std::string appId = "PRAGMA application_id = " + std::to_string(static_cast<std::int32_t>(sessionApplicationId));
    rc = sqliteExec(db, appId.c_str());
    if (rc != SQLITE_OK)
        return sqliteFailure(db, rc, "setting the application id");
    return setUserVersion(db, 1);
}

StoreStatus createSessionSchema(sqlite3 *db)
{
    if (StoreStatus status = createBaselineSchema(db); !status.ok())
        return status;
    return migrateSessionSchema(db, 1);
}

StoreStatus migrateSessionSchema(sqlite3 *db, int fromVersion)
{
    if (fromVersion < 1 || fromVersion > sessionSchemaVersion)
        return StoreStatus::failure(StoreCode::InvalidArgument,
                                    "schema version " + std::to_string(fromVersion) + " cannot be migrated");
    for (const Migration &migration : migrations) {
        if (migration.toVersion <= fromVersion)
            continue;
        const int rc = sqliteExec(db, migration.sql);
        if (rc != SQLITE_OK)
            return sqliteFailure(db, rc, "upgrading the session file to schema version " + std::to_string(migration.toVersion));
        if (StoreStatus status = setUserVersion(db, migration.toVersion); !status.ok())
            return status;
    }
    return StoreStatus::success();
}

StoreStatus verifySessionSchema(sqlite3 *db, int version)
{
    SqliteStatement query;
    int rc = query.prepare(db, "SELECT type, name, coalesce(sql, '') FROM sqlite_schema");
    if (rc != SQLITE_OK)
        return sqliteFailure(db, rc, "reading the file's schema");
    std::vector<std::string> tablesSeen;
    while ((rc = query.step()) == SQLITE_ROW) {
        const std::string type = query.columnText(0);
        const std::string name = query.columnText(1);
        const std::string sql = query.columnText(2);
        if (type == "trigger" || type == "view")
            return StoreStatus::failure(StoreCode::UnexpectedSchema,
                                        "the file contains a " + type + " named '" + name +
                                            "'; Sagline never creates one, so the file was altered and is not opened");
        if (type == "table" && sql.find("VIRTUAL") != std::string::npos)
            return StoreStatus::failure(StoreCode::UnexpectedSchema,
                                        "the file contains a virtual table named '" + name + "', which Sagline never creates");
        if (name.rfind("sqlite_autoindex_", 0) == 0)
            continue; // implicit index of a UNIQUE or PRIMARY KEY constraint
        const auto known = std::find_if(expectedObjects.begin(), expectedObjects.end(), [&](const SchemaObject &object) {
            return type == object.type && name == object.name && object.sinceVersion <= version;
        });
        if (known == expectedObjects.end() && version <= sessionSchemaVersion)
            return StoreStatus::failure(StoreCode::UnexpectedSchema,
                                        "the file contains a " + type + " named '" + name +
                                            "' that schema version " + std::to_string(version) + " does not have");
        if (type == "table")
            tablesSeen.push_back(name);
    }
    if (rc != SQLITE_DONE)
        return sqliteFailure(db, rc, "reading the file's schema");
    for (const SchemaObject &object : expectedObjects) {
        if (std::string(object.type) != "table" || object.sinceVersion > version)
            continue;
        if (std::find(tablesSeen.begin(), tablesSeen.end(), object.name) == tablesSeen.end())
            return StoreStatus::failure(StoreCode::UnexpectedSchema,
                                        std::string("the file has no '") + object.name + "' table, which schema version " +
                                            std::to_string(version) + " requires");
    }
    return StoreStatus::success();
}

} // namespace sagline
