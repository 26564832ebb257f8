// Whole sweeps through the window against sagline-sim running as its own process: its two-channel
// meter on a pseudo-terminal typed in as the serial port, or on loopback TCP typed in as the LAN
// address; or its voltmeter on a pty and its separate ammeter on loopback TCP. The test plays the operator: it sets the simulator's load for each step over the
// load's own SCPI link, then clicks the window's "Load is set" (Record) button. Wall time, with
// a short dwell, a quiet simulator (low noise) and no copper heating so a sweep takes seconds.
// Also: the simulator killed mid-sweep.
#include "RefusedLanStart.h"
#include "UiTestSupport.h"

#include "SimProcess.h"

#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "ResultsPanel.h"
#include "SessionStore.h"
#include "SessionSummary.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QDir>
#include <QPushButton>
#include <QTcpServer>

#include <cmath>

using namespace sagline;
using namespace sagline::test;

namespace {

// The simulator's meters: a fixed gain error drawn within a third of their ±(0.5 % + 3 counts)
// spec (instruments/VirtualBench.h), which no fit can see; R = ΔV/ΔI carries both meters'.
constexpr double benchGainAllowance = 2.0 * 0.005 / 3.0;

struct LinkSweep {
    QTemporaryDir folder;
    QTemporaryDir links;
    SimProcess sim;
    std::unique_ptr<MainWindow> window;

    // Starts the simulator and a window on the demo setup with a short plan, then connects
    // through the panel as a person does: the source picked, the address typed, Enter pressed.
    // `twoMeters`: the simulator's voltmeter at that source and its ammeter on the LAN, typed
    // into the separate-ammeter field; otherwise its two-channel power meter reads both.
    ::testing::AssertionResult connect(ReadingSource source, bool twoMeters = false)
    {
        QString error;
        if (!sim.start(links.path(), {QStringLiteral("--seed"), QStringLiteral("7"), QStringLiteral("--rated-rise"), QStringLiteral("0"),
                                      QStringLiteral("--noise-v"), QStringLiteral("0.0005"), QStringLiteral("--noise-a"),
                                      QStringLiteral("0.0002")},
                       &error))
            return ::testing::AssertionFailure() << error.toStdString();
        const auto meter = sim.endpoint(twoMeters ? QStringLiteral("voltmeter") : QStringLiteral("power-meter"));
        const auto ammeter = sim.endpoint(QStringLiteral("ammeter"));
        if (!meter || !ammeter)
            return ::testing::AssertionFailure() << "no meter lines in: " << sim.output().toStdString();
        identities.clear();
        if (twoMeters)
            identities = {{QStringLiteral("voltmeter"), meter->identity}, {QStringLiteral("ammeter"), ammeter->identity}};
        else
            identities = {{QStringLiteral("meter"), meter->identity}};

        window = demoWindow(folder.path());
        window->setupForm()->setSessionDetails({QStringLiteral("Link tester"), QStringLiteral("LK-1"), QStringLiteral("20 °C"), {}});
        typeInto(window->setupForm()->quantityField(QStringLiteral("bench.steps")), QStringLiteral("5"));
        typeInto(window->setupForm()->quantityField(QStringLiteral("bench.dwell_s")), QStringLiteral("50 ms"));
        InstrumentsPanel *panel = window->instrumentsPanel();
        QComboBox *box = panel->sourceBox();
        if (panel->ammeterEdit()->isVisibleTo(panel))
            return ::testing::AssertionFailure() << "a separate-ammeter field shown for the virtual bench";
        box->setCurrentIndex(box->findData(int(source)));
        if (source == ReadingSource::SerialPort) {
            typeInto(panel->portBox()->lineEdit(), meter->ptyLink);
            QTest::keyClick(panel->portBox()->lineEdit(), Qt::Key_Return);
        } else {
            typeInto(panel->addressEdit(), QStringLiteral("127.0.0.1:%1").arg(meter->tcpPort));
            QTest::keyClick(panel->addressEdit(), Qt::Key_Return);
        }
        if (twoMeters) {
            if (!panel->ammeterEdit()->isVisibleTo(panel))
                return ::testing::AssertionFailure() << "no separate-ammeter field for this source";
            typeInto(panel->ammeterEdit(), QStringLiteral("127.0.0.1:%1").arg(ammeter->tcpPort));
        }
        QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
        SweepWorkspace *workspace = window->workspace();
        if (!workspace->isRunning())
            return ::testing::AssertionFailure() << "not started: " << window->lastMessage().toStdString();
        if (!waitUntil([&] { return !workspace->run() || !workspace->run()->isConnecting(); }, 8000))
            return ::testing::AssertionFailure() << "still connecting: " << panel->statusText().toStdString();
        if (!workspace->isRunning())
            return ::testing::AssertionFailure() << "not connected: " << panel->statusText().toStdString();
        return ::testing::AssertionSuccess();
    }

    const Plan &plan() const { return *window->workspace()->plan(); }
    SweepController *controller() const { return window->workspace()->run()->controller(); }

    // Step `i` of the plan: wait for the window to ask, set the load, click the button, wait
    // until the reading is in the table.
    ::testing::AssertionResult recordStep(std::size_t i, bool waitForReading = true)
    {
        SweepWorkspace *workspace = window->workspace();
        const PlanStep &step = plan().steps[i];
        if (!waitUntil([&] { return controller()->state() == SweepState::WaitingForLoad && controller()->currentStep() == step.index; },
                       8000))
            return ::testing::AssertionFailure() << "step " << step.index << " never asked for; state "
                                                 << toString(controller()->state()).toStdString() << ", "
                                                 << window->lastMessage().toStdString();
        QString error;
        if (!sim.setLoad(step.loadResistanceOhm, &error))
            return ::testing::AssertionFailure() << error.toStdString();
        QPushButton *record = window->nextStep()->recordButton();
        if (!record->isEnabled())
            return ::testing::AssertionFailure() << "the Record button is disabled at step " << step.index;
        QTest::mouseClick(record, Qt::LeftButton);
        if (waitForReading && !waitUntil([&] { return workspace->readings().size() == i + 1; }, 8000))
            return ::testing::AssertionFailure() << "step " << step.index << " not recorded; state "
                                                 << toString(controller()->state()).toStdString() << ", "
                                                 << window->lastMessage().toStdString();
        return ::testing::AssertionSuccess();
    }

    QList<QPair<QString, QString>> identities; // instrument name, its *IDN? answer
};

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
