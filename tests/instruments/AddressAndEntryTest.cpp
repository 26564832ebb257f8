// Instrument addresses as typed on the command line, and typed-in readings per role.
#include "LinkAddress.h"
#include "ManualEntry.h"

#include <gtest/gtest.h>

using namespace sagline;

TEST(LinkAddress, SerialPortsWithBaudFormatAndFlow)
{
    auto plain = parseLinkAddress(QStringLiteral("/dev/ttyUSB0"));
    ASSERT_TRUE(plain.address) << plain.error.toStdString();
    EXPECT_EQ(plain.address->kind, LinkAddress::Kind::Serial);
    EXPECT_EQ(plain.address->serial.portName, QStringLiteral("/dev/ttyUSB0"));
    EXPECT_EQ(plain.address->serial.summary(), QStringLiteral("9600 8N1"));
    auto full = parseLinkAddress(QStringLiteral("COM3,115200,7E2,rtscts"));
    ASSERT_TRUE(full.address) << full.error.toStdString();
    EXPECT_EQ(full.address->serial.summary(), QStringLiteral("115200 7E2 RTS/CTS"));
    for (const char *bad : {"/dev/ttyS0,fast", "/dev/ttyS0,9600,9N1", "/dev/ttyS0,9600,8X1", "/dev/ttyS0,9600,8N3",
                            "/dev/ttyS0,9600,8N1,carrier", "/dev/ttyS0,9600,8N1,none,extra", ""}) {
        auto p = parseLinkAddress(QString::fromLatin1(bad));
        EXPECT_FALSE(p.address) << bad;
        EXPECT_FALSE(p.error.isEmpty()) << bad;
    }
}

TEST(LinkAddress, TcpWithTheScpiRawSocketPortByDefault)
{
    // Raw-socket SCPI listens on TCP 5025 by convention (FACTS.md §8).
    auto host = parseLinkAddress(QStringLiteral("tcp:192.0.2.7"));
    ASSERT_TRUE(host.address);
    EXPECT_EQ(host.address->kind, LinkAddress::Kind::Tcp);
    EXPECT_EQ(host.address->host, QStringLiteral("192.0.2.7"));
    EXPECT_EQ(host.address->port, 5025);
    auto port = parseLinkAddress(QStringLiteral("meter.lab.example:5555"));
    ASSERT_TRUE(port.address);
    EXPECT_EQ(port.address->port, 5555);
    EXPECT_FALSE(parseLinkAddress(QStringLiteral("tcp:host:0")).address);
    EXPECT_FALSE(parseLinkAddress(QStringLiteral("tcp:host:70000")).address);
    EXPECT_FALSE(parseLinkAddress(QStringLiteral("tcp::5025")).address);
}

TEST(LinkAddress, ARigNeedsBothSecondaryRolesOrOneMeterForBoth)
{
    QString error;
    RigAddresses onlyVolts;
    onlyVolts.voltmeter = QStringLiteral("/dev/ttyUSB0");
    EXPECT_EQ(makeRig(onlyVolts, &error), nullptr);
    EXPECT_TRUE(error.contains(QStringLiteral("ammeter")));
    RigAddresses both;
    both.meter = QStringLiteral("tcp:127.0.0.1");
    both.voltmeter = QStringLiteral("/dev/ttyUSB0");
    EXPECT_EQ(makeRig(both, &error), nullptr);
    RigAddresses badLoad;
    badLoad.meter = QStringLiteral("tcp:127.0.0.1");
    badLoad.load = QStringLiteral("tcp:127.0.0.1:0");
    EXPECT_EQ(makeRig(badLoad, &error), nullptr);
    EXPECT_TRUE(error.startsWith(QStringLiteral("load address")));
}

TEST(ManualEntry, AcceptsUnitsPrefixesAndEitherDecimalSeparator)
{
    EXPECT_DOUBLE_EQ(parseManualValue(MeterRole::SecondaryVoltage, QStringLiteral("13,8 V")).value, 13.8);
    EXPECT_DOUBLE_EQ(parseManualValue(MeterRole::SecondaryCurrent, QStringLiteral("130 mA")).value, 0.13);
    EXPECT_DOUBLE_EQ(parseManualValue(MeterRole::SecondaryCurrent, QStringLiteral(" 0.5 ")).value, 0.5);
    EXPECT_DOUBLE_EQ(parseManualValue(MeterRole::PrimaryVoltage, QStringLiteral("230V")).value, 230.0);
}

TEST(ManualEntry, RefusesTheWrongQuantityNamingTheRole)
{
    const ManualValue current = parseManualValue(MeterRole::SecondaryVoltage, QStringLiteral("130 mA"));
    EXPECT_FALSE(current.ok);
    EXPECT_TRUE(current.error.startsWith(QStringLiteral("secondary voltmeter: "))) << current.error.toStdString();
    EXPECT_TRUE(current.error.contains(QStringLiteral("a current"))) << current.error.toStdString();
    const ManualValue volts = parseManualValue(MeterRole::SecondaryCurrent, QStringLiteral("12 V"));
    EXPECT_FALSE(volts.ok);
    EXPECT_TRUE(volts.error.startsWith(QStringLiteral("secondary ammeter: ")));
    for (const char *bad : {"", "abc", "1,2.3 V", "-3 V", "nan", "inf"}) {
        const ManualValue v = parseManualValue(MeterRole::SecondaryVoltage, QString::fromLatin1(bad));
        EXPECT_FALSE(v.ok) << bad;
        EXPECT_FALSE(v.error.isEmpty()) << bad;
    }
}
