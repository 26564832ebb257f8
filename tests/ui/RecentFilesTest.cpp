// The File menu's recent sessions list only files that exist: the session file a failed start
// created and removed again, and a file deleted since it was opened, are dropped when the list
// is rebuilt and when the menu opens; opening a vanished file drops it too.
#include "RefusedLanStart.h"
#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "PlanJson.h"
#include "PlanPanel.h"
#include "SessionStore.h"
#include "SetupJson.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QAction>
#include <QComboBox>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QLineEdit>
#include <QMenu>
#include <QPushButton>
#include <QTcpServer>

using namespace sagline;
using namespace sagline::test;

namespace {

// A session file with the demo setup and no readings; its absolute path.
QString makeSession(const QString &folder, const QString &name)
{
    const auto setup = loadSetupFile(SAGLINE_SOURCE_DIR "/resources/demo-setup.json");
    EXPECT_TRUE(setup.setup.has_value());
    const auto plan = makePlan(*setup.setup);
    EXPECT_TRUE(plan.plan.has_value());
    NewSession session;
    session.setupJson = setupToJson(*setup.setup);
    session.planJson = planToJson(*plan.plan);
    session.operatorName = "Recent tester";
    session.unitSerial = "RF-1";
    session.softwareVersion = "sagline test";
    const QString path = QFileInfo(folder + QLatin1Char('/') + name).absoluteFilePath();
    auto created = SessionStore::create(path.toStdString(), session);
    EXPECT_TRUE(created.ok()) << created.message;
    return path;
}

// What the menu shows when it opens: the full paths (tooltips) of its entries.
QStringList shownWhenOpened(QMenu *menu)
{
    emit menu->aboutToShow(); // what opening the menu does before it is drawn
    QStringList paths;
    for (QAction *action : menu->actions())
        paths << action->toolTip();
    return paths;
}

} // namespace

TEST(RecentFiles, AFileDeletedSinceItWasOpenedLeavesTheList)
{
    QTemporaryDir folder;
    const QString kept = makeSession(folder.path(), QStringLiteral("kept.sagline"));
    const QString deleted = makeSession(folder.path(), QStringLiteral("deleted.sagline"));
    auto window = demoWindow(folder.path());
    ASSERT_TRUE(window->openSessionFile(kept)) << window->lastMessage().toStdString();
    ASSERT_TRUE(window->openSessionFile(deleted)) << window->lastMessage().toStdString();
    ASSERT_GE(window->recentFiles().size(), 2);
    EXPECT_EQ(window->recentFiles()[0], deleted);
    EXPECT_EQ(window->recentFiles()[1], kept);

    window->openSessionFile(kept); // closes `deleted`, so it can go
    ASSERT_TRUE(QFile::remove(deleted));
    const QStringList shown = shownWhenOpened(window->recentMenu());
    EXPECT_TRUE(shown.contains(kept)) << shown.join(QLatin1Char('\n')).toStdString();
    EXPECT_FALSE(shown.contains(deleted)) << shown.join(QLatin1Char('\n')).toStdString();
    EXPECT_FALSE(window->recentFiles().contains(deleted)); // and it is not saved back either
    for (const QString &path : window->recentFiles())
        EXPECT_TRUE(QFileInfo::exists(path)) << path.toStdString();
}

TEST(RecentFiles, OpeningAVanishedRecentFileSaysSoAndDropsIt)
{
    QTemporaryDir folder;
    const QString gone = makeSession(folder.path(), QStringLiteral("gone.sagline"));
    auto window = demoWindow(folder.path());
    ASSERT_TRUE(window->openSessionFile(gone));
    ASSERT_TRUE(QFile::remove(gone));
    EXPECT_FALSE(window->openSessionFile(gone)); // clicked in the menu before it was rebuilt
    EXPECT_TRUE(window->lastMessage().contains(QStringLiteral("Cannot open"))) << window->lastMessage().toStdString();
    EXPECT_FALSE(window->recentFiles().contains(gone));
}

TEST(RecentFiles, ASessionFileRemovedByAFailedStartIsNotListed)
{
    // The connection is refused, and the window removes the empty session file it created.
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    startOnRefusedLanPort(*window, QStringLiteral("Recent tester"), QStringLiteral("RF-2"));
    InstrumentsPanel *panel = window->instrumentsPanel();
    SweepWorkspace *workspace = window->workspace();
    const QString created = QFileInfo(workspace->sessionPath()).absoluteFilePath();
    ASSERT_FALSE(workspace->sessionPath().isEmpty()) << window->lastMessage().toStdString();
    ASSERT_TRUE(waitUntil([&] { return workspace->sessionPath().isEmpty(); }, 8000)) << panel->statusText().toStdString();
    ASSERT_FALSE(QFileInfo::exists(created));
    EXPECT_FALSE(window->recentFiles().contains(created));
    const QStringList shown = shownWhenOpened(window->recentMenu());
    EXPECT_FALSE(shown.contains(created)) << shown.join(QLatin1Char('\n')).toStdString();
    for (const QString &path : shown)
        EXPECT_TRUE(QFileInfo::exists(path)) << path.toStdString();
}
