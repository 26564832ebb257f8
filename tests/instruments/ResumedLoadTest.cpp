// After the operator pauses a sweep and resumes it, the interrupted step is not read until its
// load is confirmed again: anyone may have turned the rheostat while the sweep was paused. The
// virtual bench's meters without its programmable load (the test plays the operator), in
// simulated time; and with the programmable load, which is set again and the step goes on.
#include "OperatorSweep.h"

#include "LinkAddress.h"

using namespace sagline;
using namespace sagline::test;

namespace {

constexpr int pausedStep = 3;

} // namespace

TEST(ResumedLoad, AfterAPauseTheStepWaitsForTheOperatorAndIsReadAtTheConfirmedLoad)
{
    OperatorSweep sweep;
    const PlanStep &step = sweep.planStep(pausedStep);
    ASSERT_TRUE(step.loadResistanceOhm.has_value());
    // Step 3: the load is set and confirmed, then the operator pauses during the dwell.
    sweep.pauseAfterConfirming(pausedStep);
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.isPausedOnce(); })) << toString(sweep.controller->state()).toStdString();
    ASSERT_EQ(sweep.recorded.size(), static_cast<std::size_t>(pausedStep)); // steps 0..2 only

    // While paused, someone turns the rheostat to twice the resistance. The operator resumes
    // but does not answer the question at once: the test looks first.
    sweep.bench->setLoad(2.0 * *step.loadResistanceOhm);
    EXPECT_TRUE(sweep.resumeWithoutAnswering());
    EXPECT_EQ(sweep.controller->currentStep(), pausedStep);
    ASSERT_TRUE(sweep.staysUnreadForAMinute(pausedStep)); // nothing read, however long

    // The step is announced again, and the text says plainly what to check.
    ASSERT_EQ(sweep.announcements(pausedStep), 2);
    const QString text = sweep.instructions.back().second;
    // Demo step 3 of 8: 3/8 of 3.33 A = 1.25 A; 19.6 V - 0.48 Ω x 1.25 A = 19.0 V; 19.0 V / 1.25 A = 15.2 Ω.
    EXPECT_EQ(text.toStdString(), "resumed: check the load is still at about 15.2 Ω for step 3, then confirm; "
                                  "expect about 19 V and 1.25 A");
    EXPECT_EQ(text, sweep.controller->resumedInstruction(pausedStep));

    // The operator finds the rheostat moved, puts it back and confirms: the step is read at
    // the planned load, and the sweep completes with every step once, in order.
    ASSERT_TRUE(sweep.confirmAndComplete());
    // At twice the resistance the current would be about half: within 5 % it is the planned load.
    EXPECT_NEAR(sweep.recorded[pausedStep].currentA, step.currentA, 0.05 * step.currentA);
    const QString events = sweep.sink.events.join('\n');
    EXPECT_TRUE(events.contains(QStringLiteral("paused by the operator at step 3"))) << events.toStdString();
    EXPECT_TRUE(events.contains(QStringLiteral("resumed at step 3"))) << events.toStdString();
    EXPECT_TRUE(events.contains(QStringLiteral("step 3: waiting for the operator to confirm the load again"))) << events.toStdString();
    EXPECT_TRUE(events.contains(QStringLiteral("step 3: the operator confirmed the load again after resuming")))
        << events.toStdString();
}

TEST(ResumedLoad, APauseBeforeTheLoadWasConfirmedAsksForTheLoadAsBefore)
{
    OperatorSweep sweep;
    sweep.beforeConfirm = [&](int s) {
        if (s == pausedStep && !sweep.pausedOnce) {
            sweep.pausedOnce = true;
            sweep.controller->pause(); // paused while step 3 waits for its load
            return false;
        }
        return true;
    };
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.isPausedOnce(); }));
    sweep.controller->resume();
    ASSERT_TRUE(sweep.completesEveryStepInOrder());
    const QStringList texts = sweep.instructionsFor(pausedStep);
    ASSERT_EQ(texts.size(), 2);
    // Never confirmed, so nothing to check "still": the ordinary instruction, marked.
    EXPECT_EQ(texts.back(), QStringLiteral("resumed: ") + sweep.controller->instruction(pausedStep));
    EXPECT_TRUE(sweep.sink.events.join('\n').contains(QStringLiteral("step 3: the operator confirmed the load after resuming")));
}

TEST(ResumedLoad, PausingAgainBeforeConfirmingStillAsksToCheckTheLoad)
{
    OperatorSweep sweep;
    sweep.pauseAfterConfirming(pausedStep);
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.isPausedOnce(); }));
    ASSERT_TRUE(sweep.resumeWithoutAnswering());
    sweep.controller->pause();
    sweep.controller->resume();
    EXPECT_EQ(sweep.controller->state(), SweepState::WaitingForLoad);
    ASSERT_EQ(sweep.announcements(pausedStep), 3);
    EXPECT_EQ(sweep.instructions.back().second, sweep.controller->resumedInstruction(pausedStep));
    EXPECT_EQ(sweep.recorded.size(), static_cast<std::size_t>(pausedStep));
    ASSERT_TRUE(sweep.confirmAndComplete());
}

TEST(ResumedLoad, ALinkLostWhileTheResumedStepWaitsStillAsksToCheckTheLoad)
{
    OperatorSweep sweep;
    sweep.pauseAfterConfirming(pausedStep);
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.isPausedOnce(); }));
    ASSERT_TRUE(sweep.resumeWithoutAnswering());
    // The voltmeter's cable is pulled while the resumed step waits: the load was confirmed
    // before the pause, so after the restore the operator checks it "still", as after any loss.
    sweep.bench->voltmeter()->vanish(200);
    ASSERT_TRUE(waitUntil([&] { return sweep.controller->state() == SweepState::Paused; }, 5000));
    ASSERT_TRUE(waitUntil([&] { return sweep.controller->state() == SweepState::WaitingForLoad; }, 5000))
        << toString(sweep.controller->state()).toStdString();
    EXPECT_EQ(sweep.instructions.back().second, sweep.controller->restoredInstruction(pausedStep));
    EXPECT_EQ(sweep.recorded.size(), static_cast<std::size_t>(pausedStep));
    ASSERT_TRUE(sweep.confirmAndComplete());
}

TEST(ResumedLoad, AProgrammableLoadIsSetAgainAndTheStepProceedsByItself)
{
    OperatorSweep sweep(LoadKind::Programmable);
    const PlanStep &step = sweep.planStep(pausedStep);
    QObject::connect(sweep.controller.get(), &SweepController::stateChanged, [&](SweepState state) {
        if (state == SweepState::Settling && sweep.controller->currentStep() == pausedStep && !sweep.pausedOnce) {
            sweep.pausedOnce = true;
            QTimer::singleShot(0, sweep.controller.get(), [&] { sweep.controller->pause(); });
        }
    });
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.isPausedOnce(); })) << toString(sweep.controller->state()).toStdString();
    // The virtual clock moves only when the event loop would block, so the pause posted at the
    // start of the dwell comes before step 3 is read.
    ASSERT_EQ(sweep.recorded.size(), static_cast<std::size_t>(pausedStep));
    sweep.bench->setLoad(2.0 * *step.loadResistanceOhm); // moved while paused: set again on resume
    sweep.controller->resume();
    ASSERT_TRUE(sweep.completesEveryStepInOrder());
    EXPECT_NEAR(sweep.recorded[pausedStep].currentA, step.currentA, 0.05 * step.currentA);
    const QStringList again = sweep.instructionsFor(pausedStep);
    ASSERT_EQ(again.size(), 2);
    EXPECT_EQ(again[1].toStdString(), "resumed: setting the load again to about 15.2 Ω for step 3; expect about 19 V and 1.25 A");
    EXPECT_TRUE(sweep.sink.events.join('\n').contains(QStringLiteral("step 3: load set again after the operator resumed")));
}

TEST(ResumedLoad, APauseFromAStateChangedHandlerHoldsAndTheStepIsCheckedAgain)
{
    // A stateChanged handler may pause at once (signals re-enter): the dwell and the reading
    // that would have followed must not run while paused. Paused on entering the dwell, and
    // on entering the measurement.
    for (SweepState pauseAt : {SweepState::Settling, SweepState::Measuring}) {
        SCOPED_TRACE(toString(pauseAt).toStdString());
        OperatorSweep sweep;
        QObject::connect(sweep.controller.get(), &SweepController::stateChanged, [&](SweepState state) {
            if (state == pauseAt && sweep.controller->currentStep() == pausedStep && !sweep.pausedOnce) {
                sweep.pausedOnce = true;
                sweep.controller->pause();
            }
        });
        ASSERT_TRUE(sweep.runUntil([&] { return sweep.pausedOnce; }));
        sweep.clock.advance(60000);
        waitUntil([] { return false; }, 150);
        EXPECT_EQ(sweep.controller->state(), SweepState::Paused);
        EXPECT_EQ(sweep.recorded.size(), static_cast<std::size_t>(pausedStep));
        EXPECT_TRUE(sweep.resumeWithoutAnswering());
        EXPECT_EQ(sweep.instructions.back().second, sweep.controller->resumedInstruction(pausedStep));
        ASSERT_TRUE(sweep.confirmAndComplete());
    }
}

TEST(ResumedLoad, AfterNoValidReadingTheStepAsksForItsLoadAgain)
{
    OperatorSweep sweep;
    const PlanStep &step = sweep.planStep(pausedStep);
    ASSERT_TRUE(step.loadResistanceOhm.has_value());
    // Right after step 3's load is confirmed the voltmeter answers "not a number" (a lead
    // off): no valid reading within the stability time, so the sweep pauses by itself.
    sweep.onceAfterConfirming(pausedStep, [&] { sweep.bench->voltmeter()->injectFault(SimFault::NotANumber, 100000); });
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.controller->state() == SweepState::Paused; }))
        << toString(sweep.controller->state()).toStdString();
    EXPECT_TRUE(sweep.sink.events.join('\n').contains(QStringLiteral("step 3: no valid reading")))
        << sweep.sink.events.join('\n').toStdString();
    ASSERT_EQ(sweep.recorded.size(), static_cast<std::size_t>(pausedStep));

    // Putting the lead back, someone knocks the rheostat to twice the resistance; then resume.
    sweep.bench->voltmeter()->clearInjectedFaults();
    sweep.bench->setLoad(2.0 * *step.loadResistanceOhm);
    EXPECT_TRUE(sweep.resumeWithoutAnswering());
    ASSERT_TRUE(sweep.staysUnreadForAMinute(pausedStep));
    EXPECT_EQ(sweep.instructions.back().second, sweep.controller->resumedInstruction(pausedStep));

    // Put back and confirmed: read at the planned load (twice the resistance: about half the current).
    ASSERT_TRUE(sweep.confirmAndComplete());
    EXPECT_NEAR(sweep.recorded[pausedStep].currentA, step.currentA, 0.05 * step.currentA);
}
