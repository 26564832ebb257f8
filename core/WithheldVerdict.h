// A session that is not complete has no verdict anywhere: not in `export --json`, not in
// `fit SESSION` (text or --json). What its partial data gave is kept, labelled as such, for a
// reader who wants it. One place for the rule so the outputs cannot drift apart.
#pragma once

#include "SessionProgress.h"

#include <nlohmann/json.hpp>

#include <string>

namespace sagline {

// The "progress" object of the JSON outputs: state, recorded_steps, planned_steps, label.
// Keys in that order for nlohmann::ordered_json.
template <typename Json>
Json progressJson(const SessionProgress &progress);

// For an incomplete (or running) session: each "outcome" in `verdict` (the verdict's and each
// limit's) becomes "incomplete" (or "provisional"), the old value kept as
// "outcome_on_partial_data", and the explanation starts with the state and "no verdict".
// A complete session's verdict is left as it is.
// For nlohmann::json (fit --json) and nlohmann::ordered_json (export --json).
template <typename Json>
void withholdVerdict(Json &verdict, const SessionProgress &progress);

// "on the partial data", or "on the data so far" while the sweep runs: what the partial results
// are introduced with, in the JSON explanation and in `fit`'s text.
std::string partialDataWords(const SessionProgress &progress);

// The text with its first letter lower-cased, to follow a colon ("Judged on …" → "judged on …").
std::string withLowerFirstLetter(std::string text);

// "Incomplete (3 of 9 steps; safety stop at step 4 (output-va)): no verdict", or
// "Provisional (3 of 9 steps): no verdict yet"; "" when complete.
std::string withheldVerdictHeadline(const SessionProgress &progress);

} // namespace sagline
