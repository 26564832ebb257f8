// LTTB display thinning (core/Downsample.h). The expected picks below are worked by hand from
// the algorithm as published by Steinarsson (2013), chapter 4: equal buckets, largest
// triangle with the previous pick and the next bucket's mean.
#include "Downsample.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <random>
#include <vector>

using sagline::lttbDownsample;
using sagline::lttbIndices;
using sagline::PlotPoint;

TEST(Downsample, KeepsEverythingWhenThresholdIsNotBelowCount)
{
    const std::vector<PlotPoint> points{{0, 1}, {1, 2}, {2, 0}};
    EXPECT_EQ(lttbIndices(points, 3), (std::vector<std::size_t>{0, 1, 2}));
    EXPECT_EQ(lttbIndices(points, 10), (std::vector<std::size_t>{0, 1, 2}));
    EXPECT_TRUE(lttbIndices({}, 5).empty());
}

TEST(Downsample, ThresholdBelowThreeKeepsEverything)
{
    const std::vector<PlotPoint> points{{0, 1}, {1, 2}, {2, 0}, {3, 4}};
    EXPECT_EQ(lttbIndices(points, 2).size(), 4u);
    EXPECT_EQ(lttbIndices(points, 0).size(), 4u);
}

TEST(Downsample, OneBucketPicksTheTallestTriangle)
{
    // Hand-worked: one bucket {1, 2, 3} between (0,0) and (4,0); the triangle's area is
    // 2·|y|, so (1, 5) wins.
    const std::vector<PlotPoint> points{{0, 0}, {1, 5}, {2, 1}, {3, 0}, {4, 0}};
    EXPECT_EQ(lttbIndices(points, 3), (std::vector<std::size_t>{0, 1, 4}));
}

TEST(Downsample, TwoBucketsUseTheNextBucketMean)
{
    // Hand-worked: n = 6, threshold 4, buckets {1,2} and {3,4}.
    // Bucket 1: previous (0,0), next-bucket mean (3.5, 5): doubled areas 1.5 for (1,1) and
    // 0.5 for (2,3), so index 1. Bucket 2: previous (1,1), last point (5,0): doubled areas 6
    // for (3,2) and 31 for (4,8), so index 4.
    const std::vector<PlotPoint> points{{0, 0}, {1, 1}, {2, 3}, {3, 2}, {4, 8}, {5, 0}};
    EXPECT_EQ(lttbIndices(points, 4), (std::vector<std::size_t>{0, 1, 4, 5}));
    const auto kept = lttbDownsample(points, 4);
    ASSERT_EQ(kept.size(), 4u);
    EXPECT_DOUBLE_EQ(kept[2].x, 4.0);
    EXPECT_DOUBLE_EQ(kept[2].y, 8.0);
}

TEST(Downsample, ExactCountFirstLastAndOrderOnLargeInput)
{
    std::mt19937 rng(42);
    std::normal_distribution<double> noise(0.0, 0.05);
    std::vector<PlotPoint> points;
    for (int i = 0; i < 100000; ++i) {
        const double current = i * 1e-5;
        points.push_back({current, 26.4 - 2.0 * current + noise(rng)});
    }
    const auto indices = lttbIndices(points, 1000);
    ASSERT_EQ(indices.size(), 1000u);
    EXPECT_EQ(indices.front(), 0u);
    EXPECT_EQ(indices.back(), points.size() - 1);
    for (std::size_t k = 1; k < indices.size(); ++k)
        EXPECT_LT(indices[k - 1], indices[k]);
}

TEST(Downsample, KeepsAnIsolatedSpike)
{
    // A single deviating reading must survive thinning: it is what an engineer needs to see.
    std::vector<PlotPoint> points;
    for (int i = 0; i < 10000; ++i)
        points.push_back({static_cast<double>(i), 1.0});
    points[6543].y = 50.0;
    const auto indices = lttbIndices(points, 100);
    EXPECT_NE(std::find(indices.begin(), indices.end(), 6543u), indices.end());
}

TEST(Downsample, NeverKeepsNonFinitePoints)
{
    const double nan = std::numeric_limits<double>::quiet_NaN();
    const double inf = std::numeric_limits<double>::infinity();
    std::vector<PlotPoint> points{{0, 0}, {1, nan}, {2, 1}, {inf, 3}, {4, 0}, {5, 2}, {6, 0}};
    for (std::size_t threshold : {3u, 4u, 100u}) {
        for (const auto &p : lttbDownsample(points, threshold)) {
            EXPECT_TRUE(std::isfinite(p.x));
            EXPECT_TRUE(std::isfinite(p.y));
        }
    }
    EXPECT_EQ(lttbIndices(points, 100).size(), 5u);
}

TEST(Downsample, PicksTheSamePointsAfterSubtractingALine)
{
    // A shear (x, y) -> (x, y - a - b x) keeps every triangle's area and maps bucket means to
    // bucket means, so LTTB keeps the same points of V(I) and of its residuals about any line:
    // the residual chart thins the voltages and maps only the kept points.
    std::mt19937 rng(7);
    std::normal_distribution<double> noise(0.0, 0.004);
    std::vector<PlotPoint> voltages;
    std::vector<PlotPoint> residuals;
    const double a = 19.61;
    const double b = -0.483;
    for (int i = 0; i < 50000; ++i) {
        const double current = 3.3 * i / 49999.0;
        const double voltage = 19.6 - 0.48 * current + noise(rng);
        voltages.push_back({current, voltage});
        residuals.push_back({current, voltage - a - b * current});
    }
    EXPECT_EQ(lttbIndices(voltages, 700), lttbIndices(residuals, 700));
}

namespace {

// Residual-like scatter: x rising, y standard normal noise (a made-up sweep), one gross spike.
std::vector<PlotPoint> noiseWithASpike(std::size_t n)
{
    std::mt19937_64 random(11);
    std::normal_distribution<double> noise(0.0, 1.0);
    std::vector<PlotPoint> points;
    for (std::size_t i = 0; i < n; ++i)
        points.push_back({static_cast<double>(i), noise(random)});
    points[n / 3].y = 40.0;
    return points;
}

double shareWithinOneSigma(std::span<const PlotPoint> points, const std::vector<std::size_t> &indices)
{
    std::size_t within = 0;
    for (std::size_t i : indices)
        within += std::abs(points[i].y) < 1.0 ? 1 : 0;
    return static_cast<double>(within) / static_cast<double>(indices.size());
}

} // namespace

TEST(Downsample, ScatterSampleKeepsLttbsPicksAndAnEvenSampleInOrder)
{
    const std::vector<PlotPoint> points = noiseWithASpike(100000);
    const auto kept = sagline::scatterSampleIndices(points, 600);
    EXPECT_LE(kept.size(), 600u);
    EXPECT_GE(kept.size(), 590u); // the two halves rarely pick the same point
    EXPECT_TRUE(std::is_sorted(kept.begin(), kept.end()));
    EXPECT_EQ(std::adjacent_find(kept.begin(), kept.end()), kept.end()) << "an index kept twice";
    for (std::size_t i : lttbIndices(points, 300))
        EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), i)) << "LTTB's pick " << i << " dropped";
    EXPECT_TRUE(std::binary_search(kept.begin(), kept.end(), std::size_t{100000 / 3})) << "the spike";
    EXPECT_EQ(kept.front(), 0u);
    EXPECT_EQ(kept.back(), 99999u);
    // Room for everything: every finite point, nothing else.
    std::vector<PlotPoint> few = noiseWithASpike(50);
    few[7].y = std::numeric_limits<double>::quiet_NaN();
    const auto all = sagline::scatterSampleIndices(few, 600);
    EXPECT_EQ(all.size(), 49u);
    EXPECT_FALSE(std::binary_search(all.begin(), all.end(), std::size_t{7}));
}

// Why the residual chart needs it: LTTB keeps each bucket's most deviating point, so thinned
// Gaussian noise shows almost nothing within one sigma (where 68 % of it lies: the normal
// distribution's 68-95-99.7 rule), i.e. two bands with a gap; the even half puts the middle back.
TEST(Downsample, ScatterSampleDrawsTheMiddleOfTheSpreadThatLttbLeavesOut)
{
    const std::vector<PlotPoint> points = noiseWithASpike(100000);
    const double lttbShare = shareWithinOneSigma(points, lttbIndices(points, 600));
    const double scatterShare = shareWithinOneSigma(points, sagline::scatterSampleIndices(points, 600));
    EXPECT_LT(lttbShare, 0.15) << "LTTB alone";
    EXPECT_GT(scatterShare, 0.3) << "half the budget evenly spread holds ~68 % of its points within 1 sigma";
}
