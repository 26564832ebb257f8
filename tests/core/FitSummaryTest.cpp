// FitSummary: the batch fit every layer shows. OLS and WLS against GSL (gsl_fit_linear,
// gsl_fit_wlinear) on seeded random data; exclusion, flags, outliers and degenerate input.
#include "FitSummary.h"

#include "ReferenceData.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#if SAGLINE_HAVE_GSL
#include <gsl/gsl_fit.h>
#endif

using namespace sagline;

namespace {

std::vector<Reading> readingsOf(const std::vector<double> &current, const std::vector<double> &voltage)
{
    std::vector<Reading> readings(current.size());
    for (std::size_t i = 0; i < current.size(); ++i) {
        readings[i].currentA = current[i];
        readings[i].voltageV = voltage[i];
    }
    return readings;
}

void expectRelative(double actual, double expected, double tolerance)
{
    EXPECT_LE(std::fabs(actual - expected), tolerance * std::fabs(expected))
        << "actual " << actual << " expected " << expected;
}

// A made-up 24 V transformer: V = 26.4 - 1.9 I with noise; u(V) varies per point.
std::vector<Reading> randomReadings(std::size_t n, unsigned seed)
{
    std::mt19937_64 random(seed);
    std::uniform_real_distribution<double> current(0.0, 2.1);
    std::uniform_real_distribution<double> uDraw(0.005, 0.05);
    std::vector<Reading> readings(n);
    for (auto &r : readings) {
        r.currentA = current(random);
        r.uVoltageV = uDraw(random);
        r.uCurrentA = 0.001;
        r.voltageV = 26.4 - 1.9 * r.currentA + std::normal_distribution<double>(0.0, *r.uVoltageV)(random);
    }
    return readings;
}

} // namespace

TEST(FitSummary, MatchesNistNorrisThroughReadings)
{
    // NIST StRD Norris certified values (see LineFitTest), through the batch entry point.
    const auto data = test::loadColumns("nist-strd-norris.csv");
    ASSERT_EQ(data.size(), 2u);
    const FitSummary s = fitReadings(readingsOf(data[0], data[1]), FitMethod::Ols);
    ASSERT_TRUE(s.ok()) << s.message;
    expectRelative(s.intercept, -0.262323073774029, 1e-9);
    expectRelative(s.slope, 1.00211681802045, 1e-9);
    expectRelative(*s.interceptSe, 0.232818234301152, 1e-9);
    expectRelative(*s.slopeSe, 0.429796848199937E-03, 1e-9);
    expectRelative(*s.residualSdV, 0.884796396144373, 1e-9);
    expectRelative(*s.rSquared, 0.999993745883712, 1e-9);
}

#if SAGLINE_HAVE_GSL
TEST(FitSummary, OlsAgreesWithGslFitLinear)
{
    // Reference: GSL 2.7 gsl_fit_linear (Debian libgsl-dev), 1e-10 relative (issue 3).
    const auto readings = randomReadings(3000, 7);
    std::vector<double> x, y;
    for (const auto &r : readings) {
        x.push_back(r.currentA);
        y.push_back(r.voltageV);
    }
    double c0, c1, cov00, cov01, cov11, sumsq;
    ASSERT_EQ(gsl_fit_linear(x.data(), 1, y.data(), 1, x.size(), &c0, &c1, &cov00, &cov01, &cov11, &sumsq), 0);
    const FitSummary s = fitReadings(readings, FitMethod::Ols);
    ASSERT_TRUE(s.ok());
    expectRelative(s.intercept, c0, 1e-10);
    expectRelative(s.slope, c1, 1e-10);
    expectRelative(*s.interceptSe, std::sqrt(cov00), 1e-10);
    expectRelative(*s.slopeSe, std::sqrt(cov11), 1e-10);
    expectRelative(*s.covariance, cov01, 1e-10);
    expectRelative(*s.residualSdV, std::sqrt(sumsq / static_cast<double>(x.size() - 2)), 1e-10);

    const LineFitResult batch = fitLine(x, y); // the array batch form agrees too
    expectRelative(batch.slope, c1, 1e-10);
    expectRelative(batch.intercept, c0, 1e-10);
    expectRelative(*batch.slopeSe, std::sqrt(cov11), 1e-10);
    expectRelative(*batch.interceptSe, std::sqrt(cov00), 1e-10);

    LineFit live; // the incremental form agrees too
    for (std::size_t i = 0; i < x.size(); ++i)
        live.add(x[i], y[i]);
    const LineFitResult r = live.result();
    expectRelative(r.slope, c1, 1e-10);
    expectRelative(r.intercept, c0, 1e-10);
    expectRelative(*r.slopeSe, std::sqrt(cov11), 1e-10);
    expectRelative(*r.interceptSe, std::sqrt(cov00), 1e-10);
}

TEST(FitSummary, WlsAgreesWithGslFitWlinear)
{
    // Reference: GSL 2.7 gsl_fit_wlinear with w = 1/u², whose covariance comes from the weights
    // alone (absolute), the same convention as FitMethod::Wls; chisq is Σ w e².
    const auto readings = randomReadings(3000, 11);
    std::vector<double> x, y, w;
    for (const auto &r : readings) {
        x.push_back(r.currentA);
        y.push_back(r.voltageV);
        w.push_back(1.0 / (*r.uVoltageV * *r.uVoltageV));
    }
    double c0, c1, cov00, cov01, cov11, chisq;
    ASSERT_EQ(gsl_fit_wlinear(x.data(), 1, w.data(), 1, y.data(), 1, x.size(), &c0, &c1, &cov00, &cov01, &cov11, &chisq), 0);
    const FitSummary s = fitReadings(readings, FitMethod::Wls);
    ASSERT_TRUE(s.ok()) << s.message;
    expectRelative(s.intercept, c0, 1e-10);
    expectRelative(s.slope, c1, 1e-10);
    expectRelative(*s.interceptSe, std::sqrt(cov00), 1e-10);
    expectRelative(*s.slopeSe, std::sqrt(cov11), 1e-10);
    expectRelative(*s.covariance, cov01, 1e-10);
    expectRelative(*s.chiSquared, chisq, 1e-10);
    expectRelative(*s.mswd, chisq / static_cast<double>(x.size() - 2), 1e-10);

    LineFit live;
    for (std::size_t i = 0; i < x.size(); ++i)
        live.add(x[i], y[i], w[i]);
    const LineFitResult r = live.weightedResult();
    expectRelative(r.slope, c1, 1e-10);
    expectRelative(*r.slopeSe, std::sqrt(cov11), 1e-10);
    expectRelative(live.chiSquared(), chisq, 1e-9);
}
#endif

TEST(FitSummary, SkipsExcludedAndOverloadRowsButGivesTheirResiduals)
{
    auto readings = readingsOf({0.0, 0.5, 1.0, 1.5, 2.0, 1.2, 0.8}, {26.4, 25.45, 24.5, 23.55, 22.6, 5.0, 0.0});
    readings[5].excluded = true;
    readings[6].flags = flagOverload;
    const FitSummary s = fitReadings(readings, FitMethod::Ols);
    ASSERT_TRUE(s.ok());
    EXPECT_EQ(s.n, 5u);
    EXPECT_NEAR(s.seriesResistanceOhm(), 1.9, 1e-12);
    ASSERT_EQ(s.points.size(), 7u);
    EXPECT_FALSE(s.points[5].used);
    EXPECT_NEAR(s.points[5].residualV, 5.0 - (26.4 - 1.9 * 1.2), 1e-12);
    EXPECT_FALSE(s.points[5].studentized.has_value());
}

TEST(FitSummary, FlagsAnOutlierWithoutDroppingIt)
{
    // A made-up sweep with one misread voltage at row 4.
    const std::vector<double> i{0.0, 0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0};
    std::vector<double> v;
    const double wiggle[] = {0.01, -0.008, 0.004, -0.012, 0.0, 0.009, -0.005, 0.011, -0.007, 0.003, -0.006};
    for (std::size_t k = 0; k < i.size(); ++k)
        v.push_back(26.4 - 1.9 * i[k] + wiggle[k]);
    v[4] -= 0.3;
    const FitSummary s = fitReadings(readingsOf(i, v), FitMethod::Ols);
    ASSERT_TRUE(s.ok());
    EXPECT_EQ(s.n, 11u);
    ASSERT_EQ(s.outlierRows, std::vector<std::size_t>{4});
    EXPECT_TRUE(s.points[4].outlier);
    EXPECT_LT(*s.points[4].studentized, -3.0);
    // The screen is a Bonferroni-bounded test (OutlierScreen.h): with 11 points its critical
    // value is t(1 - 0.05/22, 8) = 3.89987 (scipy.stats.t.ppf(1 - 0.05/22, 8)).
    ASSERT_TRUE(s.outlierScreening.screened);
    EXPECT_NEAR(*s.outlierScreening.criticalValue, 3.89987, 1e-4);
    EXPECT_LT(*s.points[4].screeningStatistic, -*s.outlierScreening.criticalValue);
    FitOptions lenient;
    lenient.outlierScreen.familyAlpha = 1e-12; // a critical value far beyond the misread
    EXPECT_EQ(fitReadings(readingsOf(i, v), FitMethod::Ols, lenient).outlierRows.size(), 0u);
    // The weighted methods flag the same reading.
    auto withU = readingsOf(i, v);
    for (auto &r : withU) {
        r.uVoltageV = 0.01;
        r.uCurrentA = 0.0005;
    }
    EXPECT_EQ(fitReadings(withU, FitMethod::Wls).outlierRows, std::vector<std::size_t>{4});
    const FitSummary york = fitReadings(withU, FitMethod::York);
    ASSERT_TRUE(york.ok()) << york.message;
    EXPECT_EQ(york.outlierRows, std::vector<std::size_t>{4});
    EXPECT_GT(*york.mswd, 10.0); // the misread point makes the scatter exceed the stated u
}

TEST(FitSummary, DegenerateInputGivesStatusAndMessage)
{
    EXPECT_EQ(fitReadings(std::vector<Reading>{}, FitMethod::Ols).status, FitStatus::TooFewPoints);
    EXPECT_EQ(fitReadings(readingsOf({1.0}, {2.0}), FitMethod::Ols).status, FitStatus::TooFewPoints);
    const FitSummary same = fitReadings(readingsOf({1.0, 1.0, 1.0}, {2.0, 2.1, 2.2}), FitMethod::Ols);
    EXPECT_EQ(same.status, FitStatus::DegenerateCurrent);
    EXPECT_FALSE(same.message.empty());
    const FitSummary nan = fitReadings(readingsOf({0.0, 1.0, NAN}, {2.0, 1.0, 1.0}), FitMethod::Ols);
    EXPECT_EQ(nan.status, FitStatus::NonFiniteValue);
    EXPECT_NE(nan.message.find("row 2"), std::string::npos);
    const FitSummary missing = fitReadings(readingsOf({0.0, 1.0, 2.0}, {2.0, 1.0, 0.5}), FitMethod::Wls);
    EXPECT_EQ(missing.status, FitStatus::MissingUncertainty);
    EXPECT_NE(missing.message.find("u_voltage_v"), std::string::npos);
    auto zeroU = readingsOf({0.0, 1.0, 2.0}, {2.0, 1.0, 0.5});
    for (auto &r : zeroU) {
        r.uVoltageV = 0.01;
        r.uCurrentA = 0.0;
    }
    EXPECT_EQ(fitReadings(zeroU, FitMethod::York).status, FitStatus::InvalidUncertainty);
    zeroU[1].uVoltageV = -1.0;
    EXPECT_EQ(fitReadings(zeroU, FitMethod::Wls).status, FitStatus::InvalidUncertainty);
}

TEST(FitSummary, ConfidenceIntervalOfRUsesStudentT)
{
    const auto readings = randomReadings(8, 3);
    const FitSummary s = fitReadings(readings, FitMethod::Ols);
    ASSERT_TRUE(s.ok());
    // t_{0.975, 6} = 2.446911851144969 (statistical tables).
    EXPECT_NEAR(s.seriesResistanceCi->high - s.seriesResistanceOhm(), 2.446911851144969 * *s.slopeSe, 1e-9);
    EXPECT_NEAR(s.seriesResistanceOhm() - s.seriesResistanceCi->low, 2.446911851144969 * *s.slopeSe, 1e-9);
}

TEST(FitSummary, MethodNamesRoundTrip)
{
    for (FitMethod m : {FitMethod::Ols, FitMethod::Wls, FitMethod::York})
        EXPECT_EQ(fitMethodFromString(toString(m)), m);
    EXPECT_FALSE(fitMethodFromString("odr").has_value());
}

TEST(FitSummary, PredictionAgreesWithTheLiveFit)
{
    // Two routes to the same textbook interval: the covariance of (a, b) here, the centred
    // sums in LineFit::predict.
    const auto readings = randomReadings(12, 5);
    const FitSummary s = fitReadings(readings, FitMethod::Ols);
    LineFit live;
    for (const auto &r : readings)
        live.add(r.currentA, r.voltageV);
    for (double current : {0.0, 1.0, 2.5}) {
        const LinePrediction a = predictVoltage(s, current);
        const LinePrediction b = live.predict(current);
        ASSERT_TRUE(a.prediction && b.prediction);
        EXPECT_NEAR(a.value, b.value, 1e-12);
        EXPECT_NEAR(a.confidence->high, b.confidence->high, 1e-10);
        EXPECT_NEAR(a.prediction->low, b.prediction->low, 1e-10);
    }
    const LinePrediction withU = predictVoltage(s, 1.0, 0.5);
    EXPECT_GT(withU.prediction->high - withU.value, predictVoltage(s, 1.0).prediction->high - withU.value);
    EXPECT_FALSE(predictVoltage(FitSummary{}, 1.0).prediction.has_value());
}

TEST(FitSummary, TheLiveFitSummaryMatchesTheBatchFit)
{
    // Centred running sums (LineFit) against the batch three-pass fit: the same line,
    // uncertainties and scatter, so results shown while points arrive equal the final ones.
    const auto readings = randomReadings(15, 9);
    const FitSummary batch = fitReadings(readings, FitMethod::Ols);
    LineFit live;
    for (const auto &r : readings)
        live.add(r.currentA, r.voltageV);
    const FitSummary s = summaryOfLiveFit(live);
    ASSERT_TRUE(s.ok()) << s.message;
    EXPECT_EQ(s.n, batch.n);
    EXPECT_EQ(s.degreesOfFreedom, batch.degreesOfFreedom);
    EXPECT_NEAR(s.slope, batch.slope, 1e-12);
    EXPECT_NEAR(s.intercept, batch.intercept, 1e-12);
    EXPECT_NEAR(*s.slopeSe, *batch.slopeSe, 1e-12);
    EXPECT_NEAR(*s.interceptSe, *batch.interceptSe, 1e-12);
    EXPECT_NEAR(*s.covariance, *batch.covariance, 1e-12);
    EXPECT_NEAR(*s.residualSdV, *batch.residualSdV, 1e-12);
    EXPECT_TRUE(s.points.empty());
    EXPECT_FALSE(summaryOfLiveFit(LineFit{}).ok());
}
