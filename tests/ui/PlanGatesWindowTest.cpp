// The plan's gates in the window (issue 13, item 4): a nameplate that cannot describe the unit
// (a secondary voltage typed in mV) gives no plan and names the field; a plan with steps the
// rheostat cannot take keeps Accept disabled with the reason until the person chooses the safe
// steps (recorded in the session) or overrides with a reason.
#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "PlanPanel.h"
#include "SessionStore.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QAction>
#include <QPushButton>

using namespace sagline;
using namespace sagline::test;

TEST(PlanGatesWindow, VoltageTypedInMillivoltsGivesNoPlanAndNamesTheField)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    ASSERT_TRUE(window->planPanel()->acceptButton()->isEnabled());
    QuantityField *secondary = window->setupForm()->quantityField(QStringLiteral("nameplate.secondary_voltage_v"));
    typeInto(secondary, QStringLiteral("18 mV"));
    EXPECT_FALSE(window->workspace()->plan().has_value());
    EXPECT_FALSE(window->planPanel()->acceptButton()->isEnabled());
    EXPECT_TRUE(secondary->error().contains("typed in mV?")) << secondary->error().toStdString();
    EXPECT_FALSE(window->lastMessage().contains("Plan ready")) << window->lastMessage().toStdString();
    typeInto(secondary, QStringLiteral("18 V"));
    EXPECT_TRUE(window->workspace()->plan().has_value());
    EXPECT_TRUE(window->planPanel()->acceptButton()->isEnabled());
}

TEST(PlanGatesWindow, UnsafeStepsKeepAcceptDisabledUntilTheSafeStepsAreChosen)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    // A 100 Ω, 100 W track is safe to 1 A (I = √(P/R)); the demo unit's top steps draw more.
    typeInto(window->setupForm()->quantityField(QStringLiteral("bench.rheostat.total_resistance_ohm")), QStringLiteral("100"));
    typeInto(window->setupForm()->quantityField(QStringLiteral("bench.rheostat.power_rating_w")), QStringLiteral("100 W"));
    ASSERT_TRUE(window->workspace()->plan().has_value());
    PlanPanel *plan = window->planPanel();
    EXPECT_FALSE(plan->acceptButton()->isEnabled());
    EXPECT_TRUE(plan->acceptBlockedReason().contains("current above the rheostat's safe 1.00 A"))
        << plan->acceptBlockedReason().toStdString();

    // The Accept action (Sweep menu, shortcut) is the same action, disabled: nothing starts. The
    // status line says why; the plan tab (Alt+2) shows the reason and the two ways on.
    EXPECT_FALSE(plan->acceptAction()->isEnabled());
    plan->acceptAction()->trigger();
    EXPECT_FALSE(window->workspace()->store());
    EXPECT_TRUE(window->lastMessage().contains("the bench cannot take")) << window->lastMessage().toStdString();
    QTest::keyClick(window.get(), Qt::Key_2, Qt::AltModifier);
    EXPECT_TRUE(plan->safeStepsButton()->isVisibleTo(window.get()));
    EXPECT_TRUE(plan->overrideButton()->isVisibleTo(window.get()));

    QTest::mouseClick(plan->safeStepsButton(), Qt::LeftButton);
    EXPECT_TRUE(plan->acceptButton()->isEnabled()) << plan->acceptBlockedReason().toStdString();

    window->workspace()->setSimulatedTime(true);
    window->setupForm()->setSessionDetails({QStringLiteral("Student"), QStringLiteral("G-1"), QStringLiteral("21 °C"), {}});
    window->instrumentsPanel()->setChoice({ReadingSource::VirtualBench, {}, {}});
    QTest::mouseClick(plan->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->store()) << window->lastMessage().toStdString();
    ASSERT_TRUE(waitUntil([&] { return !window->workspace()->isRunning(); }, 60000));
    for (const Reading &reading : window->workspace()->readings())
        EXPECT_LE(reading.currentA, 1.0 * 1.05) << "step " << reading.step; // the safe steps only (5 % for the bench's scatter)

    auto stored = SessionStore::openForReview(window->workspace()->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok());
    bool truncated = false;
    for (const SweepEventRecord &event : stored.value->sweepEvents().value)
        truncated |= event.kind == SweepEventKind::Truncated && event.actor.person == testPerson.toStdString();
    EXPECT_TRUE(truncated);
}
