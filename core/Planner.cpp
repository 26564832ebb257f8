#include "Planner.h"

#include "FuseStandards.h"
#include "PlanGates.h"
#include "TransformerFormulas.h"

#include <cmath>
#include <sstream>

namespace sagline {

std::string toString(FuseOutlook outlook)
{
    switch (outlook) {
    case FuseOutlook::Holds: return "holds";
    case FuseOutlook::MayOpen: return "may-open";
    case FuseOutlook::Opens: return "opens";
    }
    return "holds";
}

namespace {

// Classifies a steady primary current against the fuse's IEC 60127-2 gates: below the
// must-hold multiple the fuse carries it for an hour; at or above the must-open multiple it
// opens within the gate's time; in between the standard promises neither.
FuseOutlook outlookFor(double currentA, const FuseSpec &fuse)
{
    const FuseGates gates = fuseGates(fuse.type);
    const double multiple = currentA / fuse.ratingA;
    if (multiple >= gates.mustOpenMultiple)
        return FuseOutlook::Opens;
    if (multiple >= gates.mustHoldMultiple)
        return FuseOutlook::MayOpen;
    return FuseOutlook::Holds;
}

std::string amps(double value)
{
    std::ostringstream out;
    out.precision(4);
    out << value << " A";
    return out.str();
}

} // namespace

PlanResult makePlan(const Setup &setup)
{
    PlanResult result;
    const Nameplate &plate = setup.nameplate;
    const Bench &bench = setup.bench;

    // The parser validates fields; a setup built in code gets the same basic guards here so
    // no NaN can come out of the formulas.
    auto require = [&](bool ok, const char *field, const std::string &rule) {
        if (!ok)
            result.errors.push_back({field, rule});
        return ok;
    };
    bool valid = true;
    valid &= require(plate.ratedPowerVa > 0.0 && std::isfinite(plate.ratedPowerVa), "nameplate.rated_power_va",
                     "must be a finite number above zero");
    valid &= require(plate.primaryVoltageV > 0.0 && std::isfinite(plate.primaryVoltageV), "nameplate.primary_voltage_v",
                     "must be a finite number above zero");
    valid &= require(plate.secondaryVoltageV > 0.0 && std::isfinite(plate.secondaryVoltageV),
                     "nameplate.secondary_voltage_v", "must be a finite number above zero");
    valid &= require(plate.secondaryNoLoadVoltageV.has_value() || plate.regulationPercent.has_value(),
                     "nameplate.secondary_no_load_voltage_v",
                     "give the secondary no-load voltage, or nameplate.regulation_percent instead (one is required)");
    valid &= require(bench.steps >= 1, "bench.steps", "must be at least 1");
    valid &= require(bench.topFraction > 0.0 && std::isfinite(bench.topFraction), "bench.top_fraction",
                     "must be a finite number above zero");
    valid &= require(bench.overloadFactor > 0.0 && std::isfinite(bench.overloadFactor), "bench.overload_factor",
                     "must be a finite number above zero");
    if (!valid)
        return result;

    Plan plan;
    const double noLoad = plate.secondaryNoLoadVoltageV
                              ? *plate.secondaryNoLoadVoltageV
                              : formulas::noLoadVoltageFromRegulation(plate.secondaryVoltageV, *plate.regulationPercent);
    if (!(noLoad > plate.secondaryVoltageV)) {
        result.errors.push_back({"nameplate.secondary_no_load_voltage_v",
                                 "must be above nameplate.secondary_voltage_v (the loaded voltage is the lower one)"});
        return result;
    }
    // A nameplate that cannot describe a mains transformer (a voltage in the wrong unit) is
    // refused before anything is computed from it.
    if (FieldErrors implausible = nameplatePlausibilityErrors(plate, noLoad); !implausible.empty()) {
        result.errors = std::move(implausible);
        return result;
    }
    plan.noLoadVoltageV = noLoad;
    plan.ratedSecondaryCurrentA = formulas::ratedCurrent(plate.ratedPowerVa, plate.secondaryVoltageV);
    plan.ratedPrimaryCurrentA = formulas::ratedCurrent(plate.ratedPowerVa, plate.primaryVoltageV);
    plan.turnsRatio = formulas::turnsRatio(plate.primaryVoltageV, noLoad);
    plan.seriesResistanceOhm = formulas::seriesResistance(noLoad, plate.secondaryVoltageV, plan.ratedSecondaryCurrentA);
    plan.regulationPercent = formulas::regulationPercent(noLoad, plate.secondaryVoltageV);
    plan.overloadLimitVa = plate.ratedPowerVa * bench.overloadFactor;
    plan.totalTimeS = static_cast<double>(bench.steps + 1) * bench.dwellS;

    if (!plate.secondaryNoLoadVoltageV)
        plan.defaultsUsed.push_back("nameplate.secondary_no_load_voltage_v"); // derived from regulation
    plan.magnetizingFraction = bench.magnetizingFraction.value_or(defaultMagnetizingFraction(plate.construction));
    if (!bench.magnetizingFraction)
        plan.defaultsUsed.push_back("bench.magnetizing_fraction"); // common practice per construction

    // Recommended primary fuse and the NEC ceiling.
    plan.recommendedFuse.factor = bench.fuseFactor.value_or(defaultFuseFactor(plate.construction));
    if (!bench.fuseFactor)
        plan.defaultsUsed.push_back("bench.fuse_factor"); // common practice per construction
    plan.recommendedFuse.type = FuseType::TimeLag;
    plan.recommendedFuse.ratingA = nextStandardFuseRating(plan.recommendedFuse.factor * plan.ratedPrimaryCurrentA);
    plan.maxPrimaryProtectionA = necPrimaryOnlyMaximumA(plan.ratedPrimaryCurrentA);
    if (plan.recommendedFuse.ratingA > plan.maxPrimaryProtectionA * (1.0 + 1e-9)) {
        plan.warnings.push_back("the recommended fuse (" + amps(plan.recommendedFuse.ratingA)
                                + ") is above the NEC 450.3(B) primary-only ceiling (" + amps(plan.maxPrimaryProtectionA)
                                + "): lower bench.fuse_factor, add an inrush limiter, or protect the secondary too");
    }

    const FuseSpec fittedFuse = bench.fuse.value_or(FuseSpec{plan.recommendedFuse.ratingA, plan.recommendedFuse.type});
    plan.outlookFuse = fittedFuse;
    plan.outlookFuseIsFitted = bench.fuse.has_value();
    if (!bench.fuse) {
        plan.defaultsUsed.push_back("bench.fuse"); // the outlook is for the recommended fuse
    } else {
        if (bench.fuse->ratingA > plan.maxPrimaryProtectionA * (1.0 + 1e-9))
            plan.warnings.push_back("the fitted fuse (" + amps(bench.fuse->ratingA)
                                    + ") is above the NEC 450.3(B) primary-only ceiling (" + amps(plan.maxPrimaryProtectionA)
                                    + "): fit a smaller fuse unless the secondary is protected too");
        if (bench.fuse->ratingA < plan.ratedPrimaryCurrentA)
            plan.warnings.push_back("the fitted fuse (" + amps(bench.fuse->ratingA) + ") is below the rated primary current ("
                                    + amps(plan.ratedPrimaryCurrentA) + "): it may open before full load; fit "
                                    + amps(plan.recommendedFuse.ratingA) + " time-lag");
        else if (bench.fuse->ratingA < plan.recommendedFuse.ratingA)
            plan.warnings.push_back("the fitted fuse (" + amps(bench.fuse->ratingA) + ") is below the recommended "
                                    + amps(plan.recommendedFuse.ratingA) + ": it may open on switch-on inrush");
        if (bench.fuse->type == FuseType::QuickActing)
            plan.warnings.push_back("a quick-acting primary fuse may open on switch-on inrush; a time-lag (T) fuse is the usual choice");
        if (!isStandardFuseRating(bench.fuse->ratingA))
            plan.warnings.push_back("the fitted fuse rating " + amps(bench.fuse->ratingA)
                                    + " is not an IEC 60127 standard rating; check the fuse marking");
    }

    if (bench.rheostat)
        plan.rheostatSafeCurrentA =
            formulas::rheostatSafeCurrent(bench.rheostat->powerRatingW, bench.rheostat->totalResistanceOhm);
    else
        plan.warnings.push_back("no rheostat given (bench.rheostat): the load's own rating is not checked");

    if (plate.frequencyHz != 50.0 && plate.frequencyHz != 60.0)
        plan.warnings.push_back("the frequency is neither 50 Hz nor 60 Hz: check nameplate.frequency_hz");

    const double magnetizingA = plan.magnetizingFraction * plan.ratedPrimaryCurrentA;
    bool rheostatTrouble = false;
    bool fuseTrouble = false;
    for (int k = 0; k <= bench.steps; ++k) {
        PlanStep step;
        step.index = k;
        step.currentA = static_cast<double>(k) / bench.steps * bench.topFraction * plan.ratedSecondaryCurrentA;
        step.predictedVoltageV = formulas::terminalVoltage(noLoad, plan.seriesResistanceOhm, step.currentA);
        if (k > 0)
            step.loadResistanceOhm = step.predictedVoltageV / step.currentA;
        step.outputVa = step.predictedVoltageV * step.currentA;
        step.loadPowerW = step.outputVa; // resistive load: power factor 1
        step.copperLossW = formulas::copperLoss(step.currentA, plan.seriesResistanceOhm);
        step.primaryCurrentA = formulas::primaryCurrent(step.currentA, plan.turnsRatio, magnetizingA);
        step.vaMargin = plate.ratedPowerVa - step.outputVa;
        if (bench.rheostat && k > 0) {
            const bool currentOk = step.currentA <= *plan.rheostatSafeCurrentA * (1.0 + 1e-9);
            const bool settingOk = *step.loadResistanceOhm <= bench.rheostat->totalResistanceOhm;
            step.rheostatOk = currentOk && settingOk;
            rheostatTrouble |= !step.rheostatOk;
        }
        step.fuseOutlook = outlookFor(step.primaryCurrentA, fittedFuse);
        fuseTrouble |= step.fuseOutlook != FuseOutlook::Holds;
        plan.steps.push_back(step);
    }

    // Hard limits on the plan itself: refused unless the user allows overload explicitly.
    const PlanStep &top = plan.steps.back();
    if (top.outputVa > plan.overloadLimitVa * (1.0 + 1e-9) && !bench.allowOverload) {
        std::ostringstream rule;
        rule.precision(4);
        rule << "the top step puts out " << top.outputVa << " VA, above the rated " << plate.ratedPowerVa
             << " VA x overload factor " << bench.overloadFactor << " = " << plan.overloadLimitVa
             << " VA: lower bench.top_fraction, or set bench.allow_overload to true to test above rating";
        result.errors.push_back({"bench.top_fraction", rule.str()});
    }
    if (bench.topFraction > 1.1 && !bench.allowOverload) {
        std::ostringstream rule;
        rule << "is " << bench.topFraction
             << ", above 1.1 x rated current: lower it to 1.1 or less, or set bench.allow_overload to true";
        result.errors.push_back({"bench.top_fraction", rule.str()});
    }
    if (bench.allowOverload && top.outputVa > plate.ratedPowerVa)
        plan.warnings.push_back("overload allowed: the top step exceeds the rated VA; watch the winding temperature");
    if (rheostatTrouble) {
        std::ostringstream text;
        text.precision(4);
        text << "the rheostat cannot take some steps (current above its safe " << *plan.rheostatSafeCurrentA
             << " A, or a setting above its " << bench.rheostat->totalResistanceOhm
             << " Ω track): use a larger rheostat or a fixed resistor in series/parallel";
        plan.warnings.push_back(text.str());
    }
    if (fuseTrouble)
        plan.warnings.push_back("at some steps the primary current reaches 1.5 x the fuse rating or more, where "
                                "IEC 60127-2 no longer guarantees that the fuse holds: check the fuse");

    if (!result.errors.empty())
        return result;
    result.plan = std::move(plan);
    return result;
}

} // namespace sagline
