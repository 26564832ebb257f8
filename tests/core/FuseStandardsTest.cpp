#include "FuseStandards.h"

#include <gtest/gtest.h>

using namespace sagline;

// IEC 60127 standard rated currents follow the R10 series with 3.15 and 6.3 (FACTS.md §1,
// verified against an IEC 60127 standard-sheet rating table).
TEST(FuseStandards, RoundsUpToTheIec60127R10Series)
{
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(0.348), 0.4);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(0.4), 0.4);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(0.401), 0.5);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(3.0), 3.15);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(3.2), 4.0);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(6.0), 6.3);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(6.4), 8.0);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(8.5), 10.0);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(0.032), 0.032);
    EXPECT_NEAR(nextStandardFuseRating(0.0301), 0.032, 1e-12);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(1.0), 1.0);
}

TEST(FuseStandards, RecognisesStandardRatings)
{
    for (double rating : {0.032, 0.05, 0.063, 0.08, 0.1, 0.125, 0.16, 0.2, 0.25, 0.315, 0.4, 0.5, 0.63, 0.8, 1.0, 1.25, 1.6,
                          2.0, 2.5, 3.15, 4.0, 5.0, 6.3, 8.0, 10.0})
        EXPECT_TRUE(isStandardFuseRating(rating)) << rating;
    EXPECT_FALSE(isStandardFuseRating(3.2));
    EXPECT_FALSE(isStandardFuseRating(0.3));
    EXPECT_FALSE(isStandardFuseRating(6.4));
}

// FACTS.md §10 worked check: 50 VA at 230 V gives I1 = 0.2174 A; 1.6 x I1 -> T 400 mA and
// 2 x I1 -> T 500 mA [computed there from the R10 series].
TEST(FuseStandards, WorkedFuseChoiceFor50VaAt230V)
{
    const double i1 = 50.0 / 230.0;
    EXPECT_NEAR(i1, 0.2174, 1e-4);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(1.6 * i1), 0.4);
    EXPECT_DOUBLE_EQ(nextStandardFuseRating(2.0 * i1), 0.5);
}

// IEC 60127-2 gates (FACTS.md §1): 1.5 In must hold for 60 min, 2.1 In must open within
// 30 min (quick-acting, sheet 2, verified) or 2 min (time-lag, sheet 3, from memory).
TEST(FuseStandards, Iec60127Gates)
{
    const FuseGates quick = fuseGates(FuseType::QuickActing);
    EXPECT_DOUBLE_EQ(quick.mustHoldMultiple, 1.5);
    EXPECT_DOUBLE_EQ(quick.mustHoldMinutes, 60.0);
    EXPECT_DOUBLE_EQ(quick.mustOpenMultiple, 2.1);
    EXPECT_DOUBLE_EQ(quick.mustOpenMaxSeconds, 30.0 * 60.0);
    const FuseGates lag = fuseGates(FuseType::TimeLag);
    EXPECT_DOUBLE_EQ(lag.mustHoldMultiple, 1.5);
    EXPECT_DOUBLE_EQ(lag.mustOpenMultiple, 2.1);
    EXPECT_DOUBLE_EQ(lag.mustOpenMaxSeconds, 120.0);
    EXPECT_NE(lag.source.find("from memory"), std::string::npos);
}

// NEC (NFPA 70) Table 450.3(B), primary-only protection (FACTS.md §2, check values computed
// there): 0.5 A -> 1.5 A (300 %), 5 A -> 8.35 A (167 %), 10 A -> 12.5 A (125 %).
TEST(FuseStandards, NecPrimaryOnlyCeiling)
{
    EXPECT_NEAR(necPrimaryOnlyMaximumA(0.5), 1.5, 1e-12);
    EXPECT_NEAR(necPrimaryOnlyMaximumA(5.0), 8.35, 1e-12);
    EXPECT_NEAR(necPrimaryOnlyMaximumA(10.0), 12.5, 1e-12);
    // Band edges: "less than 2 A" and "less than 9 A".
    EXPECT_DOUBLE_EQ(necPrimaryOnlyMultiplier(1.999), 3.00);
    EXPECT_DOUBLE_EQ(necPrimaryOnlyMultiplier(2.0), 1.67);
    EXPECT_DOUBLE_EQ(necPrimaryOnlyMultiplier(8.999), 1.67);
    EXPECT_DOUBLE_EQ(necPrimaryOnlyMultiplier(9.0), 1.25);
}

TEST(FuseStandards, ToroidsGetALargerFuseFactorThanLaminatedCores)
{
    // Common practice (FACTS.md §10): toroid inrush is higher.
    EXPECT_GT(defaultFuseFactor(Construction::Toroidal), defaultFuseFactor(Construction::Laminated));
    EXPECT_LT(defaultMagnetizingFraction(Construction::Toroidal), defaultMagnetizingFraction(Construction::Laminated));
}
