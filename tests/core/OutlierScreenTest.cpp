// The outlier screen (core/OutlierScreen.h) through fitReadings, on simulated sweeps: how often
// it flags a point of a clean sweep (family level 5 %: Bonferroni, so at most 5 % in theory) and
// how often it finds one misread voltage. The sweeps are a scenario of our own like the demo
// unit: 19.55 V at no load, 0.42 Ω, steps up to 3.33 A, a voltmeter with 1 mV resolution and an
// ammeter with 1 mA, Gaussian repeatability, every reading rounded to the meter's last digit.
//
// A fixed seed makes each count reproducible. The acceptance band is binomial: with N sweeps the
// standard error of a 5 % rate is sqrt(0.05·0.95/N), and a rate is accepted up to 5 % + 3 standard
// errors (N = 20 000: 5.46 %), so the test fails only when the true rate is above 5 %, not when a
// sample fluctuates. The rule it replaced (|studentized residual| > 3) is measured beside it.
// SAGLINE_SCREEN_SWEEPS sets N (the asan-ubsan run may use fewer; the margin widens with it).
#include "FitSummary.h"
#include "NumberFormat.h"
#include "OutlierFlagText.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <iostream>
#include <random>
#include <vector>

using namespace sagline;

namespace {

constexpr double noLoadV = 19.55, resistanceOhm = 0.42, topCurrentA = 60.0 / 18.0;
constexpr double voltageStepV = 0.001, currentStepA = 0.001;

int sweepCount()
{
    if (const char *text = std::getenv("SAGLINE_SCREEN_SWEEPS")) {
        const long value = std::strtol(text, nullptr, 10);
        if (value >= 500)
            return static_cast<int>(value);
    }
    return 20000;
}

double rounded(double value, double step)
{
    return std::round(value / step) * step;
}

struct Scenario {
    std::size_t points = 8;
    double noiseV = 0.004;      // repeatability, V
    double noiseA = 0.0015;     // repeatability, A
    bool stateRandomU = false;  // readings carry u_voltage_v / u_current_a (the known-σ branch)
    double misreadV = 0.0;      // added to one reading chosen at random
};

// One simulated sweep; `misread` receives the row of the misread reading.
std::vector<Reading> simulate(const Scenario &s, std::mt19937_64 &random, std::size_t &misread)
{
    std::normal_distribution<double> normal(0.0, 1.0);
    std::uniform_int_distribution<std::size_t> pick(0, s.points - 1);
    misread = pick(random);
    std::vector<Reading> readings(s.points);
    for (std::size_t k = 0; k < s.points; ++k) {
        const double current = topCurrentA * static_cast<double>(k) / static_cast<double>(s.points - 1);
        Reading &r = readings[k];
        r.currentA = std::max(0.0, rounded(current + s.noiseA * normal(random), currentStepA));
        double voltage = noLoadV - resistanceOhm * current + s.noiseV * normal(random);
        if (k == misread)
            voltage += s.misreadV;
        r.voltageV = rounded(voltage, voltageStepV);
        if (s.stateRandomU) { // repeatability and rounding, GUM F.2.2.1
            r.uVoltageV = std::sqrt(s.noiseV * s.noiseV + voltageStepV * voltageStepV / 12.0);
            r.uCurrentA = std::sqrt(s.noiseA * s.noiseA + currentStepA * currentStepA / 12.0);
        }
    }
    return readings;
}

FitOptions options()
{
    FitOptions o;
    o.voltageResolutionV = voltageStepV;
    o.currentResolutionA = currentStepA;
    return o;
}

struct AlarmRates {
    double screen = 0.0;   // share of sweeps with at least one flag
    double fixedThree = 0.0; // the same for |studentized residual| > 3, the rule the screen replaced
};

AlarmRates falseAlarmRates(Scenario s, std::uint64_t seed)
{
    std::mt19937_64 random(seed);
    const int sweeps = sweepCount();
    int alarmed = 0, byThree = 0;
    std::size_t unused = 0;
    for (int i = 0; i < sweeps; ++i) {
        const FitSummary fit = fitReadings(simulate(s, random, unused), FitMethod::Ols, options());
        EXPECT_TRUE(fit.outlierScreening.screened);
        alarmed += fit.outlierRows.empty() ? 0 : 1;
        bool three = false;
        for (const PointFit &p : fit.points)
            three = three || (p.studentized && std::fabs(*p.studentized) > 3.0);
        byThree += three ? 1 : 0;
    }
    return {static_cast<double>(alarmed) / sweeps, static_cast<double>(byThree) / sweeps};
}

double acceptedRate()
{
    return 0.05 + 3.0 * std::sqrt(0.05 * 0.95 / sweepCount());
}

} // namespace

TEST(OutlierScreen, CleanSweepsRarelyRaiseAnAlarm)
{
    for (std::size_t points : {6u, 8u, 13u, 40u}) {
        for (bool stated : {false, true}) {
            Scenario s;
            s.points = points;
            s.stateRandomU = stated;
            const AlarmRates rates = falseAlarmRates(s, 1000 + points + (stated ? 7 : 0));
            std::cout << "  " << points << " points, " << (stated ? "stated u (normalized)" : "scatter (studentized)")
                      << ": false-alarm rate " << rates.screen * 100.0 << " % of " << sweepCount()
                      << " sweeps (|t| > 3 would give " << rates.fixedThree * 100.0 << " %)\n";
            EXPECT_LE(rates.screen, acceptedRate()) << points << " points, stated u: " << stated;
            // The test can tell a rule that cries wolf: the fixed threshold fails it.
            if (points == 8) {
                EXPECT_GT(rates.fixedThree, acceptedRate());
            }
        }
    }
}

TEST(OutlierScreen, FindsASixtyMillivoltMisreadAtEightPoints)
{
    // 60 mV on one of 8 readings (any step, the ends too), repeatability 5 mV.
    for (bool stated : {false, true}) {
        Scenario s;
        s.points = 8;
        s.noiseV = 0.005;
        s.misreadV = 0.060;
        s.stateRandomU = stated;
        std::mt19937_64 random(stated ? 77 : 78);
        const int sweeps = sweepCount();
        int found = 0;
        std::size_t misread = 0;
        for (int i = 0; i < sweeps; ++i) {
            const FitSummary fit = fitReadings(simulate(s, random, misread), FitMethod::Ols, options());
            found += fit.points[misread].outlier ? 1 : 0;
        }
        const double rate = static_cast<double>(found) / sweeps;
        std::cout << "  60 mV misread, " << (stated ? "stated u" : "scatter") << ": found in " << rate * 100.0
                  << " % of " << sweeps << " sweeps\n";
        // Binomial margin as above, around 90 %: accepted from 90 % - 3 standard errors.
        EXPECT_GE(rate, 0.90 - 3.0 * std::sqrt(0.90 * 0.10 / sweeps)) << "stated u: " << stated;
    }
}

TEST(OutlierScreen, ReadingsRoundedToTheLastDigitDoNotDivideByNothing)
{
    // Readings on an exact line, rounded to 1 mV, one of them a count high: the scatter of the
    // others is zero. Without the resolution floor the studentized residual of that reading is
    // enormous (the old screen flagged a 0.2 mV residual at t = 335 000); with it, the scatter
    // is at least δ/sqrt(12) and one count is no outlier.
    std::vector<Reading> readings(8);
    for (std::size_t k = 0; k < readings.size(); ++k) {
        readings[k].currentA = 0.5 * static_cast<double>(k);
        readings[k].voltageV = 19.600 - 0.400 * readings[k].currentA;
    }
    readings[3].voltageV += 0.001;
    const FitSummary floored = fitReadings(readings, FitMethod::Ols, options());
    ASSERT_TRUE(floored.outlierScreening.screened);
    EXPECT_TRUE(floored.outlierRows.empty());
    ASSERT_TRUE(floored.points[3].screeningStatistic);
    EXPECT_LT(std::fabs(*floored.points[3].screeningStatistic), 5.0);
    EXPECT_NE(floored.outlierScreening.rule.find("floored by the resolution"), std::string::npos);
}

TEST(OutlierScreen, FewerThanSixPointsAreNotScreened)
{
    std::vector<Reading> readings(5);
    for (std::size_t k = 0; k < readings.size(); ++k) {
        readings[k].currentA = 0.5 * static_cast<double>(k);
        readings[k].voltageV = 19.6 - 0.4 * readings[k].currentA + (k == 2 ? 0.5 : 0.0);
    }
    const FitSummary fit = fitReadings(readings, FitMethod::Ols, options());
    EXPECT_FALSE(fit.outlierScreening.screened);
    EXPECT_FALSE(fit.outlierScreening.criticalValue.has_value());
    EXPECT_TRUE(fit.outlierRows.empty());
    EXPECT_NE(fit.outlierScreening.reason.find("too few points to screen"), std::string::npos)
        << fit.outlierScreening.reason;
}

TEST(OutlierScreen, CriticalValuesAreBonferroniQuantiles)
{
    // 8 points: unknown σ, t(1 - 0.05/16, 5) = 4.52572; stated σ, z(1 - 0.05/16) = 2.73437
    // (scipy.stats.t.ppf and scipy.stats.norm.ppf).
    Scenario s;
    std::mt19937_64 random(5);
    std::size_t unused = 0;
    const FitSummary scatter = fitReadings(simulate(s, random, unused), FitMethod::Ols, options());
    EXPECT_NEAR(*scatter.outlierScreening.criticalValue, 4.52572, 1e-4);
    s.stateRandomU = true;
    const FitSummary stated = fitReadings(simulate(s, random, unused), FitMethod::Ols, options());
    EXPECT_TRUE(stated.statedRandomUncertainty);
    EXPECT_NEAR(*stated.outlierScreening.criticalValue, 2.73437, 1e-4);
}

TEST(OutlierScreen, FlagTextNamesTheStatisticTheRuleAndItsSource)
{
    // A clean 8-point line with a 0.5 V misread at step 5: the screen flags it, and the words
    // shown beside the flag give its statistic, the critical value, the rule and the source.
    std::vector<Reading> readings(8);
    for (std::size_t k = 0; k < readings.size(); ++k) {
        readings[k].currentA = 0.25 * static_cast<double>(k);
        readings[k].voltageV = 26.4 - 1.2 * readings[k].currentA + ((k % 3) == 0 ? 0.004 : -0.002);
    }
    readings[5].voltageV += 0.5;
    const FitSummary fit = fitReadings(readings, FitMethod::Ols, options());
    ASSERT_TRUE(fit.ok()) << fit.message;
    ASSERT_EQ(fit.outlierRows, std::vector<std::size_t>{5});
    const std::string text = outlierFlagText(fit, 5);
    EXPECT_NE(text.find("critical value ±" + formatSignificant(*fit.outlierScreening.criticalValue, 3)), std::string::npos)
        << text;
    EXPECT_NE(text.find(fit.outlierScreening.rule), std::string::npos) << text;
    EXPECT_NE(text.find("Cook and Weisberg"), std::string::npos) << text;
    EXPECT_NE(text.find("never applied"), std::string::npos) << text;
    EXPECT_EQ(outlierFlagText(fit, 4), "");
    EXPECT_EQ(fit.outlierScreening.source, std::string(outlierScreenSource));
}

TEST(OutlierScreen, TheReadingsTableFootnoteStatesThisFitsCriticalValueNotAFixedThree)
{
    // 9 clean points, σ unknown: the report's footnote must give the Bonferroni critical value
    // t(1 - 0.05/18, 6) = 4.2209 (scipy.stats.t.ppf(1 - 0.05/18, 6) = 4.220928422108925), not
    // the fixed "above 3" an earlier footnote claimed while the screen applied this value.
    std::vector<Reading> readings(9);
    for (std::size_t k = 0; k < readings.size(); ++k) {
        readings[k].currentA = 0.4 * static_cast<double>(k);
        readings[k].voltageV = 19.6 - 0.48 * readings[k].currentA + ((k % 3) == 0 ? 0.004 : -0.002);
    }
    const FitSummary fit = fitReadings(readings, FitMethod::Ols, options());
    ASSERT_TRUE(fit.ok()) << fit.message;
    EXPECT_NEAR(*fit.outlierScreening.criticalValue, 4.220928422108925, 1e-6);
    const std::string footnote = outlierScreenFootnote(fit);
    EXPECT_NE(footnote.find("externally studentized residual lies beyond ±4.22 is flagged"), std::string::npos)
        << footnote;
    EXPECT_EQ(footnote.find("above 3"), std::string::npos) << footnote;

    // Five points are not screened: the footnote says so and why.
    readings.resize(5);
    const FitSummary few = fitReadings(readings, FitMethod::Ols, options());
    EXPECT_NE(outlierScreenFootnote(few).find("Outlier screen: too few points to screen (5;"), std::string::npos)
        << outlierScreenFootnote(few);
}
