// A supervised session, offscreen: locked controls say why, the checklist gates the start, a
// reading beyond the lab sheet's limit is refused and noted, the rest of the plan is entered by
// hand, and the review sees the sheet, the ticked checklist and the limit hit.
#include "../core/ReviewTestSupport.h"

#include "LabSheet.h"
#include "SessionComparison.h"
#include "SupervisedWindow.h"

#include <QDir>
#include <QPushButton>
#include <QTest>

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

namespace {

LabSheet demoSheet()
{
    const auto parse = parseLabSheetJson(R"({
      "format": "sagline-lab-sheet", "version": 1, "title": "Lab 3: load test of a 50 VA toroid",
      "setup": {"nameplate": {"rated_power_va": 50, "primary_voltage_v": 230, "secondary_voltage_v": 24,
                              "secondary_no_load_voltage_v": 26.4, "construction": "toroidal"},
                "bench": {"steps": 4, "top_fraction": 0.8}},
      "locks": {"plan_fixed": true, "max_load_fraction": 0.8, "required_fuse": {"rating_a": 0.5, "type": "time-lag"},
                "typed_in_only": true},
      "instructions": "Step the rheostat down one position at a time. Switch off before touching the wiring."})");
    EXPECT_TRUE(parse.sheet.has_value());
    return *parse.sheet;
}

} // namespace

TEST(SupervisedWindow, LockedControlsSayWhy)
{
    SupervisedWindow window(demoSheet());
    ASSERT_FALSE(window.lockedControls().isEmpty());
    for (QWidget *control : window.lockedControls()) {
        EXPECT_FALSE(control->isEnabled());
        EXPECT_NE(control->toolTip().indexOf(QStringLiteral("Locked by the lab sheet")), -1) << control->toolTip().toStdString();
    }
    EXPECT_FALSE(window.startButton()->isEnabled());
    EXPECT_FALSE(window.recordButton()->isEnabled());
}

TEST(SupervisedWindow, StudentCompletesASessionAndTheLimitIsEnforced)
{
    TempFolder folder;
    const QString path = QString::fromStdString(folder.file("student.sagline"));
    SupervisedWindow window(demoSheet());
    EXPECT_NE(window.startSession(path, "B. Student", "DEMO-0101").indexOf(QStringLiteral("checklist")), -1);
    EXPECT_FALSE(std::filesystem::exists(path.toStdString())) << "nothing is written before the checklist";
    for (int i = 0; i < 4; ++i)
        window.setChecklistTicked(i, true);
    ASSERT_EQ(window.startSession(path, "B. Student", "DEMO-0101"), QString());
    EXPECT_TRUE(window.recordButton()->isEnabled());
    EXPECT_NE(window.instructionText().indexOf(QStringLiteral("Step 1 of 5")), -1) << window.instructionText().toStdString();

    // Rated current 50/24 = 2.083 A; the sheet allows 80 % = 1.667 A (+5 % for a hand-set load).
    auto refused = window.enterReading(QStringLiteral("24.2 V"), QStringLiteral("1.9 A"));
    EXPECT_TRUE(refused.limitHit);
    EXPECT_FALSE(refused.recorded);
    EXPECT_NE(window.messageText().indexOf(QStringLiteral("Refused by the lab sheet")), -1);
    auto wrongUnit = window.enterReading(QStringLiteral("0.4 A"), QStringLiteral("0 A"));
    EXPECT_FALSE(wrongUnit.recorded);
    EXPECT_FALSE(wrongUnit.limitHit);

    // The plan's five steps (0 to 80 % in four increments), typed as a student would.
    const char *volts[] = {"26,40 V", "25.92 V", "25.44", "24.96 V", "24.47 V"};
    const char *amps[] = {"0 A", "417 mA", "0.833", "1.25 A", "1.667 A"};
    for (int k = 0; k < 5; ++k) {
        const auto outcome = window.enterReading(QString::fromLatin1(volts[k]), QString::fromLatin1(amps[k]));
        EXPECT_TRUE(outcome.recorded) << k << ": " << outcome.message.toStdString();
    }
    EXPECT_TRUE(window.session().isFinished());
    EXPECT_FALSE(window.recordButton()->isEnabled());

    window.show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(&window));
    QDir().mkpath(QStringLiteral("screenshots"));
    EXPECT_TRUE(window.grab().save(QStringLiteral("screenshots/supervised-session.png")));

    // What the lab lead sees.
    const SessionRow row = loadSessionRow(path.toStdString(), {});
    ASSERT_TRUE(row.opened) << row.problem;
    EXPECT_EQ(row.readingCount, 5u);
    ASSERT_TRUE(row.supervision.labSheet);
    EXPECT_EQ(row.supervision.labSheet->title, "Lab 3: load test of a 50 VA toroid");
    ASSERT_TRUE(row.supervision.checklist);
    EXPECT_TRUE(row.supervision.checklist->complete());
    ASSERT_EQ(row.supervision.limitHits.size(), 1u);
    EXPECT_DOUBLE_EQ(*row.supervision.limitHits[0].currentA, 1.9);
    EXPECT_TRUE(row.figures.ok) << row.figures.message;
    EXPECT_NEAR(row.figures.resistanceOhm, 1.155, 0.01);
}
