#include "PlanGates.h"

#include "NumberFormat.h"
#include "Planner.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

namespace sagline {

namespace {

// Up to 4 significant digits without padding ("0.018", "230", "18"), for messages.
std::string plain(double value)
{
    if (std::fabs(value) >= 1e4)
        return formatFixed(value, 0);
    char text[32];
    std::snprintf(text, sizeof text, "%.4g", value);
    return text;
}

std::string volts(double value) { return plain(value) + " V"; }

// A value typed in mV (or kV) for V is off by 1000: suggest the corrected one when it fits.
std::string unitHint(double voltageV, double primaryV)
{
    const double scaled = voltageV * 1000.0;
    if (primaryV / scaled <= maxPlausibleStepDownRatio && scaled / primaryV <= maxPlausibleStepUpRatio)
        return "; typed in mV? " + plain(voltageV) + " V is " + plain(scaled) + " mV, and "
               + volts(scaled) + " would fit";
    return {};
}

void checkRatio(FieldErrors &errors, const char *field, const char *what, double voltageV, double primaryV)
{
    if (!(voltageV > 0.0) || !(primaryV > 0.0))
        return;
    const double ratio = primaryV / voltageV;
    if (ratio > maxPlausibleStepDownRatio)
        errors.push_back({field, "the " + std::string(what) + " " + volts(voltageV) + " is 1/" + plain(ratio)
                                     + " of the primary " + volts(primaryV) + ", below the 1/"
                                     + plain(maxPlausibleStepDownRatio)
                                     + " a mains transformer has (common practice)" + unitHint(voltageV, primaryV)});
    else if (1.0 / ratio > maxPlausibleStepUpRatio)
        errors.push_back({field, "the " + std::string(what) + " " + volts(voltageV) + " is " + plain(1.0 / ratio)
                                     + " times the primary " + volts(primaryV) + ", above the "
                                     + plain(maxPlausibleStepUpRatio)
                                     + " times a mains transformer steps up (common practice); check the unit"});
}

} // namespace

FieldErrors nameplatePlausibilityErrors(const Nameplate &plate, double noLoadVoltageV)
{
    FieldErrors errors;
    checkRatio(errors, "nameplate.secondary_voltage_v", "full-load secondary voltage", plate.secondaryVoltageV,
               plate.primaryVoltageV);
    if (plate.secondaryNoLoadVoltageV)
        checkRatio(errors, "nameplate.secondary_no_load_voltage_v", "secondary no-load voltage", noLoadVoltageV,
                   plate.primaryVoltageV);
    if (plate.secondaryVoltageV > 0.0) {
        const double regulation = (noLoadVoltageV - plate.secondaryVoltageV) / plate.secondaryVoltageV * 100.0;
        if (regulation > maxPlausibleRegulationPercent && !plate.regulationPercent)
            errors.push_back({"nameplate.secondary_voltage_v",
                              "with the no-load voltage " + volts(noLoadVoltageV) + " the regulation would be "
                                  + formatFixed(regulation, 0) + " %, above the "
                                  + plain(maxPlausibleRegulationPercent)
                                  + " % that IEC 61558-1 Table 2 allows any VA class (from memory); check both voltages and their units"});
        const double secondaryA = plate.ratedPowerVa / plate.secondaryVoltageV;
        if (secondaryA > maxBenchCurrentA)
            errors.push_back({"nameplate.rated_power_va",
                              "the rated secondary current " + plain(plate.ratedPowerVa) + " VA / "
                                  + volts(plate.secondaryVoltageV) + " = " + plain(secondaryA)
                                  + " A is beyond what the bench carries (" + plain(maxBenchCurrentA)
                                  + " A); check nameplate.rated_power_va and nameplate.secondary_voltage_v"});
    }
    if (plate.primaryVoltageV > 0.0) {
        const double primaryA = plate.ratedPowerVa / plate.primaryVoltageV;
        if (primaryA > maxBenchCurrentA)
            errors.push_back({"nameplate.primary_voltage_v",
                              "the rated primary current " + plain(primaryA) + " A is beyond what the bench carries ("
                                  + plain(maxBenchCurrentA) + " A); check its unit"});
    }
    return errors;
}

std::vector<UnsafeStep> unsafeSteps(const Plan &plan)
{
    std::vector<UnsafeStep> result;
    for (const PlanStep &step : plan.steps) {
        UnsafeStep unsafe;
        unsafe.index = step.index;
        if (!step.rheostatOk && plan.rheostatSafeCurrentA) {
            if (step.currentA > *plan.rheostatSafeCurrentA * (1.0 + 1e-9))
                unsafe.reasons.push_back("current above the rheostat's safe " + formatQuantity(*plan.rheostatSafeCurrentA, "A", 3));
            else
                unsafe.reasons.push_back("load setting above the rheostat's track");
        }
        if (step.fuseOutlook == FuseOutlook::Opens)
            unsafe.reasons.push_back("the primary fuse (" + formatQuantity(plan.outlookFuse.ratingA, "A", 3) + " "
                                     + toString(plan.outlookFuse.type) + ") opens");
        if (!unsafe.reasons.empty())
            result.push_back(std::move(unsafe));
    }
    return result;
}

std::string describeUnsafeSteps(const std::vector<UnsafeStep> &steps)
{
    // Group consecutive steps that share their reasons: "steps 5 to 12: ...".
    std::string text;
    for (std::size_t i = 0; i < steps.size();) {
        std::size_t j = i;
        while (j + 1 < steps.size() && steps[j + 1].reasons == steps[i].reasons && steps[j + 1].index == steps[j].index + 1)
            ++j;
        std::string reasons;
        for (const std::string &reason : steps[i].reasons)
            reasons += (reasons.empty() ? "" : " and ") + reason;
        text += text.empty() ? "" : "; ";
        text += i == j ? "step " + std::to_string(steps[i].index)
                       : "steps " + std::to_string(steps[i].index) + " to " + std::to_string(steps[j].index);
        text += ": " + reasons;
        i = j + 1;
    }
    return text;
}

Plan truncatedToSafe(const Plan &plan)
{
    const std::vector<UnsafeStep> unsafe = unsafeSteps(plan);
    if (unsafe.empty())
        return plan;
    Plan safe = plan;
    std::erase_if(safe.steps, [&](const PlanStep &step) {
        return std::any_of(unsafe.begin(), unsafe.end(), [&](const UnsafeStep &u) { return u.index == step.index; });
    });
    safe.warnings.push_back("cut to the safe steps: removed " + describeUnsafeSteps(unsafe));
    safe.totalTimeS = plan.steps.empty() ? 0.0 : plan.totalTimeS * static_cast<double>(safe.steps.size()) / static_cast<double>(plan.steps.size());
    return safe;
}

} // namespace sagline
