// Output of `sagline-cli fit`: the JSON object of DESIGN.md and the aligned human summary,
// with the uncertainty budget tables on request.
#pragma once

#include "AnalysisSettingsRecord.h"
#include "ConformityAssessment.h"
#include "FitSummary.h"
#include "PrimarySideAnalysis.h"
#include "ResultAnalysis.h"
#include "SessionProgress.h"
#include "SupplyReferral.h"

#include <nlohmann/json.hpp>

#include <optional>
#include <ostream>
#include <string>
#include <vector>

namespace sagline::cli {

// Everything the fit command computed, for either output form.
struct FitReport {
    std::string source;                      // the input file as given
    std::vector<int> lineNumbers;            // CSV line of each row (empty for a session)
    FitSummary fit;
    std::optional<MeterSpecs> meters;        // the setup's meters, when known
    bool hasNameplate = false;               // a setup was given or stored
    std::optional<AnalysisResult> analysis;  // when a nameplate is known and the analysis worked
    std::optional<SpecificationVerdict> verdict;
    std::vector<std::string> warnings;
    bool printBudget = false;                // --budget: print every result's budget table
    bool pointsInJson = false;               // --points: writeFitReportJson writes the per-point array
    // Where the judging choices came from (shown when there is a nameplate).
    SettingSource ruleSource = SettingSource::Default;
    SettingSource regulationLimitSource = SettingSource::Default;
    SettingSource temperatureConstantSource = SettingSource::Default;
    std::string settingsUsed;                // describeSettingsUsed: the verdict settings and their sources
    std::optional<SupplyAssessment> supply;  // with a nameplate: the supply and what the fit was made on
    std::optional<PrimarySideResult> primarySide; // with primary readings and a nameplate
    std::optional<SessionProgress> progress; // a session: k of N steps; an incomplete one has no verdict
};

// Warnings a reader should see: bending, outliers, scatter beyond the stated uncertainties.
std::vector<std::string> fitWarnings(const FitSummary &fit, const std::vector<int> &lineNumbers);

// Whether fitReportJson puts the per-point array in the tree, leaves it empty for the stream, or
// leaves the key out (`fit --json` without --points: a million points are 232 MB of text).
enum class PointsInJson { Tree, Placeholder, Omitted };

// The JSON object as a tree (with every point: memory grows with the points; for tests and
// small fits). writeFitReportJson writes the same text, the points streamed.
nlohmann::json fitReportJson(const FitReport &report, PointsInJson points = PointsInJson::Tree);
// `fit --json`: without report.pointsInJson, jsonText(fitReportJson(report, Omitted), 2) and a
// newline; with it, the text jsonText(fitReportJson(report), 2) would be, plus a newline, the
// points streamed instead of built as a tree (a million points: 1.5 GB as a tree).
void writeFitReportJson(const FitReport &report, std::ostream &out);
void printFitReport(const FitReport &report, std::ostream &out);

} // namespace sagline::cli
