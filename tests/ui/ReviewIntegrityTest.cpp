// The review workspace tells the same story about session integrity as the bench window
// (issue 13, items 3 and 6): a crashed or safety-stopped session reads "incomplete" and never
// a pass, a signed one names its reviewer, and one reopened after its sign-off says "changed
// after sign-off". Real session files written as the programs write them (SessionFiles.h).
#include "SessionFiles.h"

#include "ReviewFilterModel.h"
#include "ReviewTableModel.h"
#include "ReviewWindow.h"

#include <gtest/gtest.h>

#include <QDir>
#include <QFileInfo>
#include <QSignalSpy>
#include <QTemporaryDir>

using namespace sagline;
using namespace sagline::test;

namespace {

// The row of the table whose file is `path`, or -1.
int rowOfFile(const ReviewWindow &window, const QString &path)
{
    for (int row = 0; row < window.model()->rowCount(); ++row)
        if (QFileInfo(QString::fromStdString(window.model()->sessionRow(row).path)) == QFileInfo(path))
            return row;
    return -1;
}

QString cell(const ReviewWindow &window, int row, int column, int role = Qt::DisplayRole)
{
    return window.model()->index(row, column).data(role).toString();
}

} // namespace

TEST(ReviewIntegrity, IncompleteSessionsGetNoPassAndAReopenedSignOffIsSaidSo)
{
    QTemporaryDir root;
    QDir().mkpath(root.filePath(QStringLiteral("bench")));
    QDir().mkpath(root.filePath(QStringLiteral("reopened")));
    const QString bench = root.filePath(QStringLiteral("bench"));
    const SessionFile complete = writeSession(bench, SessionKind::Complete);
    const SessionFile crashed = writeSession(bench, SessionKind::Crashed);
    const SessionFile stopped = writeSession(bench, SessionKind::SafetyStopped);
    const SessionFile signedOff = writeSession(bench, SessionKind::Signed);
    const SessionFile reopened = writeSession(root.filePath(QStringLiteral("reopened")), SessionKind::Signed);
    {
        auto store = SessionStore::openForWriting(reopened.path.toStdString());
        ASSERT_TRUE(store.ok()) << store.message;
        store.value->setActor({"M. Second", ""});
        ASSERT_TRUE(store.value->reopen("full-load point to be checked").ok());
    }

    ReviewWindow window;
    QSignalSpy finished(&window, &ReviewWindow::scanFinished);
    window.addInputs({root.path()});
    ASSERT_TRUE(finished.wait(30000)) << "scan did not finish";
    ASSERT_EQ(window.model()->rowCount(), 5);

    for (const SessionFile *file : {&crashed, &stopped}) {
        SCOPED_TRACE(file->path.toStdString());
        const int row = rowOfFile(window, file->path);
        ASSERT_GE(row, 0);
        EXPECT_EQ(cell(window, row, ReviewTableModel::Verdict, ReviewTableModel::VerdictRole), QStringLiteral("incomplete"));
        const QString verdict = cell(window, row, ReviewTableModel::Verdict);
        EXPECT_TRUE(verdict.startsWith(QStringLiteral("incomplete ("))) << verdict.toStdString();
        EXPECT_FALSE(verdict.contains(QStringLiteral("pass"), Qt::CaseInsensitive)) << verdict.toStdString();
    }
    EXPECT_TRUE(cell(window, rowOfFile(window, crashed.path), ReviewTableModel::Verdict).contains("4 of 9 steps"));
    EXPECT_TRUE(cell(window, rowOfFile(window, stopped.path), ReviewTableModel::Verdict).contains("5 of 11 steps"));

    const int completeRow = rowOfFile(window, complete.path);
    ASSERT_GE(completeRow, 0);
    EXPECT_NE(cell(window, completeRow, ReviewTableModel::Verdict, ReviewTableModel::VerdictRole), QStringLiteral("incomplete"));
    EXPECT_EQ(cell(window, completeRow, ReviewTableModel::Review), QStringLiteral("unreviewed"));

    const int signedRow = rowOfFile(window, signedOff.path);
    ASSERT_GE(signedRow, 0);
    EXPECT_EQ(cell(window, signedRow, ReviewTableModel::Review), QStringLiteral("accepted by L. Lead"));
    const int reopenedRow = rowOfFile(window, reopened.path);
    ASSERT_GE(reopenedRow, 0);
    EXPECT_TRUE(cell(window, reopenedRow, ReviewTableModel::Review).contains(QStringLiteral("changed after sign-off")))
        << cell(window, reopenedRow, ReviewTableModel::Review).toStdString();
}
