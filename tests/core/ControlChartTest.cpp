// The individuals control chart (core/ControlChart.h): its constant against the published
// table and against its derivation, the limits against a hand-worked example, and the cases
// that give no limits.
#include "ControlChart.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

using namespace sagline;

namespace {

// Φ(x), the standard normal distribution function.
double normalCdf(double x) { return 0.5 * std::erfc(-x / std::sqrt(2.0)); }

} // namespace

TEST(ControlChart, MovingRangeConstantMatchesThePublishedTable)
{
    // d2 for subgroups of n = 2: 1.128 in the table of factors for variables control charts
    // (Montgomery, Introduction to Statistical Quality Control, Appendix VI; also ASTM E2587,
    // table of control chart constants) (from memory).
    EXPECT_DOUBLE_EQ(movingRangeD2, 1.128);
    // Independently: d2(n) = ∫ [1 - Φ(x)^n - (1 - Φ(x))^n] dx, the expected range of n standard
    // normal values (the textbook definition of d2), integrated numerically here for n = 2 ...
    double integral = 0.0;
    const double step = 1e-3;
    for (double x = -12.0; x < 12.0; x += step) {
        const double mid = x + step / 2.0;
        const double p = normalCdf(mid);
        integral += (1.0 - p * p - (1.0 - p) * (1.0 - p)) * step;
    }
    EXPECT_NEAR(integral, movingRangeD2, 5e-4);
    // ... and its closed form for n = 2, E|X1 - X2| = 2/√π for unit σ.
    EXPECT_NEAR(2.0 / std::sqrt(M_PI), movingRangeD2, 5e-4);
    EXPECT_NEAR(integral, 2.0 / std::sqrt(M_PI), 1e-9);
}

TEST(ControlChart, LimitsMatchAHandWorkedExample)
{
    // Hand-worked: x = 10, 12, 11, 14, 13; mean 60/5 = 12; moving ranges 2, 1, 3, 1, average 7/4 = 1.75;
    // σ̂ = 1.75/1.128 = 1.5514184; UCL = 12 + 3 σ̂ = 16.6542553; LCL = 12 - 3 σ̂ = 7.3457447.
    const IndividualsChart chart = individualsChart({10.0, 12.0, 11.0, 14.0, 13.0});
    ASSERT_TRUE(chart.hasLimits()) << chart.note;
    EXPECT_EQ(chart.n, 5u);
    EXPECT_DOUBLE_EQ(*chart.centre, 12.0);
    EXPECT_DOUBLE_EQ(*chart.averageMovingRange, 1.75);
    EXPECT_NEAR(*chart.sigma, 1.5514184, 1e-7);
    EXPECT_NEAR(*chart.upper, 16.6542553, 1e-7);
    EXPECT_NEAR(*chart.lower, 7.3457447, 1e-7);
    EXPECT_TRUE(chart.outside.empty());
    EXPECT_TRUE(chart.preliminary);
    EXPECT_NE(chart.note.find("1.128"), std::string::npos) << chart.note;
}

TEST(ControlChart, MarksTheUnitOutsideTheLimits)
{
    // Hand-worked: x = 10, 12, 11, 14, 13, 30; mean 90/6 = 15; moving ranges 2, 1, 3, 1, 17,
    // average 24/5 = 4.8; σ̂ = 4.8/1.128 = 4.2553191; UCL = 27.7659574, LCL = 2.2340426: 30 is above.
    const IndividualsChart chart = individualsChart({10.0, 12.0, 11.0, 14.0, 13.0, 30.0});
    ASSERT_TRUE(chart.hasLimits());
    EXPECT_DOUBLE_EQ(*chart.centre, 15.0);
    EXPECT_DOUBLE_EQ(*chart.averageMovingRange, 4.8);
    EXPECT_NEAR(*chart.upper, 27.7659574, 1e-7);
    EXPECT_NEAR(*chart.lower, 2.2340426, 1e-7);
    ASSERT_EQ(chart.outside.size(), 1u);
    EXPECT_EQ(chart.outside[0], 5u);
}

TEST(ControlChart, OrderMattersForTheMovingRange)
{
    // The same values in another order: a slow drift gives small moving ranges (tight limits),
    // alternating values large ones. Mean 12 both ways.
    const IndividualsChart drift = individualsChart({10.0, 11.0, 12.0, 13.0, 14.0});
    const IndividualsChart alternating = individualsChart({10.0, 14.0, 11.0, 13.0, 12.0});
    EXPECT_DOUBLE_EQ(*drift.averageMovingRange, 1.0);
    EXPECT_DOUBLE_EQ(*alternating.averageMovingRange, 2.5); // (4 + 3 + 2 + 1) / 4
    EXPECT_LT(*drift.upper, *alternating.upper);
}

TEST(ControlChart, NoLimitsFromTooFewOrIdenticalValues)
{
    IndividualsChart chart = individualsChart({});
    EXPECT_FALSE(chart.hasLimits());
    EXPECT_FALSE(chart.centre.has_value());
    chart = individualsChart({1.0, 2.0});
    EXPECT_FALSE(chart.hasLimits());
    EXPECT_DOUBLE_EQ(*chart.centre, 1.5);
    EXPECT_NE(chart.note.find("at least 3"), std::string::npos) << chart.note;
    chart = individualsChart({1.0, 1.0, 1.0, 1.0});
    EXPECT_FALSE(chart.hasLimits());
    EXPECT_NE(chart.note.find("moving range is zero"), std::string::npos) << chart.note;
}

TEST(ControlChart, ValuesWithoutANumberAreLeftOutAndSaid)
{
    const double nan = std::numeric_limits<double>::quiet_NaN();
    const IndividualsChart chart = individualsChart({10.0, nan, 12.0, 11.0, 14.0, 13.0, 30.0});
    EXPECT_EQ(chart.n, 6u);
    EXPECT_DOUBLE_EQ(*chart.centre, 15.0);
    ASSERT_EQ(chart.outside.size(), 1u);
    EXPECT_EQ(chart.outside[0], 6u) << "indices refer to the values as given";
    EXPECT_NE(chart.note.find("left out"), std::string::npos) << chart.note;
}

TEST(ControlChart, TwentyValuesAreNoLongerPreliminary)
{
    std::vector<double> values;
    for (int i = 0; i < 20; ++i)
        values.push_back(1.0 + 0.01 * ((i * 7) % 5));
    const IndividualsChart chart = individualsChart(values);
    ASSERT_TRUE(chart.hasLimits());
    EXPECT_FALSE(chart.preliminary);
}
