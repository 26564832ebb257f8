// One row per session for the review workspace and `sagline-cli compare`, and the statistics
// of a batch. Every file is opened untrusted and read-only (SessionStore::openForReview); a file
// that cannot be opened becomes a row with its reason and never stops the others. The numbers
// come from the fit engine (fitReadings) and SessionFigures; nothing is fitted here.
//
// Far-from-batch rule: the modified z-score of Iglewicz and Hoaglin (1993), "How to Detect and
// Handle Outliers", ASQC Basic References in Quality Control vol. 16:
//     M_i = 0.6745 (x_i - median) / MAD,   MAD = median |x_i - median|,
// flagged when |M_i| > 3.5. It is robust (one bad unit cannot hide itself by inflating the
// spread, as it can with mean and SD) and needs at least 3 units and MAD > 0.
#pragma once

#include "ControlChart.h"
#include "FitSummary.h"
#include "PrimarySideAnalysis.h"
#include "SessionFigures.h"
#include "SupplyReferral.h"
#include "SessionProgress.h"
#include "SessionRecords.h"
#include "SessionSeal.h"
#include "Setup.h"
#include "SupervisedRecords.h"

#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace sagline {

inline constexpr double robustZThreshold = 3.5;    // Iglewicz and Hoaglin (1993)
inline constexpr double robustZConstant = 0.6745;  // Φ⁻¹(0.75), makes MAD consistent with σ for normal data
inline constexpr std::size_t robustZMinimumUnits = 3;
// Far-from-batch marks are a statement about a batch only with at least this many units of one
// design; below it (or across designs) they are labelled "screening only" (common practice).
inline constexpr std::size_t farFromBatchMinimumUnits = 10;

struct ComparisonOptions {
    FitMethod method = FitMethod::Ols;
    FigureOptions figures;
    // Which figure options the user chose. The others are taken per session from its
    // analysis-settings record (core/AnalysisSettingsRecord.h) when it has one. The reference
    // temperature is not: it stays common to the batch so that R values compare.
    bool ruleChosen = false;
    bool limitChosen = false;
    bool constantChosen = false;
};

struct ComparisonPoint {
    double currentA = 0.0;
    double voltageV = 0.0;
    bool used = true;                 // false: excluded or flagged overload / not-a-number
};

struct SessionRow {
    std::string path;
    bool opened = false;              // false: `problem` says why (not a session, corrupt, ...)
    std::string problem;
    std::string notice;               // e.g. newer-schema notice from the store
    std::string unitSerial;
    std::string operatorName;
    std::string createdUtc;           // ISO 8601 UTC
    std::string instruments;          // "Maker Model (role); ..." from the *IDN? strings
    std::size_t readingCount = 0;     // every reading recorded
    std::size_t pointsUsed = 0;       // readings that went into the fit
    FitSummary fit;
    SessionFigures figures;
    std::vector<SafetyStopRecord> safetyStops;
    std::vector<SignOffRecord> signOffs; // oldest first
    SealReport seal;                  // signed, changed after sign-off, altered
    SessionProgress progress;         // k of N steps and how the sweep ended
    SupervisionSummary supervision;
    bool settingsFromRecord = false;  // rule, limit or constant taken from the session's record
    std::string design;               // designName(setup): units of one design compare; "" without a setup
    std::vector<ComparisonPoint> points; // for the overlay chart, in recording order
    SupplyAssessment supply;          // what the fit was made on (referred to rated V1 when it was read)
    std::optional<PrimarySideResult> primarySide; // losses and efficiency, with primary readings

    // Efficiency at rated load and no-load loss with their expanded uncertainties, when known.
    std::optional<UncertainValue> efficiencyAtRated() const;
    std::optional<UncertainValue> noLoadLoss() const;

    // R the batch compares: at the reference temperature when known, else as measured.
    std::optional<double> comparedResistanceOhm(bool atReference) const;
    // "unreviewed", or the latest sign-off: "accepted", "rejected", "retest"; "changed after
    // sign-off" once it was reopened, "ALTERED" when a digest no longer matches.
    std::string reviewState() const;
    // The verdict as data (CSV, JSON): the outcome's token ("conditional-pass") for a complete
    // session, else "incomplete (...)".
    std::string verdictShown() const;
    // The verdict as people read it in every table, window and report: outcomeWords
    // ("CONDITIONAL PASS"), "NO ANALYSIS" without one, else "incomplete (...)".
    std::string verdictWords() const;
};

// The identity of an instrument from its IEEE 488.2 *IDN? reply "maker,model,serial,firmware":
// "maker model"; any other text is returned trimmed.
std::string instrumentShortName(const std::string &identity);

// The design a nameplate describes: "60 VA 230/18 V 50 Hz laminated copper".
std::string designOf(const Nameplate &nameplate);
// The design a session belongs to: the setup's own `design` name when it gives one, else designOf
// its nameplate. Batch statistics, far-from-batch marks and control charts never cross designs.
std::string designName(const Setup &setup);
// The label of the group of sessions whose setup could not be read (no design known).
inline constexpr const char *unknownDesignLabel = "design unknown (setup unreadable)";

// Opens one session for review and computes its row. Never throws.
SessionRow loadSessionRow(const std::string &path, const ComparisonOptions &options);

// Loads every file in order. `progress(done, total)` is called after each file; returning false
// cancels (the rows loaded so far are returned).
std::vector<SessionRow> loadSessionRows(const std::vector<std::string> &paths, const ComparisonOptions &options,
                                        const std::function<bool(std::size_t done, std::size_t total)> &progress = {});

// The spread of R over the units of one design, and the far-from-batch marks within it.
struct DesignStatistics {
    std::string design;               // designName of every row in the group
    std::vector<std::size_t> rows;    // indices into the rows considered, in their given order
    std::size_t resistanceCount = 0;  // complete rows of the group with a fitted R
    std::size_t incompleteLeftOut = 0; // rows of the group with a fitted R whose sweep ended early: not in the statistics
    std::optional<double> meanOhm;
    std::optional<double> sdOhm;      // sample standard deviation (n - 1)
    std::optional<double> minOhm, maxOhm;
    std::optional<double> medianOhm;
    std::optional<double> madOhm;     // median absolute deviation (unscaled)
    bool screeningOnly = true;        // fewer than 10 units: the marks only screen
    std::string ruleNote;             // which rule was applied, or why it could not be
    // R of the group's units in time order (session start), for the trend chart.
    std::vector<std::size_t> chartRows; // indices into the rows considered, oldest first
    IndividualsChart chart;             // over R of chartRows, in that order
};

struct BatchStatistics {
    std::size_t sessions = 0;         // rows considered
    std::size_t unreadable = 0;       // rows that did not open
    std::size_t withoutFit = 0;       // opened, but no fit (too few points, ...)
    bool atReferenceTemperature = false; // R compared at the reference temperature (all rows had a temperature)
    std::size_t resistanceCount = 0;  // rows in the R statistics
    // Spread over the whole batch: only when it holds one design (else see `designs`).
    std::optional<double> meanOhm;
    std::optional<double> sdOhm;      // sample standard deviation (n - 1)
    std::optional<double> minOhm, maxOhm;
    std::optional<double> medianOhm;
    std::optional<double> madOhm;     // median absolute deviation (unscaled)
    std::size_t pass = 0, fail = 0, conditionalPass = 0, conditionalFail = 0;
    std::size_t notJudged = 0;        // analysed, no limit stated
    std::size_t noVerdict = 0;        // no analysis
    std::size_t incomplete = 0;       // ended early (stop, crash): no verdict counted
    std::size_t accepted = 0, rejected = 0, retest = 0, notReviewed = 0;
    std::size_t changedAfterSignOff = 0; // reopened or altered: the sign-off no longer holds
    std::size_t safetyStopped = 0;    // rows with at least one safety stop
    std::size_t limitHit = 0;         // rows with at least one lab-sheet limit hit
    // Each row's z is taken within its own design's group only; a unit is never far from
    // units of another design.
    std::vector<std::optional<double>> robustZ; // one per row considered (same order), when computable
    std::vector<std::size_t> farFromBatch;      // indices (into the rows considered) with |z| > 3.5 in their design
    bool screeningOnly = true;        // some design has fewer than 10 units: its marks only screen
    std::string ruleNote;             // which rule was applied, or why it could not be
    std::vector<DesignStatistics> designs; // one per design among the opened rows, in order of first appearance
    // The group of row `index` (into the rows considered); nullptr for an unopened row.
    const DesignStatistics *designOfRow(std::size_t index) const;
    bool isFarFromBatch(std::size_t index) const;
};

// "PASS 3, CONDITIONAL PASS 1, CONDITIONAL FAIL 0, FAIL 0, NOT JUDGED 2, no analysis 0, incomplete (no verdict) 0":
// the outcome words as the window and the reports spell them.
std::string verdictCountsText(const BatchStatistics &stats);
// "4 units" or "4 units; 2 incomplete sessions left out": who is in a design's R statistics.
std::string unitsInStatisticsText(const DesignStatistics &group);

// Statistics over `rows` (e.g. the selection or the filtered rows).
BatchStatistics summarizeBatch(const std::vector<const SessionRow *> &rows);
BatchStatistics summarizeBatch(const std::vector<SessionRow> &rows);

// The median of `values` (empty: nullopt); exposed for the tests.
std::optional<double> median(std::vector<double> values);

} // namespace sagline
