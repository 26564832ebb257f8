// Charts you can work with: the wheel zooms around the pointer, a dragged rectangle zooms to
// it, the arrow keys pan, Home resets to the autoscaled view of the included points; while the
// person's view stands, new points do not rescale it. The chart copies and saves as an image
// (PNG, SVG; another extension refused).
#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "InteractiveChartView.h"
#include "PlanPanel.h"
#include "ResidualChart.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <QClipboard>
#include <QComboBox>
#include <QFile>
#include <QPushButton>
#include <QGuiApplication>
#include <QValueAxis>
#include <QWheelEvent>

using namespace sagline;
using namespace sagline::test;

namespace {

struct Range {
    double low;
    double high;
};

Range shown(InteractiveChartView *view, Qt::Orientation orientation)
{
    auto *axis = qobject_cast<QValueAxis *>(view->chart()->axes(orientation).value(0));
    return axis ? Range{axis->min(), axis->max()} : Range{0.0, 0.0};
}

std::unique_ptr<MainWindow> windowAfterASweep(const QString &folder)
{
    auto window = demoWindow(folder);
    window->resize(1600, 1000);
    window->show();
    window->workspace()->setSimulatedTime(true);
    window->setupForm()->setSessionDetails({QStringLiteral("Chart tester"), QStringLiteral("CH-1"), QStringLiteral("20 °C"), {}});
    window->planPanel()->acceptButton()->click();
    waitUntil([&] { return !window->workspace()->isRunning(); }, 20000);
    window->flushCharts();
    return window;
}

} // namespace

TEST(ChartInteraction, ZoomPanAndResetToTheIncludedPoints)
{
    QTemporaryDir folder;
    auto window = windowAfterASweep(folder.path());
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    ASSERT_GE(window->workspace()->readings().size(), 3u) << window->lastMessage().toStdString();
    VoltageCurrentChart *chart = window->chart();
    InteractiveChartView *view = chart->chartView();
    const Range x0 = shown(view, Qt::Horizontal);
    const Range y0 = shown(view, Qt::Vertical);
    ASSERT_GT(x0.high, x0.low);

    // Two notches of the wheel over the plot's centre: both axes span 1/1.25² as much.
    const QPointF centre = view->mapFromScene(view->chart()->mapToScene(view->chart()->plotArea().center()));
    QWheelEvent wheel(centre, view->mapToGlobal(centre), QPoint(), QPoint(0, 240), Qt::NoButton, Qt::NoModifier,
                      Qt::NoScrollPhase, false);
    QApplication::sendEvent(view->viewport(), &wheel);
    const Range x1 = shown(view, Qt::Horizontal);
    const Range y1 = shown(view, Qt::Vertical);
    EXPECT_NEAR((x1.high - x1.low) / (x0.high - x0.low), 1.0 / 1.5625, 0.02);
    EXPECT_NEAR((y1.high - y1.low) / (y0.high - y0.low), 1.0 / 1.5625, 0.02);
    EXPECT_TRUE(chart->isUserView());

    // New points (or an exclusion's rescale) leave the person's view alone.
    chart->rescale();
    chart->flushNow();
    EXPECT_DOUBLE_EQ(shown(view, Qt::Horizontal).low, x1.low);
    EXPECT_DOUBLE_EQ(shown(view, Qt::Vertical).high, y1.high);

    // The arrow keys pan: the span stays, the range moves.
    view->setFocus();
    QTest::keyClick(view, Qt::Key_Right);
    const Range x2 = shown(view, Qt::Horizontal);
    EXPECT_GT(x2.low, x1.low);
    EXPECT_NEAR(x2.high - x2.low, x1.high - x1.low, 1e-9 * (x1.high - x1.low) + 1e-12);

    // A dragged rectangle zooms to it.
    const QRectF plot = view->chart()->plotArea();
    const QPoint from = view->mapFromScene(view->chart()->mapToScene(plot.topLeft() + QPointF(plot.width() * 0.2, plot.height() * 0.2)));
    const QPoint to = view->mapFromScene(view->chart()->mapToScene(plot.topLeft() + QPointF(plot.width() * 0.6, plot.height() * 0.6)));
    QTest::mousePress(view->viewport(), Qt::LeftButton, Qt::NoModifier, from);
    QMouseEvent move(QEvent::MouseMove, QPointF(to), view->viewport()->mapToGlobal(QPointF(to)), Qt::NoButton, Qt::LeftButton,
                     Qt::NoModifier);
    QApplication::sendEvent(view->viewport(), &move);
    QTest::mouseRelease(view->viewport(), Qt::LeftButton, Qt::NoModifier, to);
    const Range x3 = shown(view, Qt::Horizontal);
    EXPECT_NEAR((x3.high - x3.low) / (x2.high - x2.low), 0.4, 0.05);

    // Home: back to the autoscaled view.
    QTest::keyClick(view, Qt::Key_Home);
    EXPECT_FALSE(chart->isUserView());
    EXPECT_DOUBLE_EQ(shown(view, Qt::Horizontal).low, x0.low);
    EXPECT_DOUBLE_EQ(shown(view, Qt::Horizontal).high, x0.high);
    EXPECT_DOUBLE_EQ(shown(view, Qt::Vertical).low, y0.low);
    EXPECT_DOUBLE_EQ(shown(view, Qt::Vertical).high, y0.high);

    // The residual chart zooms and resets the same way.
    InteractiveChartView *residuals = window->residualChart()->chartView();
    const Range r0 = shown(residuals, Qt::Vertical);
    residuals->zoomBy(2.0);
    EXPECT_TRUE(window->residualChart()->isUserView());
    EXPECT_NEAR(shown(residuals, Qt::Vertical).high - shown(residuals, Qt::Vertical).low, (r0.high - r0.low) / 2.0,
                1e-6 * (r0.high - r0.low));
    window->residualChart()->resetView();
    EXPECT_DOUBLE_EQ(shown(residuals, Qt::Vertical).high, r0.high);
}

TEST(ChartInteraction, CopiesAndSavesTheChartAsPngOrSvg)
{
    QTemporaryDir folder;
    auto window = windowAfterASweep(folder.path());
    InteractiveChartView *view = window->chart()->chartView();
    const QImage image = view->image();
    ASSERT_FALSE(image.isNull());
    EXPECT_EQ(image.size(), view->size() * view->devicePixelRatio());

    view->copyImage();
    EXPECT_FALSE(QGuiApplication::clipboard()->image().isNull());

    const QString refused = view->saveImage(folder.filePath(QStringLiteral("chart.pdf")));
    EXPECT_TRUE(refused.contains(QStringLiteral(".png or .svg"))) << refused.toStdString();
    EXPECT_FALSE(QFile::exists(folder.filePath(QStringLiteral("chart.pdf"))));

    EXPECT_EQ(view->saveImage(folder.filePath(QStringLiteral("chart"))), QString()); // PNG when no extension
    QImage png(folder.filePath(QStringLiteral("chart.png")));
    EXPECT_EQ(png.size(), image.size());

    EXPECT_EQ(view->saveImage(folder.filePath(QStringLiteral("chart.svg"))), QString());
    QFile svg(folder.filePath(QStringLiteral("chart.svg")));
    ASSERT_TRUE(svg.open(QIODevice::ReadOnly));
    const QByteArray text = svg.readAll();
    EXPECT_TRUE(text.contains("<svg")) << text.left(200).toStdString();
    EXPECT_TRUE(text.contains("Secondary V (V)")); // the axis title, as text in the drawing
}
