#include "PlanJson.h"

#include "FuseStandards.h"

#include <nlohmann/json.hpp>

namespace sagline {

using nlohmann::json;

std::string planToJson(const Plan &plan, int indent)
{
    json steps = json::array();
    for (const PlanStep &step : plan.steps) {
        steps.push_back({
            {"index", step.index},
            {"current_a", step.currentA},
            {"predicted_voltage_v", step.predictedVoltageV},
            {"load_resistance_ohm", step.loadResistanceOhm ? json(*step.loadResistanceOhm) : json(nullptr)},
            {"load_power_w", step.loadPowerW},
            {"output_va", step.outputVa},
            {"copper_loss_w", step.copperLossW},
            {"primary_current_a", step.primaryCurrentA},
            {"va_margin", step.vaMargin},
            {"rheostat_ok", step.rheostatOk},
            {"fuse_outlook", toString(step.fuseOutlook)},
        });
    }
    const FuseGates gates = fuseGates(plan.outlookFuse.type);
    json document = {
        {"rated_secondary_current_a", plan.ratedSecondaryCurrentA},
        {"rated_primary_current_a", plan.ratedPrimaryCurrentA},
        {"no_load_voltage_v", plan.noLoadVoltageV},
        {"turns_ratio", plan.turnsRatio},
        {"turns_ratio_note", "primary voltage / secondary no-load voltage"},
        {"series_resistance_ohm", plan.seriesResistanceOhm},
        {"series_resistance_note", "estimated from the nameplate, referred to the secondary"},
        {"regulation_percent", plan.regulationPercent},
        {"regulation_note", "(no-load - full-load) / full-load voltage x 100"},
        {"magnetizing_fraction", plan.magnetizingFraction},
        {"primary_current_note",
         "I1 = sqrt((I2 / turns ratio)^2 + (magnetizing fraction x rated primary current)^2): load and magnetizing "
         "currents in quadrature"},
        {"recommended_fuse",
         {{"rating_a", plan.recommendedFuse.ratingA},
          {"type", toString(plan.recommendedFuse.type)},
          {"factor", plan.recommendedFuse.factor},
          {"note", "smallest IEC 60127 R10 rating at or above factor x rated primary current"}}},
        {"max_primary_protection_a", plan.maxPrimaryProtectionA},
        {"max_primary_protection_note",
         "NEC 450.3(B) primary-only ceiling (" + std::to_string(static_cast<int>(necPrimaryOnlyMultiplier(plan.ratedPrimaryCurrentA) * 100.0 + 0.5))
             + " % of rated primary current), shown for installations that follow it; local codes and licensed "
               "practice decide"},
        {"fuse_outlook_fuse",
         {{"rating_a", plan.outlookFuse.ratingA},
          {"type", toString(plan.outlookFuse.type)},
          {"fitted", plan.outlookFuseIsFitted},
          {"gates", gates.source}}},
        {"rheostat_safe_current_a", plan.rheostatSafeCurrentA ? json(*plan.rheostatSafeCurrentA) : json(nullptr)},
        {"overload_limit_va", plan.overloadLimitVa},
        {"total_time_s", plan.totalTimeS},
        {"defaults_used", plan.defaultsUsed},
        {"warnings", plan.warnings},
        {"steps", steps},
    };
    return document.dump(indent, ' ', false, nlohmann::json::error_handler_t::replace);
}

} // namespace sagline
