// The records a session file holds besides its readings. Every record is a new row: nothing
// is updated or deleted, so a correction is a later record and the history stays readable.
// Times are ISO 8601 UTC text ("2026-12-02T10:15:03.250Z"), stamped by the store on insert.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

namespace sagline {

// Given once, when the session file is created.
struct NewSession {
    std::string setupJson;                     // setupToJson(setup): nameplate and bench; required
    std::string planJson;                      // the plan as computed, JSON; "" when there is none
    std::string operatorName;                  // who runs the test; required
    std::string unitSerial;                    // serial number of the transformer under test; required
    std::optional<double> ambientTemperatureC; // ambient at the start, °C
    std::optional<double> windingTemperatureC; // winding at the start (cold), °C
    std::string softwareVersion;               // the writing program's version, for traceability
};

struct SessionInfo {
    std::string createdUtc;
    std::string softwareVersion; // of the program that created the file
    std::string operatorName;
    std::string unitSerial;
    std::string setupJson;
    std::string planJson;
    int schemaVersion = 0;       // user_version of the file as found on disk
};

enum class TemperatureKind { Ambient, Winding };
const char *toString(TemperatureKind kind); // "ambient", "winding"

struct TemperatureRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    TemperatureKind kind = TemperatureKind::Ambient;
    double celsius = 0.0;        // °C
    std::string source;          // e.g. "thermocouple at core", "entered at start"
};

// One instrument used in the session, as it identified itself.
struct InstrumentRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::string role;            // "voltmeter", "ammeter", "meter" (both), "manual"
    std::string identity;        // the IEEE 488.2 *IDN? response, verbatim
    std::string accuracy;        // accuracy spec as the instruments layer wrote it (e.g. JSON)
};

// Excluding (excluded = true) or restoring (false) one reading; the latest row for a reading wins.
struct ExclusionRecord {
    std::int64_t id = 0;
    std::int64_t readingId = 0;
    bool excluded = true;
    std::string reason;          // required
    std::string author;
    std::string timeUtc;
};

struct NoteRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::string author;
    std::string text;
};

// A sweep stopped by a safety limit.
struct SafetyStopRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    int step = -1;                     // plan step at which it stopped, -1 when none
    std::string rule;                  // which limit, e.g. "rated-va", "rheostat-current", "meter-overload"
    std::string message;               // what the operator was told
    std::optional<double> measured;    // the measured value that broke the limit (SI unit of the rule)
    std::optional<double> limitValue;  // the limit it broke (same unit)
};

enum class Verdict { Accepted, Rejected, Retest };
const char *toString(Verdict verdict);                 // "accepted", "rejected", "retest"
std::optional<Verdict> verdictFromString(const std::string &text);

// A reviewer's sign-off (a lab lead accepting or rejecting the session).
struct SignOffRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::string reviewer;              // required
    Verdict verdict = Verdict::Accepted;
    std::string comment;
};

} // namespace sagline
