#include "SessionComparison.h"

#include "NaturalOrder.h"
#include "SessionSummary.h"

#include "AnalysisSettingsRecord.h"
#include "SessionStore.h"
#include "SetupJson.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

namespace sagline {

std::optional<double> SessionRow::comparedResistanceOhm(bool atReference) const
{
    if (!opened || !figures.ok)
        return std::nullopt;
    if (atReference)
        return figures.resistanceRefOhm;
    return figures.resistanceOhm;
}

std::string SessionRow::reviewState() const
{
    if (seal.state == SealState::Altered)
        return "ALTERED after sign-off";
    if (seal.state == SealState::ChangedAfterSignOff)
        return "changed after sign-off";
    if (signOffs.empty())
        return "unreviewed"; // no word of the verdict's ("NOT JUDGED")
    return toString(signOffs.back().decision);
}

std::string SessionRow::verdictShown() const
{
    return progress.verdictText(figures.verdictText());
}

std::string SessionRow::verdictWords() const
{
    return progress.verdictText(figures.verdict ? outcomeWords(*figures.verdict) : std::string(noAnalysisWords));
}

std::string instrumentShortName(const std::string &identity)
{
    auto trim = [](std::string text) {
        const auto first = text.find_first_not_of(" \t\r\n");
        if (first == std::string::npos)
            return std::string();
        const auto last = text.find_last_not_of(" \t\r\n");
        return text.substr(first, last - first + 1);
    };
    const auto comma = identity.find(',');
    if (comma == std::string::npos)
        return trim(identity);
    const auto second = identity.find(',', comma + 1);
    const std::string maker = trim(identity.substr(0, comma));
    const std::string model = trim(identity.substr(comma + 1, second == std::string::npos ? std::string::npos
                                                                                         : second - comma - 1));
    return model.empty() ? maker : maker + " " + model;
}

std::string designOf(const Nameplate &nameplate)
{
    const auto number = [](double value) {
        char text[32];
        std::snprintf(text, sizeof text, "%.6g", value);
        return std::string(text);
    };
    return number(nameplate.ratedPowerVa) + " VA " + number(nameplate.primaryVoltageV) + "/"
           + number(nameplate.secondaryVoltageV) + " V " + number(nameplate.frequencyHz) + " Hz "
           + toString(nameplate.construction) + " " + toString(nameplate.windingMaterial);
}

std::string designName(const Setup &setup)
{
    return setup.design.empty() ? designOf(setup.nameplate) : setup.design;
}

namespace {

std::optional<double> meanOf(const std::vector<TemperatureRecord> &records, TemperatureKind kind)
{
    double sum = 0.0;
    std::size_t count = 0;
    for (const auto &record : records) {
        if (record.kind == kind && std::isfinite(record.celsius)) {
            sum += record.celsius;
            ++count;
        }
    }
    if (count == 0)
        return std::nullopt;
    return sum / static_cast<double>(count);
}

SessionRow failedRow(SessionRow row, const std::string &what, const std::string &message)
{
    row.opened = false;
    row.problem = message.empty() ? what : what + ": " + message;
    return row;
}

} // namespace

namespace {

// The batch's figure options with what the user left open taken from the session's record;
// a record that does not parse is said in the row's notice.
FigureOptions figureOptionsFor(const ComparisonOptions &options, const std::vector<NoteRecord> &notes, SessionRow &row)
{
    FigureOptions figures = options.figures;
    const RecordedAnalysisSettings recorded = latestAnalysisSettings(notes);
    for (const std::string &notice : recorded.notices)
        row.notice += (row.notice.empty() ? "" : "; ") + notice;
    if (!recorded.settings)
        return figures;
    if (!options.ruleChosen) {
        figures.rule = recorded.settings->rule;
        row.settingsFromRecord = true;
    }
    if (!options.limitChosen && recorded.settings->regulationLimitNameplate) {
        figures.regulationLimit = {RegulationLimitChoice::Kind::Nameplate, 0.0};
        row.settingsFromRecord = true;
    } else if (!options.limitChosen && recorded.settings->regulationLimitPercent) {
        figures.regulationLimit = {RegulationLimitChoice::Kind::Stated, *recorded.settings->regulationLimitPercent};
        row.settingsFromRecord = true;
    }
    // Only the copper convention is a choice here; an aluminium winding always uses 225 °C.
    const auto constant = recorded.settings->temperatureConstant;
    if (!options.constantChosen && constant && *constant != TemperatureConstant::Aluminium) {
        figures.copperConstant = *constant;
        row.settingsFromRecord = true;
    }
    return figures;
}

} // namespace

SessionRow loadSessionRow(const std::string &path, const ComparisonOptions &options)
{
    SessionRow row;
    row.path = path;
    auto opened = SessionStore::openForReview(path);
    if (!opened.ok())
        return failedRow(row, toString(opened.code), opened.message);
    const SessionStore &store = *opened.value;
    row.notice = store.notice();

    const auto info = store.info();
    if (!info.ok())
        return failedRow(row, toString(info.code), info.message);
    row.unitSerial = info.value.unitSerial;
    row.operatorName = info.value.operatorName;
    row.createdUtc = info.value.createdUtc;

    const auto readings = store.readings();
    const auto temperatures = store.temperatures();
    const auto instruments = store.instruments();
    const auto stops = store.safetyStops();
    const auto signOffs = store.signOffs();
    const auto notes = store.notes();
    const auto events = store.sweepEvents();
    const auto seal = checkSeal(store);
    for (const StoreStatus &status : {readings.status(), temperatures.status(), instruments.status(), stops.status(),
                                      signOffs.status(), notes.status(), events.status(), seal.status()}) {
        if (!status.ok())
            return failedRow(row, toString(status.code), status.message);
    }

    std::vector<std::string> names;
    for (const auto &instrument : instruments.value) {
        std::string name = instrumentShortName(instrument.identity);
        if (name.empty())
            name = "unidentified";
        name += " (" + instrument.role + ")";
        if (std::find(names.begin(), names.end(), name) == names.end())
            names.push_back(name);
    }
    for (std::size_t i = 0; i < names.size(); ++i)
        row.instruments += (i ? "; " : "") + names[i];

    row.safetyStops = stops.value;
    row.signOffs = signOffs.value;
    row.seal = seal.value;
    std::vector<int> plannedSteps;
    for (const StoredPlanStep &step : parseStoredPlan(info.value.planJson).steps)
        plannedSteps.push_back(step.index);
    row.progress = sessionProgress(plannedSteps, readings.value, stops.value, events.value, false);
    row.supervision = summarizeSupervision(notes.value);
    row.readingCount = readings.value.size();

    const SetupParse setup = parseSetupJson(info.value.setupJson);
    // As the session's own summary does: on readings referred to the rated supply when V1 was read.
    const double ratedPrimaryV = setup.setup ? setup.setup->nameplate.primaryVoltageV : 0.0;
    row.supply = assessSupply(readings.value, ratedPrimaryV, FitVoltages::Referred, defaultSupplyDriftTolerancePercent,
                              primaryVoltmeterOf(setup.setup ? setup.setup->meters : std::nullopt));
    const FitOptions fitOptions = fitOptionsFor(setup.setup ? setup.setup->meters : std::nullopt);
    row.fit = fitReadings(columnsToFit(readings.value, row.supply.fitVoltages, ratedPrimaryV), options.method, fitOptions);
    row.points.reserve(readings.value.size());
    for (std::size_t i = 0; i < readings.value.size(); ++i) {
        const Reading &reading = readings.value[i];
        const bool used = i < row.fit.points.size() ? row.fit.points[i].used : false;
        if (std::isfinite(reading.currentA) && std::isfinite(reading.voltageV))
            row.points.push_back({reading.currentA, reading.voltageV, used});
    }
    row.pointsUsed = row.fit.n;

    if (!setup.setup) {
        row.opened = true;
        row.figures.message = "the session's setup cannot be read: "
                              + (setup.errors.empty() ? std::string("unknown error") : setup.errors.front().message());
        return row;
    }
    // R was measured at the winding temperature: the mean of the winding temperatures recorded;
    // with none, the mean ambient (the winding taken to be at ambient).
    std::optional<double> winding = meanOf(temperatures.value, TemperatureKind::Winding);
    if (!winding)
        winding = meanOf(temperatures.value, TemperatureKind::Ambient);
    row.design = designName(*setup.setup);
    FigureOptions figureOptions = figureOptionsFor(options, notes.value, row);
    figureOptions.referralGainUPercent = row.supply.referralGainUPercent;
    row.figures = computeSessionFigures(row.fit, *setup.setup, winding, figureOptions);
    if (std::any_of(readings.value.begin(), readings.value.end(), [](const Reading &r) { return r.primary.hasAny(); })) {
        AnalysisInput analysisInput = analysisInputFor(*setup.setup);
        analysisInput.referralGainUPercent = row.supply.referralGainUPercent;
        row.primarySide = analysePrimarySide(readings.value, row.fit.ok() ? &row.fit : nullptr, &analysisInput,
                                             primarySideInputFor(setup.setup->nameplate));
    }
    row.opened = true;
    return row;
}

std::optional<UncertainValue> SessionRow::efficiencyAtRated() const
{
    return primarySide ? primarySide->efficiencyAtRatedPercent : std::nullopt;
}

std::optional<UncertainValue> SessionRow::noLoadLoss() const
{
    return primarySide && primarySide->openCircuit ? primarySide->openCircuit->noLoadLossW : std::nullopt;
}

std::vector<SessionRow> loadSessionRows(const std::vector<std::string> &paths, const ComparisonOptions &options,
                                        const std::function<bool(std::size_t done, std::size_t total)> &progress)
{
    std::vector<SessionRow> rows;
    rows.reserve(paths.size());
    for (const auto &path : paths) {
        rows.push_back(loadSessionRow(path, options));
        if (progress && !progress(rows.size(), paths.size()))
            break;
    }
    return rows;
}

std::optional<double> median(std::vector<double> values)
{
    if (values.empty())
        return std::nullopt;
    const std::size_t mid = values.size() / 2;
    std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(mid), values.end());
    const double upper = values[mid];
    if (values.size() % 2 == 1)
        return upper;
    const double lower = *std::max_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(mid));
    return (lower + upper) / 2.0;
}

namespace {

constexpr const char *robustZRule = "modified z-score 0.6745 (R - median)/MAD, flagged above 3.5 (Iglewicz and Hoaglin 1993)";

// The spread, robust z and control chart of one design's rows; z and far marks go into the
// batch-wide vectors at the rows' own indices.
void describeGroup(const std::vector<const SessionRow *> &rows, bool atReference, DesignStatistics &group,
                   std::vector<std::optional<double>> &robustZ, std::vector<std::size_t> &farFromBatch)
{
    std::vector<double> values;
    std::vector<std::size_t> owners;
    for (std::size_t i : group.rows) {
        // A sweep that ended early (an R from its first steps) is no unit like the others.
        if (rows[i]->figures.ok && !rows[i]->progress.isComplete()) {
            ++group.incompleteLeftOut;
            continue;
        }
        if (const auto r = rows[i]->comparedResistanceOhm(atReference)) {
            values.push_back(*r);
            owners.push_back(i);
        }
    }
    group.resistanceCount = values.size();
    // Time order for the control chart: the session's start (ISO 8601 UTC sorts as text); the
    // given order breaks ties so that the chart is the same on every run.
    group.chartRows = owners;
    std::stable_sort(group.chartRows.begin(), group.chartRows.end(),
                     [&](std::size_t a, std::size_t b) { return rows[a]->createdUtc < rows[b]->createdUtc; });
    std::vector<double> inTime;
    for (std::size_t i : group.chartRows)
        inTime.push_back(*rows[i]->comparedResistanceOhm(atReference));
    group.chart = individualsChart(inTime);

    if (values.empty()) {
        group.ruleNote = group.incompleteLeftOut > 0 ? "no complete session of this design has a fitted R"
                                                     : "no session of this design has a fitted R";
        return;
    }
    const double n = static_cast<double>(values.size());
    // Two-pass mean and variance (no raw power sums).
    const double mean = std::accumulate(values.begin(), values.end(), 0.0) / n;
    group.meanOhm = mean;
    group.minOhm = *std::min_element(values.begin(), values.end());
    group.maxOhm = *std::max_element(values.begin(), values.end());
    if (values.size() >= 2) {
        double squares = 0.0;
        for (double v : values)
            squares += (v - mean) * (v - mean);
        group.sdOhm = std::sqrt(squares / (n - 1.0));
    }
    group.medianOhm = median(values);
    std::vector<double> deviations;
    deviations.reserve(values.size());
    for (double v : values)
        deviations.push_back(std::fabs(v - *group.medianOhm));
    group.madOhm = median(deviations);

    // A batch statement needs enough units of the design; below that the marks only screen.
    group.screeningOnly = values.size() < farFromBatchMinimumUnits;
    const std::string rule = robustZRule;
    if (values.size() < robustZMinimumUnits) {
        group.ruleNote = rule + ": needs at least 3 units of the design";
    } else if (!(*group.madOhm > 0.0)) {
        group.ruleNote = rule + ": not applied, MAD is zero (half the units have the same R)";
    } else {
        group.ruleNote = rule + (group.screeningOnly ? "; screening only (fewer than 10 units of the design)" : "");
        for (std::size_t k = 0; k < values.size(); ++k) {
            const double z = robustZConstant * (values[k] - *group.medianOhm) / *group.madOhm;
            robustZ[owners[k]] = z;
            if (std::fabs(z) > robustZThreshold)
                farFromBatch.push_back(owners[k]);
        }
    }
}

} // namespace

BatchStatistics summarizeBatch(const std::vector<const SessionRow *> &rows)
{
    BatchStatistics stats;
    stats.sessions = rows.size();
    stats.robustZ.assign(rows.size(), std::nullopt);
    bool allHaveReference = true;
    std::size_t fitted = 0;
    for (const SessionRow *row : rows) {
        if (!row->opened) {
            ++stats.unreadable;
            continue;
        }
        if (!row->figures.ok) {
            ++stats.withoutFit;
        } else if (row->progress.isComplete()) { // incomplete rows stay out of the R statistics
            ++fitted;
            allHaveReference = allHaveReference && row->figures.resistanceRefOhm.has_value();
        }
        if (!row->progress.isComplete()) {
            ++stats.incomplete; // a sweep that ended early gets no verdict, least of all a pass
        } else if (!row->figures.verdict) {
            ++stats.noVerdict;
        } else {
            switch (*row->figures.verdict) {
            case ConformityOutcome::Pass: ++stats.pass; break;
            case ConformityOutcome::Fail: ++stats.fail; break;
            case ConformityOutcome::ConditionalPass: ++stats.conditionalPass; break;
            case ConformityOutcome::ConditionalFail: ++stats.conditionalFail; break;
            case ConformityOutcome::NotJudged: ++stats.notJudged; break;
            }
        }
        if (row->seal.state == SealState::ChangedAfterSignOff || row->seal.state == SealState::Altered) {
            ++stats.changedAfterSignOff;
        } else if (row->signOffs.empty()) {
            ++stats.notReviewed;
        } else {
            switch (row->signOffs.back().decision) {
            case ReviewDecision::Accepted: ++stats.accepted; break;
            case ReviewDecision::Rejected: ++stats.rejected; break;
            case ReviewDecision::Retest: ++stats.retest; break;
            }
        }
        if (!row->safetyStops.empty())
            ++stats.safetyStopped;
        if (!row->supervision.limitHits.empty())
            ++stats.limitHit;
    }
    // Compare like with like: at the reference temperature only when every fitted row has it.
    stats.atReferenceTemperature = fitted > 0 && allHaveReference;

    for (std::size_t i = 0; i < rows.size(); ++i) {
        if (!rows[i]->opened)
            continue;
        const std::string design = rows[i]->design.empty() ? std::string(unknownDesignLabel) : rows[i]->design;
        auto group = std::find_if(stats.designs.begin(), stats.designs.end(),
                                  [&](const DesignStatistics &d) { return d.design == design; });
        if (group == stats.designs.end()) {
            stats.designs.push_back({});
            stats.designs.back().design = design;
            group = stats.designs.end() - 1;
        }
        group->rows.push_back(i);
    }
    // Designs in the order of the numbers in their names (20 VA before 100 VA), whatever order
    // the files were met in; a design's rows keep their given order.
    std::stable_sort(stats.designs.begin(), stats.designs.end(),
                     [](const DesignStatistics &a, const DesignStatistics &b) { return naturalLess(a.design, b.design); });
    for (DesignStatistics &group : stats.designs) {
        describeGroup(rows, stats.atReferenceTemperature, group, stats.robustZ, stats.farFromBatch);
        stats.resistanceCount += group.resistanceCount;
    }
    std::sort(stats.farFromBatch.begin(), stats.farFromBatch.end());

    if (stats.designs.size() == 1) {
        const DesignStatistics &only = stats.designs.front();
        stats.meanOhm = only.meanOhm;
        stats.sdOhm = only.sdOhm;
        stats.minOhm = only.minOhm;
        stats.maxOhm = only.maxOhm;
        stats.medianOhm = only.medianOhm;
        stats.madOhm = only.madOhm;
        stats.screeningOnly = only.screeningOnly;
        stats.ruleNote = only.ruleNote;
    } else if (stats.designs.empty()) {
        stats.ruleNote = "no session has a fitted R";
    } else {
        stats.screeningOnly = std::any_of(stats.designs.begin(), stats.designs.end(),
                                          [](const DesignStatistics &d) { return d.screeningOnly; });
        stats.ruleNote = std::string(robustZRule) + ", within each of " + std::to_string(stats.designs.size())
                         + " designs; no statistics across designs";
    }
    return stats;
}

const DesignStatistics *BatchStatistics::designOfRow(std::size_t index) const
{
    for (const DesignStatistics &group : designs)
        if (std::find(group.rows.begin(), group.rows.end(), index) != group.rows.end())
            return &group;
    return nullptr;
}

bool BatchStatistics::isFarFromBatch(std::size_t index) const
{
    return std::find(farFromBatch.begin(), farFromBatch.end(), index) != farFromBatch.end();
}

std::string verdictCountsText(const BatchStatistics &stats)
{
    const auto count = [](ConformityOutcome outcome, std::size_t n) { return outcomeWords(outcome) + " " + std::to_string(n); };
    return count(ConformityOutcome::Pass, stats.pass) + ", " + count(ConformityOutcome::ConditionalPass, stats.conditionalPass)
           + ", " + count(ConformityOutcome::ConditionalFail, stats.conditionalFail) + ", "
           + count(ConformityOutcome::Fail, stats.fail) + ", " + count(ConformityOutcome::NotJudged, stats.notJudged)
           + ", " + noAnalysisWords + " " + std::to_string(stats.noVerdict) + ", incomplete (no verdict) "
           + std::to_string(stats.incomplete);
}

std::string unitsInStatisticsText(const DesignStatistics &group)
{
    std::string text = std::to_string(group.resistanceCount) + (group.resistanceCount == 1 ? " unit" : " units");
    if (group.incompleteLeftOut > 0)
        text += "; " + std::to_string(group.incompleteLeftOut)
                + (group.incompleteLeftOut == 1 ? " incomplete session" : " incomplete sessions") + " left out";
    return text;
}

BatchStatistics summarizeBatch(const std::vector<SessionRow> &rows)
{
    std::vector<const SessionRow *> pointers;
    pointers.reserve(rows.size());
    for (const auto &row : rows)
        pointers.push_back(&row);
    return summarizeBatch(pointers);
}

} // namespace sagline
