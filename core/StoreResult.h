// Status values returned by the session store (core never throws across its API).
#pragma once

#include <string>
#include <utility>

namespace sagline {

enum class StoreCode {
    Ok,
    InvalidArgument,  // a value passed in breaks a rule; the message names the field
    FileExists,       // create or save-as: the target already exists (never overwritten)
    CannotOpen,       // missing, unreadable or permission denied
    NotASession,      // not an SQLite file, or an SQLite file that is not a Sagline session
    Corrupt,          // truncated or damaged (header, quick_check or a read failed)
    NewerVersion,     // written by a newer Sagline; readable for review only
    UnexpectedSchema, // triggers, views, unknown or missing tables or columns
    ReadOnly,         // a write on a store opened for review
    NotFound,         // an id that does not exist in this session
    Busy,             // another program holds a lock on the file
    IoError,          // disk full or an I/O error: nothing of the failed call was recorded
    Sealed,           // a change to a signed-off session that was not reopened
};

// A plain name for messages and logs: "ok", "invalid argument", "not a session", ...
const char *toString(StoreCode code);

struct StoreStatus {
    StoreCode code = StoreCode::Ok;
    std::string message; // empty when ok; otherwise says what failed and, when known, what to do

    bool ok() const { return code == StoreCode::Ok; }
    static StoreStatus success() { return {}; }
    static StoreStatus failure(StoreCode code, std::string message) { return {code, std::move(message)}; }
};

template <typename T>
struct StoreResult {
    T value{};            // meaningful only when ok()
    StoreCode code = StoreCode::Ok;
    std::string message;  // empty when ok

    StoreResult() = default;
    StoreResult(T success) : value(std::move(success)) {} // implicit: `return value;` is a success
    StoreResult(T result, StoreCode resultCode, std::string resultMessage)
        : value(std::move(result)), code(resultCode), message(std::move(resultMessage))
    {
    }

    bool ok() const { return code == StoreCode::Ok; }
    StoreStatus status() const { return {code, message}; }
    static StoreResult failure(const StoreStatus &status) { return {T{}, status.code, status.message}; }
    static StoreResult failure(StoreCode failureCode, std::string failureMessage)
    {
        return {T{}, failureCode, std::move(failureMessage)};
    }
};

} // namespace sagline
