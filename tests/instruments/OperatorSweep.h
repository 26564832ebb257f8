// A sweep over the virtual bench's voltmeter and ammeter without its programmable load: the
// test plays the operator, who sets the bench's load and confirms each step (simulated time).
// Shared by the tests of the load confirmation asked again after a lost link or a pause.
#pragma once

#include "InstrumentsTestSupport.h"

#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "SimInstrument.h"
#include "SweepController.h"
#include "VirtualBench.h"
#include "VirtualBenchLink.h"

#include <QDateTime>
#include <QTimer>

#include <functional>
#include <memory>
#include <optional>
#include <tuple>

namespace sagline::test {

// The bench's voltmeter and ammeter only: the load is the operator's rheostat.
class OperatorSweep {
public:
    OperatorSweep()
        : plan(planFor(demoSetup())), clock(QDateTime(QDate(2026, 12, 2), QTime(9, 0), Qt::UTC).toMSecsSinceEpoch())
    {
        const sagline::Setup setup = demoSetup();
        VirtualBenchOptions options = virtualBenchOptionsFor(setup, plan, 7);
        options.transformer.thermalResistanceKPerW = 0.0;
        bench = std::make_unique<VirtualBench>(options, &clock);
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
        rig->connectAll();
        EXPECT_TRUE(waitUntil([this] { return rig->isReady(); }));
        SweepOptions sweepOptions = sweepOptionsFor(setup, plan);
        sweepOptions.simulated = true;
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

    int announcements(int step) const
    {
        int n = 0;
        for (const auto &[s, text] : instructions)
            n += s == step ? 1 : 0;
        return n;
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
};

} // namespace sagline::test
