#include "ResultAnalysis.h"

#include "FitBudget.h"
#include "TransformerFormulas.h"

#include <cmath>

namespace sagline {

std::string toString(RegulationBase base)
{
    return base == RegulationBase::FullLoad ? "full-load" : "no-load";
}

AnalysisInput analysisInputFor(const Nameplate &nameplate)
{
    AnalysisInput input;
    if (nameplate.secondaryVoltageV > 0.0)
        input.ratedCurrentA = formulas::ratedCurrent(nameplate.ratedPowerVa, nameplate.secondaryVoltageV);
    std::optional<double> noLoad = nameplate.secondaryNoLoadVoltageV;
    if (!noLoad && nameplate.regulationPercent)
        noLoad = formulas::noLoadVoltageFromRegulation(nameplate.secondaryVoltageV, *nameplate.regulationPercent);
    if (noLoad && *noLoad > 0.0 && nameplate.primaryVoltageV > 0.0)
        input.turnsRatio = formulas::turnsRatio(nameplate.primaryVoltageV, *noLoad);
    input.temperatureConstant = nameplate.windingMaterial == WindingMaterial::Aluminium
                                    ? TemperatureConstant::Aluminium
                                    : TemperatureConstant::CopperIeee;
    return input;
}

AnalysisInput analysisInputFor(const Setup &setup)
{
    AnalysisInput input = analysisInputFor(setup.nameplate);
    input.meters = setup.meters;
    if (setup.meters && setup.meters->windingTemperatureUncertaintyC) {
        input.uWindingTemperatureC = *setup.meters->windingTemperatureUncertaintyC;
        input.windingTemperatureUncertaintyDefaulted = false;
    }
    return input;
}

std::optional<double> nameplateRegulationPercent(const Nameplate &nameplate)
{
    if (nameplate.regulationPercent && std::isfinite(*nameplate.regulationPercent))
        return nameplate.regulationPercent;
    if (nameplate.secondaryNoLoadVoltageV && nameplate.secondaryVoltageV > 0.0)
        return formulas::regulationPercent(*nameplate.secondaryNoLoadVoltageV, nameplate.secondaryVoltageV);
    return std::nullopt;
}

namespace {

// Regulation 100·R·I/base with base = V0 - R·I (full-load) or V0 (no-load), and its partial
// derivatives with respect to V0 and R.
ResultGradient regulationGradient(double v0, double r, double current, RegulationBase base)
{
    if (base == RegulationBase::FullLoad) {
        const double fullLoad = v0 - r * current;
        const double d2 = fullLoad * fullLoad;
        return {-100.0 * r * current / d2, 100.0 * current * v0 / d2, 0.0};
    }
    return {-100.0 * r * current / (v0 * v0), 100.0 * current / v0, 0.0};
}

double regulationValue(double v0, double r, double current, RegulationBase base)
{
    return 100.0 * r * current / (base == RegulationBase::FullLoad ? v0 - r * current : v0);
}

FieldErrors checkInput(const FitSummary &fit, const AnalysisInput &input)
{
    FieldErrors errors;
    if (!fit.ok())
        errors.push_back({"fit", "no usable fit: " + fit.message});
    if (!std::isfinite(input.ratedCurrentA) || !(input.ratedCurrentA > 0.0))
        errors.push_back({"rated_current_a", "must be a number above zero"});
    if (input.turnsRatio && (!std::isfinite(*input.turnsRatio) || !(*input.turnsRatio > 0.0)))
        errors.push_back({"turns_ratio", "must be a number above zero"});
    if (!std::isfinite(input.uWindingTemperatureC) || input.uWindingTemperatureC < 0.0)
        errors.push_back({"u_winding_temperature_c", "must be zero or above"});
    return errors;
}

// The results referred to the reference temperature: R' = F·R with F = (T_k + T_ref)/(T_k + T_m),
// V0 unchanged; ∂F/∂T_m = -F/(T_k + T_m).
void referToReference(AnalysisResult &result, const FitBudget &budget, const AnalysisInput &input, double v0, double r)
{
    const TemperatureCorrection correction =
        correctToReference(r, *input.windingTemperatureC, *input.referenceTemperatureC, input.temperatureConstant);
    if (!correction.ok) {
        result.errors.push_back({"winding_temperature_c", correction.error});
        return;
    }
    const double f = correction.factor;
    const double dfdT = -f / (correction.constantC + *input.windingTemperatureC);
    const double i = input.ratedCurrentA;
    const double rRef = f * r;
    result.temperatureCorrection = correction;
    result.referenceTemperatureC = input.referenceTemperatureC;
    result.referenceResistanceOhm = budget.evaluate(rRef, {0.0, f, r * dfdT});
    result.referredFullLoadVoltageV = budget.evaluate(v0 - rRef * i, {1.0, -f * i, -r * i * dfdT});
    result.referredCopperLossW = budget.evaluate(rRef * i * i, {0.0, f * i * i, r * i * i * dfdT});
    if (!(v0 - rRef * i > 0.0)) {
        result.errors.push_back({"reference_temperature_c", "referred to it, the fitted line reaches zero volts at or "
                                                            "below the rated current"});
        return;
    }
    const ResultGradient g = regulationGradient(v0, rRef, i, input.regulationBase);
    result.referredRegulationPercent =
        budget.evaluate(regulationValue(v0, rRef, i, input.regulationBase), {g.dV0, g.dR * f, g.dR * r * dfdT});
}

} // namespace

AnalysisResult analyseFit(const FitSummary &fit, const AnalysisInput &input)
{
    AnalysisResult result;
    result.regulationBase = input.regulationBase;
    result.errors = checkInput(fit, input);
    if (!result.ok())
        return result;

    const FitBudget budget(fit, input);
    result.metersKnown = input.meters.has_value();
    result.uncertaintyBasis = budget.basis();
    const double v0 = fit.intercept;
    const double r = -fit.slope;
    const double i = input.ratedCurrentA;

    result.seriesResistanceOhm = budget.evaluate(r, {0.0, 1.0, 0.0});
    result.noLoadVoltageV = budget.evaluate(v0, {1.0, 0.0, 0.0});
    const double fullLoad = v0 - r * i;
    result.fullLoadVoltageV = budget.evaluate(fullLoad, {1.0, -i, 0.0});
    if (!(fullLoad > 0.0)) {
        result.errors.push_back({"rated_current_a", "the fitted line reaches zero volts at or below the rated current; "
                                                    "check the data and the rated current"});
        return result;
    }
    result.regulationPercent = budget.evaluate(regulationValue(v0, r, i, input.regulationBase),
                                               regulationGradient(v0, r, i, input.regulationBase));
    result.copperLossW = budget.evaluate(r * i * i, {0.0, i * i, 0.0});
    if (input.turnsRatio) {
        const double a2 = *input.turnsRatio * *input.turnsRatio;
        result.primaryResistanceOhm = budget.evaluate(a2 * r, {0.0, a2, 0.0});
    }
    if (input.windingTemperatureC && input.referenceTemperatureC)
        referToReference(result, budget, input, v0, r);
    return result;
}

LineResults lineResults(const FitSummary &fit, const std::optional<MeterSpecs> &meters)
{
    LineResults results;
    if (!fit.ok())
        return results;
    AnalysisInput input;
    input.meters = meters;
    const FitBudget budget(fit, input);
    results.seriesResistanceOhm = budget.evaluate(-fit.slope, {0.0, 1.0, 0.0});
    results.noLoadVoltageV = budget.evaluate(fit.intercept, {1.0, 0.0, 0.0});
    results.uncertaintyBasis = budget.basis();
    return results;
}

} // namespace sagline
