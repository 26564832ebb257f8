// Whole sweeps through the window against sagline-sim running as its own process: its two-channel
// meter on a pseudo-terminal typed in as the serial port, or on loopback TCP typed in as the LAN
// address. The test plays the operator: it sets the simulator's load for each step over the
// load's own SCPI link, then clicks the window's "Load is set" (Record) button. Wall time, with
// a short dwell, a quiet simulator (low noise) and no copper heating so a sweep takes seconds.
// Also: the simulator killed mid-sweep.
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
#include <QPushButton>

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
    ::testing::AssertionResult connect(ReadingSource source)
    {
        QString error;
        if (!sim.start(links.path(), {QStringLiteral("--seed"), QStringLiteral("7"), QStringLiteral("--rated-rise"), QStringLiteral("0"),
                                      QStringLiteral("--noise-v"), QStringLiteral("0.0005"), QStringLiteral("--noise-a"),
                                      QStringLiteral("0.0002")},
                       &error))
            return ::testing::AssertionFailure() << error.toStdString();
        const auto meter = sim.endpoint(QStringLiteral("power-meter"));
        if (!meter)
            return ::testing::AssertionFailure() << "no power-meter line in: " << sim.output().toStdString();
        identity = meter->identity;

        window = demoWindow(folder.path());
        window->setupForm()->setSessionDetails({QStringLiteral("Link tester"), QStringLiteral("LK-1"), QStringLiteral("20 °C"), {}});
        typeInto(window->setupForm()->quantityField(QStringLiteral("bench.steps")), QStringLiteral("5"));
        typeInto(window->setupForm()->quantityField(QStringLiteral("bench.dwell_s")), QStringLiteral("50 ms"));
        InstrumentsPanel *panel = window->instrumentsPanel();
        QComboBox *box = panel->sourceBox();
        box->setCurrentIndex(box->findData(int(source)));
        if (source == ReadingSource::SerialPort) {
            typeInto(panel->portBox()->lineEdit(), meter->ptyLink);
            QTest::keyClick(panel->portBox()->lineEdit(), Qt::Key_Return);
        } else {
            typeInto(panel->addressEdit(), QStringLiteral("127.0.0.1:%1").arg(meter->tcpPort));
            QTest::keyClick(panel->addressEdit(), Qt::Key_Return);
        }
        QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
        SweepWorkspace *workspace = window->workspace();
        if (!workspace->isRunning())
            return ::testing::AssertionFailure() << "not started: " << window->lastMessage().toStdString();
        if (!waitUntil([&] { return !workspace->run()->isConnecting(); }, 8000))
            return ::testing::AssertionFailure() << "still connecting: " << panel->statusText().toStdString();
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

    QString identity;
};

void runWholeSweep(ReadingSource source)
{
    LinkSweep s;
    ASSERT_TRUE(s.connect(source));
    InstrumentsPanel *panel = s.window->instrumentsPanel();
    // The meter's own answer to *IDN?, as the simulator printed it, is shown under its name.
    EXPECT_TRUE(panel->statusText().contains(QStringLiteral("connected"))) << panel->statusText().toStdString();
    EXPECT_TRUE(panel->statusText().contains(QStringLiteral("meter: ") + s.identity))
        << panel->statusText().toStdString() << " / " << s.identity.toStdString();

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
    ASSERT_EQ(instruments.value.size(), 1u);
    EXPECT_EQ(instruments.value.front().role, "secondary_voltage,secondary_current"); // one meter, both roles
    EXPECT_EQ(instruments.value.front().identity, s.identity.toStdString());
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
