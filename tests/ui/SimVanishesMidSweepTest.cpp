// The simulator killed (SIGKILL, like a pulled plug or a crashed meter server) in the middle of
// a sweep through the window, over a serial port (its pty goes away) and over the LAN (its TCP
// peer goes away): the panel says the link is lost, nothing is recorded for the step that was
// being read, every earlier reading stays in the table and in the session file, and the
// operator can still stop the sweep cleanly.
#include "LinkSweep.h"

#include "SessionStore.h"

using namespace sagline;
using namespace sagline::test;

namespace {

void killMidSweep(ReadingSource source)
{
    LinkSweep s;
    ASSERT_TRUE(s.connect(source));
    InstrumentsPanel *panel = s.window->instrumentsPanel();
    SweepWorkspace *workspace = s.window->workspace();
    SweepController *controller = s.controller();
    const Plan &plan = s.plan();
    QPushButton *record = s.window->nextStep()->recordButton();

    // Three steps recorded normally.
    constexpr std::size_t before = 3;
    for (std::size_t i = 0; i <= before; ++i)
        ASSERT_TRUE(s.recordStep(i, i < before));
    // The fourth step is being read (the button was just clicked): the simulator dies.
    const std::vector<Reading> kept = workspace->readings();
    ASSERT_EQ(kept.size(), before);
    s.sim.kill();

    // "Status: link lost at step 3: meter (tcp 127.0.0.1:41639): ... The remote host closed the
    // connection. Recorded points are kept; ..."
    const QString lostAt = QStringLiteral("link lost at step %1").arg(plan.steps[before].index);
    ASSERT_TRUE(waitUntil([&] { return panel->statusText().contains(lostAt); }, 8000)) << panel->statusText().toStdString();
    EXPECT_FALSE(panel->statusText().contains(QStringLiteral("link lost: link lost"))) << panel->statusText().toStdString();
    EXPECT_TRUE(panel->statusText().contains(QStringLiteral("Recorded points are kept")));
    EXPECT_EQ(controller->state(), SweepState::Paused);
    EXPECT_TRUE(workspace->isRunning()); // paused, waiting for the link: not ended, not failed
    // The meter stays away through its reconnect attempts (one a second): nothing more is
    // recorded, and clicking Record while the link is down takes nothing either.
    QTest::mouseClick(record, Qt::LeftButton);
    waitUntil([] { return false; }, 1500);
    EXPECT_EQ(workspace->readings().size(), before);
    EXPECT_TRUE(panel->statusText().contains(QStringLiteral("link lost"))) << panel->statusText().toStdString();

    // The operator stops the sweep; the session keeps the three readings unchanged and says why
    // the sweep paused.
    QPushButton *stop = s.window->nextStep()->stopButton();
    ASSERT_TRUE(stop->isEnabled());
    QTest::mouseClick(stop, Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }, 5000)) << toString(controller->state()).toStdString();
    ASSERT_EQ(workspace->readings().size(), before);
    auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok()) << stored.message;
    const auto readings = stored.value->readings();
    ASSERT_TRUE(readings.ok());
    ASSERT_EQ(readings.value.size(), before);
    for (std::size_t i = 0; i < before; ++i) {
        EXPECT_EQ(readings.value[i].id, kept[i].id);
        EXPECT_EQ(readings.value[i].step, plan.steps[i].index);
        EXPECT_DOUBLE_EQ(readings.value[i].voltageV, kept[i].voltageV);
        EXPECT_DOUBLE_EQ(readings.value[i].currentA, kept[i].currentA);
        EXPECT_FALSE(readings.value[i].excluded);
    }
    const auto stops = stored.value->safetyStops();
    ASSERT_TRUE(stops.ok());
    EXPECT_TRUE(stops.value.empty()); // a lost link is not a safety stop
    const auto notes = stored.value->notes();
    ASSERT_TRUE(notes.ok());
    bool lossNoted = false;
    for (const auto &note : notes.value)
        lossNoted = lossNoted || note.text.find("link lost at step " + std::to_string(plan.steps[before].index)) != std::string::npos;
    EXPECT_TRUE(lossNoted);
}

} // namespace

TEST(SimVanishesMidSweep, OverASerialPortLinkLossIsShownAndNothingIsLost)
{
    killMidSweep(ReadingSource::SerialPort);
}

TEST(SimVanishesMidSweep, OverTheLanLinkLossIsShownAndNothingIsLost)
{
    killMidSweep(ReadingSource::Lan);
}

TEST(SimVanishesMidSweep, OverASerialPortTheSimComingBackResumesTheSweepAtTheSameStep)
{
    // The simulator restarted on the same pty link path (same serial numbers, the same meters): the
    // meter reconnects on its own; the window asks the operator to check the interrupted step's
    // load again and reads nothing until Record is clicked; then the step is read again
    // and the sweep completes, every step once, in order.
    LinkSweep s;
    ASSERT_TRUE(s.connect(ReadingSource::SerialPort));
    InstrumentsPanel *panel = s.window->instrumentsPanel();
    SweepWorkspace *workspace = s.window->workspace();
    SweepController *controller = s.controller();
    const Plan &plan = s.plan();
    for (std::size_t i = 0; i < 3; ++i)
        ASSERT_TRUE(s.recordStep(i));
    ASSERT_TRUE(s.recordStep(3, false));
    s.sim.kill();
    ASSERT_TRUE(waitUntil([&] { return panel->statusText().contains(QStringLiteral("link lost at step 3")); }, 8000))
        << panel->statusText().toStdString();

    // A restarted simulator starts with its load open: like a rheostat moved while the meter
    // was away. Nothing may be read at that load.
    QString error;
    ASSERT_TRUE(s.sim.start(s.links.path(), s.simArguments(), &error)) << error.toStdString();
    ASSERT_TRUE(waitUntil([&] { return panel->statusText().contains(QStringLiteral("link restored")); }, 8000))
        << panel->statusText().toStdString();
    ASSERT_TRUE(waitUntil([&] { return controller->state() == SweepState::WaitingForLoad; }, 8000))
        << toString(controller->state()).toStdString();
    ASSERT_TRUE(s.asksAgainAndHolds(QStringLiteral("link restored: check the load is still at about"), plan.steps[3]));
    EXPECT_EQ(workspace->readings().size(), 3u);
    // The operator puts the load back and confirms: the step is read at that load.
    ASSERT_TRUE(s.recordStep(3));
    EXPECT_NEAR(workspace->readings()[3].currentA, plan.steps[3].currentA, 0.05 * plan.steps[3].currentA);
    ASSERT_TRUE(s.recordTheRestAndFinish(4));
}

TEST(SimVanishesMidSweep, AnotherSimulatorOnTheReusedPtyIsNotTakenForTheLostMeter)
{
    // The kernel hands the dead simulator's pty number to another test's simulator (same seed,
    // same model): its meter answers on the path the window reconnects to, but with a serial
    // number of its own, so it is refused and the link stays lost; nothing is read from it.
    LinkSweep s;
    ASSERT_TRUE(s.connect(ReadingSource::SerialPort));
    InstrumentsPanel *panel = s.window->instrumentsPanel();
    SweepWorkspace *workspace = s.window->workspace();
    for (std::size_t i = 0; i < 2; ++i)
        ASSERT_TRUE(s.recordStep(i));
    ASSERT_TRUE(s.recordStep(2, false));
    const QString original = s.sim.endpoint(QStringLiteral("power-meter"))->identity;
    s.sim.kill();
    ASSERT_TRUE(waitUntil([&] { return panel->statusText().contains(QStringLiteral("link lost at step")); }, 8000))
        << panel->statusText().toStdString();

    QTemporaryDir otherLinks;
    SimProcess stranger;
    QString error;
    ASSERT_TRUE(stranger.start(otherLinks.path(), quietSimArguments(QStringLiteral("OTHER")), &error)) << error.toStdString();
    const QString strangerPty = QFileInfo(stranger.endpoint(QStringLiteral("power-meter"))->ptyLink).symLinkTarget();
    ASSERT_FALSE(strangerPty.isEmpty());
    EXPECT_NE(stranger.endpoint(QStringLiteral("power-meter"))->identity, original);
    const QString link = s.sim.endpoint(QStringLiteral("power-meter"))->ptyLink;
    ASSERT_TRUE(QFile::remove(link));
    ASSERT_TRUE(QFile::link(strangerPty, link));

    // Reconnect attempts come once a second; give them a few on a loaded machine.
    const auto refusedNoted = [&] {
        auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
        if (!stored.ok())
            return false;
        const auto notes = stored.value->notes();
        for (const auto &note : notes.value) {
            if (note.text.find("a different instrument answered after reconnecting and is not used") != std::string::npos)
                return true;
        }
        return false;
    };
    ASSERT_TRUE(waitUntil(refusedNoted, 15000)) << panel->statusText().toStdString();
    waitUntil([] { return false; }, 1500);
    EXPECT_FALSE(panel->statusText().contains(QStringLiteral("link restored"))) << panel->statusText().toStdString();
    EXPECT_EQ(s.controller()->state(), SweepState::Paused);
    EXPECT_EQ(workspace->readings().size(), 2u);
    QTest::mouseClick(s.window->nextStep()->stopButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }, 5000));
    EXPECT_EQ(workspace->readings().size(), 2u);
}
