// A whole sweep on the virtual bench with its primary analyser, in simulated time: the readings
// carry the primary side, and the analysis gives back the simulator's own P0, R, X and
// efficiency within their expanded uncertainties; the losses add up (P1 = P2 + losses).
#include "InstrumentsTestSupport.h"

#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "LinkAddress.h"
#include "PrimarySideAnalysis.h"
#include "SupplyReferral.h"
#include "SweepController.h"
#include "TransformerFormulas.h"
#include "VirtualBench.h"

#include <QDateTime>

#include <cmath>
#include <memory>

using namespace sagline;
using namespace sagline::test;

namespace {

// |measured - truth| within the expanded uncertainty (95 %), with its numbers on failure.
void expectWithinU(const std::optional<UncertainValue> &measured, double truth, const char *what)
{
    ASSERT_TRUE(measured) << what;
    ASSERT_TRUE(measured->expandedUncertainty) << what;
    EXPECT_LE(std::abs(measured->value - truth), *measured->expandedUncertainty)
        << what << ": " << measured->value << " ± " << *measured->expandedUncertainty << " against " << truth;
}

} // namespace

TEST(PrimarySideSweep, SimulatedSweepGivesBackTheSimulatorsParameters)
{
    const sagline::Setup setup = demoSetup();
    const Plan plan = planFor(setup);
    VirtualClock clock(QDateTime(QDate(2026, 12, 2), QTime(9, 0), Qt::UTC).toMSecsSinceEpoch());
    VirtualBenchOptions options = virtualBenchOptionsFor(setup, plan, 11);
    options.transformer.thermalResistanceKPerW = 0.0; // no copper heating: R stays at its 20 °C value
    // A supply that sags 1 % at rated primary current: the referral must take it out of R.
    options.transformer.supplyResistanceOhm = 0.01 * setup.nameplate.primaryVoltageV / plan.ratedPrimaryCurrentA;
    VirtualBench bench(options, &clock);
    std::unique_ptr<InstrumentRig> rig(makeVirtualBenchRig(&bench, false, nullptr, true));
    for (ScpiInstrument *instrument : rig->instruments())
        instrument->setReconnectIntervalMs(50);
    rig->connectAll();
    ASSERT_TRUE(waitUntil([&] { return rig->isReady(); }));

    SweepOptions sweepOptions = sweepOptionsFor(setup, plan);
    sweepOptions.simulated = true;
    MemorySink sink;
    LineFitLiveFit liveFit;
    SweepController controller(plan, sweepOptions, rig.get(), &sink, &liveFit, &clock);
    std::optional<SweepOutcome> outcome;
    QObject::connect(&controller, &SweepController::finished, [&](SweepOutcome o) { outcome = o; });
    clock.setAutoAdvance(true);
    controller.start();
    ASSERT_TRUE(waitUntil([&] { return outcome.has_value(); }, 20000));
    clock.setAutoAdvance(false);
    ASSERT_EQ(*outcome, SweepOutcome::Completed);
    const std::vector<Reading> &readings = sink.readings;
    ASSERT_EQ(readings.size(), plan.steps.size());
    for (const Reading &r : readings) {
        ASSERT_TRUE(r.primary.voltageV && r.primary.currentA && r.primary.powerW && r.primary.reactivePowerVar);
        EXPECT_TRUE(r.primary.uPowerW && *r.primary.uPowerW > 0.0);
        EXPECT_NE(r.rawText.find("P1: "), std::string::npos) << r.rawText;
    }

    // The analysis as a session gets it: the meters' rules, the fit on the referred readings.
    sagline::Setup recorded = setup;
    recorded.meters = rig->meterSpecs(std::nullopt);
    // The primary analyser's accuracy rules become the setup's primary meters, as the secondary
    // pair's do (gain = % of reading, offset = counts × resolution).
    ASSERT_TRUE(recorded.meters && recorded.meters->primaryVoltmeter && recorded.meters->primaryAmmeter
                && recorded.meters->powerMeter);
    const RoleConfig *powerRole = rig->roleConfig(MeterRole::PrimaryPower);
    ASSERT_NE(powerRole, nullptr);
    EXPECT_DOUBLE_EQ(recorded.meters->powerMeter->gainPercentOfReading, powerRole->accuracy.percentOfReading);
    EXPECT_DOUBLE_EQ(recorded.meters->powerMeter->offset, powerRole->accuracy.counts * powerRole->resolution);
    EXPECT_DOUBLE_EQ(recorded.meters->powerMeter->resolution, powerRole->resolution);
    const AnalysisInput analysisInput = analysisInputFor(recorded);
    SupplyAssessment supply = assessSupply(readings, setup.nameplate.primaryVoltageV, FitVoltages::Referred,
                                           defaultSupplyDriftTolerancePercent, primaryVoltmeterOf(recorded.meters));
    EXPECT_EQ(supply.fitVoltages, FitVoltages::Referred);
    EXPECT_TRUE(supply.referralGainFromSetup);
    const FitSummary fit = fitReadings(referToRatedSupply(readings, setup.nameplate.primaryVoltageV), FitMethod::Ols,
                                       fitOptionsFor(recorded.meters));
    ASSERT_TRUE(fit.ok()) << fit.message;
    AnalysisInput referredInput = analysisInput;
    referredInput.referralGainUPercent = supply.referralGainUPercent;
    const AnalysisResult analysis = analyseFit(fit, referredInput);
    ASSERT_TRUE(analysis.ok());
    const PrimarySideResult primary = analysePrimarySide(readings, &fit, &referredInput, primarySideInputFor(setup.nameplate));
    ASSERT_TRUE(primary.errors.empty());

    const TransformerParameters &t = options.transformer;
    expectWithinU(analysis.seriesResistanceOhm, t.seriesResistanceOhm, "R");
    ASSERT_TRUE(primary.openCircuit);
    expectWithinU(primary.openCircuit->noLoadLossW, t.coreLossW, "P0");
    expectWithinU(primary.seriesReactanceOhm, t.leakageReactanceOhm, "X");
    EXPECT_TRUE(primary.seriesReactanceResolved);
    const double ratedI2 = plan.ratedSecondaryCurrentA;
    expectWithinU(primary.efficiencyAtRatedPercent,
                  100.0 * formulas::modelEfficiency(t.noLoadVoltageV(), t.seriesResistanceOhm, t.coreLossW, ratedI2),
                  "efficiency at rated");
    expectWithinU(primary.maxEfficiencyCurrentA, formulas::maxEfficiencyCurrent(t.coreLossW, t.seriesResistanceOhm),
                  "peak-efficiency current");
    // The energy balance on the simulator's data: P1 = P2 + core + copper within U at every step.
    ASSERT_EQ(primary.steps.size(), plan.steps.size() - 1);
    for (const StepLosses &s : primary.steps) {
        ASSERT_TRUE(s.remainderW && s.remainderW->expandedUncertainty);
        EXPECT_LE(std::abs(s.remainderW->value), *s.remainderW->expandedUncertainty)
            << "reading " << s.readingId << ": " << s.remainderW->value << " W";
        EXPECT_GT(s.efficiencyPercent.value, 50.0);
        EXPECT_LT(s.efficiencyPercent.value, 100.0);
    }
}
