// The uncertainty budgets checked by Monte Carlo (JCGM 101:2008, GUM Supplement 1): the same
// measurement model sampled many times with a fixed seed. The analytic standard uncertainty u
// and the 95 % coverage interval U must agree with the sampled ones within 5 % (JCGM 101 §8
// compares the two the same way) for R, V0, regulation and R at the reference temperature, on
// the demo sweep and on a sweep of our own. The model is written out in the test, apart from
// the fit: each draw takes the meters' gains and offsets (rectangular, common to every reading),
// the readings' random error (normal with σ = s for u; σ² = s²ν/χ²_ν for U, JCGM 101 6.4.9)
// and the winding temperature (normal), and fits the simulated readings by ordinary least
// squares. scripts/budget-monte-carlo-check.py does the same with NumPy (10⁶ draws); its values
// are pinned below as an independent second check.
//
// Draws: 200 000 per run, or SAGLINE_MC_DRAWS (the asan-ubsan preset may use fewer; at 20 000
// the sampling error of u is about 0.5 % and of U about 1 %, well inside 5 %).
#include "ConformityAssessment.h"
#include "CsvReadings.h"
#include "FitSummary.h"
#include "SetupJson.h"

#include <gtest/gtest.h>

#include "MonteCarloSampling.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <random>
#include <string>
#include <vector>

using namespace sagline;

namespace {

struct Sweep {
    std::vector<Reading> readings;
    sagline::Setup setup;
    double windingC = 0.0;
    double referenceC = 75.0;
};

Sweep loadSweep(const std::string &csv, const std::string &setup, double windingC)
{
    Sweep sweep;
    const ReadingsCsvParse parsed = loadReadingsCsv(std::string(SAGLINE_SOURCE_DIR) + "/" + csv);
    EXPECT_TRUE(parsed.ok()) << csv;
    sweep.readings = parsed.readings;
    const SetupParse read = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/" + setup);
    EXPECT_TRUE(read.setup.has_value()) << (read.errors.empty() ? setup : read.errors.front().message());
    if (read.setup)
        sweep.setup = *read.setup;
    sweep.windingC = windingC;
    return sweep;
}

struct Results {
    montecarlo::Sampled r, v0, regulation, rReference;
};

// One Monte Carlo run of the model around the fitted line (v0, r). tCharacter: the random
// error's variance is itself uncertain (ν = n - 2), as in a Type A evaluation.
Results sample(const Sweep &sweep, double v0, double r, double s, bool tCharacter, std::uint64_t seed)
{
    const MeterSpecs &m = *sweep.setup.meters;
    const double gainV = m.voltmeter.gainPercentOfReading / 100.0, offsetV = m.voltmeter.offset;
    const double gainI = m.ammeter.gainPercentOfReading / 100.0, offsetI = m.ammeter.offset;
    const double uT = m.windingTemperatureUncertaintyC.value_or(2.0);
    const double rated = sweep.setup.nameplate.ratedPowerVa / sweep.setup.nameplate.secondaryVoltageV;
    const double tk = 234.5; // copper, IEEE C57.12.90
    std::vector<double> current;
    for (const Reading &reading : sweep.readings)
        current.push_back(reading.currentA);
    const std::size_t n = current.size();
    const std::size_t count = montecarlo::draws();
    std::mt19937_64 random(seed);
    std::uniform_real_distribution<double> unit(-1.0, 1.0);
    std::normal_distribution<double> normal(0.0, 1.0);
    std::chi_squared_distribution<double> chi(static_cast<double>(n - 2));
    std::vector<double> rs(count), v0s(count), regs(count), refs(count);
    std::vector<double> i(n), v(n);
    for (std::size_t d = 0; d < count; ++d) {
        const double gV = gainV * unit(random), oV = offsetV * unit(random);
        const double gI = gainI * unit(random), oI = offsetI * unit(random);
        const double sigma = tCharacter ? s * std::sqrt(static_cast<double>(n - 2) / chi(random)) : s;
        for (std::size_t k = 0; k < n; ++k) {
            i[k] = (1.0 + gI) * current[k] + oI;
            v[k] = (1.0 + gV) * (v0 - r * current[k]) + oV + sigma * normal(random);
        }
        const montecarlo::DrawnLine line = montecarlo::fitDrawnLine(i, v);
        rs[d] = line.r;
        v0s[d] = line.v0;
        regs[d] = 100.0 * rs[d] * rated / (line.v0 - rs[d] * rated);
        refs[d] = rs[d] * (tk + sweep.referenceC) / (tk + sweep.windingC + uT * normal(random));
    }
    return {montecarlo::summarize(rs), montecarlo::summarize(v0s), montecarlo::summarize(regs), montecarlo::summarize(refs)};
}

struct Analytic {
    const UncertainValue *r, *v0, *regulation, *rReference;
};

void expectWithin(double analytic, double sampled, double tolerance, const std::string &what)
{
    EXPECT_NEAR(analytic / sampled, 1.0, tolerance) << what << ": analytic " << analytic << ", sampled " << sampled;
}

// Checks u and U of each result against one sampled run each; returns the analysis for pins.
AnalysisResult checkSweep(const Sweep &sweep, const std::string &name)
{
    const FitSummary fit = fitReadings(sweep.readings, FitMethod::Ols, fitOptionsFor(sweep.setup.meters));
    EXPECT_TRUE(fit.ok()) << fit.message;
    AssessmentOptions options;
    options.windingTemperatureC = sweep.windingC;
    options.referenceTemperatureC = sweep.referenceC;
    const Assessment assessment = assessFit(fit, sweep.setup, options);
    const AnalysisResult &a = assessment.analysis;
    EXPECT_TRUE(a.ok());
    EXPECT_TRUE(a.metersKnown);
    const Results spread = sample(sweep, fit.intercept, -fit.slope, *fit.residualSdV, false, 20261212);
    const Results coverage = sample(sweep, fit.intercept, -fit.slope, *fit.residualSdV, true, 20261213);
    const std::pair<const UncertainValue *, std::pair<montecarlo::Sampled, montecarlo::Sampled>> checks[] = {
        {&a.seriesResistanceOhm, {spread.r, coverage.r}},
        {&a.noLoadVoltageV, {spread.v0, coverage.v0}},
        {&a.regulationPercent, {spread.regulation, coverage.regulation}},
        {&*a.referenceResistanceOhm, {spread.rReference, coverage.rReference}},
    };
    const char *names[] = {"R", "V0", "regulation", "R at 75 °C"};
    for (std::size_t k = 0; k < std::size(checks); ++k) {
        const UncertainValue &value = *checks[k].first;
        expectWithin(*value.standardUncertainty, checks[k].second.first.u, 0.05, name + " " + names[k] + " u");
        expectWithin(*value.expandedUncertainty, checks[k].second.second.halfWidth, 0.05,
                     name + " " + names[k] + " U95");
    }
    return a;
}

} // namespace

TEST(MonteCarloBudget, DemoSweepAgreesWithSampling)
{
    const Sweep demo = loadSweep("resources/demo-readings.csv", "resources/demo-setup.json", 23.0);
    ASSERT_TRUE(demo.setup.meters);
    const AnalysisResult a = checkSweep(demo, "demo");
    // NumPy, 10⁶ draws (scripts/budget-monte-carlo-check.py): u and U95 of R, V0, regulation
    // and R at 75 °C.
    expectWithin(*a.seriesResistanceOhm.standardUncertainty, 0.00285052, 0.05, "R u vs numpy");
    expectWithin(*a.seriesResistanceOhm.expandedUncertainty, 0.00536013, 0.05, "R U95 vs numpy");
    expectWithin(*a.noLoadVoltageV.standardUncertainty, 0.056463, 0.05, "V0 u vs numpy");
    expectWithin(*a.noLoadVoltageV.expandedUncertainty, 0.0928909, 0.05, "V0 U95 vs numpy");
    expectWithin(*a.regulationPercent.standardUncertainty, 0.0508148, 0.05, "regulation u vs numpy");
    expectWithin(*a.regulationPercent.expandedUncertainty, 0.0901572, 0.05, "regulation U95 vs numpy");
    expectWithin(*a.referenceResistanceOhm->standardUncertainty, 0.00452877, 0.05, "R at 75 °C u vs numpy");
    expectWithin(*a.referenceResistanceOhm->expandedUncertainty, 0.00883189, 0.05, "R at 75 °C U95 vs numpy");
    // The meters' gain dominates V0: the interval is that of a near-rectangular distribution,
    // well below 1.96 u, which is why k comes from the components' distribution.
    EXPECT_LT(*a.noLoadVoltageV.coverageFactor, 1.75);
}

TEST(MonteCarloBudget, OwnSweepAgreesWithSampling)
{
    // Six readings of a 25 VA unit (tests/data/own-sweep-25va*.{csv,json}, a scenario of our
    // own), a coarse 10 mV voltmeter: the scatter (ν = 4) dominates R and regulation, the
    // voltmeter's gain and offset dominate V0.
    const Sweep own = loadSweep("tests/data/own-sweep-25va.csv", "tests/data/own-sweep-25va-setup.json", 31.0);
    ASSERT_TRUE(own.setup.meters);
    const AnalysisResult a = checkSweep(own, "own");
    expectWithin(*a.seriesResistanceOhm.standardUncertainty, 0.00540338, 0.05, "R u vs numpy");
    expectWithin(*a.seriesResistanceOhm.expandedUncertainty, 0.0143814, 0.05, "R U95 vs numpy");
    expectWithin(*a.noLoadVoltageV.standardUncertainty, 0.0266018, 0.05, "V0 u vs numpy");
    expectWithin(*a.noLoadVoltageV.expandedUncertainty, 0.0504622, 0.05, "V0 U95 vs numpy");
    expectWithin(*a.regulationPercent.standardUncertainty, 0.0975957, 0.05, "regulation u vs numpy");
    expectWithin(*a.regulationPercent.expandedUncertainty, 0.261104, 0.05, "regulation U95 vs numpy");
    expectWithin(*a.referenceResistanceOhm->standardUncertainty, 0.00831881, 0.05, "R at 75 °C u vs numpy");
    expectWithin(*a.referenceResistanceOhm->expandedUncertainty, 0.0196963, 0.05, "R at 75 °C U95 vs numpy");
    // Type A dominated: k close to t95(ν_eff) of GUM G.4 (ν_eff about 5.5 for R).
    EXPECT_GT(*a.seriesResistanceOhm.coverageFactor, 2.4);
}

TEST(MonteCarloBudget, VoltmeterGainCancelsInRegulation)
{
    // Regulation 100·R·I/(V0 - R·I) depends on R/V0 only, and a voltmeter gain scales both: its
    // sensitivity is zero, not a contribution counted once per reading (GUM 5.2, correlated inputs).
    const Sweep demo = loadSweep("resources/demo-readings.csv", "resources/demo-setup.json", 23.0);
    const FitSummary fit = fitReadings(demo.readings, FitMethod::Ols, fitOptionsFor(demo.setup.meters));
    const Assessment assessment = assessFit(fit, demo.setup, {});
    bool found = false;
    for (const BudgetComponent &c : assessment.analysis.regulationPercent.budget) {
        if (c.source.rfind("voltmeter gain", 0) == 0) {
            found = true;
            EXPECT_EQ(c.sensitivity, 0.0);
            EXPECT_EQ(c.contribution, 0.0);
        }
    }
    EXPECT_TRUE(found);
    for (const BudgetComponent &c : assessment.analysis.noLoadVoltageV.budget) {
        if (c.source.rfind("voltmeter gain", 0) == 0) {
            EXPECT_GT(c.contribution, 0.04); // 19.55 V × 0.5 %/sqrt(3) = 56 mV in V0
        }
    }
}
