// Each simulator process gives its instruments identities of its own, so a simulator that
// takes over a killed one's pty number or TCP port is a stranger to the identity check (as a
// USB adapter that re-enumerates to another meter is on a real bench). Reproducer: under the
// parallel suite a killed simulator's pty went to another test's simulator with the same seed,
// whose meters answered with the same serial numbers, and the window took it for the lost
// meter ("link restored: meter is back").
#include "SimProcess.h"

#include <gtest/gtest.h>

#include <QTemporaryDir>

using namespace sagline::test;

namespace {

// What the instrument itself answers to *IDN? over its TCP port (not what the simulator printed).
QString askIdentity(quint16 port)
{
    QTcpSocket socket;
    socket.connectToHost(QStringLiteral("127.0.0.1"), port);
    if (!socket.waitForConnected(5000))
        return QStringLiteral("(no connection: %1)").arg(socket.errorString());
    socket.write("*IDN?\n");
    QByteArray reply;
    QElapsedTimer elapsed;
    elapsed.start();
    while (!reply.contains('\n') && elapsed.elapsed() < 10000) { // generous on a loaded machine
        socket.waitForReadyRead(200);
        reply += socket.readAll();
    }
    return QString::fromUtf8(reply).trimmed();
}

const QStringList sameArguments{QStringLiteral("--seed"), QStringLiteral("7")};
const QStringList instruments{QStringLiteral("voltmeter"), QStringLiteral("ammeter"), QStringLiteral("power-meter"),
                              QStringLiteral("load")};

} // namespace

TEST(SimulatorIdentity, TwoSimulatorsStartedAlikeAnswerWithDifferentSerialNumbers)
{
    QTemporaryDir linksA, linksB;
    SimProcess a, b;
    QString error;
    ASSERT_TRUE(a.start(linksA.path(), sameArguments, &error)) << error.toStdString();
    ASSERT_TRUE(b.start(linksB.path(), sameArguments, &error)) << error.toStdString();
    for (const QString &instrument : instruments) {
        SCOPED_TRACE(instrument.toStdString());
        const auto first = a.endpoint(instrument);
        const auto second = b.endpoint(instrument);
        ASSERT_TRUE(first && second) << a.output().toStdString();
        const QString firstIdentity = askIdentity(first->tcpPort);
        const QString secondIdentity = askIdentity(second->tcpPort);
        EXPECT_EQ(firstIdentity, first->identity);
        EXPECT_EQ(secondIdentity, second->identity);
        ASSERT_TRUE(firstIdentity.startsWith(QStringLiteral("Sagline Virtual Bench,"))) << firstIdentity.toStdString();
        // Same maker and model (same seed, same setup), different serial number.
        EXPECT_EQ(firstIdentity.section(QLatin1Char(','), 0, 1), secondIdentity.section(QLatin1Char(','), 0, 1));
        EXPECT_NE(firstIdentity.section(QLatin1Char(','), 2, 2), secondIdentity.section(QLatin1Char(','), 2, 2))
            << firstIdentity.toStdString();
    }
}

TEST(SimulatorIdentity, ARestartWithTheSameSerialSuffixIsTheSameMeterAgain)
{
    // A test that restarts "the same" simulator after killing it asks for it explicitly.
    QTemporaryDir links;
    SimProcess sim;
    QString error;
    const QStringList arguments = sameArguments + QStringList{QStringLiteral("--serial-suffix"), QStringLiteral("RESTART-1")};
    ASSERT_TRUE(sim.start(links.path(), arguments, &error)) << error.toStdString();
    const auto before = sim.endpoint(QStringLiteral("power-meter"));
    ASSERT_TRUE(before);
    const QString identityBefore = askIdentity(before->tcpPort);
    EXPECT_TRUE(identityBefore.contains(QStringLiteral("-RESTART-1,"))) << identityBefore.toStdString();
    sim.kill();
    ASSERT_TRUE(sim.start(links.path(), arguments, &error)) << error.toStdString();
    const auto after = sim.endpoint(QStringLiteral("power-meter"));
    ASSERT_TRUE(after);
    EXPECT_EQ(askIdentity(after->tcpPort), identityBefore);
}
