#include "AssessmentJson.h"

#include <cmath>

namespace sagline {

using nlohmann::json;

namespace {

json number(std::optional<double> value)
{
    return value && std::isfinite(*value) ? json(*value) : json(nullptr);
}

json rangeJson(const ToleranceRange &range)
{
    return {{"min", number(range.min)}, {"max", number(range.max)}};
}

json optionalValue(const std::optional<UncertainValue> &value)
{
    return value ? uncertainValueJson(*value) : json(nullptr);
}

} // namespace

json uncertainValueJson(const UncertainValue &value)
{
    json budget = json::array();
    for (const BudgetComponent &c : value.budget)
        budget.push_back({{"source", c.source},
                          {"type", toString(c.type)},
                          {"distribution", c.distribution},
                          {"standard_uncertainty", number(c.standardUncertainty)},
                          {"input_unit", c.inputUnit},
                          {"sensitivity", number(c.sensitivity)},
                          {"contribution", number(c.contribution)},
                          {"degrees_of_freedom", number(c.degreesOfFreedom)}});
    return {{"value", number(value.value)},
            {"standard_uncertainty", number(value.standardUncertainty)},
            {"effective_dof", number(value.effectiveDof)},
            {"coverage_factor", number(value.coverageFactor)},
            {"expanded_uncertainty", number(value.expandedUncertainty)},
            {"budget", budget}};
}

json resultsJson(const AnalysisResult &a)
{
    json out = {{"series_resistance_ohm", uncertainValueJson(a.seriesResistanceOhm)},
                {"no_load_voltage_v", uncertainValueJson(a.noLoadVoltageV)},
                {"full_load_voltage_v", uncertainValueJson(a.fullLoadVoltageV)},
                {"regulation_percent", uncertainValueJson(a.regulationPercent)},
                {"copper_loss_w", uncertainValueJson(a.copperLossW)},
                {"series_resistance_primary_ohm", optionalValue(a.primaryResistanceOhm)},
                {"series_resistance_reference_ohm", optionalValue(a.referenceResistanceOhm)},
                {"full_load_voltage_reference_v", optionalValue(a.referredFullLoadVoltageV)},
                {"regulation_reference_percent", optionalValue(a.referredRegulationPercent)},
                {"copper_loss_reference_w", optionalValue(a.referredCopperLossW)}};
    return out;
}

json verdictJson(const SpecificationVerdict &v)
{
    json limits = json::array();
    std::optional<double> regulationLimit, regulationAcceptance;
    for (const ConformityDecision &d : v.limits) {
        limits.push_back({{"quantity", d.quantity},
                          {"unit", d.unit},
                          {"ok", d.ok},
                          {"error", d.error},
                          {"outcome", toString(d.outcome)},
                          {"measured", number(d.measured)},
                          {"expanded_uncertainty", number(d.expandedUncertainty)},
                          {"tolerance_limits", rangeJson(d.limits)},
                          {"guard_band", number(d.guardBand)},
                          {"acceptance_limits", rangeJson(d.acceptance)},
                          {"conformance_probability", number(d.conformanceProbability)},
                          {"explanation", d.explanation}});
        if (d.quantity.rfind("regulation", 0) == 0) {
            regulationLimit = d.limits.max;
            regulationAcceptance = d.acceptance.max;
        }
    }
    return {{"outcome", toString(v.outcome)},
            {"conformance_probability", number(v.conformanceProbability)},
            {"rule", toString(v.rule)},
            {"rule_name", v.ruleName},
            {"limits_source", v.limitsSource},
            {"at_reference_temperature", v.atReferenceTemperature},
            {"reference_temperature_c", number(v.referenceTemperatureC)},
            {"explanation", v.explanation},
            {"limits", limits},
            {"regulation_limit_percent", number(regulationLimit)},
            {"acceptance_limit_percent", number(regulationAcceptance)},
            {"nameplate_regulation_percent", number(v.nameplateRegulationPercent)},
            {"regulation_minus_nameplate_percent", number(v.regulationMinusNameplatePercent)}};
}

json outlierScreeningJson(const OutlierScreening &screening)
{
    return {{"screened", screening.screened},
            {"rule", screening.rule},
            {"source", screening.source},
            {"critical_value", number(screening.criticalValue)},
            {"reason", screening.reason}};
}

} // namespace sagline
