#include "SessionSummary.h"

#include "JsonReader.h"
#include "SetupJson.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace sagline {

namespace {

std::optional<double> number(const nlohmann::json &object, const char *key)
{
    const auto found = object.find(key);
    if (found == object.end() || !found->is_number())
        return std::nullopt;
    const double value = found->get<double>();
    return std::isfinite(value) ? std::optional<double>(value) : std::nullopt;
}

template <typename T>
StoreStatus take(StoreResult<T> result, T &into)
{
    if (!result.ok())
        return result.status();
    into = std::move(result.value);
    return StoreStatus::success();
}

} // namespace

StoredPlan parseStoredPlan(const std::string &planJson)
{
    StoredPlan plan;
    if (planJson.empty())
        return plan;
    plan.present = true;
    const JsonRead read = readJson(planJson);
    if (!read.ok() || !read.document->is_object()) {
        plan.problem = read.ok() ? "the stored plan is not a JSON object" : "the stored plan " + read.error;
        return plan;
    }
    const nlohmann::json &root = *read.document;
    plan.ratedSecondaryCurrentA = number(root, "rated_secondary_current_a");
    plan.ratedPrimaryCurrentA = number(root, "rated_primary_current_a");
    plan.turnsRatio = number(root, "turns_ratio");
    plan.seriesResistanceOhm = number(root, "series_resistance_ohm");
    plan.regulationPercent = number(root, "regulation_percent");
    if (const auto fuse = root.find("recommended_fuse"); fuse != root.end() && fuse->is_object()) {
        plan.recommendedFuseA = number(*fuse, "rating_a");
        if (const auto type = fuse->find("type"); type != fuse->end() && type->is_string())
            plan.recommendedFuseType = type->get<std::string>();
    }
    if (const auto warnings = root.find("warnings"); warnings != root.end() && warnings->is_array()) {
        for (const auto &warning : *warnings)
            if (warning.is_string())
                plan.warnings.push_back(warning.get<std::string>());
    }
    if (const auto steps = root.find("steps"); steps != root.end() && steps->is_array()) {
        for (const auto &step : *steps) {
            if (!step.is_object())
                continue;
            StoredPlanStep entry;
            const auto index = number(step, "index");
            entry.index = index && std::abs(*index) < 1e6 ? static_cast<int>(*index) : 0;
            entry.currentA = number(step, "current_a").value_or(NAN);
            entry.predictedVoltageV = number(step, "predicted_voltage_v").value_or(NAN);
            entry.loadResistanceOhm = number(step, "load_resistance_ohm");
            entry.outputVa = number(step, "output_va").value_or(NAN);
            if (const auto outlook = step.find("fuse_outlook"); outlook != step.end() && outlook->is_string())
                entry.fuseOutlook = outlook->get<std::string>();
            plan.steps.push_back(entry);
        }
    }
    return plan;
}

std::size_t SessionSummary::excludedCount() const
{
    return static_cast<std::size_t>(
        std::count_if(readings.begin(), readings.end(), [](const Reading &reading) { return reading.excluded; }));
}

std::optional<double> SessionSummary::latestTemperatureC(TemperatureKind kind) const
{
    for (auto it = temperatures.rbegin(); it != temperatures.rend(); ++it)
        if (it->kind == kind)
            return it->celsius;
    return std::nullopt;
}

std::string SessionSummary::exclusionReason(std::int64_t readingId) const
{
    const ExclusionRecord *latest = latestExclusion(readingId);
    return latest ? latest->reason : std::string();
}

const ExclusionRecord *SessionSummary::latestExclusion(std::int64_t readingId) const
{
    for (auto it = exclusions.rbegin(); it != exclusions.rend(); ++it)
        if (it->readingId == readingId)
            return &*it;
    return nullptr;
}

const SupersessionRecord *SessionSummary::supersessionOf(std::int64_t readingId) const
{
    for (const SupersessionRecord &record : supersessions)
        if (record.readingId == readingId)
            return &record;
    return nullptr;
}

bool SessionSummary::isSimulated() const
{
    return std::any_of(readings.begin(), readings.end(), [](const Reading &r) { return (r.flags & flagSimulated) != 0; });
}

std::size_t SessionSummary::readingNumber(std::int64_t readingId) const
{
    // Ids grow with recording order, so the number is the id's place in the sorted list.
    const auto found = std::lower_bound(readings.begin(), readings.end(), readingId,
                                        [](const Reading &r, std::int64_t id) { return r.id < id; });
    return found != readings.end() && found->id == readingId ? static_cast<std::size_t>(found - readings.begin()) + 1 : 0;
}

std::string SessionSummary::verdictText() const
{
    std::string outcome = "not judged";
    if (verdict)
        outcome = toString(verdict->outcome);
    return progress.verdictText(outcome);
}

namespace {

// Analysis at rated current and the verdict against the specification, from the session's own
// setup and winding temperature (core/ConformityAssessment); what is missing is said in
// analysisProblem.
void analyse(SessionSummary &summary)
{
    if (!summary.setup) {
        summary.analysisProblem = "the session's setup could not be read: " + summary.setupProblem;
        return;
    }
    if (!summary.fit.ok()) {
        summary.analysisProblem = "no fit: " + summary.fit.message;
        return;
    }
    const ReviewOptions &options = summary.options;
    AssessmentOptions assessment;
    assessment.rule = summary.rule;
    if (options.regulationLimit)
        assessment.regulationLimit = *options.regulationLimit;
    assessment.temperatureConstant = options.temperatureConstant;
    assessment.windingTemperatureC = options.windingTemperatureC ? options.windingTemperatureC
                                                                 : summary.latestTemperatureC(TemperatureKind::Winding);
    if (assessment.windingTemperatureC) {
        assessment.referenceTemperatureC = options.referenceTemperatureC.value_or(defaultReferenceTemperatureC);
        summary.referenceTemperatureDefaulted = !options.referenceTemperatureC.has_value();
        // A defaulted reference temperature is shown, not judged at: the verdict stays on the
        // measured values unless someone set the temperature.
        assessment.judgeAtReferenceTemperature = !summary.referenceTemperatureDefaulted;
    }
    assessment.referralGainUPercent = summary.supply.referralGainUPercent;
    Assessment result = assessFit(summary.fit, *summary.setup, assessment);
    if (!result.analysis.ok()) {
        summary.analysisProblem = result.analysis.errors.front().message();
        return;
    }
    summary.analysis = std::move(result.analysis);
    summary.verdict = std::move(result.verdict);
}

// Losses, efficiency and the equivalent circuit from the primary readings, beside the fit.
void analysePrimary(SessionSummary &summary)
{
    const bool anyPrimary = std::any_of(summary.readings.begin(), summary.readings.end(),
                                        [](const Reading &r) { return r.primary.hasAny(); });
    if (!summary.setup || !anyPrimary)
        return;
    AnalysisInput analysisInput = analysisInputFor(*summary.setup);
    analysisInput.referralGainUPercent = summary.supply.referralGainUPercent;
    PrimarySideInput input = primarySideInputFor(summary.setup->nameplate);
    input.regulationPowerFactor = summary.options.regulationPowerFactor;
    input.leading = summary.options.leadingPowerFactor;
    input.regulationBase = analysisInput.regulationBase;
    summary.primarySide = analysePrimarySide(summary.readings, summary.fit.ok() ? &summary.fit : nullptr, &analysisInput, input);
}

// Fills the choices the caller left open from the session's latest analysis-settings record.
void applyRecordedSettings(SessionSummary &summary)
{
    summary.recordedSettings = latestAnalysisSettings(summary.notes);
    ReviewOptions &options = summary.options;
    const std::optional<AnalysisSettings> &recorded = summary.recordedSettings.settings;
    const auto source = [&](bool given, bool inRecord) {
        return given ? SettingSource::Option : inRecord ? SettingSource::SessionRecord : SettingSource::Default;
    };
    summary.ruleSource = source(options.rule.has_value(), recorded.has_value());
    const bool recordedLimit = recorded && (recorded->regulationLimitPercent || recorded->regulationLimitNameplate);
    summary.regulationLimitSource = source(options.regulationLimit.has_value(), recordedLimit);
    summary.referenceTemperatureSource =
        source(options.referenceTemperatureC.has_value(), recorded && recorded->referenceTemperatureC);
    summary.temperatureConstantSource =
        source(options.temperatureConstant.has_value(), recorded && recorded->temperatureConstant);
    if (recorded) {
        if (!options.rule)
            options.rule = recorded->rule;
        if (!options.regulationLimit && recordedLimit)
            options.regulationLimit = recorded->regulationLimitNameplate
                                          ? RegulationLimitChoice{RegulationLimitChoice::Kind::Nameplate, 0.0}
                                          : RegulationLimitChoice{RegulationLimitChoice::Kind::Stated,
                                                                  *recorded->regulationLimitPercent};
        if (!options.referenceTemperatureC)
            options.referenceTemperatureC = recorded->referenceTemperatureC;
        if (!options.temperatureConstant)
            options.temperatureConstant = recorded->temperatureConstant;
    }
    summary.rule = options.rule.value_or(DecisionRule::NonBinary);
}

} // namespace

StoreResult<SessionSummary> summarizeSession(const SessionStore &store, const ReviewOptions &options)
{
    SessionSummary summary;
    summary.options = options;
    summary.path = store.path();
    summary.notice = store.notice();
    const StoreStatus statuses[] = {
        take(store.info(), summary.info),
        take(store.readings(), summary.readings),
        take(store.exclusions(), summary.exclusions),
        take(store.temperatures(), summary.temperatures),
        take(store.instruments(), summary.instruments),
        take(store.notes(), summary.notes),
        take(store.safetyStops(), summary.safetyStops),
        take(store.signOffs(), summary.signOffs),
        take(store.readingRecorders(), summary.recorders),
        take(store.supersessions(), summary.supersessions),
        take(store.sweepEvents(), summary.sweepEvents),
        take(store.reopens(), summary.reopens),
        take(checkSeal(store), summary.seal),
    };
    for (const StoreStatus &status : statuses)
        if (!status.ok())
            return StoreResult<SessionSummary>::failure(status);

    SetupParse setup = parseSetupJson(summary.info.setupJson);
    if (setup.errors.empty())
        summary.setup = std::move(setup.setup);
    else
        summary.setupProblem = setup.errors.front().message();
    summary.plan = parseStoredPlan(summary.info.planJson);
    std::vector<int> plannedSteps;
    for (const StoredPlanStep &step : summary.plan.steps)
        plannedSteps.push_back(step.index);
    summary.progress = sessionProgress(plannedSteps, summary.readings, summary.safetyStops, summary.sweepEvents, false);
    const double ratedPrimaryV = summary.setup ? summary.setup->nameplate.primaryVoltageV : 0.0;
    summary.supply = assessSupply(summary.readings, ratedPrimaryV, options.fitVoltages, options.supplyDriftTolerancePercent,
                                  primaryVoltmeterOf(summary.setup ? summary.setup->meters : std::nullopt));
    const FitOptions fitOptions = fitOptionsFor(summary.setup ? summary.setup->meters : std::nullopt);
    summary.fit = fitReadings(columnsToFit(summary.readings, summary.supply.fitVoltages, ratedPrimaryV), options.method,
                              fitOptions);
    applyRecordedSettings(summary);
    analyse(summary);
    analysePrimary(summary);
    return summary;
}

std::string describeSettingsUsed(const SettingsUsed &used)
{
    const auto from = [](SettingSource source) { return " (" + toString(source) + ")"; };
    const auto number = [](double value) {
        char text[32];
        std::snprintf(text, sizeof text, "%.4g", value);
        return std::string(text);
    };
    const auto limit = [&]() -> std::string {
        if (!used.regulationLimit || used.regulationLimit->kind == RegulationLimitChoice::Kind::Specification)
            return "from the specification";
        if (used.regulationLimit->kind == RegulationLimitChoice::Kind::Nameplate)
            return "the nameplate's regulation";
        return number(used.regulationLimit->percent) + " %";
    };
    std::string line = "decision rule " + toString(used.rule) + from(used.ruleSource);
    line += "; regulation limit " + limit() + from(used.regulationLimitSource);
    line += "; reference temperature " + number(used.referenceTemperatureC.value_or(defaultReferenceTemperatureC))
            + " °C" + from(used.referenceTemperatureSource);
    line += "; temperature constant "
            + (used.temperatureConstant ? toString(*used.temperatureConstant) : std::string("per winding material"))
            + from(used.temperatureConstantSource);
    return line;
}

std::string describeSettingsUsed(const SessionSummary &summary)
{
    const ReviewOptions &o = summary.options;
    return describeSettingsUsed(SettingsUsed{summary.rule, summary.ruleSource, o.regulationLimit,
                                             summary.regulationLimitSource, o.referenceTemperatureC,
                                             summary.referenceTemperatureSource, o.temperatureConstant,
                                             summary.temperatureConstantSource});
}

StoreResult<SessionSummary> loadSessionSummary(const std::string &path, const ReviewOptions &options)
{
    auto opened = SessionStore::openForReview(path);
    if (!opened.ok())
        return StoreResult<SessionSummary>::failure(opened.status());
    return summarizeSession(*opened.value, options);
}

} // namespace sagline
