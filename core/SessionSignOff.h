// A reviewer's sign-off: the one write the review workspace makes. It adds one row to the
// session's sign_off table (SessionStore::addSignOff) and nothing else: the readings and every
// other record stay as they were. A file written by an older or a newer Sagline is refused,
// because signing it would first have to upgrade (rewrite) its schema, or would write into a
// schema this build does not know.
#pragma once

#include "SessionRecords.h"
#include "StoreResult.h"

#include <cstdint>
#include <string>

namespace sagline {

struct SignOffRequest {
    std::string reviewer;           // required
    ReviewDecision decision = ReviewDecision::Accepted;
    std::string comment;            // required when the verdict is reject or retest (say why)
};

// Validates the request (each error names the field); empty when it is complete.
std::string signOffRequestError(const SignOffRequest &request);

// Appends the sign-off (UTC time stamped by the store) and returns its row id.
StoreResult<std::int64_t> signOffSession(const std::string &path, const SignOffRequest &request);

} // namespace sagline
