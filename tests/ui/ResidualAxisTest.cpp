// The residual axis when the fit goes from exact to real: two points fit a line exactly (their
// residuals are rounding noise, ~1e-13 mV) and the third brings millivolts. Qt Charts lays the
// ticks out again on every range change with the interval it has, so an axis sized to the
// noise and then widened to millivolts looped over ~1e14 ticks and froze the window (seen as a
// hang of the chart tests on a loaded machine, where the refresh after the second point is not
// merged with the next one).
#include "UiTestSupport.h"

#include "DisplayPoints.h"
#include "InteractiveChartView.h"
#include "ResidualChart.h"

#include <gtest/gtest.h>

#include <QChart>
#include <QValueAxis>

using namespace sagline;

namespace {

QValueAxis *residualAxis(ResidualChart &chart)
{
    return qobject_cast<QValueAxis *>(chart.chartView()->chart()->axes(Qt::Vertical).value(0));
}

} // namespace

// Before any reading (a new session) the axis spans ±1 mV, not a scale made of nothing.
TEST(ResidualAxis, AnEmptyChartShowsAMillivoltSpan)
{
    DisplayPoints points;
    ResidualChart chart(points);
    chart.resize(800, 300);
    chart.show();
    chart.setCurrentSpan(2.0);
    chart.setResidualFunction([](double, double) { return 0.0; }, 0.0);
    chart.pointsChanged();
    chart.flushNow();
    const auto [low, high] = chart.residualAxisRange();
    EXPECT_GE(high, 1.0);
    EXPECT_LE(low, -1.0);
    EXPECT_LE(high, 2.5);
}

TEST(ResidualAxis, NoiseOfAnExactFitIsNotAScaleAndWideningStaysQuick)
{
    DisplayPoints points;
    ResidualChart chart(points);
    chart.resize(800, 300);
    chart.show();

    // Invented demo readings: V = 19.6 V - 0.48 Ohm * I exactly at two currents.
    points.add(1, 0.0, 19.6, false);
    points.add(2, 1.0, 19.12, false);
    chart.setCurrentSpan(2.0);
    chart.setResidualFunction([](double, double) { return 3e-17; }, 0.0);
    chart.pointsChanged();
    chart.flushNow();
    const auto [low, high] = chart.residualAxisRange();
    ASSERT_GE(high, 1.0) << "an exact fit's rounding noise set the residual scale (mV)";
    ASSERT_LE(low, -1.0);

    // The third point is 5 mV off the line: the axis widens to it with a handful of ticks.
    points.add(3, 2.0, 18.645, false);
    chart.setResidualFunction([](double i, double) { return i > 1.5 ? 0.005 : -0.0025; }, 0.004);
    chart.pointsChanged();
    chart.flushNow();
    QValueAxis *axis = residualAxis(chart);
    ASSERT_NE(axis, nullptr);
    EXPECT_GE(axis->max(), 5.0);
    EXPECT_LE((axis->max() - axis->min()) / axis->tickInterval(), 20.0);

    // And back: a residual function that yields infinities (a fit gone bad) keeps a finite axis.
    chart.setResidualFunction([](double, double) { return std::numeric_limits<double>::infinity(); }, 0.004);
    chart.pointsChanged();
    chart.flushNow();
    EXPECT_TRUE(std::isfinite(axis->min()) && std::isfinite(axis->max()));
}
