// Everything a review, an export or a report shows about one session, read once from the store
// and fitted once with core's batch fit: the single source for the CLI, the JSON/CSV export
// and the PDF report, so none of them recomputes anything.
#pragma once

#include "AnalysisSettingsRecord.h"
#include "ConformityAssessment.h"
#include "ConformityDecision.h"
#include "FitSummary.h"
#include "PrimarySideAnalysis.h"
#include "Reading.h"
#include "ResultAnalysis.h"
#include "SessionProgress.h"
#include "SessionRecords.h"
#include "SessionSeal.h"
#include "SessionStore.h"
#include "Setup.h"
#include "StoreResult.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

// One step of the plan as stored in the session (the plan JSON of DESIGN.md).
struct StoredPlanStep {
    int index = 0;
    double currentA = 0.0;                   // A
    double predictedVoltageV = 0.0;          // V
    std::optional<double> loadResistanceOhm; // Ω, none at k = 0
    double outputVa = 0.0;                   // VA
    std::string fuseOutlook;                 // "holds", "may-open", "opens"
};

// The parts of the stored plan a reviewer sees; absent keys stay empty.
struct StoredPlan {
    bool present = false;                    // the session carries a plan
    std::string problem;                     // why the stored plan could not be read, "" if fine
    std::optional<double> ratedSecondaryCurrentA;
    std::optional<double> ratedPrimaryCurrentA;
    std::optional<double> turnsRatio;
    std::optional<double> seriesResistanceOhm;
    std::optional<double> regulationPercent;
    std::optional<double> recommendedFuseA;
    std::string recommendedFuseType;
    std::vector<std::string> warnings;
    std::vector<StoredPlanStep> steps;
};

// Reads the plan JSON written by planToJson; never throws.
StoredPlan parseStoredPlan(const std::string &planJson);

// How a reviewer wants the session judged; every choice is shown in the outputs. A choice left
// unset is taken from the session's analysis-settings record (core/AnalysisSettingsRecord.h)
// when it has one, else from the default named beside it.
struct ReviewOptions {
    FitMethod method = FitMethod::Ols;
    std::optional<DecisionRule> rule;                           // default: non-binary (ILAC-G8:09/2019 §4.2.3)
    std::optional<RegulationLimitChoice> regulationLimit;       // default: the setup's specification
    std::optional<double> referenceTemperatureC;                // default: 75 °C when a winding temperature exists
                                                                // (shown; judged at only when set)
    std::optional<double> windingTemperatureC;                  // default: the session's latest winding temperature
    std::optional<TemperatureConstant> temperatureConstant;     // default: from the winding material
    // The primary side (core/SupplyReferral.h, core/PrimarySideAnalysis.h).
    FitVoltages fitVoltages = FitVoltages::Referred;            // referred to rated V1 when V1 was measured
    double supplyDriftTolerancePercent = defaultSupplyDriftTolerancePercent;
    double regulationPowerFactor = defaultRegulationPowerFactor; // regulation predicted at this cos φ
    bool leadingPowerFactor = false;                            // ... lagging unless this is set
};

// 75 °C: IEC 60076-1's reference temperature (from memory, FACTS.md §3), used for small
// transformers too when nothing else is agreed (common practice).
inline constexpr double defaultReferenceTemperatureC = 75.0;

struct SessionSummary {
    std::string path;
    std::string notice;                      // from the store (newer version, recovered copy)
    SessionInfo info;
    std::optional<Setup> setup;              // parsed from info.setupJson
    std::string setupProblem;                // why it did not parse, "" if it did
    StoredPlan plan;
    std::vector<Reading> readings;           // every reading, `excluded` resolved
    std::vector<ExclusionRecord> exclusions; // the full history
    std::vector<TemperatureRecord> temperatures;
    std::vector<InstrumentRecord> instruments;
    std::vector<NoteRecord> notes;
    std::vector<SafetyStopRecord> safetyStops;
    std::vector<SignOffRecord> signOffs;
    ReadingRecorders recorders;              // who recorded each reading
    std::vector<SupersessionRecord> supersessions; // retakes
    std::vector<SweepEventRecord> sweepEvents;
    std::vector<ReopenRecord> reopens;
    SealReport seal;                         // signed, changed after sign-off, altered
    SessionProgress progress;                // k of N steps and how the sweep ended (never "running": read from a file)
    ReviewOptions options;                   // as used: the options given, gaps filled from the record
    DecisionRule rule = DecisionRule::NonBinary; // the decision rule used
    // Where each choice came from (option, session record or default).
    SettingSource ruleSource = SettingSource::Default;
    SettingSource regulationLimitSource = SettingSource::Default;
    SettingSource referenceTemperatureSource = SettingSource::Default;
    SettingSource temperatureConstantSource = SettingSource::Default;
    RecordedAnalysisSettings recordedSettings; // the latest record and notices about bad ones
    FitSummary fit;                          // fitReadings(readings, options.method, the setup's fit options)
    std::optional<AnalysisResult> analysis;  // when the setup parsed and the fit is ok
    std::string analysisProblem;             // why there is no analysis, "" when there is
    bool referenceTemperatureDefaulted = false; // T_ref is defaultReferenceTemperatureC, not chosen
    std::optional<SpecificationVerdict> verdict; // with the analysis: outcome (or not-judged), limits
    SupplyAssessment supply;                 // the supply over the sweep and what the fit was made on
    std::optional<PrimarySideResult> primarySide; // when a reading has primary values and the setup parsed

    std::size_t excludedCount() const;
    // The latest recorded temperature of a kind, °C.
    std::optional<double> latestTemperatureC(TemperatureKind kind) const;
    // The reason of the latest exclusion row of a reading, "" when it has none.
    std::string exclusionReason(std::int64_t readingId) const;
    // The latest exclusion row of a reading, or null.
    const ExclusionRecord *latestExclusion(std::int64_t readingId) const;
    // The retake that superseded a reading, or null.
    const SupersessionRecord *supersessionOf(std::int64_t readingId) const;
    // The verdict as every output shows it: the outcome when the session is complete, else
    // "provisional (k of N steps)" or "incomplete (...)" (core/SessionProgress.h).
    std::string verdictText() const;
    // Readings from the virtual bench (flagged simulated): every printed page says so.
    bool isSimulated() const;
    // The reading's number as the window, the report, the export and sagline-cli count them
    // (from 1, in recording order); 0 for an id the session does not hold.
    std::size_t readingNumber(std::int64_t readingId) const;
};

// One line for reports: each judging choice used and where it came from, e.g. "decision rule
// simple (session record); regulation limit 5 % (session record); reference temperature 75 °C
// (default); temperature constant per winding material (default)".
// The verdict settings a result was judged with and where each came from, in one line
// ("decision rule non-binary (default); regulation limit from the specification (default); ..."):
// the same words for `fit SESSION`, `fit X.csv --setup`, `run` and the report.
struct SettingsUsed {
    DecisionRule rule = DecisionRule::NonBinary;
    SettingSource ruleSource = SettingSource::Default;
    std::optional<RegulationLimitChoice> regulationLimit; // absent: the setup's specification
    SettingSource regulationLimitSource = SettingSource::Default;
    std::optional<double> referenceTemperatureC;          // absent: defaultReferenceTemperatureC
    SettingSource referenceTemperatureSource = SettingSource::Default;
    std::optional<TemperatureConstant> temperatureConstant; // absent: per winding material
    SettingSource temperatureConstantSource = SettingSource::Default;
};
std::string describeSettingsUsed(const SettingsUsed &used);
std::string describeSettingsUsed(const SessionSummary &summary);

StoreResult<SessionSummary> summarizeSession(const SessionStore &store, const ReviewOptions &options = {});
// Opens `path` for review (read-only, untrusted) and summarizes it.
StoreResult<SessionSummary> loadSessionSummary(const std::string &path, const ReviewOptions &options = {});

} // namespace sagline
