// After a lost meter link comes back the interrupted step is not read until its load is
// confirmed again: nobody watched the rheostat while the meters were away. The virtual bench's
// meters without its programmable load (an operator, played by the test, sets the bench's load
// and confirms), in simulated time; and with the programmable load, which is set again.
#include "OperatorSweep.h"

#include <QTimer>

using namespace sagline;
using namespace sagline::test;

namespace {

constexpr int restoredStep = 3;

} // namespace

TEST(LinkRestoredLoad, TheInterruptedStepWaitsForTheOperatorAndIsReadAtTheConfirmedLoad)
{
    OperatorSweep sweep;
    const PlanStep &step = sweep.planStep(restoredStep);
    ASSERT_TRUE(step.loadResistanceOhm.has_value());
    bool pulled = false;
    // Step 3: the load is set and confirmed, then the voltmeter's cable is pulled (0.2 s wall)
    // and, while it is away, someone turns the rheostat to twice the resistance.
    sweep.onceAfterConfirming(restoredStep, [&] {
        pulled = true;
        sweep.bench->voltmeter()->vanish(200);
        sweep.bench->setLoad(2.0 * *step.loadResistanceOhm);
    });
    // The operator does not answer the first question after the restore: the test looks first.
    bool heldOnce = false;
    sweep.beforeConfirm = [&](int s) {
        if (s == restoredStep && pulled && !heldOnce) {
            heldOnce = true;
            return false;
        }
        return true;
    };
    ASSERT_TRUE(sweep.runUntil([&] { return heldOnce; })) << toString(sweep.controller->state()).toStdString();

    // Back, and waiting: nothing read for step 3, however long nobody confirms.
    EXPECT_EQ(sweep.controller->state(), SweepState::WaitingForLoad);
    EXPECT_EQ(sweep.controller->currentStep(), restoredStep);
    ASSERT_TRUE(sweep.staysUnreadForAMinute(restoredStep)); // steps 0..2 only

    // The step is announced again, and the text says plainly what to check.
    ASSERT_EQ(sweep.announcements(restoredStep), 2);
    const QString text = sweep.instructions.back().second;
    // Demo step 3 of 8: 3/8 of 3.33 A = 1.25 A; 19.6 V - 0.48 Ω x 1.25 A = 19.0 V; 19.0 V / 1.25 A = 15.2 Ω.
    EXPECT_EQ(text.toStdString(), "link restored: check the load is still at about 15.2 Ω for step 3, then confirm; "
                                  "expect about 19 V and 1.25 A");
    EXPECT_EQ(text, sweep.controller->restoredInstruction(restoredStep));

    // The operator finds the rheostat moved, puts it back and confirms: the step is read at
    // the planned load, and the sweep completes with every step once, in order.
    ASSERT_TRUE(sweep.confirmAndComplete());
    // At twice the resistance the current would be about half: within 5 % it is the planned load.
    EXPECT_NEAR(sweep.recorded[restoredStep].currentA, step.currentA, 0.05 * step.currentA);
    const QString events = sweep.sink.events.join('\n');
    EXPECT_TRUE(events.contains(QStringLiteral("link lost at step 3"))) << events.toStdString();
    EXPECT_TRUE(events.contains(QStringLiteral("confirm the load of this step again"))) << events.toStdString();
    EXPECT_TRUE(events.contains(QStringLiteral("step 3: the operator confirmed the load again after the link was restored")))
        << events.toStdString();
}

TEST(LinkRestoredLoad, ALinkLostBeforeTheLoadWasConfirmedAsksForTheLoadAsBefore)
{
    OperatorSweep sweep;
    bool pulled = false;
    sweep.beforeConfirm = [&](int s) {
        if (s == restoredStep && !pulled) {
            pulled = true;
            sweep.bench->voltmeter()->vanish(200); // pulled while step 3 waits for its load
            return false;
        }
        return true;
    };
    sweep.run();
    ASSERT_TRUE(sweep.completesEveryStepInOrder());
    const QStringList texts = sweep.instructionsFor(restoredStep);
    ASSERT_EQ(texts.size(), 2);
    // Never confirmed, so nothing to check "still": the ordinary instruction, marked.
    EXPECT_EQ(texts.back(), QStringLiteral("link restored: ") + sweep.controller->instruction(restoredStep));
}

TEST(LinkRestoredLoad, AnOperatorPauseDuringTheOutageStillNeedsTheLoadConfirmedAfterResume)
{
    OperatorSweep sweep;
    const PlanStep &step = sweep.planStep(restoredStep);
    bool pulled = false;
    sweep.onceAfterConfirming(restoredStep, [&] {
        pulled = true;
        sweep.bench->voltmeter()->vanish(200);
        QTimer::singleShot(0, sweep.controller.get(), [&] { sweep.controller->pause(); }); // paused while the link is down
    });
    ASSERT_TRUE(sweep.runUntil([&] { return pulled && sweep.controller->state() == SweepState::Paused; }));
    ASSERT_TRUE(waitUntil([&] { return !sweep.bench->voltmeter()->isVanished() && sweep.rig->isReady(); }, 5000));
    waitUntil([] { return false; }, 100);
    EXPECT_EQ(sweep.controller->state(), SweepState::Paused); // the operator's pause holds
    EXPECT_TRUE(sweep.resumeWithoutAnswering());
    EXPECT_EQ(sweep.instructions.back().second, sweep.controller->restoredInstruction(step.index));
    EXPECT_EQ(sweep.recorded.size(), static_cast<std::size_t>(restoredStep));
    ASSERT_TRUE(sweep.confirmAndComplete());
}

TEST(LinkRestoredLoad, AProgrammableLoadIsSetAgainAndTheStepProceedsByItself)
{
    OperatorSweep sweep(LoadKind::Programmable);
    const PlanStep &step = sweep.planStep(restoredStep);
    bool pulled = false;
    QObject::connect(sweep.controller.get(), &SweepController::stateChanged, [&](SweepState state) {
        if (state == SweepState::Settling && sweep.controller->currentStep() == restoredStep && !pulled) {
            pulled = true;
            sweep.bench->voltmeter()->vanish(200);
            sweep.bench->setLoad(2.0 * *step.loadResistanceOhm); // moved while away: set again on restore
        }
    });
    sweep.run();
    ASSERT_TRUE(sweep.completesEveryStepInOrder());
    EXPECT_NEAR(sweep.recorded[restoredStep].currentA, step.currentA, 0.05 * step.currentA);
    const QStringList again = sweep.instructionsFor(restoredStep);
    ASSERT_EQ(again.size(), 2);
    EXPECT_EQ(again[1].toStdString(), "link restored: setting the load again to about 15.2 Ω for step 3; expect about 19 V "
                                      "and 1.25 A");
    EXPECT_TRUE(sweep.sink.events.join('\n').contains(QStringLiteral("step 3: load set again after the link was restored")));
}
