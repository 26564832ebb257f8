// YorkFit: errors in both variables, on Pearson's (1901) data with York's (1966) weights.
#include "YorkFit.h"

#include "FitSummary.h"
#include "ReferenceData.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

namespace {

struct PearsonYork {
    std::vector<double> x, y, sx, sy;
};

PearsonYork loadPearsonYork()
{
    const auto c = test::loadColumns("pearson-york.csv"); // x, y, weight_x, weight_y; u = 1/sqrt(w)
    PearsonYork d;
    if (c.size() != 4)
        return d;
    d.x = c[0];
    d.y = c[1];
    for (std::size_t i = 0; i < c[0].size(); ++i) {
        d.sx.push_back(1.0 / std::sqrt(c[2][i]));
        d.sy.push_back(1.0 / std::sqrt(c[3][i]));
    }
    return d;
}

void expectRelative(double actual, double expected, double tolerance)
{
    EXPECT_LE(std::fabs(actual - expected), tolerance * std::fabs(expected))
        << "actual " << actual << " expected " << expected;
}

} // namespace

TEST(YorkFit, MatchesPublishedPearsonYorkSolution)
{
    const PearsonYork d = loadPearsonYork();
    ASSERT_EQ(d.x.size(), 10u);
    const YorkFitResult r = yorkFit(d.x, d.y, d.sx, d.sy);
    ASSERT_TRUE(r.ok()) << r.message;
    // Slope and intercept: the test suite of the Julia package LinearFitXYerrors.jl asserts
    // a = 5.47991022403286, b = -0.48053340744620 (FACTS.md §5, verified), 1e-9 relative.
    expectRelative(r.slope, -0.48053340744620, 1e-9);
    expectRelative(r.intercept, 5.47991022403286, 1e-9);
    // Standard errors scaled by sqrt(MSWD): the same Julia suite asserts σ_a = 0.359246522551112,
    // σ_b = 0.070620269528771, and sqrt(MSWD) = 1.217905640539398.
    expectRelative(*r.slopeSeScaled, 0.070620269528771, 1e-8);
    expectRelative(*r.interceptSeScaled, 0.359246522551112, 1e-8);
    expectRelative(std::sqrt(*r.mswd), 1.217905640539398, 1e-9);
    // Intrinsic (unscaled) standard errors by the York 2004 closed form, computed for FACTS.md §5
    // in double precision: σ_b = 0.0579850, σ_a = 0.2949707, cov(a,b) = -0.0164725, S = 11.86635.
    expectRelative(r.slopeSe, 0.0579850, 1e-6);
    expectRelative(r.interceptSe, 0.2949707, 1e-6);
    expectRelative(r.covariance, -0.0164725, 1e-5);
    expectRelative(r.chiSquared, 11.86635, 1e-6);
    EXPECT_LT(r.iterations, 50);
}

TEST(YorkFit, AgreesWithAnIndependentOrthogonalDistanceFit)
{
    // Independent general-purpose library: SciPy 1.10 scipy.odr (ODRPACK) from Debian's
    // python3-scipy, weights wd = w(x), we = w(y); values printed by scripts/york-odr-check.py:
    // a = 5.4799104319294, b = -0.48053345082549, sd_beta (scaled by the residual variance)
    // 0.359246493612771 / 0.070620268173098, res_var 1.48329414929314. ODRPACK stops at its own
    // convergence tolerance, so the agreement is held to 1e-6 relative.
    const PearsonYork d = loadPearsonYork();
    ASSERT_EQ(d.x.size(), 10u);
    const YorkFitResult r = yorkFit(d.x, d.y, d.sx, d.sy);
    ASSERT_TRUE(r.ok()) << r.message;
    expectRelative(r.intercept, 5.4799104319294, 1e-6);
    expectRelative(r.slope, -0.48053345082549, 1e-6);
    expectRelative(*r.interceptSeScaled, 0.359246493612771, 1e-6);
    expectRelative(*r.slopeSeScaled, 0.070620268173098, 1e-6);
    expectRelative(*r.mswd, 1.48329414929314, 1e-6);
}

TEST(YorkFit, ReducesToWeightedLeastSquaresWhenXIsExact)
{
    // With negligible u(x), York's W_i -> 1/u(y)² and the line is the WLS line (York 2004, §II).
    const std::vector<double> x{0.0, 0.5, 1.0, 1.5, 2.0};
    const std::vector<double> y{26.41, 25.43, 24.52, 23.57, 22.58};
    const std::vector<double> sx(5, 1e-9), sy{0.01, 0.02, 0.01, 0.03, 0.02};
    std::vector<Reading> readings(5);
    for (std::size_t i = 0; i < 5; ++i) {
        readings[i].currentA = x[i];
        readings[i].voltageV = y[i];
        readings[i].uVoltageV = sy[i];
    }
    const FitSummary wls = fitReadings(readings, FitMethod::Wls);
    const YorkFitResult york = yorkFit(x, y, sx, sy);
    ASSERT_TRUE(york.ok());
    expectRelative(york.slope, wls.slope, 1e-9);
    expectRelative(york.intercept, wls.intercept, 1e-9);
    expectRelative(york.slopeSe, *wls.slopeSe, 1e-6);
}

TEST(YorkFit, FitSummaryCarriesBothConventions)
{
    const PearsonYork d = loadPearsonYork();
    ASSERT_EQ(d.x.size(), 10u);
    std::vector<Reading> readings(d.x.size());
    for (std::size_t i = 0; i < d.x.size(); ++i) {
        readings[i].currentA = d.x[i];
        readings[i].voltageV = d.y[i];
        readings[i].uCurrentA = d.sx[i];
        readings[i].uVoltageV = d.sy[i];
    }
    const FitSummary s = fitReadings(readings, FitMethod::York);
    ASSERT_TRUE(s.ok()) << s.message;
    expectRelative(s.slope, -0.48053340744620, 1e-9);   // LinearFitXYerrors.jl test suite
    expectRelative(*s.slopeSe, 0.0579850, 1e-6);        // York 2004 closed form (FACTS.md §5)
    expectRelative(*s.slopeSeScaled, 0.070620269528771, 1e-8); // LinearFitXYerrors.jl
    expectRelative(*s.mswd, 1.483294, 1e-6);            // FACTS.md §5, computed
    // MSWD > 1: the analysis propagates the scaled standard errors.
    expectRelative(*s.analysisSlopeSe(), 0.070620269528771, 1e-8);
    EXPECT_GT(s.iterations, 0);
}

TEST(YorkFit, DegenerateInputGivesStatus)
{
    const std::vector<double> one{1.0};
    EXPECT_EQ(yorkFit(one, one, one, one).status, FitStatus::TooFewPoints);
    const std::vector<double> x{1.0, 1.0, 1.0}, y{1.0, 2.0, 3.0}, u{0.1, 0.1, 0.1}, zero{0.1, 0.0, 0.1};
    EXPECT_EQ(yorkFit(x, y, u, u).status, FitStatus::DegenerateCurrent);
    const std::vector<double> x2{0.0, 1.0, 2.0};
    EXPECT_EQ(yorkFit(x2, y, u, zero).status, FitStatus::InvalidUncertainty);
    const std::vector<double> bad{0.0, NAN, 2.0};
    EXPECT_EQ(yorkFit(bad, y, u, u).status, FitStatus::NonFiniteValue);
    YorkOptions tight;
    tight.maxIterations = 1;
    const PearsonYork d = loadPearsonYork();
    EXPECT_EQ(yorkFit(d.x, d.y, d.sx, d.sy, {}, tight).status, FitStatus::NotConverged);
}
