// Long sweeps on the charts: what is drawn is thinned to about one point per pixel column
// (LTTB), while the fit and the table keep every point; the extremes stay on screen.
#include "UiTestSupport.h"

#include "DisplayPoints.h"
#include "InteractiveChartView.h"
#include "ReadingsTableModel.h"
#include "ResidualChart.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <QChart>
#include <QChartView>
#include <QLineSeries>

using namespace sagline;
using namespace sagline::test;

namespace {

// Invented readings of a made-up transformer (demo data): V = 19.6 V − 0.48 Ω · I with a
// saw-tooth of ±5 mV, one 0.3 V dip at the middle that thinning must keep.
Reading reading(std::size_t i, std::size_t total)
{
    Reading r;
    r.id = static_cast<std::int64_t>(i + 1);
    r.step = static_cast<int>(i * 9 / total);
    r.currentA = 3.3 * static_cast<double>(i) / static_cast<double>(total - 1);
    r.voltageV = 19.6 - 0.48 * r.currentA + 0.005 * (static_cast<double>(i % 7) - 3.0) / 3.0;
    if (i == total / 2)
        r.voltageV -= 0.3;
    r.timeUtc = "2026-12-02T03:00:00.000Z";
    return r;
}

QLineSeries *measuredSeries(VoltageCurrentChart *chart)
{
    for (auto *series : chart->chartView()->chart()->series()) {
        if (series->name() == QStringLiteral("measured"))
            return qobject_cast<QLineSeries *>(series);
    }
    return nullptr;
}

} // namespace

TEST(ChartThinning, BudgetFollowsThePlotWidthWithinBounds)
{
    EXPECT_EQ(drawnPointBudget(0.0), 300u);
    EXPECT_EQ(drawnPointBudget(812.4), 812u);
    EXPECT_EQ(drawnPointBudget(1.0e6), 4000u);
}

TEST(ChartThinning, TwentyThousandPointsDrawnThinnedFittedWhole)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    constexpr std::size_t total = 20000;
    for (std::size_t i = 0; i < total; ++i)
        window->workspace()->acceptRecorded(reading(i, total));
    window->flushCharts();

    VoltageCurrentChart *chart = window->chart();
    const double plotWidth = chart->chartView()->chart()->plotArea().width();
    ASSERT_GT(plotWidth, 100.0);
    const int drawn = chart->drawnIncludedCount();
    EXPECT_EQ(static_cast<std::size_t>(drawn), drawnPointBudget(plotWidth));
    EXPECT_LT(drawn, 4001);
    EXPECT_LE(window->residualChart()->drawnIncludedCount(), 4000);

    // The first and last points and the dip are among the drawn points.
    QLineSeries *measured = measuredSeries(chart);
    ASSERT_NE(measured, nullptr);
    const auto points = measured->points();
    ASSERT_FALSE(points.isEmpty());
    EXPECT_DOUBLE_EQ(points.front().x(), 0.0);
    EXPECT_DOUBLE_EQ(points.back().x(), 3.3);
    const Reading dip = reading(total / 2, total);
    bool dipShown = false;
    for (const QPointF &p : points)
        dipShown = dipShown || (p.x() == dip.currentA && p.y() == dip.voltageV);
    EXPECT_TRUE(dipShown);

    // The fit and the table use every point.
    EXPECT_EQ(window->workspace()->liveFit().count(), total);
    EXPECT_EQ(window->readingsModel()->rowCount(), static_cast<int>(total));

    // The full fit of this many points runs on a worker thread and arrives by itself: every
    // point used, the dip flagged as the outlier, and marked in its table row.
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(waitUntil([&] {
        window->flushCharts();
        return workspace->summary().n == total;
    }));
    const auto &outliers = workspace->summary().outlierRows;
    ASSERT_EQ(outliers.size(), 1u);
    EXPECT_EQ(outliers.front(), total / 2);
    window->flushCharts();
    const auto *model = window->readingsModel();
    EXPECT_TRUE(model->data(model->index(static_cast<int>(total / 2), ReadingsTableModel::Flags))
                    .toString()
                    .contains(QStringLiteral("outlier")));
}
