// The review PDF's first page names every safety stop and every session that ended early (read
// back with Debian's pdftotext): a lab lead must not have to open each report to find them.
#include "../core/ReviewTestSupport.h"

#include "ReviewPdfExport.h"
#include "SessionComparison.h"
#include "ShotsAtWorkingSizes.h"

#include <QDir>
#include <QFile>
#include <QProcess>
#include <QString>

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

TEST(ReviewPdfStops, SummaryListsSafetyStopsAndIncompleteSessions)
{
    TempFolder folder;
    // Three units of one invented design, each with the plan's 11 steps: one complete, one
    // stopped by a safety limit at step 6, one interrupted after four steps.
    DemoUnit whole;
    whole.serial = "PDF-1";
    whole.withPlan = true;
    makeDemoSession(folder.file("whole.sagline"), whole);
    DemoUnit stopped = whole;
    stopped.serial = "PDF-2";
    stopped.points = 6;
    makeDemoSession(folder.file("stopped.sagline"), stopped);
    {
        auto store = SessionStore::openForWriting(folder.file("stopped.sagline"));
        ASSERT_TRUE(store.ok()) << store.message;
        SafetyStopRecord stop;
        stop.step = 6;
        stop.rule = "output-va";
        stop.message = "output 56.1 VA above the hard limit 55.0 VA";
        stop.measured = 56.1;
        stop.limitValue = 55.0;
        ASSERT_TRUE(store.value->recordSafetyStop(stop).ok());
    }
    DemoUnit cut = whole;
    cut.serial = "PDF-3";
    cut.points = 4;
    makeDemoSession(folder.file("cut.sagline"), cut);

    std::vector<SessionRow> rows;
    for (const char *name : {"whole.sagline", "stopped.sagline", "cut.sagline"})
        rows.push_back(loadSessionRow(folder.file(name), {}));
    ASSERT_TRUE(rows[0].progress.isComplete()) << rows[0].progress.label();
    ASSERT_EQ(rows[1].progress.state, Completeness::Stopped) << rows[1].progress.label();
    ASSERT_EQ(rows[2].progress.state, Completeness::Interrupted) << rows[2].progress.label();
    std::vector<const SessionRow *> pointers;
    for (const SessionRow &row : rows)
        pointers.push_back(&row);

    const QString pdf = QString::fromStdString(folder.file("review.pdf"));
    ReportOptions reportOptions;
    reportOptions.generatedUtc = QStringLiteral("2026-12-03T10:00:00Z");
    reportOptions.producedBy = QStringLiteral("test");
    ASSERT_EQ(writeReviewPdf(pointers, {}, pdf, reportOptions), QString());
    // For a person to look at (render its first page with pdftoppm): kept with SAGLINE_SHOTS_DIR.
    if (const QString shots = shotsFolder(QStringLiteral("review")); !shots.isEmpty()) {
        QFile::remove(QDir(shots).filePath(QStringLiteral("review-stops-and-incomplete.pdf")));
        QFile::copy(pdf, QDir(shots).filePath(QStringLiteral("review-stops-and-incomplete.pdf")));
    }
    QProcess pdftotext;
    pdftotext.start(QStringLiteral("pdftotext"), {QStringLiteral("-layout"), QStringLiteral("-l"), QStringLiteral("2"), pdf,
                                                  QStringLiteral("-")});
    ASSERT_TRUE(pdftotext.waitForFinished(30000));
    const QString text = QString::fromUtf8(pdftotext.readAllStandardOutput());
    const QString summary = text.section(QStringLiteral("Design:"), 0, 0); // before the per-design tables
    EXPECT_NE(summary.indexOf(QStringLiteral("Safety stops (1)")), -1) << summary.toStdString();
    EXPECT_NE(summary.indexOf(QStringLiteral("stopped.sagline")), -1) << summary.toStdString();
    EXPECT_NE(summary.indexOf(QStringLiteral("output-va")), -1) << summary.toStdString();
    EXPECT_NE(summary.indexOf(QStringLiteral("Incomplete sessions (2): no verdict")), -1) << summary.toStdString();
    EXPECT_NE(summary.indexOf(QStringLiteral("cut.sagline")), -1) << summary.toStdString();
    EXPECT_NE(summary.indexOf(QStringLiteral("interrupted")), -1) << summary.toStdString();
    EXPECT_EQ(summary.indexOf(QStringLiteral("whole.sagline")), -1) << "a complete session is in neither list";
    // The two that ended early stay out of the design's statistics, and the page says so.
    EXPECT_NE(text.simplified().indexOf(QStringLiteral("1 unit; 2 incomplete sessions left out")), -1) << text.toStdString();
}
