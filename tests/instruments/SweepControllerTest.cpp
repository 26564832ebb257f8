// The sweep controller on the in-process virtual bench, in simulated time (VirtualClock), so
// dwell times cost nothing: whole sweeps, every safety limit, the stability rule, a failed
// commit, a link that vanishes mid-sweep, and typed-in readings.
#include "InstrumentsTestSupport.h"

#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "LinkAddress.h"
#include "SimInstrument.h"
#include "SweepController.h"
#include "VirtualBench.h"
#include "VirtualBenchLink.h"

#include <QDateTime>

#include <memory>

using namespace sagline;
using namespace sagline::test;

namespace {

class VirtualSweep {
public:
    explicit VirtualSweep(const Setup &setup, std::function<void(VirtualBenchOptions &)> tweak = {}, bool singleMeter = false)
        : plan(planFor(setup)), clock(QDateTime(QDate(2026, 12, 2), QTime(9, 0), Qt::UTC).toMSecsSinceEpoch())
    {
        VirtualBenchOptions options = virtualBenchOptionsFor(setup, plan, 7);
        if (tweak)
            tweak(options);
        bench = std::make_unique<VirtualBench>(options, &clock);
        rig.reset(makeVirtualBenchRig(bench.get(), singleMeter));
        for (ScpiInstrument *instrument : rig->instruments())
            instrument->setReconnectIntervalMs(50);
        rig->connectAll();
        EXPECT_TRUE(waitUntil([this] { return rig->isReady(); }));
        sweepOptions = sweepOptionsFor(setup, plan);
        sweepOptions.simulated = true;
    }

    SweepController &controller()
    {
        if (!m_controller) {
            m_controller = std::make_unique<SweepController>(plan, sweepOptions, rig.get(), &sink, &fit, &clock);
            QObject::connect(m_controller.get(), &SweepController::pointRecorded,
                             [this](const Reading &reading, const LiveFitSnapshot &snapshot) {
                                 // Reported only after the commit: the sink already holds it.
                                 EXPECT_FALSE(sink.readings.empty());
                                 EXPECT_EQ(sink.readings.back().step, reading.step);
                                 EXPECT_GT(reading.id, 0);
                                 recorded.push_back(reading);
                                 snapshots.push_back(snapshot);
                             });
            QObject::connect(m_controller.get(), &SweepController::finished,
                             [this](SweepOutcome o) { outcome = o; });
            QObject::connect(m_controller.get(), &SweepController::stepStarted,
                             [this](int step, const QString &text) { instructions.emplace_back(step, text); });
            QObject::connect(m_controller.get(), &SweepController::notice, [this](const QString &m) { notices << m; });
            QObject::connect(m_controller.get(), &SweepController::linkLost, [this](const QString &) { ++lostCount; });
            QObject::connect(m_controller.get(), &SweepController::linkRestored, [this](const QString &) { ++restoredCount; });
        }
        return *m_controller;
    }

    bool run(int wallTimeoutMs = 10000)
    {
        clock.setAutoAdvance(true);
        controller().start();
        return waitUntil([this] { return outcome.has_value(); }, wallTimeoutMs);
    }

    Plan plan;
    VirtualClock clock;
    std::unique_ptr<VirtualBench> bench;
    std::unique_ptr<InstrumentRig> rig;
    SweepOptions sweepOptions;
    MemorySink sink;
    LineFitLiveFit fit;
    std::vector<Reading> recorded;
    std::vector<LiveFitSnapshot> snapshots;
    std::vector<std::pair<int, QString>> instructions;
    QStringList notices;
    std::optional<SweepOutcome> outcome;
    int lostCount = 0;
    int restoredCount = 0;

private:
    std::unique_ptr<SweepController> m_controller;
};

} // namespace

TEST(SweepController, RecordsEveryStepOfTheVirtualBenchAndFitsItsTransformer)
{
    VirtualSweep sweep(demoSetup(), [](VirtualBenchOptions &o) { o.transformer.thermalResistanceKPerW = 0.0; });
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::Completed);
    ASSERT_EQ(sweep.recorded.size(), sweep.plan.steps.size());
    for (std::size_t i = 0; i < sweep.recorded.size(); ++i) {
        EXPECT_EQ(sweep.recorded[i].step, sweep.plan.steps[i].index);
        EXPECT_TRUE(sweep.recorded[i].flags & flagSimulated);
        EXPECT_FALSE(sweep.recorded[i].flags & flagUnstable);
        // The meters' accuracy is systematic (gain and offset, in the session's setup), not a
        // per-reading random u: a reading from meters states none.
        EXPECT_FALSE(sweep.recorded[i].uVoltageV.has_value());
        EXPECT_FALSE(sweep.recorded[i].rawText.empty());
    }
    // Dwell in simulated time: 5 s per step, so the last point is at least 9 x 5 s after 09:00.
    EXPECT_GE(sweep.recorded.back().timeUtc, std::string("2026-12-02T09:00:45"));
    // The live fit recovers the simulated transformer: V0 and R within a few standard errors
    // plus the meters' fixed gain errors (drawn within a third of 0.5 % and 1 %).
    const LiveFitSnapshot &fit = sweep.snapshots.back();
    ASSERT_TRUE(fit.valid);
    const TransformerParameters &t = sweep.bench->options().transformer;
    EXPECT_NEAR(fit.noLoadVoltageV, t.noLoadVoltageV(), 3 * fit.noLoadVoltageSeV + 0.002 * t.noLoadVoltageV());
    EXPECT_NEAR(fit.seriesResistanceOhm, t.seriesResistanceOhm, 3 * fit.seriesResistanceSeOhm + 0.01 * 19.6 / 3.33);
    // The programmable load is left open after the sweep.
    sweep.rig->load()->setLoad(std::nullopt, nullptr, [](bool, const QString &) {});
    EXPECT_TRUE(waitUntil([&] { return !sweep.bench->load().has_value(); }));
    EXPECT_EQ(sweep.sink.instruments.size(), 3u); // voltmeter, ammeter, load identities
    EXPECT_TRUE(sweep.sink.instruments[0].identity.startsWith(QStringLiteral("Sagline Virtual Bench,")));
}

TEST(SweepController, TellsTheOperatorWhatToSetAndWhatToExpect)
{
    VirtualSweep sweep(demoSetup());
    SweepController &c = sweep.controller();
    // Plan step 1 of the demo: load 46.56 Ω, 19.40 V, 0.4167 A.
    EXPECT_EQ(c.instruction(1), QStringLiteral("set the load to about 46.6 Ω; expect about 19.4 V and 417 mA"));
    EXPECT_EQ(c.instruction(0), QStringLiteral("disconnect the load (open circuit); expect about 19.6 V and 0 mA"));
    EXPECT_EQ(c.instruction(8), QStringLiteral("set the load to about 5.4 Ω; expect about 18 V and 3.33 A"));
}

TEST(SweepController, OneMeterMayServeBothRoles)
{
    VirtualSweep sweep(demoSetup(), {}, true);
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::Completed);
    EXPECT_EQ(sweep.recorded.size(), sweep.plan.steps.size());
    EXPECT_EQ(sweep.sink.instruments[0].roleKeys, QStringLiteral("secondary_voltage,secondary_current"));
}

TEST(SweepController, OutputVaAboveTheLimitStopsAndIsRecorded)
{
    VirtualSweep sweep(demoSetup());
    sweep.sweepOptions.limits.maxOutputVa = 30.0;
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::SafetyStop);
    ASSERT_EQ(sweep.sink.stops.size(), 1u);
    EXPECT_EQ(sweep.sink.stops[0].limit, SafetyLimit::OutputVa);
    EXPECT_GT(sweep.sink.stops[0].measured, 30.0);
    // The reading that tripped is kept, left out of fits, and the load is opened.
    ASSERT_EQ(sweep.sink.exclusions.size(), 1u);
    EXPECT_EQ(sweep.sink.exclusions[0].first, sweep.sink.stopReadingIds[0]);
    EXPECT_EQ(sweep.sink.readings.size(), sweep.recorded.size() + 1);
    EXPECT_TRUE(waitUntil([&] { return !sweep.bench->load().has_value(); }));
    EXPECT_EQ(sweep.controller().state(), SweepState::Stopped);
}

TEST(SweepController, CurrentAboveTheRheostatSafeCurrentStops)
{
    VirtualSweep sweep(demoSetup());
    sweep.sweepOptions.limits.maxCurrentA = 1.0;
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::SafetyStop);
    ASSERT_EQ(sweep.sink.stops.size(), 1u);
    EXPECT_EQ(sweep.sink.stops[0].limit, SafetyLimit::RheostatCurrent);
    EXPECT_EQ(sweep.recorded.back().step, 2); // 0.83 A recorded; step 3 (1.25 A) trips
}

TEST(SweepController, MeterOverloadStopsAndTheReadingIsFlagged)
{
    VirtualSweep sweep(demoSetup());
    SweepController &c = sweep.controller();
    QObject::connect(&c, &SweepController::pointRecorded, [&](const Reading &reading, const LiveFitSnapshot &) {
        if (reading.step == 2)
            sweep.bench->ammeter()->injectFault(SimFault::Overload);
    });
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::SafetyStop);
    ASSERT_EQ(sweep.sink.stops.size(), 1u);
    EXPECT_EQ(sweep.sink.stops[0].limit, SafetyLimit::MeterOverload);
    EXPECT_NE(sweep.sink.stops[0].message.find("secondary ammeter"), std::string::npos);
    EXPECT_TRUE(sweep.sink.readings.back().flags & flagOverload);
    EXPECT_EQ(sweep.sink.readings.back().step, 3);
    for (const LiveFitSnapshot &s : sweep.snapshots)
        EXPECT_LE(s.pointCount, 3); // the overload value never reached the fit
}

TEST(SweepController, AnOpenPrimaryFuseStopsTheSweep)
{
    // A 40 mA quick-acting fuse: at step 2 the primary draws about 81 mA (2 In), which opens
    // it within the dwell (FuseModel, IEC 60127-2 gates), and the secondary collapses.
    VirtualSweep sweep(demoSetup(), [](VirtualBenchOptions &o) {
        o.fuse = FuseSpec{0.04, FuseType::QuickActing};
    });
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::SafetyStop);
    ASSERT_EQ(sweep.sink.stops.size(), 1u);
    EXPECT_EQ(sweep.sink.stops[0].limit, SafetyLimit::FuseOpen);
    EXPECT_TRUE(sweep.bench->isFuseOpen());
    EXPECT_LT(sweep.sink.readings.back().voltageV, 1.0);
}

TEST(SweepController, UnsettledReadingsAreRecordedAsUnstableAfterTheMaximumTime)
{
    VirtualSweep sweep(demoSetup(), [](VirtualBenchOptions &o) { o.voltmeter.noiseSd = 0.5; });
    sweep.sweepOptions.stability.maxTimeS = 3.0;
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::Completed);
    int unstable = 0;
    for (const Reading &r : sweep.recorded)
        unstable += (r.flags & flagUnstable) ? 1 : 0;
    EXPECT_GE(unstable, 5); // 0.5 V noise never agrees within 0.2 % three times running
    EXPECT_TRUE(sweep.notices.join('\n').contains(QStringLiteral("did not settle")));
}

TEST(SweepController, AFailedCommitPausesAndNothingIsLostOnResume)
{
    VirtualSweep sweep(demoSetup());
    SweepController &c = sweep.controller();
    QString pausedReason;
    QObject::connect(&c, &SweepController::paused, [&](const QString &reason) { pausedReason = reason; });
    QObject::connect(&c, &SweepController::pointRecorded, [&](const Reading &reading, const LiveFitSnapshot &) {
        if (reading.step == 3)
            sweep.sink.failNextCommits = 1;
    });
    sweep.clock.setAutoAdvance(true);
    c.start();
    ASSERT_TRUE(waitUntil([&] { return c.state() == SweepState::Paused; }));
    EXPECT_TRUE(pausedReason.contains(QStringLiteral("disk full")));
    EXPECT_EQ(sweep.recorded.size(), 4u); // steps 0..3; step 4 is held, not reported
    c.resume();
    ASSERT_TRUE(waitUntil([&] { return sweep.outcome.has_value(); }));
    EXPECT_EQ(*sweep.outcome, SweepOutcome::Completed);
    ASSERT_EQ(sweep.recorded.size(), sweep.plan.steps.size());
    for (std::size_t i = 0; i < sweep.recorded.size(); ++i)
        EXPECT_EQ(sweep.recorded[i].step, static_cast<int>(i));
}

TEST(SweepController, ALinkThatVanishesPausesAndTheSweepResumesAtTheSameStep)
{
    VirtualSweep sweep(demoSetup());
    SweepController &c = sweep.controller();
    bool vanished = false;
    QObject::connect(&c, &SweepController::stepStarted, [&](int step, const QString &) {
        if (step == 4 && !vanished) {
            vanished = true;
            sweep.bench->voltmeter()->vanish(200); // wall-clock ms, while the load is being set
        }
    });
    ASSERT_TRUE(sweep.run()) << "lost " << sweep.lostCount << ", restored " << sweep.restoredCount << ", state "
                             << toString(c.state()).toStdString() << ", recorded " << sweep.recorded.size() << ", reason " << c.pauseReason().toStdString() << "\n"
                             << sweep.notices.join('\n').toStdString();
    EXPECT_EQ(*sweep.outcome, SweepOutcome::Completed);
    EXPECT_EQ(sweep.lostCount, 1);
    EXPECT_EQ(sweep.restoredCount, 1);
    ASSERT_EQ(sweep.recorded.size(), sweep.plan.steps.size()); // nothing lost, nothing twice
    for (std::size_t i = 0; i < sweep.recorded.size(); ++i)
        EXPECT_EQ(sweep.recorded[i].step, static_cast<int>(i));
    // Step 4 was announced again after the link came back.
    int step4 = 0;
    for (const auto &[step, text] : sweep.instructions)
        step4 += step == 4 ? 1 : 0;
    EXPECT_EQ(step4, 2);
    EXPECT_TRUE(sweep.sink.events.join('\n').contains(QStringLiteral("link lost at step 4")));
}

TEST(SweepController, TypedInReadingsAreValidatedAgainstTheirRole)
{
    const sagline::Setup setup = demoSetup();
    const Plan plan = planFor(setup);
    VirtualClock clock(0);
    MemorySink sink;
    LineFitLiveFit fit;
    SweepController c(plan, sweepOptionsFor(setup, plan), nullptr, &sink, &fit, &clock);
    int recorded = 0;
    QObject::connect(&c, &SweepController::pointRecorded, [&](const Reading &, const LiveFitSnapshot &) { ++recorded; });
    EXPECT_NE(c.submitManualReading(QStringLiteral("19,6 V"), QStringLiteral("0 A")), QString()); // not started
    c.start();
    EXPECT_EQ(c.state(), SweepState::WaitingForEntry);
    const QString refused = c.submitManualReading(QStringLiteral("130 mA"), QStringLiteral("0 A"));
    EXPECT_TRUE(refused.contains(QStringLiteral("secondary voltmeter"))) << refused.toStdString();
    EXPECT_TRUE(refused.contains(QStringLiteral("a voltage"))) << refused.toStdString();
    EXPECT_TRUE(c.submitManualReading(QStringLiteral("19.6 V"), QStringLiteral("-1 A")).contains(QStringLiteral("negative")));
    EXPECT_EQ(recorded, 0);
    EXPECT_EQ(c.submitManualReading(QStringLiteral("19,6 V"), QStringLiteral("0 mA")), QString());
    EXPECT_EQ(c.submitManualReading(QStringLiteral("19.41"), QStringLiteral("415 mA")), QString());
    EXPECT_EQ(c.submitManualReading(QStringLiteral("19,19 V"), QStringLiteral("0,834 A")), QString());
    EXPECT_EQ(recorded, 3);
    EXPECT_EQ(c.currentStep(), 3);
    ASSERT_EQ(sink.readings.size(), 3u);
    EXPECT_TRUE(sink.readings[1].flags & flagManual);
    EXPECT_DOUBLE_EQ(sink.readings[1].currentA, 0.415);
    EXPECT_DOUBLE_EQ(sink.readings[2].voltageV, 19.19);
    // A collapsed voltage under load is the fuse-open stop, typed in or not.
    EXPECT_EQ(c.submitManualReading(QStringLiteral("0.02 V"), QStringLiteral("1 mA")), QString());
    EXPECT_EQ(c.state(), SweepState::Stopped);
    ASSERT_EQ(sink.stops.size(), 1u);
    EXPECT_EQ(sink.stops[0].limit, SafetyLimit::FuseOpen);
}

TEST(SweepController, AReadingFarOutsideThePredictionIntervalIsFlagged)
{
    const sagline::Setup setup = demoSetup();
    const Plan plan = planFor(setup);
    VirtualClock clock(0);
    MemorySink sink;
    LineFitLiveFit fit;
    SweepController c(plan, sweepOptionsFor(setup, plan), nullptr, &sink, &fit, &clock);
    QStringList notices;
    QObject::connect(&c, &SweepController::notice, [&](const QString &m) { notices << m; });
    c.start();
    // Five readings near the line V = 19.6 - 0.48 I, then one 1.6 V low (a loose lead, say).
    const char *typed[][2] = {{"19.601", "0"}, {"19.399", "0.4167"}, {"19.202", "0.8333"}, {"18.999", "1.25"},
                              {"18.801", "1.6667"}, {"17.0", "2.0833"}};
    for (const auto &pair : typed)
        ASSERT_EQ(c.submitManualReading(QString::fromLatin1(pair[0]), QString::fromLatin1(pair[1])), QString());
    ASSERT_EQ(sink.readings.size(), 6u);
    for (std::size_t i = 0; i < 5; ++i)
        EXPECT_FALSE(sink.readings[i].flags & flagOutsidePrediction) << i;
    EXPECT_TRUE(sink.readings[5].flags & flagOutsidePrediction);
    EXPECT_TRUE(notices.join('\n').contains(QStringLiteral("loose lead")));
}

TEST(SweepController, OptionalPrimaryMetersAreReadWithEveryPoint)
{
    VirtualSweep sweep(demoSetup());
    auto *mains = new ScpiInstrument(QStringLiteral("mains meter"), new VirtualBenchLink(sweep.bench->primaryMeter()));
    RoleConfig v1 = defaultRoleConfig(MeterRole::PrimaryVoltage);
    RoleConfig i1 = defaultRoleConfig(MeterRole::PrimaryCurrent);
    v1.configureCommands.clear();
    i1.configureCommands.clear();
    mains->setRoles({v1, i1});
    sweep.rig->addInstrument(mains);
    sweep.rig->connectAll();
    ASSERT_TRUE(waitUntil([&] { return sweep.rig->isReady(); }));
    ASSERT_TRUE(sweep.run());
    EXPECT_EQ(*sweep.outcome, SweepOutcome::Completed);
    ASSERT_EQ(sweep.recorded.size(), sweep.plan.steps.size());
    // 230 V supply; the last step draws about the plan's primary current (0.287 A).
    EXPECT_NE(sweep.recorded.back().rawText.find("; V1: 2.30"), std::string::npos) << sweep.recorded.back().rawText;
    EXPECT_NE(sweep.recorded.back().rawText.find("; I1: 2.8"), std::string::npos) << sweep.recorded.back().rawText;
}

TEST(SweepController, ACleanSweepOfAUnitBuiltToItsNameplateKeepsItsFullLoadPointWhateverTheSeed)
{
    // Reproducer (issue 13): with the hard stop exactly at rated VA (overload_factor 1.0, as the
    // default once was) and a top step at rated load, a clean simulated sweep of the 60 VA demo
    // unit tripped "output 60.1 VA above the limit of 60 VA" at its last step for many seeds,
    // losing the full-load point. The default now leaves 10 % above the top step (DESIGN.md).
    sagline::Setup setup = demoSetup();
    setup.bench.overloadFactor = sagline::Setup{}.bench.overloadFactor;
    setup.bench.topFraction = 1.0;
    const auto sweepWith = [](const sagline::Setup &s, std::uint64_t seed) {
        VirtualSweep sweep(s, [seed](VirtualBenchOptions &o) {
            o.seed = seed;
            o.transformer.thermalResistanceKPerW = 0.0;
        });
        const bool ended = sweep.run(30000);
        return std::tuple{ended, sweep.outcome, sweep.recorded.size(), sweep.plan.steps.size()};
    };
    for (std::uint64_t seed = 1; seed <= 12; ++seed) {
        SCOPED_TRACE(seed);
        const auto [ended, outcome, recorded, planned] = sweepWith(setup, seed);
        ASSERT_TRUE(ended);
        EXPECT_EQ(outcome, SweepOutcome::Completed);
        EXPECT_EQ(recorded, planned);
    }
    // The same unit with the stop on the limit itself trips for some of these seeds: the margin
    // is what keeps the full-load point, not luck.
    setup.bench.overloadFactor = 1.0;
    int tripped = 0;
    for (std::uint64_t seed = 1; seed <= 12; ++seed) {
        const auto [ended, outcome, recorded, planned] = sweepWith(setup, seed);
        ASSERT_TRUE(ended);
        tripped += outcome == SweepOutcome::SafetyStop ? 1 : 0;
    }
    EXPECT_GT(tripped, 0);
}
