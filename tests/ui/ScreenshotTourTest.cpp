// Screenshots for people to look at (not compared by the test): with SAGLINE_SHOTS_DIR set,
// the window at 1366 × 768 and 1600 × 1000, light and dark, in the states that must be
// unmistakable: a dwell countdown, a paused sweep, a lost link, the instruments tab after
// Connect and test, and a zoomed chart. Without the variable the test is skipped.
//   SAGLINE_SHOTS_DIR=/tmp/shots build/ci/tests/ui_tests --gtest_filter='ScreenshotTour.*'
#include "UiTestSupport.h"

#include "DemoSweep.h"
#include "EfficiencyChart.h"
#include "InstrumentsPanel.h"
#include "InteractiveChartView.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "SimInstrument.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"
#include "VirtualBench.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QDir>
#include <QPushButton>
#include <QStyle>
#include <QTabWidget>

using namespace sagline;
using namespace sagline::test;

namespace {

void usePalette(bool dark)
{
    if (!dark) {
        QApplication::setPalette(QApplication::style()->standardPalette());
        return;
    }
    QApplication::setPalette(darkPalette()); // the app's own --dark palette
}

void shoot(MainWindow &window, const QString &dir, const QString &name)
{
    window.flushCharts();
    QTest::qWait(150);
    ASSERT_TRUE(window.grab().save(dir + QLatin1Char('/') + name + QStringLiteral(".png"))) << name.toStdString();
}

void tour(QSize size, bool dark, const QString &dir)
{
    usePalette(dark);
    const QString tag = QStringLiteral("%1x%2-%3").arg(size.width()).arg(size.height()).arg(dark ? "dark" : "light");
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->resize(size);
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    window->setupForm()->setSessionDetails({QStringLiteral("A. Bench"), QStringLiteral("PT-60-0142"), QStringLiteral("21 °C"), {}});
    QComboBox *source = window->instrumentsPanel()->sourceBox();
    source->setCurrentIndex(source->findData(int(ReadingSource::VirtualBench)));

    // The instruments tab after Connect and test.
    window->findChild<QTabWidget *>()->setCurrentIndex(2);
    QTest::mouseClick(window->instrumentsPanel()->testButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return window->instrumentsPanel()->testButton()->isEnabled(); }, 20000));
    shoot(*window, dir, tag + QStringLiteral("-instruments-tested"));
    window->findChild<QTabWidget *>()->setCurrentIndex(1);

    window->planPanel()->acceptButton()->click();
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();
    // A dwell countdown, a few steps in.
    ASSERT_TRUE(waitUntil([&] { return workspace->readings().size() >= 3 && strip->sweepState() == StripState::Settling; }, 30000));
    shoot(*window, dir, tag + QStringLiteral("-dwell-countdown"));
    // Paused.
    strip->pauseAction()->trigger();
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() == StripState::Paused; }, 5000));
    QTest::qWait(1200); // "Paused for 1 s"
    shoot(*window, dir, tag + QStringLiteral("-paused"));
    strip->pauseAction()->trigger();
    // A lost link.
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() == StripState::Settling || strip->sweepState() == StripState::Busy; }, 10000));
    VirtualBench *bench = workspace->run()->bench();
    for (SimInstrument *meter : {bench->voltmeter(), bench->ammeter(), bench->powerMeter()})
        meter->injectFault(SimFault::Vanish);
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() == StripState::LinkLost; }, 15000));
    shoot(*window, dir, tag + QStringLiteral("-link-lost"));
    ASSERT_TRUE(waitUntil([&] { return strip->sweepState() != StripState::LinkLost; }, 20000));
    // A zoomed chart, with the sweep paused so nothing moves meanwhile.
    ASSERT_TRUE(waitUntil([&] { return workspace->readings().size() >= 6; }, 30000));
    strip->pauseAction()->trigger();
    window->chart()->chartView()->zoomBy(1.8);
    shoot(*window, dir, tag + QStringLiteral("-chart-zoomed"));
    // The efficiency and losses, in their tab under the V–I chart, with the plan's figures.
    if (window->efficiencyOffered()) {
        window->lowerCharts()->setCurrentWidget(window->efficiencyChart());
        window->findChild<QTabWidget *>()->setCurrentIndex(1);
        shoot(*window, dir, tag + QStringLiteral("-efficiency"));
    }
    usePalette(false);
}

} // namespace

TEST(ScreenshotTour, WindowStatesAtTwoSizesLightAndDark)
{
    const QString dir = qEnvironmentVariable("SAGLINE_SHOTS_DIR");
    if (dir.isEmpty())
        GTEST_SKIP() << "set SAGLINE_SHOTS_DIR to a folder to take the screenshots";
    QDir().mkpath(dir);
    for (const QSize size : {QSize(1366, 768), QSize(1600, 1000)}) {
        for (const bool dark : {false, true})
            tour(size, dark, dir);
    }
}
