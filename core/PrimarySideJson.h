// The primary side in JSON, shared by `sagline-cli fit --json` and the session export:
// the six headline results under `results` (each {value, standard_uncertainty,
// coverage_factor, expanded_uncertainty, ...} as core/AssessmentJson.h writes them, null when
// not computed) and a `primary_side` object with the supply, the open-circuit point and the
// loss balance of every step.
#pragma once

#include "PrimarySideAnalysis.h"
#include "SupplyReferral.h"

#include <nlohmann/json.hpp>

#include <optional>

namespace sagline {

// Adds no_load_loss_w, no_load_current_a, efficiency_at_rated_percent, max_efficiency_percent,
// max_efficiency_current_a and series_reactance_ohm to `results` (null without a primary side).
void addPrimaryResultsJson(nlohmann::json &results, const std::optional<PrimarySideResult> &primary);

// {fit_voltages, supply: {...}, open_circuit: {...}|null, steps: [...], series_reactance_resolved,
//  regulation_at_power_factor: {power_factor, leading, regulation_percent}, warnings, notes}
nlohmann::json primarySideJson(const std::optional<PrimarySideResult> &primary, const SupplyAssessment &supply);

} // namespace sagline
