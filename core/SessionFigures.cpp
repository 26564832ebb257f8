#include "SessionFigures.h"

#include <cmath>

namespace sagline {

std::string toString(TemperatureConvention convention)
{
    return convention == TemperatureConvention::Iec ? "iec" : "ieee";
}

double temperatureConstantC(WindingMaterial material, TemperatureConvention convention)
{
    if (material == WindingMaterial::Aluminium)
        return 225.0; // IEC 60076-1 and IEEE C57.12.90 alike (FACTS.md §3; IEC value from memory)
    return convention == TemperatureConvention::Iec ? 235.0 : 234.5;
}

std::string toString(DecisionRule rule)
{
    return rule == DecisionRule::SimpleAcceptance ? "simple-acceptance" : "guarded-acceptance";
}

std::string describe(DecisionRule rule)
{
    if (rule == DecisionRule::SimpleAcceptance)
        return "simple acceptance (ILAC-G8:09/2019 4.2.1): pass if the regulation is at or below the limit";
    return "guarded acceptance (ILAC-G8:09/2019 4.2.2), guard band w = U: pass at or below limit - U, "
           "fail above limit + U, otherwise undecided";
}

std::string toString(Conformity conformity)
{
    switch (conformity) {
    case Conformity::Pass:
        return "pass";
    case Conformity::Fail:
        return "fail";
    case Conformity::Undecided:
        return "undecided";
    case Conformity::NotAvailable:
        break;
    }
    return "n/a";
}

RegulationEstimate regulationAt(double resistanceOhm, double noLoadVoltageV, double currentA, double uResistance,
                                double uNoLoadVoltage, double covResistanceNoLoad)
{
    RegulationEstimate estimate;
    const double fullLoad = noLoadVoltageV - resistanceOhm * currentA; // V_fl
    if (!(fullLoad > 0.0) || !std::isfinite(fullLoad))
        return estimate;
    // reg = 100 R I / (V0 - R I); partial derivatives with D = V0 - R I:
    //   d/dR = 100 I V0 / D², d/dV0 = -100 R I / D².
    const double d2 = fullLoad * fullLoad;
    const double dR = 100.0 * currentA * noLoadVoltageV / d2;
    const double dV0 = -100.0 * resistanceOhm * currentA / d2;
    const double variance = dR * dR * uResistance * uResistance + dV0 * dV0 * uNoLoadVoltage * uNoLoadVoltage
                            + 2.0 * dR * dV0 * covResistanceNoLoad;
    estimate.ok = true;
    estimate.percent = 100.0 * resistanceOhm * currentA / fullLoad;
    estimate.standardUncertaintyPercent = std::sqrt(std::max(0.0, variance));
    return estimate;
}

Conformity judgeUpperLimit(double value, double expandedU, double limit, DecisionRule rule)
{
    if (!std::isfinite(value) || !std::isfinite(limit))
        return Conformity::NotAvailable;
    if (rule == DecisionRule::SimpleAcceptance)
        return value <= limit ? Conformity::Pass : Conformity::Fail;
    if (!std::isfinite(expandedU))
        return Conformity::NotAvailable;
    if (value <= limit - expandedU)
        return Conformity::Pass;
    if (value > limit + expandedU)
        return Conformity::Fail;
    return Conformity::Undecided;
}

namespace {

std::optional<double> nameplateRegulationPercent(const Nameplate &plate)
{
    if (plate.regulationPercent)
        return plate.regulationPercent;
    if (plate.secondaryNoLoadVoltageV && plate.secondaryVoltageV > 0.0)
        return (*plate.secondaryNoLoadVoltageV - plate.secondaryVoltageV) / plate.secondaryVoltageV * 100.0;
    return std::nullopt;
}

} // namespace

SessionFigures computeSessionFigures(const FitSummary &fit, const Setup &setup,
                                     std::optional<double> windingTemperatureC, const FigureOptions &options)
{
    SessionFigures figures;
    figures.rule = options.rule;
    figures.referenceTemperatureC = options.referenceTemperatureC;
    figures.temperatureConstantC = temperatureConstantC(setup.nameplate.windingMaterial, options.convention);
    figures.windingTemperatureC = windingTemperatureC;
    if (!fit.ok()) {
        figures.message = fit.message.empty() ? "the fit has no result (" + toString(fit.status) + ")" : fit.message;
        return figures;
    }
    figures.ok = true;
    const double k = options.coverageFactor;
    figures.resistanceOhm = fit.seriesResistanceOhm();
    figures.noLoadVoltageV = fit.noLoadVoltageV();
    const auto uR = fit.analysisSlopeSe();      // u(R) = u(slope)
    const auto uV0 = fit.analysisInterceptSe();
    const auto covSlopeIntercept = fit.analysisCovariance();
    if (uR)
        figures.resistanceUOhm = k * *uR;
    if (uV0)
        figures.noLoadVoltageUV = k * *uV0;

    // R_ref = R_m (T_k + T_ref)/(T_k + T_m): IEEE C57.12.90 / IEC 60076-1 resistance law.
    if (windingTemperatureC && *windingTemperatureC + figures.temperatureConstantC > 0.0) {
        const double factor = (figures.temperatureConstantC + options.referenceTemperatureC)
                              / (figures.temperatureConstantC + *windingTemperatureC);
        figures.resistanceRefOhm = figures.resistanceOhm * factor;
        if (figures.resistanceUOhm)
            figures.resistanceRefUOhm = *figures.resistanceUOhm * factor;
    }

    const Nameplate &plate = setup.nameplate;
    if (plate.secondaryVoltageV > 0.0)
        figures.ratedCurrentA = plate.ratedPowerVa / plate.secondaryVoltageV;
    if (figures.ratedCurrentA > 0.0 && uR && uV0 && covSlopeIntercept) {
        // cov(R, V0) = cov(-slope, intercept) = -cov(slope, intercept)
        const RegulationEstimate reg = regulationAt(figures.resistanceOhm, figures.noLoadVoltageV, figures.ratedCurrentA,
                                                    *uR, *uV0, -*covSlopeIntercept);
        if (reg.ok) {
            figures.regulationPercent = reg.percent;
            figures.regulationUPercent = k * reg.standardUncertaintyPercent;
        }
    }
    figures.regulationLimitPercent = options.regulationLimitPercent ? options.regulationLimitPercent
                                                                    : nameplateRegulationPercent(plate);
    if (figures.regulationPercent && figures.regulationUPercent && figures.regulationLimitPercent)
        figures.verdict = judgeUpperLimit(*figures.regulationPercent, *figures.regulationUPercent,
                                          *figures.regulationLimitPercent, options.rule);
    return figures;
}

} // namespace sagline
