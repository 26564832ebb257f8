#include "ConformityAssessment.h"

#include "NumberFormat.h"
#include "UncertaintyFormat.h"
#include "Units.h"

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

std::string percentText(double value)
{
    return formatSignificant(value, 3) + " %";
}

// The regulation limit chosen, and its label; nothing when there is none.
std::optional<double> regulationLimit(const RegulationLimitChoice &choice, const std::optional<Specification> &spec,
                                      const Nameplate &nameplate, std::string &label)
{
    switch (choice.kind) {
    case RegulationLimitChoice::Kind::Stated:
        label = "regulation limit " + percentText(choice.percent) + " given for this judgement";
        return choice.percent;
    case RegulationLimitChoice::Kind::Nameplate:
        if (const auto plate = nameplateRegulationPercent(nameplate)) {
            label = "regulation limit: the nameplate's own regulation, " + percentText(*plate) + ", chosen as the limit";
            return plate;
        }
        label = "the nameplate's regulation was chosen as the limit but the nameplate gives none";
        return std::nullopt;
    case RegulationLimitChoice::Kind::Specification:
        break;
    }
    if (spec && spec->regulationMaxPercent)
        return spec->regulationMaxPercent;
    return std::nullopt;
}

std::string specificationLabel(const Specification &spec)
{
    return "specification (" + (spec.source.empty() ? std::string("source not stated") : spec.source) + ")";
}

void judge(SpecificationVerdict &verdict, const std::string &quantity, const std::string &unit,
           const UncertainValue &result, const ToleranceRange &limits)
{
    verdict.limits.push_back(decideConformity(quantity, unit, result, limits, verdict.rule));
}

// The overall outcome, the lowest conformance probability and a one-line explanation.
void conclude(SpecificationVerdict &verdict, const AnalysisResult &analysis)
{
    for (const ConformityDecision &d : verdict.limits) {
        if (!d.ok)
            continue;
        verdict.outcome = worseOutcome(verdict.outcome, d.outcome);
        if (d.conformanceProbability)
            verdict.conformanceProbability = std::min(verdict.conformanceProbability.value_or(1.0),
                                                      *d.conformanceProbability);
    }
    const UncertainValue &regulation = analysis.regulationPercent;
    if (verdict.nameplateRegulationPercent)
        verdict.regulationMinusNameplatePercent = regulation.value - *verdict.nameplateRegulationPercent;
    if (verdict.limits.empty()) {
        verdict.explanation = "No limit stated: not judged.";
        if (verdict.nameplateRegulationPercent) {
            const std::string measured = regulation.expandedUncertainty
                                             ? formatWithUncertainty(regulation.value, *regulation.expandedUncertainty, "%")
                                             : percentText(regulation.value);
            verdict.explanation += " For information: regulation " + measured + " against the nameplate's "
                                   + percentText(*verdict.nameplateRegulationPercent) + ", a difference of "
                                   + formatSignificant(*verdict.regulationMinusNameplatePercent, 3)
                                   + " percentage points.";
        }
        return;
    }
    verdict.explanation = "Judged on " + std::to_string(verdict.limits.size())
                          + (verdict.limits.size() == 1 ? " limit" : " limits");
    if (verdict.conformanceProbability)
        verdict.explanation += "; probability of conformity " + conformanceProbabilityText(*verdict.conformanceProbability)
                               + (verdict.limits.size() > 1 ? " (the lowest of the limits)" : "");
    verdict.explanation += ".";
}

} // namespace

std::optional<RegulationLimitChoice> regulationLimitFromText(std::string_view text)
{
    while (!text.empty() && text.front() == ' ')
        text.remove_prefix(1);
    while (!text.empty() && text.back() == ' ')
        text.remove_suffix(1);
    if (text == "nameplate")
        return RegulationLimitChoice{RegulationLimitChoice::Kind::Nameplate, 0.0};
    const QuantityParse parsed = parseQuantity(text, Unit::Percent);
    if (!parsed.ok || !(parsed.value > 0.0) || parsed.value > 100.0)
        return std::nullopt;
    return RegulationLimitChoice{RegulationLimitChoice::Kind::Stated, parsed.value};
}

std::string toString(const RegulationLimitChoice &choice)
{
    switch (choice.kind) {
    case RegulationLimitChoice::Kind::Stated: return percentText(choice.percent);
    case RegulationLimitChoice::Kind::Nameplate: return "nameplate";
    case RegulationLimitChoice::Kind::Specification: break;
    }
    return "specification";
}

Assessment assessFit(const FitSummary &fit, const Setup &setup, const AssessmentOptions &options)
{
    Assessment assessment;
    AnalysisInput input = analysisInputFor(setup);
    if (options.temperatureConstant)
        input.temperatureConstant = *options.temperatureConstant;
    input.windingTemperatureC = options.windingTemperatureC;
    input.referralGainUPercent = options.referralGainUPercent;
    if (options.windingTemperatureC)
        input.referenceTemperatureC = options.referenceTemperatureC;
    assessment.analysis = analyseFit(fit, input);

    SpecificationVerdict &verdict = assessment.verdict;
    verdict.rule = options.rule;
    verdict.ruleName = describe(options.rule);
    verdict.nameplateRegulationPercent = nameplateRegulationPercent(setup.nameplate);
    const AnalysisResult &a = assessment.analysis;
    if (!a.ok()) {
        verdict.explanation = "Not judged: " + a.errors.front().message();
        return assessment;
    }
    verdict.atReferenceTemperature = options.judgeAtReferenceTemperature && a.referredRegulationPercent
                                     && a.referenceResistanceOhm && a.referredFullLoadVoltageV;
    verdict.referenceTemperatureC = verdict.atReferenceTemperature ? a.referenceTemperatureC : std::nullopt;
    const std::string at = verdict.atReferenceTemperature
                               ? " at " + formatSignificant(*a.referenceTemperatureC, 3) + " °C"
                               : std::string();

    std::vector<std::string> sources;
    std::string regulationLabel;
    const auto limit = regulationLimit(options.regulationLimit, setup.specification, setup.nameplate, regulationLabel);
    if (!regulationLabel.empty())
        sources.push_back(regulationLabel);
    const std::optional<Specification> &spec = setup.specification;
    if (limit)
        judge(verdict, "regulation" + at, "%",
              verdict.atReferenceTemperature ? *a.referredRegulationPercent : a.regulationPercent, {std::nullopt, *limit});
    if (spec && spec->fullLoadVoltageV)
        judge(verdict, "full-load voltage" + at, "V",
              verdict.atReferenceTemperature ? *a.referredFullLoadVoltageV : a.fullLoadVoltageV, *spec->fullLoadVoltageV);
    if (spec && spec->noLoadVoltageV)
        judge(verdict, "no-load voltage", "V", a.noLoadVoltageV, *spec->noLoadVoltageV);
    if (spec && spec->seriesResistanceMaxOhm)
        judge(verdict, "series resistance" + at, "Ω",
              verdict.atReferenceTemperature ? *a.referenceResistanceOhm : a.seriesResistanceOhm,
              {std::nullopt, *spec->seriesResistanceMaxOhm});
    const bool specUsed = spec && (spec->fullLoadVoltageV || spec->noLoadVoltageV || spec->seriesResistanceMaxOhm
                                   || (spec->regulationMaxPercent
                                       && options.regulationLimit.kind == RegulationLimitChoice::Kind::Specification));
    if (specUsed)
        sources.push_back(specificationLabel(*spec));
    for (const std::string &source : sources)
        verdict.limitsSource += (verdict.limitsSource.empty() ? "" : "; ") + source;
    if (verdict.limitsSource.empty())
        verdict.limitsSource = "no limit stated";
    conclude(verdict, a);
    return assessment;
}

} // namespace sagline
