// Sealed sign-off: what a lab lead signs is the session as it was at that moment.
//
// Signing stores, with the sign-off row, the SHA-256 digest (FIPS 180-4, core/Sha256.h) of the
// session's content: every row of every content table (setup and plan, temperatures,
// instruments, readings, exclusions, notes, safety stops, retakes, sweep events, earlier
// sign-offs and reopens) up to the last row that existed then ("content marks"), in a fixed
// column order and a typed, length-prefixed encoding, followed by the sign-off's own fields.
// The store then refuses every change (StoreCode::Sealed) until someone reopens the session
// with a reason; the sign-off is then superseded, and everything that shows the session says
// "changed after sign-off". Because records are only ever appended, the digest of a sign-off
// can be recomputed at any later time: a mismatch means the file was altered outside Sagline.
// It is a digest, not a cryptographic signature: it reveals an edited file, it cannot stop
// someone who recomputes it.
#pragma once

#include "SessionRecords.h"
#include "StoreResult.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

class SessionStore;

enum class SealState {
    NotSigned,           // no sign-off
    Signed,              // the latest sign-off is in force and its digest matches
    ChangedAfterSignOff, // the latest sign-off was lifted by a reopen (who and why are recorded)
    Altered,             // a digest does not match, or content was added without a reopen
};
const char *toString(SealState state); // "not signed", "signed", "changed after sign-off", "altered"

struct SealReport {
    SealState state = SealState::NotSigned;
    std::optional<SignOffRecord> signOff;  // the latest sign-off
    std::optional<ReopenRecord> reopen;    // the reopen that lifted it, when there is one
    std::vector<std::string> findings;     // each problem found, in words
    // One line for people: "signed off by A. Reviewer on 2026-12-02 10:15 UTC (accepted)",
    // "changed after sign-off: reopened by ... (reason)", "ALTERED: ...", "not signed off".
    std::string summary() const;
};

// Recomputes every sign-off's digest and compares the content now with the latest one's marks.
StoreResult<SealReport> checkSeal(const SessionStore &store);

} // namespace sagline
