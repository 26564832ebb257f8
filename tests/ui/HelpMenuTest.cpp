// The Help menu: a user guide with the cautions, the keyboard shortcuts as the actions have
// them (and no two actions on one key), and About with version, commit and licences.
#include "UiTestSupport.h"

#include "BuildInfo.h"
#include "HelpMenu.h"

#include <gtest/gtest.h>

#include <QAction>
#include <QMenu>
#include <QMenuBar>
#include <QSet>

using namespace sagline;
using namespace sagline::test;

TEST(HelpMenu, GuideShortcutsAndAbout)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    QMenu *help = nullptr;
    for (QAction *action : window->menuBar()->actions()) {
        if (action->text() == QStringLiteral("&Help"))
            help = action->menu();
    }
    ASSERT_NE(help, nullptr);
    QStringList items;
    for (QAction *action : help->actions())
        items << action->text();
    EXPECT_TRUE(items.contains(QStringLiteral("&User guide")));
    EXPECT_TRUE(items.contains(QStringLiteral("&Keyboard shortcuts")));
    EXPECT_TRUE(items.contains(QStringLiteral("&About Sagline")));

    const QString guide = userGuideHtml();
    for (const char *part : {"mains voltage", "Run a sweep", "Type readings in", "Review", "lab sheet", "Record"})
        EXPECT_TRUE(guide.contains(QLatin1String(part))) << part;

    const QString about = aboutHtml();
    EXPECT_TRUE(about.contains(QLatin1String(buildinfo::version)));
    EXPECT_TRUE(about.contains(QLatin1String(buildinfo::gitCommit)));
    for (const char *library : {"Qt 6", "Eigen", "SQLite", "nlohmann-json", "LGPL", "Mozilla Public License", "MIT"})
        EXPECT_TRUE(about.contains(QLatin1String(library))) << library;

    const QString shortcuts = shortcutsHtml(window.get());
    EXPECT_TRUE(shortcuts.contains(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_A).toString(QKeySequence::NativeText)));
    EXPECT_TRUE(shortcuts.contains(QStringLiteral("Record")));
    // No key does two things.
    QSet<QString> seen;
    for (QAction *action : window->findChildren<QAction *>()) {
        for (const QKeySequence &keys : action->shortcuts()) {
            const QString text = keys.toString();
            EXPECT_FALSE(seen.contains(text)) << text.toStdString() << " again on " << action->text().toStdString();
            seen.insert(text);
        }
    }
}
