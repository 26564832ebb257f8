// A sweep over the virtual bench's voltmeter and ammeter without its programmable load: the
// test plays the operator, who sets the bench's load and confirms each step (simulated time).
// Shared by the tests of the load confirmation asked again after a lost link or a pause; with
// `LoadKind::Programmable` the bench's own load is in the rig too and nobody needs to answer.
#pragma once

#include "InstrumentsTestSupport.h"

#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "LinkAddress.h"
#include "SimInstrument.h"
#include "SweepController.h"
#include "VirtualBench.h"
#include "VirtualBenchLink.h"

#include <QDateTime>
#include <QStringList>
#include <QTimer>

#include <functional>
#include <utility>
#include <memory>
#include <optional>
#include <tuple>

namespace sagline::test {

enum class LoadKind { Operator, Programmable };

// By default the bench's voltmeter and ammeter only: the load is the operator's rheostat.
class OperatorSweep {
public:
    // `adjust` changes the sweep's options before the controller is made (give-up time, ...).
    explicit OperatorSweep(LoadKind load = LoadKind::Operator, const std::function<void(SweepOptions &)> &adjust = {})
        : plan(planFor(demoSetup())), clock(QDateTime(QDate(2026, 12, 2), QTime(9, 0), Qt::UTC).toMSecsSinceEpoch())
    {
        const sagline::Setup setup = demoSetup();
        VirtualBenchOptions options = virtualBenchOptionsFor(setup, plan, 7);
        options.transformer.thermalResistanceKPerW = 0.0;
        bench = std::make_unique<VirtualBench>(options, &clock);
        if (load == LoadKind::Programmable) {
            operatorAnswers = false; // the load sets itself: a question to the operator would hang the test
            rig.reset(makeVirtualBenchRig(bench.get(), false));
            for (ScpiInstrument *instrument : rig->instruments())
                instrument->setReconnectIntervalMs(50);
        } else {
            rig = std::make_unique<InstrumentRig>();
            for (auto [name, instrument, role] : {std::tuple{"voltmeter", bench->voltmeter(), MeterRole::SecondaryVoltage},
                                                  std::tuple{"ammeter", bench->ammeter(), MeterRole::SecondaryCurrent}}) {
                auto *meter = new ScpiInstrument(QString::fromLatin1(name), new VirtualBenchLink(instrument));
                RoleConfig config = defaultRoleConfig(role);
                const SimMeterSpec &spec = role == MeterRole::SecondaryVoltage ? options.voltmeter : options.ammeter;
                config.accuracy = spec.accuracy;
                config.resolution = spec.resolution;
                meter->setRoles({config});
                meter->setReconnectIntervalMs(50);
                rig->addInstrument(meter);
            }
        }
        rig->connectAll();
        EXPECT_TRUE(waitUntil([this] { return rig->isReady(); }));
        SweepOptions sweepOptions = sweepOptionsFor(setup, plan);
        sweepOptions.simulated = true;
        if (adjust)
            adjust(sweepOptions);
        controller = std::make_unique<SweepController>(plan, sweepOptions, rig.get(), &sink, &fit, &clock);
        QObject::connect(controller.get(), &SweepController::pointRecorded,
                         [this](const Reading &reading, const LiveFitSnapshot &) { recorded.push_back(reading); });
        QObject::connect(controller.get(), &SweepController::stepStarted,
                         [this](int step, const QString &text) { instructions.emplace_back(step, text); });
        QObject::connect(controller.get(), &SweepController::finished, [this](SweepOutcome o) { outcome = o; });
        QObject::connect(controller.get(), &SweepController::stateChanged, [this](SweepState state) {
            if (state == SweepState::WaitingForLoad && operatorAnswers)
                QTimer::singleShot(0, controller.get(), [this] { playOperator(); });
        });
    }

    const PlanStep &planStep(int index) const
    {
        for (const PlanStep &s : plan.steps) {
            if (s.index == index)
                return s;
        }
        ADD_FAILURE() << "no step " << index;
        return plan.steps.front();
    }

    // Sets the bench's load as the plan asks and confirms, unless `beforeConfirm` holds the step.
    void playOperator()
    {
        if (controller->state() != SweepState::WaitingForLoad)
            return;
        const int step = controller->currentStep();
        if (beforeConfirm && !beforeConfirm(step))
            return;
        bench->setLoad(planStep(step).loadResistanceOhm);
        controller->confirmLoadSet();
        if (afterConfirm)
            afterConfirm(step);
    }

    // Every instruction the controller gave for `step`, in order.
    QStringList instructionsFor(int step) const
    {
        QStringList texts;
        for (const auto &[s, text] : instructions) {
            if (s == step)
                texts << text;
        }
        return texts;
    }

    int announcements(int step) const { return static_cast<int>(instructionsFor(step).size()); }

    // `action` runs once, right after the operator confirmed `step`'s load (the dwell has begun).
    void onceAfterConfirming(int step, std::function<void()> action)
    {
        afterConfirm = [step, action = std::move(action), done = false](int s) mutable {
            if (s == step && !done) {
                done = true;
                action();
            }
        };
    }

    // The operator pauses once, right after confirming `step`'s load.
    void pauseAfterConfirming(int step)
    {
        onceAfterConfirming(step, [this] {
            pausedOnce = true;
            controller->pause();
        });
    }

    // The operator resumes but does not answer yet: the step must wait for its load again.
    testing::AssertionResult resumeWithoutAnswering()
    {
        operatorAnswers = false;
        controller->resume();
        if (controller->state() != SweepState::WaitingForLoad)
            return testing::AssertionFailure() << "after resume: " << toString(controller->state()).toStdString();
        return testing::AssertionSuccess();
    }

    // Starts the sweep on the auto-advancing clock (time jumps to the next timer).
    void run()
    {
        clock.setAutoAdvance(true);
        controller->start();
    }

    // Runs, and waits (wall time) until `condition` holds.
    bool runUntil(const std::function<bool()> &condition, int timeoutMs = 10000)
    {
        run();
        return waitUntil(condition, timeoutMs);
    }

    bool isPausedOnce() const { return pausedOnce && controller->state() == SweepState::Paused; }

    // A simulated minute passes with nobody confirming: the sweep still waits for the load of
    // `step`, and only the steps before it are recorded.
    testing::AssertionResult staysUnreadForAMinute(int step)
    {
        clock.advance(60000);
        waitUntil([] { return false; }, 150);
        if (controller->state() != SweepState::WaitingForLoad || controller->currentStep() != step)
            return testing::AssertionFailure() << toString(controller->state()).toStdString() << " at step " << controller->currentStep();
        if (recorded.size() != static_cast<std::size_t>(step))
            return testing::AssertionFailure() << recorded.size() << " readings while step " << step << " waits";
        return testing::AssertionSuccess();
    }

    // Waits for the end: completed, with every step of the plan recorded once, in order.
    testing::AssertionResult completesEveryStepInOrder(int timeoutMs = 10000)
    {
        if (!waitUntil([this] { return outcome.has_value(); }, timeoutMs))
            return testing::AssertionFailure() << "not finished; state " << toString(controller->state()).toStdString();
        if (*outcome != SweepOutcome::Completed)
            return testing::AssertionFailure() << "outcome " << toString(*outcome).toStdString();
        if (recorded.size() != plan.steps.size())
            return testing::AssertionFailure() << recorded.size() << " readings for " << plan.steps.size() << " steps";
        for (std::size_t i = 0; i < recorded.size(); ++i) {
            if (recorded[i].step != plan.steps[i].index)
                return testing::AssertionFailure() << "reading " << i << " is of step " << recorded[i].step;
        }
        return testing::AssertionSuccess();
    }

    // The operator answers again, sets and confirms the waiting step, and the sweep runs to its end.
    testing::AssertionResult confirmAndComplete()
    {
        operatorAnswers = true;
        playOperator();
        return completesEveryStepInOrder();
    }

    Plan plan;
    VirtualClock clock;
    std::unique_ptr<VirtualBench> bench;
    std::unique_ptr<InstrumentRig> rig;
    MemorySink sink;
    LineFitLiveFit fit;
    std::unique_ptr<SweepController> controller;
    std::vector<Reading> recorded;
    std::vector<std::pair<int, QString>> instructions;
    std::optional<SweepOutcome> outcome;
    bool operatorAnswers = true;
    std::function<bool(int)> beforeConfirm; // false: the operator does not confirm (yet)
    std::function<void(int)> afterConfirm;
    bool pausedOnce = false; // set by pauseAfterConfirming, or by a test's own pause
};

} // namespace sagline::test
