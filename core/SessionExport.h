// Exports of a session for other tools: the readings CSV of DESIGN.md (re-importable), a CSV
// of the fit results, and a one-object JSON summary. Numbers are SI units, written with
// enough digits to read back exactly; text never depends on the locale.
#pragma once

#include "SessionSummary.h"

#include <string>
#include <vector>

namespace sagline {

// Header: current_a,voltage_v,u_current_a,u_voltage_v,step,time_utc,flags,excluded. An unknown
// uncertainty is an empty cell; a reading with no value (overload, not-a-number) has empty
// current_a/voltage_v cells.
std::string readingsToCsv(const std::vector<Reading> &readings);
// The same columns, then who did what: exclusion_reason, excluded_by (the latest exclusion in
// force), superseded_reason (a retake), recorded_by, recorded_account. Import skips these.
std::string sessionReadingsToCsv(const SessionSummary &summary);

// The 95 % interval of R printed everywhere: R ± U of its budget when the session has an
// analysis, else the fit's own (Student t, n - 2 dof, the scatter alone). Empty below 3 points.
std::optional<Interval> seriesResistanceInterval(const SessionSummary &summary);

// Header: quantity,value,standard_uncertainty,unit, one row per fitted quantity (R, V0, ...),
// then per reading: reading_id, residual and studentized residual under the same columns.
std::string fitResultsToCsv(const SessionSummary &summary);

// One JSON object: session, setup, plan summary, temperatures, instruments, counts, fit (the
// keys of `fit --json` in DESIGN.md), progress (k of N steps), seal (sign-off state), exclusions,
// retakes, safety stops, sweep events, notes, sign-offs and reopens, each with its person and
// OS account.
std::string sessionSummaryToJson(const SessionSummary &summary, int indent = 2);

} // namespace sagline
