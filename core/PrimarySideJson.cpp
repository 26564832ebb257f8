#include "PrimarySideJson.h"

#include "AssessmentJson.h"

namespace sagline {

namespace {

using json = nlohmann::json;

json optionalValue(const std::optional<UncertainValue> &value)
{
    return value ? uncertainValueJson(*value) : json(nullptr);
}

json optionalNumber(const std::optional<double> &value)
{
    return value ? json(*value) : json(nullptr);
}

json openCircuitJson(const OpenCircuitResult &oc)
{
    return {{"reading_id", oc.readingId},
            {"primary_voltage_v", oc.voltageV},
            {"primary_voltage_measured", oc.voltageMeasured},
            {"no_load_loss_w", optionalValue(oc.noLoadLossW)},
            {"no_load_current_a", optionalValue(oc.noLoadCurrentA)},
            {"no_load_current_percent_of_rated", optionalValue(oc.noLoadCurrentPercent)},
            {"no_load_power_factor", optionalValue(oc.noLoadPowerFactor)},
            {"no_load_reactive_power_var", optionalValue(oc.noLoadReactivePowerVar)},
            {"core_loss_resistance_ohm", optionalValue(oc.coreLossResistanceOhm)},
            {"magnetizing_reactance_ohm", optionalValue(oc.magnetizingReactanceOhm)}};
}

// A step's figures with value and expanded uncertainty only: the budgets are per result above.
json brief(const UncertainValue &v)
{
    return {{"value", v.value}, {"expanded_uncertainty", optionalNumber(v.expandedUncertainty)}};
}

json briefOptional(const std::optional<UncertainValue> &v)
{
    return v ? brief(*v) : json(nullptr);
}

} // namespace

void addPrimaryResultsJson(json &results, const std::optional<PrimarySideResult> &primary)
{
    const OpenCircuitResult *oc = primary && primary->openCircuit ? &*primary->openCircuit : nullptr;
    results["no_load_loss_w"] = oc ? optionalValue(oc->noLoadLossW) : json(nullptr);
    results["no_load_current_a"] = oc ? optionalValue(oc->noLoadCurrentA) : json(nullptr);
    results["efficiency_at_rated_percent"] = primary ? optionalValue(primary->efficiencyAtRatedPercent) : json(nullptr);
    results["max_efficiency_percent"] = primary ? optionalValue(primary->maxEfficiencyPercent) : json(nullptr);
    results["max_efficiency_current_a"] = primary ? optionalValue(primary->maxEfficiencyCurrentA) : json(nullptr);
    results["series_reactance_ohm"] = primary ? optionalValue(primary->seriesReactanceOhm) : json(nullptr);
}

json primarySideJson(const std::optional<PrimarySideResult> &primary, const SupplyAssessment &supply)
{
    json out;
    out["fit_voltages"] = toString(supply.fitVoltages);
    out["supply"] = {{"rated_primary_voltage_v", supply.ratedPrimaryVoltageV},
                     {"readings_with_primary_voltage", supply.readingsWithVoltage},
                     {"readings_used", supply.readingsUsed},
                     {"lowest_v", optionalNumber(supply.lowestV)},
                     {"highest_v", optionalNumber(supply.highestV)},
                     {"drift_percent", optionalNumber(supply.driftPercent)},
                     {"tolerance_percent", supply.tolerancePercent},
                     {"drifted", supply.drifted},
                     {"statement", supply.statement}};
    if (!primary) {
        out["open_circuit"] = nullptr;
        out["steps"] = json::array();
        return out;
    }
    out["open_circuit"] = primary->openCircuit ? openCircuitJson(*primary->openCircuit) : json(nullptr);
    json steps = json::array();
    for (const StepLosses &s : primary->steps)
        steps.push_back({{"reading_id", s.readingId},
                         {"step", s.step >= 0 ? json(s.step) : json(nullptr)},
                         {"current_a", s.currentA},
                         {"input_power_w", brief(s.inputPowerW)},
                         {"output_power_w", brief(s.outputPowerW)},
                         {"total_loss_w", brief(s.totalLossW)},
                         {"core_loss_w", brief(s.coreLossW)},
                         {"copper_loss_w", briefOptional(s.copperLossW)},
                         {"remainder_w", briefOptional(s.remainderW)},
                         {"efficiency_percent", brief(s.efficiencyPercent)},
                         {"reactive_power_var", optionalNumber(s.reactivePowerVar)}});
    out["steps"] = steps;
    out["series_reactance_resolved"] = primary->seriesReactanceResolved;
    out["regulation_at_power_factor"] = {{"power_factor", primary->regulationPowerFactor},
                                         {"leading", primary->leading},
                                         {"regulation_percent", optionalValue(primary->regulationAtPowerFactorPercent)}};
    out["warnings"] = primary->warnings;
    out["notes"] = primary->notes;
    json errors = json::array();
    for (const FieldError &e : primary->errors)
        errors.push_back({{"field", e.field}, {"rule", e.rule}});
    out["errors"] = errors;
    return out;
}

} // namespace sagline
