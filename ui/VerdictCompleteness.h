// The completeness wrapper around a verdict in the window and the review: until every planned
// step is recorded the verdict reads "provisional (k of N steps)", and a session that ended
// early reads "incomplete (...)": neither shows a pass or a fail (core/SessionProgress.h).
#pragma once

#include "FitPresentation.h"
#include "SessionProgress.h"

namespace sagline {

// Replaces a judged verdict in `view` by the progress label when the session is not complete.
void applyCompleteness(ResultsView &view, const SessionProgress &progress);

} // namespace sagline
