// The window never gives up on a paused sweep (its operator decides), but it says how long the
// sweep has been waiting and why, updated every second.
#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QPushButton>
#include <QRegularExpression>

using namespace sagline;
using namespace sagline::test;

TEST(PausedWait, ThePausedSweepShowsHowLongItHasWaited)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->setupForm()->setSessionDetails({QStringLiteral("Waiting tester"), QStringLiteral("PW-1"), QStringLiteral("20 °C"), {}});
    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();
    EXPECT_TRUE(strip->waitingText().isEmpty());

    QTest::mouseClick(strip->pauseButton(), Qt::LeftButton);
    // Shown at its one-second updates (any count from 1 s: a loaded machine may skip one).
    static const QRegularExpression waited(QStringLiteral("^Paused for [1-9][0-9]* s: "));
    ASSERT_TRUE(waitUntil([&] { return waited.match(strip->waitingText()).hasMatch(); }, 8000))
        << strip->waitingText().toStdString();
    EXPECT_TRUE(strip->waitingText().contains(QStringLiteral("paused by the operator"))) << strip->waitingText().toStdString();
    EXPECT_TRUE(window->workspace()->isRunning()); // still waiting, not given up

    QTest::mouseClick(strip->pauseButton(), Qt::LeftButton); // resume
    ASSERT_TRUE(waitUntil([&] { return strip->waitingText().isEmpty(); }, 5000)) << strip->waitingText().toStdString();
}
