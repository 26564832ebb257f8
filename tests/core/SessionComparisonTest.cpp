// The review's comparison rows and batch statistics. Fit values are checked against an
// independent least-squares solution (Eigen's column-pivoting QR on the design matrix, the
// textbook covariance s²(XᵀX)⁻¹) and a numerical-Jacobian propagation for regulation, never
// against the fit engine itself.
#include "ReviewTestSupport.h"
#include "SessionComparison.h"
#include "SessionScan.h"

#include <Eigen/Dense>
#include <gtest/gtest.h>

#include <cmath>
#include <functional>

using namespace sagline;
using namespace sagline::test;

namespace {

struct IndependentFit {
    double intercept, slope;     // V0, -R
    Eigen::Matrix2d covariance;  // of (intercept, slope)
};

IndependentFit independentFit(const std::vector<Reading> &readings)
{
    const Eigen::Index n = static_cast<Eigen::Index>(readings.size());
    Eigen::MatrixXd x(n, 2);
    Eigen::VectorXd y(n);
    for (Eigen::Index i = 0; i < n; ++i) {
        x(i, 0) = 1.0;
        x(i, 1) = readings[static_cast<std::size_t>(i)].currentA;
        y(i) = readings[static_cast<std::size_t>(i)].voltageV;
    }
    const Eigen::Vector2d beta = x.colPivHouseholderQr().solve(y);
    const double s2 = (y - x * beta).squaredNorm() / static_cast<double>(n - 2);
    return {beta(0), beta(1), s2 * (x.transpose() * x).inverse()};
}

// Regulation from the nameplate definition, (V0 - V_fl)/V_fl × 100 (electric-machines textbook,
// FACTS.md §4), written directly in (V0, slope).
double regulation(double v0, double slope, double current)
{
    const double fullLoad = v0 + slope * current;
    return (v0 - fullLoad) / fullLoad * 100.0;
}

} // namespace

TEST(SessionComparison, RowMatchesIndependentLeastSquares)
{
    TempFolder folder;
    DemoUnit unit;
    const std::string path = makeDemoSession(folder.file("unit.sagline"), unit);
    ComparisonOptions options; // OLS, non-binary rule, 75 °C, copper 234.5 °C; the nameplate's limit chosen
    options.figures.regulationLimit = {RegulationLimitChoice::Kind::Nameplate, 0.0};
    const SessionRow row = loadSessionRow(path, options);
    ASSERT_TRUE(row.opened) << row.problem;
    ASSERT_TRUE(row.figures.ok) << row.figures.message;

    const IndependentFit fit = independentFit(demoReadings(unit));
    const double seSlope = std::sqrt(fit.covariance(1, 1));
    const double seIntercept = std::sqrt(fit.covariance(0, 0));
    EXPECT_NEAR(row.figures.resistanceOhm, -fit.slope, 1e-10);
    EXPECT_NEAR(row.figures.noLoadVoltageV, fit.intercept, 1e-10);
    // No meter specifications in this setup: the scatter alone, ν = n - 2 = 9, k = t_0.975(9) =
    // 2.262157 (scipy.stats.t.ppf(0.975, 9); GUM Table G.2: 2.26).
    const double k = 2.262157;
    EXPECT_NEAR(*row.figures.resistanceUOhm, k * seSlope, 1e-6 * seSlope);
    EXPECT_NEAR(*row.figures.noLoadVoltageUV, k * seIntercept, 1e-6 * seIntercept);
    EXPECT_FALSE(row.figures.metersKnown);

    // R at 75 °C from 20 °C, copper, T_k = 234.5 °C: factor 1.216110 (FACTS.md §3 check value).
    EXPECT_NEAR(*row.figures.resistanceRefOhm / row.figures.resistanceOhm, 1.216110, 1e-6);
    EXPECT_DOUBLE_EQ(row.figures.temperatureConstantC, 234.5);

    // Regulation at rated current 50 VA / 24 V, its uncertainty by a numerical Jacobian J Σ Jᵀ.
    const double rated = 50.0 / 24.0;
    const double reg = regulation(fit.intercept, fit.slope, rated);
    const double h0 = 1e-6, h1 = 1e-7;
    Eigen::RowVector2d jacobian((regulation(fit.intercept + h0, fit.slope, rated) - regulation(fit.intercept - h0, fit.slope, rated)) / (2 * h0),
                                (regulation(fit.intercept, fit.slope + h1, rated) - regulation(fit.intercept, fit.slope - h1, rated)) / (2 * h1));
    const double uReg = std::sqrt((jacobian * fit.covariance * jacobian.transpose())(0, 0));
    EXPECT_NEAR(*row.figures.regulationPercent, reg, 1e-9);
    EXPECT_NEAR(*row.figures.regulationUPercent, k * uReg, 1e-5 * uReg);
    // Nameplate regulation (26.4 - 24)/24 × 100 = 10 %.
    EXPECT_NEAR(*row.figures.regulationLimitPercent, 10.0, 1e-12);

    EXPECT_EQ(row.unitSerial, "DEMO-0001");
    EXPECT_EQ(row.operatorName, "A. Tester");
    EXPECT_EQ(row.instruments, "DemoMaker DV-100 (voltmeter); DemoMaker DA-20 (ammeter)");
    EXPECT_EQ(row.pointsUsed, 11u);
    EXPECT_EQ(row.points.size(), 11u);
    EXPECT_EQ(row.reviewState(), "unreviewed");
}

TEST(SessionComparison, ExcludedReadingIsLeftOutOfTheFit)
{
    TempFolder folder;
    DemoUnit unit;
    const std::string path = makeDemoSession(folder.file("unit.sagline"), unit);
    {
        auto store = SessionStore::openForWriting(path);
        ASSERT_TRUE(store.ok()) << store.message;
        const auto readings = store.value->readings().value;
        ASSERT_TRUE(store.value->excludeReading(readings[4].id, "lead slipped", "A. Tester").ok());
    }
    const SessionRow row = loadSessionRow(path, {});
    ASSERT_TRUE(row.figures.ok);
    EXPECT_EQ(row.pointsUsed, 10u);
    EXPECT_EQ(row.readingCount, 11u);
    EXPECT_FALSE(row.points[4].used);
    auto kept = demoReadings(unit);
    kept.erase(kept.begin() + 4);
    EXPECT_NEAR(row.figures.resistanceOhm, -independentFit(kept).slope, 1e-10);
}

TEST(SessionComparison, FolderWithBadFilesListsReasonsAndComparesTheRest)
{
    TempFolder folder;
    std::filesystem::create_directories(folder.file("batch/week2"));
    DemoUnit a;
    makeDemoSession(folder.file("batch/a.sagline"), a);
    DemoUnit b;
    b.serial = "DEMO-0002";
    b.resistanceOhm = 1.160;
    makeDemoSession(folder.file("batch/week2/b.sagline"), b);

    DemoUnit big;
    big.points = 300; // enough pages to damage one in the middle
    const std::string corrupt = makeDemoSession(folder.file("batch/corrupt.sagline"), big);
    std::string bytes = fileBytes(corrupt);
    for (std::size_t i = 3 * 4096 + 8; i < 5 * 4096 && i < bytes.size(); i += 7)
        bytes[i] = static_cast<char>(bytes[i] ^ 0x5A);
    writeBytes(corrupt, bytes);

    const std::string truncated = makeDemoSession(folder.file("batch/truncated.sagline"), big);
    const std::string whole = fileBytes(truncated);
    writeBytes(truncated, whole.substr(0, whole.size() / 2));

    DemoUnit newer;
    newer.serial = "DEMO-NEW";
    const std::string newerPath = makeDemoSession(folder.file("batch/week2/newer.sagline"), newer);
    runSql(newerPath, "CREATE TABLE calibration (id INTEGER PRIMARY KEY, text TEXT); PRAGMA user_version = 9;");

    writeBytes(folder.file("batch/notes.sagline"), "not a database\n");
    writeBytes(folder.file("batch/readme.txt"), "ignored: not a session file name\n");

    const SessionFileList found = findSessionFiles({folder.file("batch")});
    ASSERT_EQ(found.files.size(), 6u);
    EXPECT_TRUE(found.problems.empty());
    const auto rows = loadSessionRows(found.files, {});
    ASSERT_EQ(rows.size(), 6u);

    auto rowFor = [&](const std::string &name) -> const SessionRow & {
        for (const auto &row : rows)
            if (std::filesystem::path(row.path).filename() == name)
                return row;
        ADD_FAILURE() << "no row for " << name;
        return rows.front();
    };
    EXPECT_TRUE(rowFor("a.sagline").figures.ok);
    EXPECT_TRUE(rowFor("b.sagline").figures.ok);
    EXPECT_NEAR(rowFor("b.sagline").figures.resistanceOhm, 1.160, 0.01);

    const SessionRow &newerRow = rowFor("newer.sagline");
    EXPECT_TRUE(newerRow.opened) << newerRow.problem;
    EXPECT_TRUE(newerRow.figures.ok);
    EXPECT_NE(newerRow.notice.find("newer"), std::string::npos) << newerRow.notice;

    for (const char *name : {"corrupt.sagline", "truncated.sagline", "notes.sagline"}) {
        const SessionRow &bad = rowFor(name);
        EXPECT_FALSE(bad.opened) << name;
        EXPECT_FALSE(bad.problem.empty()) << name;
    }
    EXPECT_NE(rowFor("truncated.sagline").problem.find("truncated"), std::string::npos) << rowFor("truncated.sagline").problem;
    EXPECT_NE(rowFor("notes.sagline").problem.find("not a session"), std::string::npos) << rowFor("notes.sagline").problem;
    EXPECT_NE(rowFor("corrupt.sagline").problem.find("corrupt"), std::string::npos) << rowFor("corrupt.sagline").problem;

    const BatchStatistics stats = summarizeBatch(rows);
    EXPECT_EQ(stats.sessions, 6u);
    EXPECT_EQ(stats.unreadable, 3u);
    EXPECT_EQ(stats.resistanceCount, 3u);
}

namespace {

SessionRow fittedRow(double resistance, ConformityOutcome verdict = ConformityOutcome::Pass)
{
    SessionRow row;
    row.opened = true;
    row.figures.ok = true;
    row.figures.resistanceOhm = resistance;
    row.figures.resistanceRefOhm = resistance * 1.2;
    row.figures.verdict = verdict;
    return row;
}

} // namespace

TEST(SessionComparison, RobustZFlagsTheUnitFarFromTheBatch)
{
    // Hand-worked (Iglewicz and Hoaglin 1993 modified z-score): median 1.1505 Ω, MAD 0.0015 Ω,
    // z(1.30) = 0.6745 × 0.1495 / 0.0015 = 67.225, z(1.148) = -1.12417. Mean 1.175 Ω, SD 0.0612536 Ω.
    std::vector<SessionRow> rows;
    for (double r : {1.150, 1.152, 1.148, 1.151, 1.149, 1.30})
        rows.push_back(fittedRow(r));
    for (auto &row : rows)
        row.figures.resistanceRefOhm.reset(); // no temperature: compared as measured
    const BatchStatistics stats = summarizeBatch(rows);
    EXPECT_FALSE(stats.atReferenceTemperature);
    EXPECT_NEAR(*stats.medianOhm, 1.1505, 1e-12);
    EXPECT_NEAR(*stats.madOhm, 0.0015, 1e-12);
    EXPECT_NEAR(*stats.meanOhm, 1.175, 1e-12);
    EXPECT_NEAR(*stats.sdOhm, 0.0612536, 1e-7);
    ASSERT_EQ(stats.farFromBatch.size(), 1u);
    EXPECT_EQ(stats.farFromBatch[0], 5u);
    EXPECT_NEAR(*stats.robustZ[5], 67.22517, 1e-4);
    EXPECT_NEAR(*stats.robustZ[2], -1.124167, 1e-6);
    EXPECT_NE(stats.ruleNote.find("Iglewicz"), std::string::npos);
    // Six units: the marks only screen (a batch statement wants 10 units of one design).
    EXPECT_TRUE(stats.screeningOnly);
    EXPECT_NE(stats.ruleNote.find("screening only"), std::string::npos) << stats.ruleNote;
}

TEST(SessionComparison, FarFromBatchNeedsTenUnitsOfOneDesign)
{
    std::vector<SessionRow> rows;
    for (double r : {1.150, 1.152, 1.148, 1.151, 1.149, 1.150, 1.153, 1.147, 1.151, 1.30})
        rows.push_back(fittedRow(r));
    BatchStatistics stats = summarizeBatch(rows);
    EXPECT_FALSE(stats.screeningOnly) << stats.ruleNote;
    ASSERT_EQ(stats.farFromBatch.size(), 1u);
    EXPECT_EQ(stats.farFromBatch[0], 9u);
    EXPECT_EQ(stats.ruleNote.find("screening only"), std::string::npos) << stats.ruleNote;
    // One unit of another design: nine of the first design (screening only), and one alone.
    rows[3].design = "another design";
    stats = summarizeBatch(rows);
    EXPECT_TRUE(stats.screeningOnly);
    ASSERT_EQ(stats.designs.size(), 2u);
    EXPECT_NE(stats.ruleNote.find("within each of 2 designs"), std::string::npos) << stats.ruleNote;
    ASSERT_TRUE(stats.designOfRow(0));
    EXPECT_NE(stats.designOfRow(0)->ruleNote.find("screening only"), std::string::npos) << stats.designOfRow(0)->ruleNote;
    EXPECT_FALSE(stats.robustZ[3].has_value()) << "one unit alone has no batch to be far from";
}

TEST(SessionComparison, ThreeDesignsNeverFlagAcrossDesigns)
{
    // A folder of 20, 60 and 100 VA units (scenario of our own): R differs by design by a factor
    // of ten, which across designs would make every small unit "far"; within its design none is.
    std::vector<SessionRow> rows;
    const struct {
        const char *design;
        double r;
    } units[] = {{"20 VA", 6.10}, {"60 VA", 0.631}, {"100 VA", 0.301}, {"20 VA", 6.05}, {"60 VA", 0.628},
                 {"100 VA", 0.299}, {"20 VA", 6.12}, {"60 VA", 0.634}, {"100 VA", 0.303}, {"60 VA", 0.630}};
    for (const auto &unit : units) {
        rows.push_back(fittedRow(unit.r));
        rows.back().design = unit.design;
        rows.back().figures.resistanceRefOhm.reset();
    }
    const BatchStatistics stats = summarizeBatch(rows);
    EXPECT_TRUE(stats.farFromBatch.empty());
    ASSERT_EQ(stats.designs.size(), 3u);
    EXPECT_FALSE(stats.meanOhm.has_value()) << "no mean across designs";
    EXPECT_EQ(stats.resistanceCount, 10u);
    EXPECT_EQ(stats.designs[0].design, "20 VA");
    EXPECT_EQ(stats.designs[0].rows, (std::vector<std::size_t>{0, 3, 6}));
    EXPECT_NEAR(*stats.designs[0].meanOhm, (6.10 + 6.05 + 6.12) / 3.0, 1e-12);
    EXPECT_NEAR(*stats.designs[1].meanOhm, (0.631 + 0.628 + 0.634 + 0.630) / 4.0, 1e-12);
    EXPECT_NEAR(*stats.designs[2].medianOhm, 0.301, 1e-12);
    for (std::size_t i = 0; i < rows.size(); ++i) {
        ASSERT_TRUE(stats.robustZ[i].has_value()) << i;
        EXPECT_LT(std::fabs(*stats.robustZ[i]), robustZThreshold) << i;
    }
    // Each design has its own control chart, over its own units only.
    EXPECT_EQ(stats.designs[1].chart.n, 4u);
    EXPECT_TRUE(stats.designs[1].chart.hasLimits());
    EXPECT_NEAR(*stats.designs[1].chart.centre, *stats.designs[1].meanOhm, 1e-15);
    EXPECT_EQ(stats.designOfRow(9), &stats.designs[1]);
    // The same rows as one design would have flagged the small units.
    for (auto &row : rows)
        row.design = "one design";
    EXPECT_FALSE(summarizeBatch(rows).farFromBatch.empty());
}

TEST(SessionComparison, DesignsInTheOrderOfTheNumbersInTheirNames)
{
    // Files met as u100..., u20..., u60...: the designs still read 20, 60, 100 VA (the window's
    // table sorts them so too).
    std::vector<SessionRow> rows;
    for (int i = 0; i < 4; ++i)
        rows.push_back(fittedRow(1.0 + 0.01 * i));
    rows[0].design = "100 VA 230/24 V";
    rows[1].design = "20 VA 230/12 V";
    rows[2].design = "60 VA 230/18 V";
    rows[3].design = "100 VA 230/24 V";
    const BatchStatistics stats = summarizeBatch(rows);
    ASSERT_EQ(stats.designs.size(), 3u);
    EXPECT_EQ(stats.designs[0].design, "20 VA 230/12 V");
    EXPECT_EQ(stats.designs[1].design, "60 VA 230/18 V");
    EXPECT_EQ(stats.designs[2].design, "100 VA 230/24 V");
    EXPECT_EQ(stats.designs[2].rows, (std::vector<std::size_t>{0, 3}));
    EXPECT_EQ(stats.designOfRow(3), &stats.designs[2]);
}

TEST(SessionComparison, FarWithinItsOwnDesignIsStillFlagged)
{
    std::vector<SessionRow> rows;
    for (double r : {0.630, 0.631, 0.629, 0.632, 0.90})
        rows.push_back(fittedRow(r));
    for (double r : {6.10, 6.05, 6.12})
        rows.push_back(fittedRow(r));
    for (std::size_t i = 0; i < rows.size(); ++i)
        rows[i].design = i < 5 ? "60 VA" : "20 VA";
    const BatchStatistics stats = summarizeBatch(rows);
    ASSERT_EQ(stats.farFromBatch.size(), 1u);
    EXPECT_EQ(stats.farFromBatch[0], 4u);
}

TEST(SessionComparison, ControlChartFollowsTheSessionsStartTimes)
{
    // Given out of time order: the chart takes them by start time.
    std::vector<SessionRow> rows = {fittedRow(11.0), fittedRow(10.0), fittedRow(14.0), fittedRow(12.0), fittedRow(13.0)};
    const char *started[] = {"2026-12-03T08:00:00.000Z", "2026-12-01T08:00:00.000Z", "2026-12-04T08:00:00.000Z",
                             "2026-12-02T08:00:00.000Z", "2026-12-05T08:00:00.000Z"};
    for (std::size_t i = 0; i < rows.size(); ++i) {
        rows[i].createdUtc = started[i];
        rows[i].figures.resistanceRefOhm.reset();
    }
    const BatchStatistics stats = summarizeBatch(rows);
    ASSERT_EQ(stats.designs.size(), 1u);
    // In time order 10, 12, 11, 14, 13: the hand-worked example of ControlChartTest.
    EXPECT_EQ(stats.designs[0].chartRows, (std::vector<std::size_t>{1, 3, 0, 2, 4}));
    EXPECT_NEAR(*stats.designs[0].chart.upper, 16.6542553, 1e-7);
}

TEST(SessionComparison, IncompleteSessionsStayOutOfTheBatchAndTheChart)
{
    // A sweep interrupted after two steps gives an R from two points: not a unit like the others.
    // Four complete units of one design and two that ended early, one of them far off and one
    // without a winding temperature: the statistics, flags and chart are over the four alone.
    std::vector<SessionRow> rows = {fittedRow(1.150), fittedRow(1.152), fittedRow(0.70), fittedRow(1.148),
                                    fittedRow(1.151), fittedRow(1.149)};
    rows[2].progress.state = Completeness::Interrupted;
    rows[2].progress.plannedSteps = 9;
    rows[2].progress.recordedSteps = 2;
    rows[4].progress.state = Completeness::Stopped;
    rows[4].figures.resistanceRefOhm.reset();
    const BatchStatistics stats = summarizeBatch(rows);
    EXPECT_TRUE(stats.atReferenceTemperature) << "the stopped session's missing temperature does not count";
    ASSERT_EQ(stats.designs.size(), 1u);
    const DesignStatistics &group = stats.designs[0];
    EXPECT_EQ(group.rows.size(), 6u) << "still listed in its design";
    EXPECT_EQ(group.resistanceCount, 4u);
    EXPECT_EQ(group.incompleteLeftOut, 2u);
    EXPECT_NEAR(*group.meanOhm, 1.2 * (1.150 + 1.152 + 1.148 + 1.149) / 4.0, 1e-12);
    EXPECT_EQ(group.chart.n, 4u);
    EXPECT_EQ(group.chartRows, (std::vector<std::size_t>{0, 1, 3, 5}));
    EXPECT_TRUE(stats.farFromBatch.empty());
    EXPECT_FALSE(stats.robustZ[2].has_value());
    EXPECT_FALSE(stats.robustZ[4].has_value());
    EXPECT_EQ(stats.resistanceCount, 4u);
    EXPECT_EQ(stats.incomplete, 2u);
}

TEST(SessionComparison, BatchUsesReferenceTemperatureOnlyWhenEveryUnitHasIt)
{
    std::vector<SessionRow> rows = {fittedRow(1.0), fittedRow(1.1), fittedRow(1.2)};
    BatchStatistics stats = summarizeBatch(rows);
    EXPECT_TRUE(stats.atReferenceTemperature);
    EXPECT_NEAR(*stats.meanOhm, 1.32, 1e-12);
    rows[1].figures.resistanceRefOhm.reset();
    stats = summarizeBatch(rows);
    EXPECT_FALSE(stats.atReferenceTemperature);
    EXPECT_NEAR(*stats.meanOhm, 1.1, 1e-12);
}

TEST(SessionComparison, RuleNeedsThreeUnitsAndANonZeroMad)
{
    std::vector<SessionRow> two = {fittedRow(1.0), fittedRow(2.0)};
    BatchStatistics stats = summarizeBatch(two);
    EXPECT_TRUE(stats.farFromBatch.empty());
    EXPECT_NE(stats.ruleNote.find("at least 3"), std::string::npos);
    std::vector<SessionRow> same = {fittedRow(1.0), fittedRow(1.0), fittedRow(1.0), fittedRow(5.0)};
    stats = summarizeBatch(same);
    EXPECT_TRUE(stats.farFromBatch.empty());
    EXPECT_NE(stats.ruleNote.find("MAD is zero"), std::string::npos);
    for (const auto &z : stats.robustZ)
        EXPECT_FALSE(z.has_value());
}

TEST(SessionComparison, CountsVerdictsReviewsAndUnreadableRows)
{
    std::vector<SessionRow> rows = {fittedRow(1.0, ConformityOutcome::Pass), fittedRow(1.1, ConformityOutcome::Fail),
                                    fittedRow(1.2, ConformityOutcome::ConditionalPass), fittedRow(1.3, ConformityOutcome::Pass),
                                    fittedRow(1.4, ConformityOutcome::NotJudged)};
    rows[1].signOffs.push_back({1, "t", "Lead", ReviewDecision::Accepted, "", "", "", ""});
    rows[1].signOffs.push_back({2, "t", "Lead", ReviewDecision::Rejected, "over limit", "", "", ""});
    rows[2].safetyStops.push_back({});
    SessionRow bad;
    bad.problem = "corrupt";
    rows.push_back(bad);
    // A unit whose sweep stopped before its last step: counted incomplete, never as its outcome.
    SessionRow stopped = fittedRow(1.5, ConformityOutcome::Pass);
    stopped.progress.state = Completeness::Stopped;
    rows.push_back(stopped);
    const BatchStatistics stats = summarizeBatch(rows);
    EXPECT_EQ(stats.pass, 2u);
    EXPECT_EQ(stats.fail, 1u);
    EXPECT_EQ(stats.conditionalPass, 1u);
    EXPECT_EQ(stats.conditionalFail, 0u);
    EXPECT_EQ(stats.notJudged, 1u);
    EXPECT_EQ(stats.incomplete, 1u);
    EXPECT_EQ(verdictCountsText(stats), "PASS 2, CONDITIONAL PASS 1, CONDITIONAL FAIL 0, FAIL 1, NOT JUDGED 1, "
                                        "NO ANALYSIS 0, incomplete (no verdict) 1");
    EXPECT_EQ(stats.rejected, 1u);
    EXPECT_EQ(stats.accepted, 0u);
    EXPECT_EQ(stats.notReviewed, 5u);
    EXPECT_EQ(stats.safetyStopped, 1u);
    EXPECT_EQ(stats.unreadable, 1u);
    EXPECT_EQ(rows[1].reviewState(), "rejected");
}

TEST(SessionComparison, MedianOfEvenAndOddCounts)
{
    EXPECT_FALSE(median({}).has_value());
    EXPECT_DOUBLE_EQ(*median({3.0, 1.0, 2.0}), 2.0);
    EXPECT_DOUBLE_EQ(*median({4.0, 1.0, 3.0, 2.0}), 2.5);
}

TEST(SessionComparison, InstrumentShortNameFromIdn)
{
    // IEEE 488.2 *IDN? reply: manufacturer, model, serial number, firmware.
    EXPECT_EQ(instrumentShortName("DemoMaker,DV-100,SN123,1.0"), "DemoMaker DV-100");
    EXPECT_EQ(instrumentShortName("  hand-held meter "), "hand-held meter");
    EXPECT_EQ(instrumentShortName("Maker,"), "Maker");
}

TEST(SessionFigures, CopperConstantFollowsTheOption)
{
    TempFolder folder;
    const std::string path = makeDemoSession(folder.file("unit.sagline"), DemoUnit{});
    ComparisonOptions options;
    options.figures.copperConstant = TemperatureConstant::CopperIec;
    const SessionRow row = loadSessionRow(path, options);
    ASSERT_TRUE(row.figures.ok) << row.figures.message;
    // Cu, 20 → 75 °C with T_k = 235 °C: ×1.215686 (FACTS.md §3 check value).
    EXPECT_DOUBLE_EQ(row.figures.temperatureConstantC, 235.0);
    EXPECT_NEAR(*row.figures.resistanceRefOhm / row.figures.resistanceOhm, 1.215686, 1e-6);
}

TEST(SessionFigures, NoLimitIsNotJudgedAndTheNameplateOnlyWhenChosen)
{
    // R = 1.10 Ω: regulation 100·R·I/(V0 - R·I) = 100 × 2.29167 / 24.10833 = 9.506 %, U about
    // 0.03 %. The setup states no specification: not judged. With the nameplate's own 10 %
    // (26.4 V no-load, 24 V full-load) chosen as the limit, a non-binary pass, so labelled.
    TempFolder folder;
    DemoUnit unit;
    unit.resistanceOhm = 1.10;
    const std::string path = makeDemoSession(folder.file("unit.sagline"), unit);
    const SessionRow plain = loadSessionRow(path, {});
    ASSERT_TRUE(plain.figures.ok);
    EXPECT_NEAR(*plain.figures.regulationPercent, 9.506, 0.05); // the demo scatter moves the fit a little
    EXPECT_EQ(plain.figures.verdictText(), "not-judged");
    EXPECT_FALSE(plain.figures.regulationLimitPercent.has_value());
    ComparisonOptions nameplate;
    nameplate.figures.regulationLimit = {RegulationLimitChoice::Kind::Nameplate, 0.0};
    const SessionRow row = loadSessionRow(path, nameplate);
    ASSERT_TRUE(row.figures.ok);
    EXPECT_EQ(row.figures.verdictText(), "pass");
    EXPECT_NEAR(*row.figures.regulationLimitPercent, 10.0, 1e-9);
    EXPECT_NE(row.figures.limitsSource.find("nameplate"), std::string::npos) << row.figures.limitsSource;
    EXPECT_NE(row.figures.ruleName.find("ILAC-G8"), std::string::npos) << row.figures.ruleName;
    ASSERT_TRUE(row.figures.conformanceProbability.has_value());
    EXPECT_GT(*row.figures.conformanceProbability, 0.999);
}

TEST(SessionFigures, UnknownUncertaintyIsNotTakenAsZero)
{
    // Two readings: the line goes through both, so the fit has no scatter to give an
    // uncertainty (n - 2 = 0 degrees of freedom) and regulation has no U. The guard band of the
    // non-binary rule (ILAC-G8:09/2019 §4.2.3, w = U) cannot be applied: not judged, even though
    // the value (about 9.5 %) is below the 10 % limit. U = 0 would have called it a pass.
    TempFolder folder;
    DemoUnit unit;
    unit.resistanceOhm = 1.10;
    unit.points = 2;
    const std::string path = makeDemoSession(folder.file("unit.sagline"), unit);
    ComparisonOptions nameplate;
    nameplate.figures.regulationLimit = {RegulationLimitChoice::Kind::Nameplate, 0.0};
    const SessionRow guarded = loadSessionRow(path, nameplate);
    ASSERT_TRUE(guarded.figures.ok) << guarded.figures.message;
    ASSERT_TRUE(guarded.figures.regulationPercent.has_value());
    EXPECT_LT(*guarded.figures.regulationPercent, 10.0);
    EXPECT_FALSE(guarded.figures.regulationUPercent.has_value());
    EXPECT_EQ(guarded.figures.verdictText(), "not-judged");
    EXPECT_NE(guarded.figures.ruleName.find("non-binary"), std::string::npos) << guarded.figures.ruleName;

    // Simple acceptance (ILAC-G8 §4.2.1, w = 0) decides on the value alone, as the rule says.
    ComparisonOptions simple = nameplate;
    simple.figures.rule = DecisionRule::Simple;
    const SessionRow row = loadSessionRow(path, simple);
    ASSERT_TRUE(row.figures.ok);
    EXPECT_EQ(row.figures.verdictText(), "pass");
}
