// Whole sweeps through the window against sagline-sim running as its own process: its two-channel
// meter on a pseudo-terminal typed in as the serial port, or on loopback TCP typed in as the LAN
// address; or its voltmeter on a pty and its separate ammeter on loopback TCP. The test plays the operator: it sets the simulator's load for each step over the
// load's own SCPI link, then clicks the window's Record button. Wall time, with
// a short dwell, a quiet simulator (low noise) and no copper heating so a sweep takes seconds.
// Also: the simulator killed mid-sweep.
#include "LinkSweep.h"
#include "RefusedLanStart.h"

#include "ResultsPanel.h"
#include "SessionStore.h"
#include "SessionSummary.h"

#include <QDir>

#include <cmath>

using namespace sagline;
using namespace sagline::test;

namespace {

// The simulator's meters: a fixed gain error drawn within a third of their ±(0.5 % + 3 counts)
// spec (instruments/VirtualBench.h), which no fit can see; R = ΔV/ΔI carries both meters'.
constexpr double benchGainAllowance = 2.0 * 0.005 / 3.0;

void runWholeSweep(ReadingSource source, bool twoMeters = false)
{
    LinkSweep s;
    ASSERT_TRUE(s.connect(source, twoMeters));
    InstrumentsPanel *panel = s.window->instrumentsPanel();
    // Each meter's own answer to *IDN?, as the simulator printed it, is shown under its name.
    EXPECT_TRUE(panel->statusText().contains(QStringLiteral("connected"))) << panel->statusText().toStdString();
    for (const auto &[name, identity] : s.identities)
        EXPECT_TRUE(panel->statusText().contains(name + QStringLiteral(": ") + identity))
            << panel->statusText().toStdString() << " / " << identity.toStdString();

    const std::size_t steps = s.plan().steps.size();
    ASSERT_EQ(steps, 6u); // 5 load steps and the open circuit
    for (std::size_t i = 0; i < steps; ++i)
        ASSERT_TRUE(s.recordStep(i));
    SweepWorkspace *workspace = s.window->workspace();
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }, 5000));
    EXPECT_EQ(s.controller()->state(), SweepState::Finished);

    // Every step once, in order, from the meters (not the in-process virtual bench).
    const std::vector<Reading> shown = workspace->readings();
    ASSERT_EQ(shown.size(), steps);
    for (std::size_t i = 0; i < steps; ++i) {
        EXPECT_EQ(shown[i].step, s.plan().steps[i].index);
        EXPECT_FALSE(shown[i].flags & flagSimulated);
        EXPECT_FALSE(shown[i].excluded);
    }

    // R shown against the simulator's true R (no heating): within the fit's U plus the meters'
    // fixed gain errors.
    s.window->flushCharts();
    const QString shownText = s.window->results()->value(QStringLiteral("series_resistance"));
    const double shownR = shownValue(shownText, Unit::Ohm);
    const auto uPart = parseQuantity(shownText.section(QStringLiteral(" ± "), 1, 1).toStdString(), Unit::Ohm);
    ASSERT_TRUE(uPart.ok) << shownText.toStdString();
    const double trueR = s.sim.seriesResistanceOhm();
    ASSERT_GT(trueR, 0.0);
    EXPECT_NEAR(shownR, trueR, uPart.value + benchGainAllowance * trueR) << shownText.toStdString();

    // The session file holds the same readings, the meter's identity and the same fit.
    auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok()) << stored.message;
    const auto readings = stored.value->readings();
    ASSERT_TRUE(readings.ok());
    ASSERT_EQ(readings.value.size(), steps);
    for (std::size_t i = 0; i < steps; ++i) {
        EXPECT_EQ(readings.value[i].step, shown[i].step);
        EXPECT_DOUBLE_EQ(readings.value[i].currentA, shown[i].currentA);
        EXPECT_DOUBLE_EQ(readings.value[i].voltageV, shown[i].voltageV);
    }
    const auto instruments = stored.value->instruments();
    ASSERT_TRUE(instruments.ok());
    ASSERT_EQ(instruments.value.size(), s.identities.size());
    if (twoMeters) {
        EXPECT_EQ(instruments.value[0].role, "secondary_voltage");
        EXPECT_EQ(instruments.value[1].role, "secondary_current");
    } else {
        EXPECT_EQ(instruments.value[0].role, "secondary_voltage,secondary_current"); // one meter, both roles
    }
    for (qsizetype i = 0; i < s.identities.size(); ++i)
        EXPECT_EQ(instruments.value[static_cast<std::size_t>(i)].identity, s.identities[i].second.toStdString());
    stored.value.reset();
    const auto summary = loadSessionSummary(workspace->sessionPath().toStdString());
    ASSERT_TRUE(summary.ok()) << summary.message;
    ASSERT_TRUE(summary.value.fit.ok()) << summary.value.fit.message;
    EXPECT_NEAR(summary.value.fit.seriesResistanceOhm(), shownR, 0.001 * trueR);
}

} // namespace

TEST(SerialAndLanSweep, SerialPortPathTypedInRunsTheWholeSweep)
{
    runWholeSweep(ReadingSource::SerialPort);
}

TEST(SerialAndLanSweep, LanAddressTypedInRunsTheWholeSweep)
{
    runWholeSweep(ReadingSource::Lan);
}

TEST(SerialAndLanSweep, VoltmeterOnASerialPortAndAmmeterOnTheLanRunTheWholeSweep)
{
    runWholeSweep(ReadingSource::SerialPort, true);
}

TEST(SerialAndLanSweep, AWrongAmmeterAddressIsRefusedNamingIt)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->setupForm()->setSessionDetails({QStringLiteral("Link tester"), QStringLiteral("LK-3"), {}, {}});
    InstrumentsPanel *panel = window->instrumentsPanel();
    panel->sourceBox()->setCurrentIndex(panel->sourceBox()->findData(int(ReadingSource::Lan)));
    typeInto(panel->addressEdit(), QStringLiteral("127.0.0.1:5025"));
    typeInto(panel->ammeterEdit(), QStringLiteral("tcp:127.0.0.1:99999"));
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    EXPECT_FALSE(window->workspace()->isRunning());
    EXPECT_TRUE(window->lastMessage().contains(QStringLiteral("ammeter address"))) << window->lastMessage().toStdString();
    EXPECT_TRUE(window->lastMessage().contains(QStringLiteral("99999"))) << window->lastMessage().toStdString();
    // Nothing could be recorded: no empty session file is left in the folder.
    EXPECT_TRUE(QDir(folder.path()).entryList({QStringLiteral("*.sagline")}, QDir::Files).isEmpty());
    EXPECT_TRUE(window->workspace()->sessionPath().isEmpty());
}

TEST(SerialAndLanSweep, NoMeterAtTheAddressSaysSoLeavesNoEmptySessionAndCanBeRetried)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    startOnRefusedLanPort(*window, QStringLiteral("Link tester"), QStringLiteral("LK-4"));
    InstrumentsPanel *panel = window->instrumentsPanel();
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }, 8000)) << panel->statusText().toStdString();
    EXPECT_TRUE(panel->statusText().contains(QStringLiteral("cannot connect"))) << panel->statusText().toStdString();
    ASSERT_TRUE(waitUntil([&] { return workspace->sessionPath().isEmpty(); }, 2000));
    EXPECT_TRUE(QDir(folder.path()).entryList({QStringLiteral("*.sagline")}, QDir::Files).isEmpty());
    EXPECT_FALSE(window->nextStep()->recordButton()->isEnabled());
    // The address can be corrected and the plan accepted again.
    EXPECT_TRUE(panel->addressEdit()->isEnabled());
    EXPECT_TRUE(panel->sourceBox()->isEnabled());
    EXPECT_TRUE(window->planPanel()->acceptButton()->isEnabled());
}
