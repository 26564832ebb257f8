// The changes a person makes to a recorded session (exclude, restore, note), with the rules the
// window and sagline-cli share: the person's name is required (never taken from the operator
// field), a reason is required, a superseded reading stays out of the fit, a signed-off
// session refuses until reopened (the store's rule). The person and the OS account are the
// store's actor (SessionStore::setActor).
#pragma once

#include "Reading.h"
#include "SessionStore.h"
#include "StoreResult.h"

#include <cstdint>
#include <string>

namespace sagline {

// "" when `person` names someone; else the rule, naming the field "by".
std::string personError(const std::string &person);

// Reading numbers count from 1 in recording order, as the window, the report and the export
// list them. `reading` is the reading with that number as read from the store.
StoreResult<std::int64_t> excludeReadingAs(SessionStore &store, const Reading &reading, long long number,
                                           const std::string &reason);
StoreResult<std::int64_t> restoreReadingAs(SessionStore &store, const Reading &reading, long long number,
                                           const std::string &reason);
// The same by number alone (reads the readings first): for scripts.
StoreResult<std::int64_t> excludeReadingNumber(SessionStore &store, long long number, const std::string &reason);
StoreResult<std::int64_t> restoreReadingNumber(SessionStore &store, long long number, const std::string &reason);
// A note written by the store's actor.
StoreResult<std::int64_t> addPersonNote(SessionStore &store, const std::string &text);

// A temperature measured after the session began (the winding's, read right after the sweep),
// by the store's actor, with how it was measured (required). Within what a bench sees: winding
// -60 to 400 °C (above any insulation class's hot-spot limit is a typing error), ambient -60 to
// 80 °C (common practice). The latest of each kind is the one the analysis uses.
struct TemperatureRange {
    double lowC;
    double highC;
};
TemperatureRange plausibleTemperatureRange(TemperatureKind kind);
StoreResult<std::int64_t> recordPersonTemperature(SessionStore &store, TemperatureKind kind, double celsius,
                                                  const std::string &source);

} // namespace sagline
