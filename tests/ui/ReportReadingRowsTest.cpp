// The report's readings table on large sessions: the first and last rows and every reading a
// reviewer must see (excluded, flagged, outlier, not fitted) are printed, the rest counted in a
// line that says where the full list is; a small session is printed in full.
#include "ReportReadingRows.h"
#include "ReportWriter.h"
#include "PlanJson.h"
#include "Planner.h"
#include "SessionStore.h"
#include "SessionSummary.h"
#include "SetupJson.h"

#include <gtest/gtest.h>

#include <QProcess>
#include <QRegularExpression>
#include <QTemporaryDir>

#include <algorithm>
#include <cmath>

using namespace sagline;

namespace {

// An invented straight-line sweep, V = 19.6 V − 0.48 Ω · I with a small deterministic ripple
// (no reading is an outlier), every reading marked simulated (a source, not a problem).
std::vector<Reading> lineReadings(std::size_t n)
{
    std::vector<Reading> readings(n);
    for (std::size_t k = 0; k < n; ++k) {
        Reading &r = readings[k];
        r.id = static_cast<std::int64_t>(k + 1);
        r.step = static_cast<int>(k % 9);
        r.currentA = 3.3 * static_cast<double>(k) / static_cast<double>(n - 1);
        r.voltageV = 19.6 - 0.48 * r.currentA + 0.003 * std::sin(1.7 * static_cast<double>(k));
        r.uCurrentA = 0.004;
        r.uVoltageV = 0.05;
        r.timeUtc = "2026-12-02T09:00:00.000Z";
        r.flags = flagSimulated;
    }
    return readings;
}

SessionSummary summaryOf(std::vector<Reading> readings)
{
    SessionSummary summary;
    summary.readings = std::move(readings);
    summary.fit = fitReadings(summary.readings, FitMethod::Ols);
    return summary;
}

bool contains(const std::vector<std::size_t> &rows, std::size_t row)
{
    return std::binary_search(rows.begin(), rows.end(), row);
}

} // namespace

TEST(ReportReadingRows, SmallSessionIsPrintedInFull)
{
    const SessionSummary summary = summaryOf(lineReadings(250));
    const ReadingRowSelection selection = selectReportRows(summary);
    EXPECT_TRUE(selection.complete());
    ASSERT_EQ(selection.rows.size(), 250u);
    EXPECT_EQ(selection.rows.back(), 249u);
}

TEST(ReportReadingRows, LargeSessionKeepsEdgesAndEveryNoteworthyReading)
{
    std::vector<Reading> readings = lineReadings(1000);
    readings[300].excluded = true;
    readings[301].excluded = true;
    readings[500].flags |= flagOverload;
    readings[600].flags |= flagManual; // a source, not a problem
    readings[700].voltageV += 0.5;     // a misread point: the fit marks it an outlier
    const SessionSummary summary = summaryOf(readings);
    ASSERT_TRUE(summary.fit.ok());
    ASSERT_TRUE(summary.fit.points[700].outlier);

    const ReadingRowSelection selection = selectReportRows(summary);
    ASSERT_TRUE(std::is_sorted(selection.rows.begin(), selection.rows.end()));
    EXPECT_EQ(selection.rows.size(), 50u + 4u + 50u);
    for (std::size_t row = 0; row < 50; ++row)
        EXPECT_TRUE(contains(selection.rows, row)) << row;
    for (std::size_t row = 950; row < 1000; ++row)
        EXPECT_TRUE(contains(selection.rows, row)) << row;
    for (std::size_t row : {300u, 301u, 500u, 700u})
        EXPECT_TRUE(contains(selection.rows, row)) << row;
    EXPECT_FALSE(contains(selection.rows, 600u));
    EXPECT_EQ(selection.notPrinted, 1000u - selection.rows.size());
    EXPECT_EQ(selection.noteworthyNotPrinted, 0u);

    ReadingRowLimits tight;
    tight.maxNoteworthy = 2;
    const ReadingRowSelection capped = selectReportRows(summary, tight);
    EXPECT_TRUE(contains(capped.rows, 300u) && contains(capped.rows, 301u));
    EXPECT_FALSE(contains(capped.rows, 500u) || contains(capped.rows, 700u));
    EXPECT_EQ(capped.noteworthyNotPrinted, 2u);
    EXPECT_EQ(capped.notPrinted, 1000u - capped.rows.size());
}

TEST(ReportReadingRows, PrintedReportSaysHowManyAreLeftOutAndWhereTheyAre)
{
    QTemporaryDir folder;
    const auto setup = loadSetupFile(SAGLINE_SOURCE_DIR "/resources/demo-setup.json");
    ASSERT_TRUE(setup.setup.has_value());
    const auto plan = makePlan(*setup.setup);
    ASSERT_TRUE(plan.plan.has_value());
    NewSession session;
    session.setupJson = setupToJson(*setup.setup);
    session.planJson = planToJson(*plan.plan);
    session.operatorName = "Long Run";
    session.unitSerial = "LR-3000";
    session.softwareVersion = "sagline test";
    const std::string path = (folder.path() + QStringLiteral("/long.sagline")).toStdString();
    auto created = SessionStore::create(path, session);
    ASSERT_TRUE(created.ok()) << created.message;
    std::vector<Reading> readings = lineReadings(3000);
    readings[1700].flags |= flagOverload;
    const auto ids = created.value->appendReadings(readings);
    ASSERT_TRUE(ids.ok()) << ids.message;
    ASSERT_TRUE(created.value->excludeReading(ids.value[1200], "clip fell off the terminal", "Long Run").ok());
    created.value.reset();

    const auto summary = loadSessionSummary(path);
    ASSERT_TRUE(summary.ok()) << summary.message;
    const ReadingRowSelection selection = selectReportRows(summary.value);
    ASSERT_EQ(selection.rows.size(), 102u); // 50 + the excluded + the overload + 50
    const QString pdf = folder.path() + QStringLiteral("/long.pdf");
    ASSERT_EQ(writeSessionReport(summary.value, pdf, {}), QString());

    QProcess text;
    text.start(QStringLiteral("pdftotext"), {QStringLiteral("-layout"), pdf, QStringLiteral("-")});
    ASSERT_TRUE(text.waitForFinished(30000));
    const QString printed = QString::fromUtf8(text.readAllStandardOutput());
    EXPECT_TRUE(printed.contains(QStringLiteral("… 2898 readings not printed; the full list is in the CSV export")))
        << printed.toStdString();
    EXPECT_TRUE(printed.contains(QRegularExpression(QStringLiteral("excluded: clip fell o")))); // pdftotext keeps the "ff" ligature
    // Table rows start with the reading's id: the edges and the two noteworthy ones are there,
    // a plain reading from the middle is not, and each gap says how many it stands for.
    auto hasRow = [&](std::int64_t id) {
        return printed.contains(QRegularExpression(QStringLiteral("^\\s*%1\\s+\\d\\s+09:00:00").arg(id),
                                                   QRegularExpression::MultilineOption));
    };
    for (std::int64_t id : {ids.value[0], ids.value[49], ids.value[1200], ids.value[1700], ids.value[2950], ids.value[2999]})
        EXPECT_TRUE(hasRow(id)) << id;
    EXPECT_FALSE(hasRow(ids.value[1500]));
    EXPECT_FALSE(hasRow(ids.value[50]));
    EXPECT_TRUE(printed.contains(QRegularExpression(QStringLiteral("…\\s+1150 not printed")))); // rows 50..1199
    EXPECT_TRUE(printed.contains(QRegularExpression(QStringLiteral("…\\s+499 not printed"))));  // rows 1201..1699
    EXPECT_TRUE(printed.contains(QRegularExpression(QStringLiteral("…\\s+1249 not printed")))); // rows 1701..2949

    QProcess info;
    info.start(QStringLiteral("pdfinfo"), {pdf});
    ASSERT_TRUE(info.waitForFinished(30000));
    const auto pages = QRegularExpression(QStringLiteral("Pages:\\s+(\\d+)")).match(QString::fromUtf8(info.readAllStandardOutput()));
    ASSERT_TRUE(pages.hasMatch());
    EXPECT_LE(pages.captured(1).toInt(), 10); // every row would take about 50 pages
}
