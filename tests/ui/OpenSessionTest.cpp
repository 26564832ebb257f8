// Opening a saved session in the window: readings stored in any current order (a sweep down,
// a scattered log) are drawn sorted by current on the first frame after opening, without
// waiting for the charts' refresh timer; the table and the live fit hold every reading. And
// the startup probe reports the session as open and drawn.
#include "UiTestSupport.h"

#include "DemoSession.h"
#include "InteractiveChartView.h"
#include "ReadingsTableModel.h"
#include "ResidualChart.h"
#include "RunProgram.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <QChart>
#include <QChartView>
#include <QLineSeries>

#include <algorithm>
#include <regex>

using namespace sagline;
using namespace sagline::test;

namespace {

QList<QPointF> measuredPoints(VoltageCurrentChart *chart)
{
    for (auto *series : chart->chartView()->chart()->series()) {
        if (series->name() == QStringLiteral("measured"))
            return qobject_cast<QLineSeries *>(series)->points();
    }
    return {};
}

Setup demoSetup()
{
    const auto parsed = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    EXPECT_TRUE(parsed.setup.has_value());
    return *parsed.setup;
}

} // namespace

TEST(OpenSession, ReadingsInAnyOrderAreDrawnSortedOnTheFirstFrame)
{
    QTemporaryDir folder;
    constexpr std::size_t count = 12000;
    for (CurrentOrder order : {CurrentOrder::Falling, CurrentOrder::Random}) {
        SCOPED_TRACE(toString(order));
        const QString path = folder.filePath(QStringLiteral("%1.sagline").arg(QLatin1String(toString(order))));
        ASSERT_EQ(writeDemoSession(path, demoSetup(), count, order), QString());
        auto window = demoWindow(folder.path());
        window->show();
        ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
        ASSERT_TRUE(window->openSessionFile(path)) << window->lastMessage().toStdString();

        // No event processed since: what is drawn was drawn by opening.
        const QList<QPointF> drawn = measuredPoints(window->chart());
        ASSERT_GT(drawn.size(), 100);
        EXPECT_LE(drawn.size(), 4000);
        EXPECT_TRUE(std::is_sorted(drawn.begin(), drawn.end(),
                                   [](const QPointF &a, const QPointF &b) { return a.x() < b.x(); }));
        const auto [lowest, highest] = std::minmax_element(
            window->workspace()->readings().begin(), window->workspace()->readings().end(),
            [](const Reading &a, const Reading &b) { return a.currentA < b.currentA; });
        EXPECT_DOUBLE_EQ(drawn.front().x(), lowest->currentA);  // thinning keeps the ends
        EXPECT_DOUBLE_EQ(drawn.back().x(), highest->currentA);
        EXPECT_GT(window->residualChart()->drawnIncludedCount(), 100);
        EXPECT_EQ(window->readingsModel()->rowCount(), static_cast<int>(count));
        EXPECT_EQ(window->workspace()->liveFit().count(), count);
    }
}

TEST(OpenSession, StartupProbeReportsTheSessionOpenAndDrawn)
{
    QTemporaryDir folder;
    const QString path = folder.filePath(QStringLiteral("probe.sagline"));
    ASSERT_EQ(writeDemoSession(path, demoSetup(), 3000, CurrentOrder::Falling), QString());
    const auto run = sagline::testing::runProgram(SAGLINE_GUI_PATH, {"--startup-probe", path.toStdString()});
    ASSERT_EQ(run.exitCode, 0) << run.err;
    // "first painted frame after 412 ms from process start (kernel start time, 10 ms steps;
    // 380 ms after main(); 3000 readings open, 540 points drawn)"
    std::smatch match;
    ASSERT_TRUE(std::regex_search(run.out, match,
                                  std::regex(R"(after (\d+) ms from process start .*; (\d+) ms after main\(\); )"
                                             R"(3000 readings open, (\d+) points drawn)")))
        << run.out;
    // Process start comes before main() (by the libraries' loading), to the kernel's tick.
    EXPECT_GE(std::stoi(match[1]) + 10, std::stoi(match[2]));
    EXPECT_GT(std::stoi(match[3]), 0);
}
