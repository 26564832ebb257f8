// The setup's primary meters (`meters.primary_voltmeter`, `power_meter`) in the primary side's
// budgets, checked by Monte Carlo (JCGM 101:2008, GUM Supplement 1) against the analytic budget
// (JCGM 100:2008, the law of propagation), within the 5 % the other budget tests use.
//
// A meter's gain is one error common to every reading it takes (GUM 5.2): in a result that uses
// several of its readings (the loss remainder: P1 at the step and P0 at no load; the efficiency
// at rated load: V0 through the referral and P0 referred to the rated V1) its parts add before
// they are squared. Offset and resolution are drawn per reading. The scenario is our own: the
// demo unit's line (resources/demo-readings.csv: currents, and V0 - R·I as the exact secondary
// readings, so the secondary meters add nothing), on a stiff 230 V supply, a no-load loss of
// 4 W (about 7 % of 60 VA; common practice is 3-5 % for small laminated units) and
// P1 = V2·I2 + P0 + R·I2² at every step (the energy balance), read by a primary voltmeter of
// ±0.5 % of reading ± 0.01 V, 10 mV counts, and a power meter of ±0.5 % ± 0.03 W, 10 mW counts.
//
// Not in the analytic budget: the primary voltmeter's offset and resolution per reading, through
// the referral they scatter the referred points (in a real sweep that is inside the fit's scatter;
// here the nominal readings lie exactly on the line). With these meters their share is below 1 %
// of every u checked (0.2 mΩ in R, 0.003 % in the efficiency at rated, in quadrature); with a
// ±0.05 V offset it would be 9 % of the efficiency at rated, and this check would say so.
#include "CsvReadings.h"
#include "FitSummary.h"
#include "MonteCarloSampling.h"
#include "PrimarySideAnalysis.h"
#include "SetupJson.h"
#include "SupplyReferral.h"
#include "TransformerFormulas.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <string>
#include <vector>

using namespace sagline;
using namespace sagline::montecarlo;

namespace {

constexpr double ratedV1 = 230.0;
constexpr double noLoadLossW = 4.0;

struct Scenario {
    Setup setup;
    std::vector<double> currents, voltages, inputPowers; // the truth at each reading
    std::vector<Reading> readings;                         // as read, nominally (no meter error)
    double v0 = 0.0, r = 0.0;
};

Scenario makeScenario()
{
    Scenario sc;
    const SetupParse setup = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    EXPECT_TRUE(setup.setup && setup.setup->meters);
    sc.setup = *setup.setup;
    MeterSpecs &m = *sc.setup.meters;
    m.voltmeter = {};
    m.ammeter = {};
    m.primaryVoltmeter = MeterSpec{0.5, 0.01, 0.01};
    m.powerMeter = MeterSpec{0.5, 0.03, 0.01};
    const ReadingsCsvParse csv = loadReadingsCsv(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-readings.csv");
    EXPECT_TRUE(csv.ok());
    const FitSummary demo = fitReadings(csv.readings, FitMethod::Ols);
    sc.v0 = demo.intercept;
    sc.r = -demo.slope;
    int step = 0;
    for (const Reading &source : csv.readings) {
        const double i = source.currentA, v = sc.v0 - sc.r * i;
        Reading reading;
        reading.id = step + 1;
        reading.step = step++;
        reading.currentA = i;
        reading.voltageV = v;
        reading.primary.voltageV = ratedV1;
        reading.primary.powerW = v * i + noLoadLossW + sc.r * i * i;
        sc.currents.push_back(i);
        sc.voltages.push_back(v);
        sc.inputPowers.push_back(*reading.primary.powerW);
        sc.readings.push_back(reading);
    }
    return sc;
}

struct Analysed {
    SupplyAssessment supply;
    FitSummary fit;
    PrimarySideResult primary;
};

Analysed analyse(const Scenario &sc)
{
    Analysed out;
    out.supply = assessSupply(sc.readings, ratedV1, FitVoltages::Referred, defaultSupplyDriftTolerancePercent,
                              primaryVoltmeterOf(sc.setup.meters));
    out.fit = fitReadings(referToRatedSupply(sc.readings, ratedV1), FitMethod::Ols, fitOptionsFor(sc.setup.meters));
    AnalysisInput input = analysisInputFor(sc.setup);
    input.referralGainUPercent = out.supply.referralGainUPercent;
    out.primary = analysePrimarySide(sc.readings, &out.fit, &input, primarySideInputFor(sc.setup.nameplate));
    return out;
}

struct Results {
    Sampled noLoadLoss, efficiencyAtTop, remainderAtTop, efficiencyAtRated;
};

// The measurement model, sampled: V1' = (1 + γ1)V1 + o1 + ρ1 and P1' = (1 + γP)P1 + oP + ρP per
// reading (γ common, o and ρ drawn per reading, all rectangular), the secondary readings exact;
// then the same chain the product computes (referral, OLS fit, P0 referred to rated V1).
Results sample(const Scenario &sc, std::uint64_t seed)
{
    const MeterSpec &vm = *sc.setup.meters->primaryVoltmeter;
    const MeterSpec &pm = *sc.setup.meters->powerMeter;
    const double ratedI = sc.setup.nameplate.ratedPowerVa / sc.setup.nameplate.secondaryVoltageV;
    const std::size_t n = sc.currents.size(), top = n - 1;
    const std::size_t count = draws();
    std::mt19937_64 random(seed);
    std::uniform_real_distribution<double> unit(-1.0, 1.0);
    std::vector<double> p0s(count), etaTops(count), remainders(count), etaRated(count), v1(n), p1(n), i(n), v(n);
    for (std::size_t d = 0; d < count; ++d) {
        const double g1 = vm.gainPercentOfReading / 100.0 * unit(random);
        const double gP = pm.gainPercentOfReading / 100.0 * unit(random);
        for (std::size_t k = 0; k < n; ++k) {
            v1[k] = (1.0 + g1) * ratedV1 + vm.offset * unit(random) + vm.resolution / 2.0 * unit(random);
            p1[k] = (1.0 + gP) * sc.inputPowers[k] + pm.offset * unit(random) + pm.resolution / 2.0 * unit(random);
            const double refer = ratedV1 / v1[k];
            i[k] = sc.currents[k] * refer;
            v[k] = sc.voltages[k] * refer;
        }
        const DrawnLine line = fitDrawnLine(i, v);
        const double r = line.r, v0 = line.v0;
        const double p0 = p1[0] * std::pow(ratedV1 / v1[0], 2);
        p0s[d] = p0;
        const double p2 = sc.voltages[top] * sc.currents[top];
        etaTops[d] = 100.0 * p2 / p1[top];
        remainders[d] = p1[top] - p2 - p1[0] * std::pow(v1[top] / v1[0], 2) - r * sc.currents[top] * sc.currents[top];
        etaRated[d] = 100.0 * formulas::modelEfficiency(v0, r, p0, ratedI);
    }
    return {summarize(p0s), summarize(etaTops), summarize(remainders), summarize(etaRated)};
}

std::vector<const BudgetComponent *> linesStartingWith(const UncertainValue &value, const std::string &start)
{
    std::vector<const BudgetComponent *> lines;
    for (const BudgetComponent &c : value.budget)
        if (c.source.rfind(start, 0) == 0)
            lines.push_back(&c);
    return lines;
}

} // namespace

TEST(PrimaryMeterBudget, EachMetersGainIsOneCommonLine)
{
    const Scenario sc = makeScenario();
    const Analysed a = analyse(sc);
    ASSERT_TRUE(a.fit.ok());
    ASSERT_TRUE(a.supply.referralGainFromSetup);
    EXPECT_NEAR(*a.supply.referralGainUPercent, 0.5 / std::sqrt(3.0), 1e-12);
    ASSERT_TRUE(a.primary.openCircuit && a.primary.openCircuit->noLoadLossW);
    const UncertainValue &p0 = *a.primary.openCircuit->noLoadLossW;
    const double p0Read = sc.inputPowers.front(); // P1 at step 0 (0.001 A drawn: 4.02 W)
    EXPECT_NEAR(p0.value, p0Read, 1e-9);
    // P0 referred = P0'·(V1,rated/V1')²: ∂/∂γP = P0/100 and ∂/∂γ1 = -2·P0/100 per %.
    const auto power = linesStartingWith(p0, "power meter gain");
    const auto volt = linesStartingWith(p0, "primary voltmeter gain");
    ASSERT_EQ(power.size(), 1u);
    ASSERT_EQ(volt.size(), 1u);
    EXPECT_NEAR(power[0]->sensitivity, p0Read / 100.0, 1e-12);
    EXPECT_NEAR(volt[0]->sensitivity, -2.0 * p0Read / 100.0, 1e-12);
    EXPECT_NEAR(power[0]->standardUncertainty, 0.5 / std::sqrt(3.0), 1e-12);
    // The remainder uses the power meter twice (P1 at the step, P0 at no load): one line with
    // ∂/∂γP = (P1 - P0)/100, not two.
    ASSERT_FALSE(a.primary.steps.empty());
    const StepLosses &top = a.primary.steps.back();
    ASSERT_TRUE(top.remainderW);
    const auto remainderPower = linesStartingWith(*top.remainderW, "power meter gain");
    ASSERT_EQ(remainderPower.size(), 1u);
    EXPECT_NEAR(remainderPower[0]->sensitivity, (sc.inputPowers.back() - p0Read) / 100.0, 1e-9);
    // Efficiency at rated: V0 through the referral and P0 referred to rated V1 move with the same
    // γ1, so the FitBudget's line and the primary side's merge into one.
    ASSERT_TRUE(a.primary.efficiencyAtRatedPercent);
    EXPECT_EQ(linesStartingWith(*a.primary.efficiencyAtRatedPercent, "primary voltmeter gain").size(), 1u);
    EXPECT_EQ(linesStartingWith(*a.primary.efficiencyAtRatedPercent, "power meter gain").size(), 1u);
    // The per-reading terms keep their own lines.
    EXPECT_EQ(linesStartingWith(p0, "primary power meter, offset").size(), 1u);
    EXPECT_EQ(linesStartingWith(p0, "primary power meter, resolution").size(), 1u);
}

TEST(PrimaryMeterBudget, WithoutTheSetupsMetersTheReadingsStatedUncertaintyIsUsed)
{
    Scenario sc = makeScenario();
    sc.setup.meters->primaryVoltmeter.reset();
    sc.setup.meters->powerMeter.reset();
    for (Reading &reading : sc.readings)
        reading.primary.uPowerW = 0.1;
    const Analysed a = analyse(sc);
    ASSERT_TRUE(a.primary.openCircuit && a.primary.openCircuit->noLoadLossW);
    const UncertainValue &p0 = *a.primary.openCircuit->noLoadLossW;
    EXPECT_TRUE(linesStartingWith(p0, "power meter gain").empty());
    const auto stated = linesStartingWith(p0, "primary power meter");
    ASSERT_EQ(stated.size(), 1u);
    EXPECT_DOUBLE_EQ(stated[0]->standardUncertainty, 0.1);
}

TEST(PrimaryMeterBudget, AgreesWithMonteCarlo)
{
    const Scenario sc = makeScenario();
    const Analysed a = analyse(sc);
    ASSERT_TRUE(a.fit.ok() && a.primary.openCircuit && a.primary.openCircuit->noLoadLossW);
    ASSERT_TRUE(a.primary.efficiencyAtRatedPercent && !a.primary.steps.empty() && a.primary.steps.back().remainderW);
    const Results sampled = sample(sc, 20261203);
    const StepLosses &top = a.primary.steps.back();
    const std::pair<const UncertainValue *, Sampled> checks[] = {
        {&*a.primary.openCircuit->noLoadLossW, sampled.noLoadLoss},
        {&top.efficiencyPercent, sampled.efficiencyAtTop},
        {&*top.remainderW, sampled.remainderAtTop},
        {&*a.primary.efficiencyAtRatedPercent, sampled.efficiencyAtRated},
    };
    const char *names[] = {"P0", "efficiency at the top step", "loss remainder at the top step", "efficiency at rated"};
    for (std::size_t k = 0; k < std::size(checks); ++k) {
        const UncertainValue &value = *checks[k].first;
        ASSERT_TRUE(value.standardUncertainty && value.expandedUncertainty) << names[k];
        expectWithin(*value.standardUncertainty, checks[k].second.u, 0.05, std::string(names[k]) + " u");
        // The ratios, for the record (--gtest_output=json): analytic over sampled.
        RecordProperty(std::string(names[k]) + " u ratio", std::to_string(*value.standardUncertainty / checks[k].second.u));
        RecordProperty(std::string(names[k]) + " U95 ratio",
                       std::to_string(*value.expandedUncertainty / checks[k].second.halfWidth));
        expectWithin(*value.expandedUncertainty, checks[k].second.halfWidth, 0.05, std::string(names[k]) + " U95");
    }
    // The check can fail: the power meter's gain taken per reading (root sum of squares of its
    // parts in P1 and P0, as if independent) overstates the remainder's u beyond the tolerance.
    double independentSquares = 0.0;
    for (const BudgetComponent &c : top.remainderW->budget) {
        if (c.source.rfind("power meter gain", 0) == 0) {
            const double p1Part = sc.inputPowers.back() / 100.0 * c.standardUncertainty;
            const double p0Part = sc.inputPowers.front() / 100.0 * c.standardUncertainty;
            independentSquares += p1Part * p1Part + p0Part * p0Part;
        } else {
            independentSquares += c.contribution * c.contribution;
        }
    }
    EXPECT_GT(std::sqrt(independentSquares) / sampled.remainderAtTop.u, 1.05);
    RecordProperty("remainder u ratio with the gain per reading", std::to_string(std::sqrt(independentSquares) / sampled.remainderAtTop.u));
}
