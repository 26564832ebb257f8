// Whole sweeps on the virtual bench through the window, on simulated time (seconds, not
// minutes): every step recorded and the transformer's R found; and a safety stop shown as an
// alarm naming the limit, recorded in the session.
#include "UiTestSupport.h"

#include "CautionStrip.h"
#include "InstrumentsPanel.h"
#include "PlanPanel.h"
#include "ResultsPanel.h"
#include "SessionStore.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"
#include "VirtualBench.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QPushButton>

using namespace sagline;
using namespace sagline::test;

namespace {

void startOnVirtualBench(MainWindow &window)
{
    window.workspace()->setSimulatedTime(true);
    window.setupForm()->setSessionDetails({QStringLiteral("Bench tester"), QStringLiteral("VB-7"), QStringLiteral("20 °C"), {}});
    QComboBox *source = window.instrumentsPanel()->sourceBox();
    source->setCurrentIndex(source->findData(int(ReadingSource::VirtualBench)));
    QTest::mouseClick(window.planPanel()->acceptButton(), Qt::LeftButton);
}

} // namespace

TEST(VirtualBenchSweep, RecordsEveryStepAndFindsTheBenchResistance)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    startOnVirtualBench(*window);
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    ASSERT_NE(workspace->run()->bench(), nullptr);
    // The meters' status stays in sight in the status bar, whatever tab is open.
    ASSERT_TRUE(waitUntil([&] { return window->sourceStatusText().contains(QStringLiteral(": connected")); }, 5000))
        << window->sourceStatusText().toStdString();
    EXPECT_TRUE(window->sourceStatusText().startsWith(QStringLiteral("Virtual bench"))) << window->sourceStatusText().toStdString();
    const double benchR = workspace->run()->bench()->options().transformer.seriesResistanceOhm;
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }, 20000))
        << window->lastMessage().toStdString() << " connecting " << workspace->run()->isConnecting() << " state "
        << toString(workspace->run()->controller()->state()).toStdString() << " readings " << workspace->readings().size();

    const std::size_t steps = workspace->plan()->steps.size();
    EXPECT_EQ(workspace->readings().size(), steps) << window->lastMessage().toStdString();
    window->flushCharts();
    EXPECT_EQ(window->chart()->drawnIncludedCount(), static_cast<int>(steps));
    EXPECT_GE(window->chart()->drawnFitPointCount(), 2);
    // The bench's copper warms a little during the sweep (its thermal model) and the meters
    // carry gain errors within their spec, so R agrees to a few per cent, not exactly.
    const double shownR = shownValue(window->results()->value("series_resistance"), Unit::Ohm);
    EXPECT_NEAR(shownR, benchR, 0.05 * benchR) << window->results()->value("series_resistance").toStdString();
    EXPECT_FALSE(window->caution()->isAlarmShown());
    for (const Reading &reading : workspace->readings())
        EXPECT_TRUE(reading.flags & flagSimulated);
}

TEST(VirtualBenchSweep, ABlownPrimaryFuseStopsWithAnAlarmAndIsRecorded)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    // A 40 mA time-lag primary fuse on a 60 VA, 230 V transformer (rated primary current
    // about 0.26 A): it opens early in the sweep (IEC 60127-2 gates in the bench's fuse model).
    typeInto(window->setupForm()->quantityField("bench.fuse.rating_a"), "40 mA");
    // The plan already says the fuse opens from step 3: Accept stays disabled until the limits
    // are overridden with a reason (recorded); the bench's own stop is what is tested here.
    EXPECT_FALSE(window->planPanel()->acceptButton()->isEnabled());
    EXPECT_TRUE(window->planPanel()->acceptBlockedReason().contains("the primary fuse (40.0 mA time-lag) opens"))
        << window->planPanel()->acceptBlockedReason().toStdString();
    answerPrompts(*window, {QStringLiteral("checking that the bench stops on a blown fuse")});
    QTest::mouseClick(window->planPanel()->overrideButton(), Qt::LeftButton);
    EXPECT_TRUE(window->planPanel()->acceptButton()->isEnabled());
    startOnVirtualBench(*window);
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }, 20000));

    EXPECT_TRUE(window->caution()->isAlarmShown());
    const QString alarm = window->caution()->alarmText();
    EXPECT_TRUE(alarm.contains("fuse", Qt::CaseInsensitive)) << alarm.toStdString();
    EXPECT_LT(workspace->readings().size(), workspace->plan()->steps.size());
    // The tripping reading is kept, excluded from the fit.
    ASSERT_FALSE(workspace->readings().empty());
    EXPECT_TRUE(workspace->readings().back().excluded);

    auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok()) << stored.message;
    const auto stops = stored.value->safetyStops();
    ASSERT_TRUE(stops.ok());
    ASSERT_EQ(stops.value.size(), 1u);
    EXPECT_EQ(stops.value.front().rule, "fuse-open");
    const auto events = stored.value->sweepEvents().value;
    ASSERT_FALSE(events.empty());
    EXPECT_EQ(events.front().kind, SweepEventKind::LimitOverride);
    EXPECT_EQ(events.front().actor.person, testPerson.toStdString());
    EXPECT_NE(events.front().detail.find("checking that the bench stops on a blown fuse"), std::string::npos);
}
