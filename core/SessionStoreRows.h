// The reading and exclusion rows as SessionStore writes them, shared by the one-row writers
// (SessionStoreWrite.cpp) and the bulk import (SessionStoreBulk.cpp). Internal to the store.
#pragma once

#include "Reading.h"
#include "SessionRecords.h"
#include "SqliteStatement.h"

#include <string>

namespace sagline::storerows {

// The reading columns a writer sets, in parameter order; the store assigns `id` unless told.
constexpr const char *readingColumns =
    "time_utc, step, current_a, voltage_v, u_current_a, u_voltage_v, flags, raw_text, person, os_account";
constexpr int readingParameters = 10;

constexpr const char *insertExclusionSql =
    "INSERT INTO exclusion (reading_id, excluded, reason, author, time_utc, os_account) VALUES (?, ?, ?, ?, ?, ?)";

// Binds the reading's columns to parameters first .. first + 9. The texts are bound without
// a copy: every caller steps the statement while they live.
inline void bindReading(SqliteStatement &insert, int first, const Reading &reading, const std::string &time,
                        const Actor &actor)
{
    insert.bindUncopied(first, time).bind(first + 1, reading.step).bind(first + 2, reading.currentA);
    insert.bind(first + 3, reading.voltageV).bind(first + 4, reading.uCurrentA).bind(first + 5, reading.uVoltageV);
    insert.bind(first + 6, static_cast<std::int64_t>(reading.flags)).bindUncopied(first + 7, reading.rawText);
    insert.bindUncopied(first + 8, actor.person).bindUncopied(first + 9, actor.osAccount);
}

// The primary side of a reading, one row keyed by the reading's id (schema 4).
constexpr const char *insertPrimarySql =
    "INSERT INTO primary_reading (id, voltage_v, u_voltage_v, current_a, u_current_a, power_w, u_power_w, power_factor, "
    "u_power_factor, reactive_power_var, u_reactive_power_var) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)";

inline void bindPrimary(SqliteStatement &insert, std::int64_t readingId, const PrimaryReading &p)
{
    insert.bind(1, readingId).bind(2, p.voltageV).bind(3, p.uVoltageV).bind(4, p.currentA).bind(5, p.uCurrentA);
    insert.bind(6, p.powerW).bind(7, p.uPowerW).bind(8, p.powerFactor).bind(9, p.uPowerFactor);
    insert.bind(10, p.reactivePowerVar).bind(11, p.uReactivePowerVar);
}

inline bool isBlank(const std::string &text)
{
    return text.find_first_not_of(" \t\r\n") == std::string::npos;
}

} // namespace sagline::storerows
