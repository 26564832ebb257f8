// The points both charts draw: whatever order they arrive in, they come out sorted by current
// (LTTB needs x in order), split into included and excluded, with equal currents kept in
// arrival order, and a session's worth of points is sorted once, not inserted one by one.
#include "DisplayPoints.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>

using namespace sagline;

namespace {

std::vector<double> xs(std::span<const PlotPoint> points)
{
    std::vector<double> out;
    for (const PlotPoint &p : points)
        out.push_back(p.x);
    return out;
}

bool sortedByCurrent(std::span<const PlotPoint> points)
{
    return std::is_sorted(points.begin(), points.end(), [](const PlotPoint &a, const PlotPoint &b) { return a.x < b.x; });
}

} // namespace

TEST(DisplayPoints, FallingAndShuffledArrivalsComeOutSortedAndComplete)
{
    std::mt19937 random(7);
    std::vector<double> currents;
    for (int i = 0; i < 5000; ++i)
        currents.push_back(0.001 * i);
    for (const bool shuffled : {false, true}) {
        std::vector<double> order(currents.rbegin(), currents.rend());
        if (shuffled)
            std::shuffle(order.begin(), order.end(), random);
        DisplayPoints points;
        for (std::size_t i = 0; i < order.size(); ++i)
            points.add(static_cast<std::int64_t>(i), order[i], 20.0 - order[i], i % 10 == 0);
        ASSERT_EQ(points.size(), order.size());
        EXPECT_TRUE(sortedByCurrent(points.included()));
        EXPECT_TRUE(sortedByCurrent(points.excluded()));
        EXPECT_EQ(points.included().size() + points.excluded().size(), order.size());
        EXPECT_EQ(points.excluded().size(), order.size() / 10);
        for (const PlotPoint &p : points.included())
            EXPECT_DOUBLE_EQ(p.y, 20.0 - p.x); // each voltage stays with its current
        // The extremes are those of the included points (an excluded point never sizes an axis).
        const double topIncluded = points.included().back().x;
        EXPECT_DOUBLE_EQ(points.maxCurrent(), topIncluded);
        EXPECT_DOUBLE_EQ(points.minVoltage(), 20.0 - topIncluded);
        EXPECT_DOUBLE_EQ(points.maxVoltage(), 20.0 - points.included().front().x);
    }
}

TEST(DisplayPoints, ExcludedPointsNeverSetTheExtremes)
{
    DisplayPoints points;
    points.add(0, 0.0, 19.6, false);
    points.add(1, 0.417, 19.4, false);
    points.add(2, 417.0, 19.4, true);  // 417 typed for 0.417 A, excluded
    points.add(3, 0.833, 196.0, false); // 196 typed for 19.6 V, not yet excluded
    EXPECT_DOUBLE_EQ(points.maxCurrent(), 0.833);
    EXPECT_DOUBLE_EQ(points.maxVoltage(), 196.0);
    ASSERT_TRUE(points.setExcluded(3, true)); // excluded (or superseded) later: the extremes shrink
    EXPECT_DOUBLE_EQ(points.maxCurrent(), 0.417);
    EXPECT_DOUBLE_EQ(points.maxVoltage(), 19.6);
    EXPECT_DOUBLE_EQ(points.minVoltage(), 19.4);
    ASSERT_TRUE(points.setExcluded(2, false));
    EXPECT_DOUBLE_EQ(points.maxCurrent(), 417.0);
}

TEST(DisplayPoints, LatePointsMergeIntoTheSortedOnesEqualCurrentsInArrivalOrder)
{
    DisplayPoints points;
    points.add(0, 1.0, 10.0, false);
    points.add(1, 3.0, 30.0, false);
    points.add(2, 2.0, 20.0, false);
    EXPECT_EQ(xs(points.included()), (std::vector<double>{1.0, 2.0, 3.0}));
    // Read once; then more arrive: below, between, equal to an earlier one, and above.
    points.add(3, 0.5, 5.0, false);
    points.add(4, 2.0, 21.0, false);
    points.add(5, 4.0, 40.0, false);
    points.add(6, 2.0, 22.0, false);
    const auto included = points.included();
    EXPECT_EQ(xs(included), (std::vector<double>{0.5, 1.0, 2.0, 2.0, 2.0, 3.0, 4.0}));
    EXPECT_DOUBLE_EQ(included[2].y, 20.0);
    EXPECT_DOUBLE_EQ(included[3].y, 21.0);
    EXPECT_DOUBLE_EQ(included[4].y, 22.0);
    // A rising sweep appends.
    points.add(7, 5.0, 50.0, true);
    EXPECT_EQ(xs(points.excluded()), (std::vector<double>{5.0}));
    EXPECT_EQ(points.included().size(), 7u);
}

TEST(DisplayPoints, ExcludingAndRestoringMovesAPointBetweenTheArrays)
{
    DisplayPoints points;
    for (int i = 0; i < 6; ++i)
        points.add(100 + i, 5.0 - i, 10.0 + i, false);
    EXPECT_TRUE(points.setExcluded(102, true));
    EXPECT_EQ(xs(points.excluded()), (std::vector<double>{3.0}));
    EXPECT_EQ(xs(points.included()), (std::vector<double>{0.0, 1.0, 2.0, 4.0, 5.0}));
    EXPECT_TRUE(points.setExcluded(102, false));
    EXPECT_TRUE(points.excluded().empty());
    EXPECT_EQ(points.included().size(), 6u);
    EXPECT_FALSE(points.setExcluded(999, true));
}

TEST(DisplayPoints, PointsThatCannotBeDrawnAreNotKept)
{
    DisplayPoints points;
    points.add(0, std::nan(""), 1.0, false);
    points.add(1, 1.0, INFINITY, false);
    points.add(2, 1.0, 2.0, false);
    EXPECT_EQ(points.size(), 1u);
    EXPECT_DOUBLE_EQ(points.maxCurrent(), 1.0);
}

TEST(DisplayPoints, ClearForgetsEverything)
{
    DisplayPoints points;
    points.add(0, 1.0, 2.0, false);
    points.add(1, 0.5, 3.0, true);
    points.clear();
    EXPECT_EQ(points.size(), 0u);
    EXPECT_TRUE(points.included().empty());
    EXPECT_TRUE(points.excluded().empty());
    EXPECT_DOUBLE_EQ(points.maxCurrent(), 0.0);
    EXPECT_TRUE(std::isinf(points.minVoltage()));
}
