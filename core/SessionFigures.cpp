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

    AssessmentOptions assessmentOptions;
    assessmentOptions.rule = options.rule;
    assessmentOptions.regulationLimit = options.regulationLimit;
    assessmentOptions.windingTemperatureC = windingTemperatureC;
    assessmentOptions.referenceTemperatureC = options.referenceTemperatureC;
    assessmentOptions.judgeAtReferenceTemperature = options.judgeAtReferenceTemperature;
    assessmentOptions.referralGainUPercent = options.referralGainUPercent;
    // Only the copper convention is a choice; an aluminium winding keeps 225 °C.
    if (setup.nameplate.windingMaterial == WindingMaterial::Copper)
        assessmentOptions.temperatureConstant = options.copperConstant;
    figures.assessment = assessFit(fit, setup, assessmentOptions);
    const AnalysisResult &analysis = figures.assessment.analysis;
    figures.temperatureConstantC = temperatureConstantC(
        assessmentOptions.temperatureConstant.value_or(analysisInputFor(setup.nameplate).temperatureConstant));
    figures.ratedCurrentA = analysisInputFor(setup.nameplate).ratedCurrentA;
    if (!analysis.ok()) {
        figures.message = "no analysis at rated current: " + analysis.errors.front().message();
        return figures;
    }
    figures.ok = true;
    figures.metersKnown = analysis.metersKnown;
    figures.resistanceOhm = analysis.seriesResistanceOhm.value;
    figures.resistanceUOhm = analysis.seriesResistanceOhm.expandedUncertainty;
    figures.resistanceK = analysis.seriesResistanceOhm.coverageFactor;
    figures.noLoadVoltageV = analysis.noLoadVoltageV.value;
    figures.noLoadVoltageUV = analysis.noLoadVoltageV.expandedUncertainty;
    figures.noLoadVoltageK = analysis.noLoadVoltageV.coverageFactor;
    if (analysis.referenceResistanceOhm) {
        figures.resistanceRefOhm = analysis.referenceResistanceOhm->value;
        figures.resistanceRefUOhm = analysis.referenceResistanceOhm->expandedUncertainty;
        figures.resistanceRefK = analysis.referenceResistanceOhm->coverageFactor;
    }
    figures.regulationPercent = analysis.regulationPercent.value;
    figures.regulationUPercent = analysis.regulationPercent.expandedUncertainty;
    figures.regulationK = analysis.regulationPercent.coverageFactor;
    const SpecificationVerdict &verdict = figures.assessment.verdict;
    for (const ConformityDecision &d : verdict.limits)
        if (d.quantity.rfind("regulation", 0) == 0)
            figures.regulationLimitPercent = d.limits.max;
    figures.verdict = verdict.outcome;
    figures.conformanceProbability = verdict.conformanceProbability;
    figures.ruleName = verdict.ruleName;
    figures.limitsSource = verdict.limitsSource;
    return figures;
}

} // namespace sagline
