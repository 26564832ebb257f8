// State you cannot miss: the next-step strip counts the dwell down with Record disabled, turns
// to a paused or lost-link look with words and buttons to match, the Sweep menu's items are the
// strip's and the plan's own actions (enabled together), Stop asks first and has no shortcut,
// and messages in the status bar expire. On the virtual bench in wall time, with a short dwell.
#include "UiTestSupport.h"

#include "ElidedLabel.h"
#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "SimInstrument.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"
#include "VirtualBench.h"

#include <gtest/gtest.h>

#include <QAction>
#include <QComboBox>
#include <QMenu>
#include <QPushButton>
#include <QRegularExpression>
#include <QStatusBar>

using namespace sagline;
using namespace sagline::test;

namespace {

// The window's Sweep menu and the buttons they stand for agree, item by item.
void expectMenuMatchesButtons(MainWindow &window, const char *when)
{
    NextStepStrip *strip = window.nextStep();
    const std::pair<QAction *, QPushButton *> pairs[] = {
        {window.planPanel()->acceptAction(), window.planPanel()->acceptButton()},
        {strip->recordAction(), strip->recordButton()},
        {strip->pauseAction(), strip->pauseButton()},
        {strip->stopAction(), strip->stopButton()},
    };
    for (const auto &[action, button] : pairs) {
        EXPECT_TRUE(window.sweepMenu()->actions().contains(action)) << when << ": " << action->text().toStdString();
        EXPECT_EQ(action->isEnabled(), button->isEnabled()) << when << ": " << action->text().toStdString();
    }
}

void startVirtualBenchInWallTime(MainWindow &window, const QString &dwell)
{
    window.setupForm()->setSessionDetails({QStringLiteral("State tester"), QStringLiteral("ST-1"), QStringLiteral("20 °C"), {}});
    typeInto(window.setupForm()->quantityField(QStringLiteral("bench.dwell_s")), dwell);
    QComboBox *source = window.instrumentsPanel()->sourceBox();
    source->setCurrentIndex(source->findData(int(ReadingSource::VirtualBench)));
    QTest::mouseClick(window.planPanel()->acceptButton(), Qt::LeftButton);
}

} // namespace

TEST(BenchState, SweepMenuItemsAreTheButtonsOwnActions)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    expectMenuMatchesButtons(*window, "before a sweep");
    EXPECT_TRUE(window->planPanel()->acceptAction()->isEnabled());
    EXPECT_FALSE(window->nextStep()->recordAction()->isEnabled());
    // Code that only knows the button still reaches the menu item.
    window->planPanel()->acceptButton()->setEnabled(false);
    EXPECT_FALSE(window->planPanel()->acceptAction()->isEnabled());
    window->planPanel()->acceptButton()->setEnabled(true);
    EXPECT_TRUE(window->planPanel()->acceptAction()->isEnabled());

    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    window->setupForm()->setSessionDetails({QStringLiteral("State tester"), QStringLiteral("ST-2"), QStringLiteral("20 °C"), {}});
    window->planPanel()->acceptAction()->trigger(); // from the menu
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();
    ASSERT_TRUE(waitUntil([&] { return window->nextStep()->sweepState() == StripState::Ready; }, 5000));
    expectMenuMatchesButtons(*window, "typed-in sweep running");
    EXPECT_TRUE(window->nextStep()->recordAction()->isEnabled());
    EXPECT_FALSE(window->planPanel()->acceptAction()->isEnabled());
    // One name for the record action, whatever takes the reading.
    EXPECT_TRUE(window->nextStep()->recordButton()->text().contains(QStringLiteral("Record")));
    const QString typedName = window->nextStep()->recordButton()->text();
    window->nextStep()->setTypedEntry(false); // meters read it: the same name
    EXPECT_EQ(window->nextStep()->recordButton()->text(), typedName);
}

TEST(BenchState, StopAsksFirstAndHasNoShortcut)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    QStringList asked;
    bool agree = false;
    window->setConfirmPrompt([&](const QString &title, const QString &) {
        asked << title;
        return agree;
    });
    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    window->setupForm()->setSessionDetails({QStringLiteral("State tester"), QStringLiteral("ST-3"), QStringLiteral("20 °C"), {}});
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->isRunning());
    EXPECT_TRUE(window->nextStep()->stopAction()->shortcut().isEmpty());
    // Nothing in the window sits on Ctrl+Shift+S any more (one key from Accept's Ctrl+Shift+A).
    for (QAction *action : window->findChildren<QAction *>())
        EXPECT_NE(action->shortcut(), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_S)) << action->text().toStdString();

    QTest::mouseClick(window->nextStep()->stopButton(), Qt::LeftButton);
    EXPECT_EQ(asked, QStringList{QStringLiteral("Stop the sweep")});
    EXPECT_TRUE(window->workspace()->isRunning()); // declined: nothing ended
    agree = true;
    window->nextStep()->stopAction()->trigger(); // the menu item asks too
    EXPECT_EQ(asked.size(), 2);
    ASSERT_TRUE(waitUntil([&] { return !window->workspace()->isRunning(); }, 5000));
}

TEST(BenchState, DwellCountsDownPauseAndLostLinkChangeTheStrip)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    startVirtualBenchInWallTime(*window, QStringLiteral("3 s"));
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();

    // The dwell: a countdown in tenths of a second, Record disabled in the strip and the menu.
    // (The virtual bench shortens any dwell to 1.2 s.)
    static const QRegularExpression countdown(QStringLiteral("^Settling: reading in [01]\\.[0-9] s of 1\\.2 s$"));
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() == StripState::Settling; }, 15000))
        << strip->countdownText().toStdString();
    EXPECT_TRUE(countdown.match(strip->countdownText()).hasMatch()) << strip->countdownText().toStdString();
    EXPECT_FALSE(strip->recordButton()->isEnabled());
    EXPECT_FALSE(strip->recordAction()->isEnabled());
    expectMenuMatchesButtons(*window, "settling");

    // Paused by the operator: amber look, the words, Resume.
    QTest::mouseClick(strip->pauseButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() == StripState::Paused; }, 5000));
    const int step = workspace->run()->controller()->currentStep();
    EXPECT_EQ(strip->bannerText(), QStringLiteral("❚❚ Paused — resume to continue at step %1").arg(step));
    EXPECT_TRUE(strip->pauseButton()->text().contains(QStringLiteral("Resume")));
    EXPECT_FALSE(strip->recordButton()->isEnabled());
    EXPECT_TRUE(strip->stopButton()->isEnabled());
    const QColor pausedColour = strip->palette().color(QPalette::Window);
    expectMenuMatchesButtons(*window, "paused");

    // Resumed: the banner and "Paused" message go, a "Resumed" one says so.
    QTest::mouseClick(strip->pauseButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() != StripState::Paused; }, 5000));
    EXPECT_TRUE(strip->bannerText().isEmpty());
    EXPECT_TRUE(window->shownMessage().startsWith(QStringLiteral("Resumed at step"))) << window->shownMessage().toStdString();
    EXPECT_TRUE(strip->pauseButton()->text().contains(QStringLiteral("Pause")));
    EXPECT_NE(strip->palette().color(QPalette::Window), pausedColour);

    // A lost link: red look, its own words, Record disabled; back by itself afterwards.
    VirtualBench *bench = workspace->run()->bench();
    ASSERT_NE(bench, nullptr);
    for (SimInstrument *meter : {bench->voltmeter(), bench->ammeter(), bench->powerMeter()})
        meter->injectFault(SimFault::Vanish);
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() == StripState::LinkLost; }, 15000))
        << toString(workspace->run()->controller()->state()).toStdString();
    const int lostAt = workspace->run()->controller()->currentStep();
    EXPECT_EQ(strip->bannerText(), QStringLiteral("⚠ Link lost at step %1 — recorded points are kept").arg(lostAt));
    EXPECT_FALSE(strip->recordButton()->isEnabled());
    EXPECT_NE(strip->palette().color(QPalette::Window), pausedColour);
    expectMenuMatchesButtons(*window, "link lost");
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() != StripState::LinkLost; }, 20000));
    EXPECT_TRUE(strip->bannerText().isEmpty());
}

TEST(BenchState, MessagesExpireAndNeverCoverTheStatusFields)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    // A long message and a long session path: each is shortened, none overlaps another.
    window->workspace()->setSimulatedTime(true);
    window->setSessionFolder(folder.path() + QStringLiteral("/a folder with a rather long name for the session files "
                                                            "of this bench, to push the status bar"));
    window->setupForm()->setSessionDetails({QStringLiteral("State tester"), QStringLiteral("ST-4"), QStringLiteral("20 °C"), {}});
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return !window->workspace()->isRunning(); }, 20000));
    QTest::qWait(50);
    const QList<QWidget *> fields = window->statusBar()->findChildren<QWidget *>(QString(), Qt::FindDirectChildrenOnly);
    for (QWidget *a : fields) {
        if (!a->isVisible())
            continue;
        EXPECT_TRUE(window->statusBar()->rect().contains(a->geometry())) << a->metaObject()->className();
        for (QWidget *b : fields) {
            if (a != b && b->isVisible()) {
                EXPECT_FALSE(a->geometry().intersects(b->geometry()))
                    << a->metaObject()->className() << " " << a->objectName().toStdString() << " / "
                    << b->metaObject()->className() << " " << b->objectName().toStdString();
            }
        }
    }
    // The message on display is the one sent; it expires (timer), and a newer one replaces it.
    EXPECT_FALSE(window->shownMessage().isEmpty());
    ElidedLabel *message = window->messageLabel();
    EXPECT_EQ(message->text(), message->fontMetrics().elidedText(message->fullText(), Qt::ElideRight,
                                                                 message->contentsRect().width()));
    ASSERT_TRUE(waitUntil([&] { return window->shownMessage().isEmpty(); }, 30000)) << window->shownMessage().toStdString();
    EXPECT_FALSE(window->lastMessage().isEmpty()); // still known to whoever asks what was said
}
