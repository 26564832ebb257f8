// The demo sweeps on the virtual bench, run through the sweep controller in simulated time
// without a window, against the outlier screen (core/OutlierScreen.h: Bonferroni-bounded test of
// externally studentized residuals, Cook and Weisberg 1982 §2.2, from memory). The screen is
// designed to flag one or more points of a clean sweep with a chance of 5 % per sweep (the family
// level), so:
// - the sweeps Sagline ships as demos (the window's virtual bench, seed 2026, 1.2 s dwell; and
//   `sagline-cli run --sim --sim-primary-meter`, seed 1) are not flagged, fitted as read or
//   referred to the rated supply;
// - seed 1 with a supply that sags 1 % is one of the clean sweeps in twenty the screen flags: its
//   first loaded step reads about two standard deviations of the voltmeter's noise low while the
//   other eight sit unusually close to the line, so the studentized residual (scatter from the
//   others) passes the critical value. Nothing at light load, in the magnetizing current or in the
//   referral puts it there: over 2000 seeds that step is flagged as often as any other;
// - over 400 seeds of the demo scenario (1 % supply sag, the setup's 5 s dwell, copper heating,
//   leakage reactance, magnetizing and core-loss current all on) the share of flagged sweeps stays
//   within the binomial spread of the 5 % family level: the simulator's physics adds no false
//   alarms of its own (measured 91 of 2000 with it all, 96 of 2000 with heating, leakage and
//   ammeter noise off: the same rate).
#include "InstrumentsTestSupport.h"

#include "FitSummary.h"
#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "LinkAddress.h"
#include "SupplyReferral.h"
#include "SweepController.h"
#include "VirtualBench.h"

#include <QDateTime>

#include <cmath>
#include <memory>

using namespace sagline;
using namespace sagline::test;

namespace {

struct DemoRun {
    std::uint64_t seed = 1;
    double supplyRegulationPercent = 0.0; // as `run --sim-supply-regulation`
    bool windowDwell = false;             // ui/SweepRun.cpp's 1.2 s dwell and 0.2 s reads, else the setup's
};

std::vector<Reading> demoSweep(const DemoRun &run)
{
    const sagline::Setup setup = demoSetup();
    const Plan plan = planFor(setup);
    VirtualClock clock(QDateTime(QDate(2026, 12, 2), QTime(9, 0), Qt::UTC).toMSecsSinceEpoch());
    VirtualBenchOptions benchOptions = virtualBenchOptionsFor(setup, plan, run.seed);
    // As RunCommand sets the supply's own resistance for a regulation in % of rated.
    benchOptions.transformer.supplyResistanceOhm =
        run.supplyRegulationPercent / 100.0 * setup.nameplate.primaryVoltageV / plan.ratedPrimaryCurrentA;
    VirtualBench bench(benchOptions, &clock);
    std::unique_ptr<InstrumentRig> rig(makeVirtualBenchRig(&bench, false, nullptr, true));
    for (ScpiInstrument *instrument : rig->instruments())
        instrument->setReconnectIntervalMs(50);
    rig->connectAll();
    EXPECT_TRUE(waitUntil([&] { return rig->isReady(); }));
    SweepOptions options = sweepOptionsFor(setup, plan);
    options.simulated = true;
    if (run.windowDwell) {
        options.dwellMs = std::min<std::int64_t>(options.dwellMs, 1200);
        options.readIntervalMs = std::min<std::int64_t>(options.readIntervalMs, 200);
    }
    MemorySink sink;
    LineFitLiveFit liveFit;
    SweepController controller(plan, options, rig.get(), &sink, &liveFit, &clock);
    std::optional<SweepOutcome> outcome;
    QObject::connect(&controller, &SweepController::finished, [&](SweepOutcome o) { outcome = o; });
    clock.setAutoAdvance(true);
    controller.start();
    EXPECT_TRUE(waitUntil([&] { return outcome.has_value(); }, 20000));
    clock.setAutoAdvance(false);
    EXPECT_EQ(outcome, SweepOutcome::Completed);
    return sink.readings;
}

// The fits every output makes of a session's readings: referred (the default, with the meters'
// resolution) and as read (the window's live batch fit, without it).
struct DemoFits {
    FitSummary referred;
    FitSummary raw;
};

DemoFits fitsOf(const std::vector<Reading> &readings)
{
    const sagline::Setup setup = demoSetup();
    return {fitReadings(referToRatedSupply(readings, setup.nameplate.primaryVoltageV), FitMethod::Ols,
                        fitOptionsFor(setup.meters)),
            fitReadings(readings, FitMethod::Ols)};
}

} // namespace

TEST(DemoSweepOutliers, ShippedDemoSweepsAreNotFlagged)
{
    const std::size_t steps = planFor(demoSetup()).steps.size();
    for (const DemoRun &run : {DemoRun{2026, 0.0, true}, DemoRun{1, 0.0, false}}) {
        SCOPED_TRACE("seed " + std::to_string(run.seed) + ", supply sag " + std::to_string(run.supplyRegulationPercent) + " %");
        const std::vector<Reading> readings = demoSweep(run);
        ASSERT_EQ(readings.size(), steps);
        const DemoFits fits = fitsOf(readings);
        for (const FitSummary *fit : {&fits.referred, &fits.raw}) {
            ASSERT_TRUE(fit->ok()) << fit->message;
            ASSERT_TRUE(fit->outlierScreening.screened);
            EXPECT_TRUE(fit->outlierRows.empty()) << "row " << fit->outlierRows.front() << " flagged";
        }
    }
}

TEST(DemoSweepOutliers, FalseAlarmRateStaysAtTheFamilyLevel)
{
    constexpr int sweeps = 400;
    int flaggedReferred = 0, flaggedRaw = 0;
    for (int seed = 1000; seed < 1000 + sweeps; ++seed) {
        const DemoFits fits = fitsOf(demoSweep({static_cast<std::uint64_t>(seed), 1.0, false}));
        ASSERT_TRUE(fits.referred.ok() && fits.raw.ok());
        flaggedReferred += fits.referred.outlierRows.empty() ? 0 : 1;
        flaggedRaw += fits.raw.outlierRows.empty() ? 0 : 1;
    }
    // 5 % of 400 is 20, binomial SD 4.4: above 32 (+2.7 SD) the simulator would be adding false
    // alarms. Deterministic (seeded, simulated time), so no flake.
    EXPECT_LE(flaggedReferred, 32);
    EXPECT_LE(flaggedRaw, 32);
    // And the screen is alive: a clean 5 % screen flags some of 400 sweeps.
    EXPECT_GE(flaggedReferred, 5);
    RecordProperty("flagged_referred", flaggedReferred);
    RecordProperty("flagged_raw", flaggedRaw);
}
TEST(DemoSweepOutliers, TheFlagOfSeedOneWithASaggingSupplyIsAnOrdinaryNoiseDraw)
{
    const DemoFits fits = fitsOf(demoSweep({1, 1.0, false}));
    ASSERT_EQ(fits.referred.outlierRows, std::vector<std::size_t>{1});
    // The voltmeter's noise on the virtual bench: σ = one count plus the count's rounding.
    const VirtualBenchOptions bench = virtualBenchOptionsFor(demoSetup(), planFor(demoSetup()), 1);
    const double noiseV = std::hypot(bench.voltmeter.noiseSd, bench.voltmeter.resolution / std::sqrt(12.0));
    const double residual = fits.referred.points[1].residualV;
    EXPECT_LT(std::abs(residual), 2.5 * noiseV) << residual;
    // The others' scatter is what is small: about half the meter's noise.
    double squares = 0.0;
    for (std::size_t k = 0; k < fits.referred.points.size(); ++k)
        if (k != 1)
            squares += fits.referred.points[k].residualV * fits.referred.points[k].residualV;
    EXPECT_LT(std::sqrt(squares / 6.0), 0.75 * noiseV);
}
