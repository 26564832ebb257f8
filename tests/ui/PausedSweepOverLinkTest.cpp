// The operator pauses a sweep through the window over a real link (sagline-sim as its own
// process, its two-channel meter on loopback TCP typed in as the LAN address), someone turns the
// rheostat while it is paused, and the operator resumes: the window asks to check the step's
// load again and reads nothing until Record is clicked; the step is then read at its
// planned current, the sweep completes with every step once, and the session notes say so.
#include "LinkSweep.h"

#include <string>

using namespace sagline;
using namespace sagline::test;

TEST(PausedSweepOverLink, AfterResumeTheStepWaitsForTheLoadToBeCheckedAndIsReadAtThePlannedCurrent)
{
    LinkSweep s;
    ASSERT_TRUE(s.connect(ReadingSource::Lan));
    SweepWorkspace *workspace = s.window->workspace();
    SweepController *controller = s.controller();
    const Plan &plan = s.plan();
    QPushButton *pause = s.window->nextStep()->pauseButton();
    constexpr std::size_t paused = 2;
    const PlanStep &step = plan.steps[paused];
    ASSERT_TRUE(step.loadResistanceOhm.has_value());

    for (std::size_t i = 0; i < paused; ++i)
        ASSERT_TRUE(s.recordStep(i));
    // The load of the next step is set and confirmed; the operator pauses before it is read
    // (a real meter needs three agreeing readings 500 ms apart, so the click comes first).
    ASSERT_TRUE(s.recordStep(paused, false));
    ASSERT_NE(controller->state(), SweepState::WaitingForLoad);
    QTest::mouseClick(pause, Qt::LeftButton);
    ASSERT_EQ(controller->state(), SweepState::Paused);
    EXPECT_TRUE(pause->text().contains(QStringLiteral("Resume"))) << pause->text().toStdString();
    ASSERT_EQ(workspace->readings().size(), paused);

    // While paused, someone turns the rheostat to twice the resistance; the operator resumes.
    QString error;
    ASSERT_TRUE(s.sim.setLoad(2.0 * *step.loadResistanceOhm, &error)) << error.toStdString();
    QTest::mouseClick(pause, Qt::LeftButton);
    EXPECT_TRUE(pause->text().contains(QStringLiteral("Pause"))) << pause->text().toStdString();
    // Nothing is read at the moved load, however long nobody confirms.
    ASSERT_TRUE(s.asksAgainAndHolds(QStringLiteral("resumed: check the load is still at about"), step));
    ASSERT_EQ(workspace->readings().size(), paused);

    // The operator puts the load back and clicks Record: the step is read at the planned
    // current (twice the resistance would give about half of it).
    ASSERT_TRUE(s.recordStep(paused));
    EXPECT_NEAR(workspace->readings()[paused].currentA, step.currentA, 0.05 * step.currentA);
    ASSERT_TRUE(s.recordTheRestAndFinish(paused + 1));

    // The session notes record the pause, the resume and the load confirmed again.
    auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok()) << stored.message;
    const auto notes = stored.value->notes();
    ASSERT_TRUE(notes.ok());
    std::string all;
    for (const auto &note : notes.value)
        all += note.text + "\n";
    const std::string n = std::to_string(step.index);
    for (const std::string &expected :
         {"paused by the operator at step " + n, "resumed at step " + n, "step " + n + ": waiting for the operator to confirm the load again",
          "step " + n + ": the operator confirmed the load again after resuming"})
        EXPECT_NE(all.find(expected), std::string::npos) << expected << " not in:\n" << all;
}
