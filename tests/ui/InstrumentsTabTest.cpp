// The instruments tab before a sweep: the serial settings and a programmable load's address
// reach the links, the status of one source is cleared when another is picked, Connect and
// test shows each meter's *IDN?, function and one live reading, and a no-load reading far from
// the nameplate (a wrong tap, winding or range) is asked about before the sweep goes on.
#include "UiTestSupport.h"

#include "InstrumentRig.h"
#include "InstrumentsPanel.h"
#include "LinkAddress.h"
#include "LinkSweep.h"
#include "PlanPanel.h"
#include "RigForSource.h"
#include "SimProcess.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QLineEdit>
#include <QPushButton>

using namespace sagline;
using namespace sagline::test;

namespace {

void pick(QComboBox *box, const QVariant &data)
{
    const int index = box->findData(data);
    ASSERT_GE(index, 0) << data.toString().toStdString();
    box->setCurrentIndex(index);
}

} // namespace

TEST(InstrumentsTab, SerialSettingsAndLoadAddressReachTheLinks)
{
    InstrumentsPanel panel;
    pick(panel.sourceBox(), int(ReadingSource::SerialPort));
    panel.portBox()->setEditText(QStringLiteral("/dev/ttyUSB0"));
    panel.baudBox()->setEditText(QStringLiteral("19200"));
    pick(panel.dataBitsBox(), 7);
    pick(panel.parityBox(), QStringLiteral("E"));
    pick(panel.stopBitsBox(), QStringLiteral("2"));
    pick(panel.flowBox(), QStringLiteral("rtscts"));
    panel.loadEdit()->setText(QStringLiteral("127.0.0.1:5099"));
    const SourceChoice choice = panel.choice();
    EXPECT_EQ(choice.serialPort, QStringLiteral("/dev/ttyUSB0"));
    EXPECT_EQ(choice.serialFormat, QStringLiteral("19200,7E2,rtscts"));
    EXPECT_EQ(choice.loadAddress, QStringLiteral("127.0.0.1:5099"));

    // The address the link is made from carries every setting.
    const LinkAddressParse parsed = parseLinkAddress(withSerialFormat(choice.serialPort, choice.serialFormat));
    ASSERT_TRUE(parsed.address.has_value()) << parsed.error.toStdString();
    EXPECT_EQ(parsed.address->serial.baudRate, 19200);
    EXPECT_EQ(parsed.address->serial.dataBits, QSerialPort::Data7);
    EXPECT_EQ(parsed.address->serial.parity, QSerialPort::EvenParity);
    EXPECT_EQ(parsed.address->serial.stopBits, QSerialPort::TwoStop);
    EXPECT_EQ(parsed.address->serial.flowControl, QSerialPort::HardwareControl);
    // An address typed with its own settings keeps them; a LAN address takes none.
    EXPECT_EQ(withSerialFormat(QStringLiteral("/dev/ttyS1,4800"), choice.serialFormat), QStringLiteral("/dev/ttyS1,4800"));
    EXPECT_EQ(withSerialFormat(QStringLiteral("10.0.0.2:5025"), choice.serialFormat), QStringLiteral("10.0.0.2:5025"));

    // The rig has the programmable load (nothing is connected yet).
    QString error;
    std::unique_ptr<InstrumentRig> rig(rigForSource(choice, &error));
    ASSERT_NE(rig, nullptr) << error.toStdString();
    EXPECT_NE(rig->load(), nullptr);

    // The choice comes back into the boxes (saved settings, a reopened window).
    InstrumentsPanel other;
    other.setChoice(choice);
    EXPECT_EQ(other.choice().serialFormat, choice.serialFormat);
    EXPECT_EQ(other.choice().loadAddress, choice.loadAddress);
}

TEST(InstrumentsTab, AnotherSourceClearsTheOldStatus)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    InstrumentsPanel *panel = window->instrumentsPanel();
    pick(panel->sourceBox(), int(ReadingSource::VirtualBench));
    panel->setStatus(QStringLiteral("connected\nmeter: Sagline Virtual Bench,VB-P2"));
    panel->setTestResult(QStringLiteral("meter (virtual): *IDN?: Sagline Virtual Bench"), true);
    pick(panel->sourceBox(), int(ReadingSource::Lan));
    EXPECT_EQ(panel->statusText(), QStringLiteral("Status: not connected"));
    EXPECT_TRUE(panel->testResultText().isEmpty());
    EXPECT_FALSE(window->sourceStatusText().contains(QStringLiteral("connected "))) << window->sourceStatusText().toStdString();
}

TEST(InstrumentsTab, ConnectAndTestShowsIdentityFunctionAndAReading)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    InstrumentsPanel *panel = window->instrumentsPanel();
    pick(panel->sourceBox(), int(ReadingSource::VirtualBench));
    QTest::mouseClick(panel->testButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return panel->testButton()->isEnabled() && panel->testResultText().contains("*IDN?"); }, 15000))
        << panel->testResultText().toStdString();
    const QString result = panel->testResultText();
    EXPECT_TRUE(result.contains(QStringLiteral("Virtual Bench"))) << result.toStdString();
    EXPECT_TRUE(result.contains(QStringLiteral("secondary voltmeter"))) << result.toStdString();
    EXPECT_TRUE(result.contains(QStringLiteral("MEAS"))) << result.toStdString(); // the configured query
    EXPECT_TRUE(result.contains(QRegularExpression(QStringLiteral(": [0-9.]+.?V\\n")))) << result.toStdString();
    EXPECT_FALSE(result.contains(QStringLiteral("✖"))) << result.toStdString();
    EXPECT_FALSE(window->workspace()->isRunning()); // nothing started, nothing recorded
    EXPECT_EQ(window->workspace()->store(), nullptr);

    // Readings typed in by hand: nothing to test.
    pick(panel->sourceBox(), int(ReadingSource::TypedIn));
    EXPECT_FALSE(panel->testButton()->isEnabled());
}

TEST(InstrumentsTab, ANoLoadReadingFarFromTheNameplateIsAskedAbout)
{
    // The simulator is the demo transformer (19.6 V at no load); the window's nameplate says
    // 26.4 V, as a unit wired to the wrong tap would read. Its programmable load, on the LAN,
    // steps the sweep by itself.
    QTemporaryDir links;
    SimProcess sim;
    QString error;
    ASSERT_TRUE(sim.start(links.path(), quietSimArguments(QStringLiteral("NL")), &error)) << error.toStdString();
    const auto meter = sim.endpoint(QStringLiteral("power-meter"));
    const auto load = sim.endpoint(QStringLiteral("load"));
    ASSERT_TRUE(meter && load) << sim.output().toStdString();

    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    QStringList asked;
    bool keepGoing = false;
    window->setConfirmPrompt([&](const QString &title, const QString &text) {
        asked << title + QStringLiteral(": ") + text;
        return title == QLatin1String("Stop the sweep") || keepGoing;
    });
    typeInto(window->setupForm()->quantityField(QStringLiteral("nameplate.secondary_no_load_voltage_v")), QStringLiteral("26.4 V"));
    typeInto(window->setupForm()->quantityField(QStringLiteral("nameplate.secondary_voltage_v")), QStringLiteral("24 V"));
    typeInto(window->setupForm()->quantityField(QStringLiteral("bench.steps")), QStringLiteral("2"));
    window->setupForm()->setSessionDetails({QStringLiteral("Tap tester"), QStringLiteral("NL-1"), QStringLiteral("20 °C"), {}});
    InstrumentsPanel *panel = window->instrumentsPanel();
    pick(panel->sourceBox(), int(ReadingSource::Lan));
    panel->addressEdit()->setText(QStringLiteral("127.0.0.1:%1").arg(meter->tcpPort));
    panel->loadEdit()->setText(QStringLiteral("127.0.0.1:%1").arg(load->tcpPort));
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();

    ASSERT_TRUE(waitUntil([&] { return !asked.isEmpty(); }, 30000)) << window->lastMessage().toStdString();
    EXPECT_TRUE(asked.front().startsWith(QStringLiteral("Check the no-load reading"))) << asked.front().toStdString();
    EXPECT_TRUE(asked.front().contains(QStringLiteral("26.40 V"))) << asked.front().toStdString();
    EXPECT_TRUE(asked.front().contains(QStringLiteral("tap"))) << asked.front().toStdString();
    // Declined: the sweep stops with the one reading kept.
    ASSERT_TRUE(waitUntil([&] { return !window->workspace()->isRunning(); }, 15000));
    EXPECT_EQ(window->workspace()->readings().size(), 1u);
    EXPECT_EQ(asked.size(), 1);
}
