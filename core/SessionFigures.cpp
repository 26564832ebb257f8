#include "SessionFigures.h"

namespace sagline {

std::string SessionFigures::verdictText() const
{
    return verdict ? toString(*verdict) : std::string("n/a");
}

SessionFigures computeSessionFigures(const FitSummary &fit, const Setup &setup,
                                     std::optional<double> windingTemperatureC, const FigureOptions &options)
{
    SessionFigures figures;
    figures.rule = options.rule;
    figures.referenceTemperatureC = options.referenceTemperatureC;
    figures.windingTemperatureC = windingTemperatureC;
    if (!fit.ok()) {
        figures.message = fit.message.empty() ? "no fit (" + toString(fit.status) + ")" : fit.message;
        return figures;
    }
    figures.resistanceOhm = fit.seriesResistanceOhm();
    figures.noLoadVoltageV = fit.noLoadVoltageV();

    AnalysisInput input = analysisInputFor(setup.nameplate);
    if (setup.nameplate.windingMaterial == WindingMaterial::Copper)
        input.temperatureConstant = options.copperConstant;
    input.coverageFactor = options.coverageFactor;
    input.windingTemperatureC = windingTemperatureC;
    if (windingTemperatureC)
        input.referenceTemperatureC = options.referenceTemperatureC;
    figures.temperatureConstantC = temperatureConstantC(input.temperatureConstant);
    figures.ratedCurrentA = input.ratedCurrentA;

    const AnalysisResult analysis = analyseFit(fit, input);
    if (!analysis.ok()) {
        figures.message = "no analysis at rated current: " + analysis.errors.front().message();
        return figures;
    }
    figures.ok = true;
    figures.resistanceOhm = analysis.seriesResistanceOhm.value;
    figures.resistanceUOhm = analysis.seriesResistanceOhm.expandedUncertainty;
    figures.noLoadVoltageV = analysis.noLoadVoltageV.value;
    figures.noLoadVoltageUV = analysis.noLoadVoltageV.expandedUncertainty;
    if (analysis.referenceResistanceOhm) {
        figures.resistanceRefOhm = analysis.referenceResistanceOhm->value;
        figures.resistanceRefUOhm = analysis.referenceResistanceOhm->expandedUncertainty;
    }
    figures.regulationPercent = analysis.regulationPercent.value;
    figures.regulationUPercent = analysis.regulationPercent.expandedUncertainty;
    figures.regulationLimitPercent = options.regulationLimitPercent ? options.regulationLimitPercent
                                                                    : nameplateRegulationPercent(setup.nameplate);
    if (figures.regulationLimitPercent) {
        // U unknown (two points) is passed as unknown, never as 0: the guarded rule then cannot
        // decide, the simple rule decides on the value alone (core/ConformityDecision.h).
        const ConformityDecision decision = decideAgainstUpperLimit(
            *figures.regulationPercent, figures.regulationUPercent, *figures.regulationLimitPercent, options.rule);
        if (decision.ok) {
            figures.verdict = decision.outcome;
            figures.ruleName = decision.ruleName;
        }
    }
    return figures;
}

} // namespace sagline
