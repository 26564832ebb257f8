#include "ResultAnalysis.h"

#include "NumberFormat.h"
#include "TransformerFormulas.h"

#include <cmath>

namespace sagline {

namespace {

UncertainValue withUncertainty(double value, std::optional<double> variance, double k)
{
    UncertainValue v;
    v.value = value;
    if (variance) {
        v.standardUncertainty = std::sqrt(std::max(0.0, *variance));
        v.expandedUncertainty = k * *v.standardUncertainty;
    }
    return v;
}

} // namespace

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

std::optional<double> nameplateRegulationPercent(const Nameplate &nameplate)
{
    if (nameplate.regulationPercent && std::isfinite(*nameplate.regulationPercent))
        return nameplate.regulationPercent;
    if (nameplate.secondaryNoLoadVoltageV && nameplate.secondaryVoltageV > 0.0)
        return formulas::regulationPercent(*nameplate.secondaryNoLoadVoltageV, nameplate.secondaryVoltageV);
    return std::nullopt;
}

AnalysisResult analyseFit(const FitSummary &fit, const AnalysisInput &input)
{
    AnalysisResult result;
    result.coverageFactor = input.coverageFactor;
    result.regulationBase = input.regulationBase;
    if (!fit.ok())
        result.errors.push_back({"fit", "no usable fit: " + fit.message});
    else if (!(fit.seriesResistanceOhm() > 0.0))
        // A loaded transformer's voltage falls with current (R > 0). A line that rises or stays
        // flat means crossed leads, a wrong meter range or readings of something else: no
        // regulation, copper loss or verdict is computed from it.
        result.errors.push_back({"fit", "the voltage does not fall with the current (R = "
                                            + formatSignificant(fit.seriesResistanceOhm(), 3)
                                            + " Ω, not above 0): check the connections and the meters; no regulation, "
                                              "copper loss or verdict from such a line"});
    if (!std::isfinite(input.ratedCurrentA) || !(input.ratedCurrentA > 0.0))
        result.errors.push_back({"rated_current_a", "must be a number above zero"});
    if (!std::isfinite(input.coverageFactor) || !(input.coverageFactor > 0.0))
        result.errors.push_back({"coverage_factor", "must be a number above zero"});
    if (input.turnsRatio && (!std::isfinite(*input.turnsRatio) || !(*input.turnsRatio > 0.0)))
        result.errors.push_back({"turns_ratio", "must be a number above zero"});
    if (!std::isfinite(input.uWindingTemperatureC) || input.uWindingTemperatureC < 0.0)
        result.errors.push_back({"u_winding_temperature_c", "must be zero or above"});
    if (!result.ok())
        return result;

    const double k = input.coverageFactor;
    const double a = fit.intercept; // V0
    const double b = fit.slope;     // -R
    const double current = input.ratedCurrentA;
    const auto seA = fit.analysisInterceptSe();
    const auto seB = fit.analysisSlopeSe();
    const auto cov = fit.analysisCovariance();
    const bool haveU = seA && seB && cov;
    const auto variance = [&](double dA, double dB) -> std::optional<double> {
        // Var = g' C g with the gradient g = (∂f/∂a, ∂f/∂b) (GUM 5.2.2, correlated inputs).
        if (!haveU)
            return std::nullopt;
        return dA * dA * *seA * *seA + dB * dB * *seB * *seB + 2.0 * dA * dB * *cov;
    };

    result.seriesResistanceOhm = withUncertainty(-b, variance(0.0, -1.0), k);
    result.noLoadVoltageV = withUncertainty(a, variance(1.0, 0.0), k);
    const double fullLoad = a + b * current;
    result.fullLoadVoltageV = withUncertainty(fullLoad, variance(1.0, current), k);
    if (!(fullLoad > 0.0)) {
        result.errors.push_back({"rated_current_a", "the fitted line reaches zero volts at or below the rated current; "
                                                    "check the data and the rated current"});
        return result;
    }
    if (input.regulationBase == RegulationBase::FullLoad) {
        // reg = 100 (a - V_fl)/V_fl = -100 b I/(a + b I)
        const double d2 = fullLoad * fullLoad;
        result.regulationPercent = withUncertainty(-100.0 * b * current / fullLoad,
                                                   variance(100.0 * b * current / d2, -100.0 * current * a / d2), k);
    } else {
        // reg = 100 (a - V_fl)/a = -100 b I/a
        result.regulationPercent =
            withUncertainty(-100.0 * b * current / a, variance(100.0 * b * current / (a * a), -100.0 * current / a), k);
    }
    const double i2 = current * current;
    result.copperLossW = withUncertainty(-b * i2, variance(0.0, -i2), k);
    if (input.turnsRatio) {
        const double a2 = *input.turnsRatio * *input.turnsRatio;
        result.primaryResistanceOhm = withUncertainty(-b * a2, variance(0.0, -a2), k);
    }
    if (input.windingTemperatureC && input.referenceTemperatureC) {
        const TemperatureCorrection correction = correctToReference(-b, *input.windingTemperatureC,
                                                                    *input.referenceTemperatureC,
                                                                    input.temperatureConstant);
        if (!correction.ok) {
            result.errors.push_back({"winding_temperature_c", correction.error});
            return result;
        }
        // u² = (f·u_R)² + (∂R_ref/∂T_m · u_Tm)², ∂R_ref/∂T_m = -R_ref/(T_k + T_m).
        std::optional<double> var = variance(0.0, -correction.factor);
        if (var) {
            const double dT = -correction.resistanceOhm / (correction.constantC + *input.windingTemperatureC);
            *var += dT * dT * input.uWindingTemperatureC * input.uWindingTemperatureC;
        }
        result.referenceResistanceOhm = withUncertainty(correction.resistanceOhm, var, k);
        result.temperatureCorrection = correction;
    }
    return result;
}

} // namespace sagline
