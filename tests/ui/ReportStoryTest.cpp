// The report tells the same story as the window: readings numbered as the window numbers them
// with their steps, program records (the analysis settings) as a table and never raw JSON,
// SIMULATED on every page of a virtual-bench session, a long file name wrapped rather than cut,
// who did what, "changed after sign-off" after a reopen, and no verdict for an incomplete
// session. Read back with pdftotext (Debian's poppler-utils).
#include "SessionFiles.h"

#include "AnalysisSettingsRecord.h"
#include "ReportWriter.h"
#include "SessionSummary.h"

#include <gtest/gtest.h>

#include <QFileInfo>
#include <QProcess>
#include <QRegularExpression>
#include <QTemporaryDir>

using namespace sagline;
using namespace sagline::test;

namespace {

QString pdfText(const QString &pdf, bool layout = true)
{
    QProcess text;
    text.start(QStringLiteral("pdftotext"), layout ? QStringList{QStringLiteral("-layout"), pdf, QStringLiteral("-")}
                                                   : QStringList{pdf, QStringLiteral("-")});
    text.waitForFinished(30000);
    QString out = QString::fromUtf8(text.readAllStandardOutput()).remove(QChar(0x200B));
    // pdftotext writes the font's ligatures as one character.
    return out.replace(QChar(0xFB00), QStringLiteral("ff")).replace(QChar(0xFB01), QStringLiteral("fi"))
        .replace(QChar(0xFB02), QStringLiteral("fl"));
}

// The text as one line with single spaces: checks do not depend on where the layout wrapped.
QString flowingText(const QString &pdf)
{
    return pdfText(pdf, false).simplified();
}

int pageCount(const QString &pdf)
{
    QProcess info;
    info.start(QStringLiteral("pdfinfo"), {pdf});
    info.waitForFinished(30000);
    for (const QString &line : QString::fromUtf8(info.readAllStandardOutput()).split('\n'))
        if (line.startsWith(QStringLiteral("Pages:")))
            return line.mid(6).trimmed().toInt();
    return -1;
}

QString writeReport(const QString &session, const QString &pdf)
{
    const auto summary = loadSessionSummary(session.toStdString());
    EXPECT_TRUE(summary.ok()) << summary.message;
    ReportOptions options;
    options.producedBy = QStringLiteral("sagline test");
    options.generatedUtc = QStringLiteral("2026-12-02T12:00:00.000Z");
    EXPECT_EQ(writeSessionReport(summary.value, pdf, options), QString());
    return pdfText(pdf);
}

} // namespace

TEST(ReportStory, TellsTheSameStoryAsTheWindow)
{
    QTemporaryDir folder;
    const SessionFile file = writeSession(folder.path(), SessionKind::Signed); // virtual bench, signed off
    // A long name, as the window gives sessions (serial and UTC stamp).
    const QString longPath = folder.filePath(QStringLiteral("transformer-under-test-SG-80-batch-2026-week-49-"
                                                            "20261202-101503-250.sagline"));
    ASSERT_TRUE(QFile::rename(file.path, longPath));
    {
        auto store = SessionStore::openForWriting(longPath.toStdString());
        ASSERT_TRUE(store.ok()) << store.message;
        store.value->setActor({"M. Second", ""});
        ASSERT_TRUE(store.value->reopen("full-load point to be checked").ok());
        const auto readings = store.value->readings().value;
        ASSERT_TRUE(store.value->excludeReading(readings.back().id, "clip fell off", "M. Second").ok());
        AnalysisSettings settings;
        settings.regulationLimitPercent = 12.0;
        settings.rule = DecisionRule::Simple;
        ASSERT_TRUE(store.value->addNote(analysisSettingsNoteAuthor, analysisSettingsNoteText(settings)).ok());
    }
    const QString pdf = folder.filePath(QStringLiteral("story.pdf"));
    writeReport(longPath, pdf);
    const QString text = flowingText(pdf);
    const int pages = pageCount(pdf);
    ASSERT_GE(pages, 2);

    // SIMULATED on every page (each footer), and said at the top.
    EXPECT_EQ(text.count(QStringLiteral("SIMULATED (virtual bench)")), pages) << text.toStdString();
    // Readings numbered from 1 with their steps, as the window's table; the exclusion names
    // the reading the same way and who made it (with the account), not the operator.
    EXPECT_TRUE(text.contains(QStringLiteral("8 (step 7) excluded clip fell off M. Second (account"))) << text.toStdString();
    // The analysis settings as a table, no raw JSON anywhere.
    EXPECT_TRUE(text.contains(QStringLiteral("Analysis settings recorded")));
    EXPECT_TRUE(text.contains(QStringLiteral("12.00 % simple default per winding material M. Second"))) << text.toStdString();
    EXPECT_FALSE(text.contains(QStringLiteral("{\"")));
    // The sign-off is superseded: said in the title block and the sign-off section.
    EXPECT_GE(text.count(QStringLiteral("changed after sign-off")), 2) << text.toStdString();
    EXPECT_TRUE(text.contains(QStringLiteral("full-load point to be checked")));
    // The long file name is all there, wrapped: pdftotext joins the lines and drops the hyphen
    // at each break, so compare without hyphens and spaces.
    const QString joined = pdfText(pdf, false).remove('\n').remove('-').remove(' ');
    EXPECT_TRUE(joined.contains(QFileInfo(longPath).fileName().remove('-'))) << joined.toStdString();
}

TEST(ReportStory, IncompleteSessionGetsNoVerdict)
{
    QTemporaryDir folder;
    const SessionFile file = writeSession(folder.path(), SessionKind::SafetyStopped);
    const QString pdf = folder.filePath(QStringLiteral("stopped.pdf"));
    writeReport(file.path, pdf);
    const QString text = flowingText(pdf);
    // (pdftotext drops the hyphen of "OUTPUT-VA" where the line wraps.)
    EXPECT_TRUE(text.contains(QRegularExpression(
        QStringLiteral("INCOMPLETE \\(5 OF 11 STEPS; SAFETY STOP AT STEP 5 \\(OUTPUT-?VA\\)\\): NO VERDICT"))))
        << text.toStdString();
    EXPECT_FALSE(text.contains(QStringLiteral("PASS")));
    EXPECT_TRUE(text.contains(QStringLiteral("Completeness")));
}
