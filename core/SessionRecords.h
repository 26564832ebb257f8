// The records a session file holds besides its readings. Every record is a new row: nothing
// is updated or deleted, so a correction is a later record and the history stays readable.
// Times are ISO 8601 UTC text ("2026-12-02T10:15:03.250Z"), stamped by the store on insert.
#pragma once

#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace sagline {

// Who made a change: the person's name as they gave it (never taken from the operator field)
// and the operating-system account the program ran under. Files older than schema 3 have
// neither (both "").
struct Actor {
    std::string person;
    std::string osAccount;
    bool operator==(const Actor &) const = default;
};

// Who recorded each reading, kept compact: a session of 1e5 readings has one or a few recorders,
// so each reading holds an index into `distinct` (in order of first appearance), not two strings.
struct ReadingRecorders {
    std::vector<Actor> distinct;
    std::vector<std::uint32_t> byReading; // parallel to the readings, oldest first

    // The recorder of reading `index`; an empty Actor past the end.
    Actor of(std::size_t index) const
    {
        return index < byReading.size() ? distinct[byReading[index]] : Actor{};
    }
};

// Given once, when the session file is created.
struct NewSession {
    std::string setupJson;                     // setupToJson(setup): nameplate and bench; required
    std::string planJson;                      // the plan as computed, JSON; "" when there is none
    std::string operatorName;                  // who runs the test; required
    std::string unitSerial;                    // serial number of the transformer under test; required
    std::optional<double> ambientTemperatureC; // ambient at the start, °C
    std::optional<double> windingTemperatureC; // winding at the start (cold), °C
    std::string softwareVersion;               // the writing program's version, for traceability
    Actor createdBy;                           // who creates it; an empty OS account is filled in
};

// Who excluded the readings an import marks excluded, and why (SessionStore::appendReadings).
struct MarkedExclusions {
    std::string author;                             // required
    std::function<std::string(std::size_t)> reason; // for readings[index]; required, not blank
};

struct SessionInfo {
    Actor createdBy;             // who created the file ("" in files older than schema 3)
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
    Actor actor;
};

// One instrument used in the session, as it identified itself.
struct InstrumentRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::string role;            // "voltmeter", "ammeter", "meter" (both), "manual"
    std::string identity;        // the IEEE 488.2 *IDN? response, verbatim
    std::string accuracy;        // accuracy spec as the instruments layer wrote it (e.g. JSON)
    Actor actor;
};

// Excluding (excluded = true) or restoring (false) one reading; the latest row for a reading wins.
struct ExclusionRecord {
    std::int64_t id = 0;
    std::int64_t readingId = 0;
    bool excluded = true;
    std::string reason;          // required
    std::string author;          // the person who excluded or restored it
    std::string timeUtc;
    std::string osAccount;
};

struct NoteRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::string author;          // the person, or a program's tag such as "sagline/analysis-settings"
    std::string text;
    Actor actor;                 // who was at the keyboard when it was written
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
    Actor actor;                       // who ran the sweep
};

enum class ReviewDecision { Accepted, Rejected, Retest };
const char *toString(ReviewDecision verdict);                 // "accepted", "rejected", "retest"
std::optional<ReviewDecision> reviewDecisionFromString(const std::string &text);

// A reviewer's sign-off (a lab lead accepting or rejecting the session). From schema 3 it
// seals the session: the SHA-256 digest of its content up to `contentMarks` (see
// SessionSeal.h); changes need a reopen first.
struct SignOffRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::string reviewer;              // required
    ReviewDecision decision = ReviewDecision::Accepted;
    std::string comment;
    std::string osAccount;
    std::string digest;                // hex SHA-256; "" for sign-offs older than schema 3
    std::string contentMarks;          // the last row of each content table it covers
};

// A reading taken again for its step: the old one stays, marked superseded by the new one.
struct SupersessionRecord {
    std::int64_t id = 0;
    std::int64_t readingId = 0;        // the reading set aside
    std::int64_t replacementId = 0;    // the reading that replaced it
    std::string reason;                // required
    Actor actor;
    std::string timeUtc;
};

// What happened to the sweep itself, for completeness and resumption.
enum class SweepEventKind {
    Started,        // step = first step
    Finished,       // every planned step recorded
    Stopped,        // by the operator (a safety stop has its own record)
    Resumed,        // a stopped or interrupted session continued at `step`
    LimitOverride,  // the plan's unsafe steps accepted anyway; detail = the reason
    Truncated,      // unsafe steps removed from the plan; detail = which
    ValueConfirmed, // a typed value outside the expectation confirmed; detail = what was expected
};
const char *toString(SweepEventKind kind); // "started", "finished", "stopped", "resumed", "limit-override", "truncated", "value-confirmed"
std::optional<SweepEventKind> sweepEventKindFromString(const std::string &text);

struct SweepEventRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    SweepEventKind kind = SweepEventKind::Started;
    int step = -1;
    std::string detail;
    Actor actor;
};

// A signed-off session opened again for changes: the sign-off it lifts is superseded.
struct ReopenRecord {
    std::int64_t id = 0;
    std::string timeUtc;
    std::int64_t signOffId = 0;
    std::string reason;                // required
    Actor actor;
};

} // namespace sagline
