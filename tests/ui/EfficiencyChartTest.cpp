// The efficiency-and-losses chart, a tab beside the residuals under the V–I chart: hidden until readings carry the primary
// power, then filled from core's analysis after a virtual-bench sweep with its mains-side
// analyser; the results panel gains the primary-side rows. Set SAGLINE_SCREENSHOT_DIR to keep
// PNGs of the window and the chart (light and dark) at 1366x768 and 1600x1000.
#include "UiTestSupport.h"

#include "DemoSweep.h"
#include "EfficiencyChart.h"
#include "MainWindow.h"
#include "ResultsPanel.h"
#include "SweepWorkspace.h"

#include <QDir>

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

namespace {

void keepScreenshot(QWidget *widget, const QString &name)
{
    const QString folder = qEnvironmentVariable("SAGLINE_SCREENSHOT_DIR");
    if (folder.isEmpty())
        return;
    QDir().mkpath(folder);
    widget->grab().save(folder + QLatin1Char('/') + name);
}

} // namespace

TEST(EfficiencyChartView, EmptyChartSaysWhatItNeeds)
{
    EfficiencyChart chart;
    EXPECT_EQ(chart.drawnEfficiencyPoints(), 0);
    EXPECT_TRUE(chart.statusText().contains(QStringLiteral("primary power")));
}

TEST(EfficiencyChartView, VirtualBenchSweepFillsTheChartAndTheResults)
{
    for (const QSize size : {QSize(1366, 768), QSize(1600, 1000)}) {
        QTemporaryDir folder;
        auto window = demoWindow(folder.path());
        window->resize(size);
        window->show();
        ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
        EXPECT_FALSE(window->efficiencyOffered()) << "no primary readings yet";
        const DemoResult demo = runVirtualBenchDemo(*window);
        ASSERT_TRUE(demo.ok) << demo.message.toStdString();
        window->flushCharts();
        // A gtest assertion: a QTRY_ macro that times out only returns, and the test passes.
        ASSERT_TRUE(waitUntil([&] { return window->efficiencyOffered(); }, 10000));
        window->lowerCharts()->setCurrentWidget(window->efficiencyChart());
        const auto &primary = window->workspace()->primarySide();
        ASSERT_TRUE(primary.result);
        EXPECT_EQ(window->efficiencyChart()->drawnEfficiencyPoints(), demo.points - 1); // every loaded step
        EXPECT_TRUE(window->efficiencyChart()->statusText().isEmpty()) << window->efficiencyChart()->statusText().toStdString();
        EXPECT_FALSE(window->results()->value(QStringLiteral("efficiency_at_rated")).isEmpty());
        EXPECT_FALSE(window->results()->value(QStringLiteral("no_load_loss")).isEmpty());
        EXPECT_FALSE(window->results()->value(QStringLiteral("supply")).isEmpty());
        const QString tag = QStringLiteral("%1x%2").arg(size.width()).arg(size.height());
        keepScreenshot(window.get(), QStringLiteral("window-efficiency-%1-light.png").arg(tag));
        keepScreenshot(window->efficiencyChart(), QStringLiteral("efficiency-chart-%1-light.png").arg(tag));
        window->efficiencyChart()->applyColours(true);
        keepScreenshot(window->efficiencyChart(), QStringLiteral("efficiency-chart-%1-dark.png").arg(tag));
    }
}
