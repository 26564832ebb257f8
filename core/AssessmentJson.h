// The JSON of results with their budgets, of the verdict and of the outlier screen, shared by
// `sagline-cli fit --json` and the session export so both say the same thing the same way.
// Numbers are SI (regulation in %); an infinite effective degrees of freedom is null.
#pragma once

#include "ConformityAssessment.h"
#include "OutlierScreen.h"
#include "ResultAnalysis.h"

#include <nlohmann/json.hpp>

namespace sagline {

// {value, standard_uncertainty, effective_dof, coverage_factor, expanded_uncertainty,
//  budget: [{source, type, distribution, standard_uncertainty, input_unit, sensitivity,
//  contribution, degrees_of_freedom}]}
nlohmann::json uncertainValueJson(const UncertainValue &value);
// {series_resistance_ohm, no_load_voltage_v, full_load_voltage_v, regulation_percent,
//  copper_loss_w, series_resistance_primary_ohm, and at the reference temperature
//  series_resistance_reference_ohm, full_load_voltage_reference_v, regulation_reference_percent,
//  copper_loss_reference_w (null when not referred)}
nlohmann::json resultsJson(const AnalysisResult &analysis);
// {outcome, conformance_probability, rule, rule_name, limits_source, at_reference_temperature,
//  reference_temperature_c, explanation, limits: [...], nameplate_regulation_percent,
//  regulation_minus_nameplate_percent, regulation_limit_percent, acceptance_limit_percent}
nlohmann::json verdictJson(const SpecificationVerdict &verdict);
// {screened, rule, critical_value, reason}
nlohmann::json outlierScreeningJson(const OutlierScreening &screening);

} // namespace sagline
