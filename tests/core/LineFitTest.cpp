// LineFit: the live O(1) straight-line fit, checked against NIST StRD Norris and the property
// that any sequence of adds and removes equals a batch fit of the points that remain.
#include "LineFit.h"

#include "ReferenceData.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

using namespace sagline;

namespace {

// NIST StRD, linear regression, Norris (lower difficulty): certified values, published by the
// NIST Information Technology Laboratory (see /work/shared/reference/README.md).
constexpr double norrisB0 = -0.262323073774029;
constexpr double norrisB0Sd = 0.232818234301152;
constexpr double norrisB1 = 1.00211681802045;
constexpr double norrisB1Sd = 0.429796848199937E-03;
constexpr double norrisResidualSd = 0.884796396144373;
constexpr double norrisRSquared = 0.999993745883712;

void expectRelative(double actual, double expected, double tolerance)
{
    EXPECT_LE(std::fabs(actual - expected), tolerance * std::fabs(expected))
        << "actual " << actual << " expected " << expected;
}

LineFit fitOf(const std::vector<double> &x, const std::vector<double> &y, double shift = 0.0)
{
    LineFit fit;
    for (std::size_t i = 0; i < x.size(); ++i)
        EXPECT_TRUE(fit.add(x[i] + shift, y[i] + shift));
    return fit;
}

} // namespace

TEST(LineFit, MatchesNistNorrisCertifiedValues)
{
    const auto data = test::loadColumns("nist-strd-norris.csv");
    ASSERT_EQ(data.size(), 2u);
    ASSERT_EQ(data[0].size(), 36u);
    const LineFitResult r = fitOf(data[0], data[1]).result();
    ASSERT_TRUE(r.ok()) << r.message;
    // Issue 3: at least 9 significant digits against the NIST StRD certified values.
    expectRelative(r.intercept, norrisB0, 1e-9);
    expectRelative(r.slope, norrisB1, 1e-9);
    expectRelative(*r.interceptSe, norrisB0Sd, 1e-9);
    expectRelative(*r.slopeSe, norrisB1Sd, 1e-9);
    expectRelative(*r.residualSd, norrisResidualSd, 1e-9);
    expectRelative(*r.rSquared, norrisRSquared, 1e-9);
    EXPECT_EQ(r.degreesOfFreedom, 34);
}

TEST(LineFit, KeepsNorrisDigitsWhenDataAreShiftedByALargeConstant)
{
    // Stability: x and y both shifted by 1e6, so raw power sums would lose about 12 digits.
    // Slope, its SE, residual SD and R² are unchanged (NIST StRD Norris certified values);
    // the intercept moves by c(1 - b1).
    const auto data = test::loadColumns("nist-strd-norris.csv");
    ASSERT_EQ(data.size(), 2u);
    constexpr double shift = 1e6;
    const LineFitResult r = fitOf(data[0], data[1], shift).result();
    ASSERT_TRUE(r.ok()) << r.message;
    expectRelative(r.slope, norrisB1, 1e-9);
    expectRelative(*r.slopeSe, norrisB1Sd, 1e-9);
    expectRelative(*r.residualSd, norrisResidualSd, 1e-9);
    expectRelative(*r.rSquared, norrisRSquared, 1e-9);
    // The shifted data themselves carry only ~1e-10 absolute precision, so the intercept is
    // held to an absolute bound.
    EXPECT_NEAR(r.intercept - shift * (1.0 - r.slope), norrisB0, 1e-6);
}

TEST(LineFit, RecoversAnExactLineWithZeroStandardError)
{
    LineFit fit;
    for (int i = 0; i <= 10; ++i)
        fit.add(0.1 * i, 24.0 - 1.5 * 0.1 * i);
    const LineFitResult r = fit.result();
    ASSERT_TRUE(r.ok());
    EXPECT_NEAR(r.seriesResistanceOhm(), 1.5, 1e-13);
    EXPECT_NEAR(r.noLoadVoltageV(), 24.0, 1e-13);
    EXPECT_NEAR(*r.slopeSe, 0.0, 1e-12);
    EXPECT_NEAR(*r.rSquared, 1.0, 1e-15);
}

TEST(LineFit, ReportsDegenerateInputWithoutNaN)
{
    LineFit fit;
    EXPECT_EQ(fit.result().status, FitStatus::TooFewPoints);
    EXPECT_FALSE(fit.add(std::nan(""), 1.0));
    EXPECT_FALSE(fit.add(1.0, INFINITY));
    EXPECT_FALSE(fit.add(1.0, 1.0, 0.0));
    EXPECT_FALSE(fit.add(1.0, 1.0, -2.0));
    EXPECT_EQ(fit.count(), 0u);
    fit.add(0.5, 12.0);
    EXPECT_EQ(fit.result().status, FitStatus::TooFewPoints);
    EXPECT_FALSE(fit.result().message.empty());
    fit.add(0.5, 11.0);
    fit.add(0.5, 11.5);
    const LineFitResult r = fit.result();
    EXPECT_EQ(r.status, FitStatus::DegenerateCurrent);
    EXPECT_FALSE(std::isnan(r.slope));
    EXPECT_FALSE(r.slopeSe.has_value());
}

TEST(LineFit, TwoPointsGiveALineButNoUncertainty)
{
    LineFit fit;
    fit.add(0.0, 26.0);
    fit.add(2.0, 24.0);
    const LineFitResult r = fit.result();
    ASSERT_TRUE(r.ok());
    EXPECT_DOUBLE_EQ(r.seriesResistanceOhm(), 1.0);
    EXPECT_FALSE(r.slopeSe.has_value());
    EXPECT_FALSE(r.residualSd.has_value());
    EXPECT_FALSE(fit.predict(1.0).prediction.has_value());
}

TEST(LineFit, EqualsBatchFitAfterAnySequenceOfAddsAndRemoves)
{
    // Property test: random adds and removes (seeded), compared after every operation with a
    // fresh fit of exactly the points that remain.
    std::mt19937_64 random(20261202);
    std::uniform_real_distribution<double> current(0.0, 2.0);
    std::normal_distribution<double> noise(0.0, 0.05);
    std::uniform_real_distribution<double> weightDraw(0.5, 4.0);
    for (int trial = 0; trial < 20; ++trial) {
        LineFit live;
        struct Point { double x, y, w; };
        std::vector<Point> kept;
        const bool weighted = trial % 2 == 1;
        for (int op = 0; op < 300; ++op) {
            const bool doRemove = !kept.empty() && std::uniform_int_distribution<int>(0, 2)(random) == 0;
            if (doRemove) {
                const std::size_t index = std::uniform_int_distribution<std::size_t>(0, kept.size() - 1)(random);
                ASSERT_TRUE(live.remove(kept[index].x, kept[index].y, kept[index].w));
                kept.erase(kept.begin() + static_cast<std::ptrdiff_t>(index));
            } else {
                const double x = current(random);
                const Point p{x, 230.0 - 1.9 * x + noise(random), weighted ? weightDraw(random) : 1.0};
                ASSERT_TRUE(live.add(p.x, p.y, p.w));
                kept.push_back(p);
            }
            LineFit batch;
            for (const Point &p : kept)
                batch.add(p.x, p.y, p.w);
            const LineFitResult a = live.result();
            const LineFitResult b = batch.result();
            ASSERT_EQ(a.status, b.status) << "trial " << trial << " op " << op;
            ASSERT_EQ(a.n, kept.size());
            if (!a.ok())
                continue;
            EXPECT_NEAR(a.slope, b.slope, 1e-9 * std::fabs(b.slope) + 1e-12);
            EXPECT_NEAR(a.intercept, b.intercept, 1e-9 * std::fabs(b.intercept));
            if (b.slopeSe) {
                ASSERT_TRUE(a.slopeSe.has_value());
                EXPECT_NEAR(*a.slopeSe, *b.slopeSe, 1e-7 * *b.slopeSe + 1e-14);
                EXPECT_NEAR(*a.residualSd, *b.residualSd, 1e-7 * *b.residualSd + 1e-14);
            }
        }
    }
}

TEST(LineFit, RemovingEveryPointEmptiesTheFit)
{
    LineFit fit;
    fit.add(1.0, 2.0);
    fit.add(2.0, 3.0);
    EXPECT_TRUE(fit.remove(1.0, 2.0));
    EXPECT_TRUE(fit.remove(2.0, 3.0));
    EXPECT_EQ(fit.count(), 0u);
    EXPECT_FALSE(fit.remove(2.0, 3.0));
    fit.add(5.0, 1.0);
    fit.add(6.0, 3.0);
    EXPECT_DOUBLE_EQ(fit.result().slope, 2.0);
}

TEST(LineFit, PredictionIntervalFollowsTheTextbookFormula)
{
    // Var(ŷ0) = s²(1/n + (x0 - x̄)²/Sxx), prediction adds s² (Montgomery & Runger, Applied
    // Statistics and Probability for Engineers, section 11-6, from memory).
    const std::vector<double> x{0.0, 0.5, 1.0, 1.5, 2.0};
    const std::vector<double> y{24.1, 23.3, 22.6, 21.6, 21.0};
    LineFit fit;
    for (std::size_t i = 0; i < x.size(); ++i)
        fit.add(x[i], y[i]);
    const LineFitResult r = fit.result();
    const LinePrediction p = fit.predict(2.5);
    ASSERT_TRUE(p.prediction.has_value());
    const double s = *r.residualSd;
    const double sxx = 2.5; // Σ (x - 1)² for x = 0..2 step 0.5
    const double t = 3.182446305284263; // t_{0.975, 3} (statistical tables)
    const double lineSe = s * std::sqrt(1.0 / 5.0 + 1.5 * 1.5 / sxx);
    EXPECT_NEAR(p.value, r.intercept + r.slope * 2.5, 1e-12);
    EXPECT_NEAR(p.confidence->high - p.value, t * lineSe, 1e-9);
    EXPECT_NEAR(p.prediction->high - p.value, t * std::sqrt(lineSe * lineSe + s * s), 1e-9);
}

TEST(LineFit, PredictAllGivesPredictAtEveryGridPoint)
{
    // The band's grid shortcut (t found once) must give predict()'s values exactly, with
    // intervals only from 3 points on, and nothing but values from 2.
    const std::vector<double> x{0.0, 0.5, 1.0, 1.5, 2.0};
    const std::vector<double> y{24.1, 23.3, 22.6, 21.6, 21.0};
    const std::vector<double> grid{-1.0, 0.0, 0.7, 2.0, 3.3};
    LineFit fit;
    EXPECT_EQ(fit.predictAll(grid).size(), grid.size());
    for (std::size_t i = 0; i < x.size(); ++i) {
        fit.add(x[i], y[i]);
        const auto all = fit.predictAll(grid, 0.9);
        ASSERT_EQ(all.size(), grid.size());
        for (std::size_t g = 0; g < grid.size(); ++g) {
            const LinePrediction one = fit.predict(grid[g], 0.9);
            EXPECT_EQ(all[g].value, one.value);
            ASSERT_EQ(all[g].confidence.has_value(), one.confidence.has_value());
            EXPECT_EQ(all[g].confidence.has_value(), fit.count() >= 3);
            if (one.confidence) {
                EXPECT_EQ(all[g].confidence->low, one.confidence->low);
                EXPECT_EQ(all[g].prediction->high, one.prediction->high);
            }
        }
    }
}

TEST(LineFit, BatchFitLineMatchesNorrisAndTheLiveFit)
{
    // NIST StRD Norris certified values, through the array batch fit (9 significant digits).
    const auto data = test::loadColumns("nist-strd-norris.csv");
    ASSERT_EQ(data.size(), 2u);
    const LineFitResult r = fitLine(data[0], data[1]);
    ASSERT_TRUE(r.ok()) << r.message;
    expectRelative(r.intercept, norrisB0, 1e-9);
    expectRelative(r.slope, norrisB1, 1e-9);
    expectRelative(*r.interceptSe, norrisB0Sd, 1e-9);
    expectRelative(*r.slopeSe, norrisB1Sd, 1e-9);
    expectRelative(*r.residualSd, norrisResidualSd, 1e-9);
    expectRelative(*r.rSquared, norrisRSquared, 1e-9);
    const std::vector<double> same{1.0, 1.0, 1.0}, y{1.0, 2.0, 3.0};
    EXPECT_EQ(fitLine(same, y).status, FitStatus::DegenerateCurrent);
    const std::vector<double> bad{0.0, NAN, 1.0};
    EXPECT_EQ(fitLine(bad, y).status, FitStatus::NonFiniteValue);
    EXPECT_EQ(fitLine(std::vector<double>{1.0}, std::vector<double>{1.0}).status, FitStatus::TooFewPoints);
}
