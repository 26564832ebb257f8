// `sagline-cli run` against meters that misbehave after they have connected, headless: each
// run must end by itself within a bounded time (exit 4, gave up) with the load switched off,
// the reason in the session and no reading taken from the bad replies. Reproducers (issue 18):
// a single meter that stops answering, one that sends 1 MB without a newline, one that answers
// one byte a second, and one that closes the connection after *IDN? made `run` loop "link
// lost ... restored" or wait for ever.
#include "OperatorSweep.h"

#include "SessionStore.h"
#include "SimEndpoints.h"

#include <QProcess>
#include <QTcpServer>
#include <QTcpSocket>
#include <QTemporaryDir>
#include <QTimer>

using namespace sagline;
using namespace sagline::test;

namespace {

enum class Misbehaviour {
    EndlessLine,    // every measurement reply is 1 MB with no newline
    OneByteASecond, // every measurement reply trickles in at one byte a second
    ClosesAfterIdn, // answers the connect sequence, then closes at the first measurement
    Silent,         // answers the connect sequence, then never a measurement
};

// A meter on loopback TCP that answers the connect sequence (*IDN?, the error queue, *OPC?)
// as a well-behaved one does, then misbehaves on every measurement query.
class HostileMeter {
public:
    explicit HostileMeter(Misbehaviour how) : m_how(how)
    {
        QObject::connect(&m_server, &QTcpServer::newConnection, [this] {
            while (QTcpSocket *socket = m_server.nextPendingConnection()) {
                ++connections;
                QObject::connect(socket, &QTcpSocket::disconnected, socket, &QObject::deleteLater);
                QObject::connect(socket, &QTcpSocket::readyRead, socket, [this, socket] { answer(socket); });
            }
        });
        EXPECT_TRUE(m_server.listen(QHostAddress::LocalHost, 0));
    }
    quint16 port() const { return m_server.serverPort(); }
    int connections = 0;
    int measurements = 0;

private:
    void answer(QTcpSocket *socket)
    {
        while (socket->canReadLine()) {
            const QByteArray line = socket->readLine().trimmed().toUpper();
            if (line == "*IDN?")
                socket->write("Test Maker,Hostile meter HM-1,HM-0001,1.0\n");
            else if (line.startsWith("SYST"))
                socket->write("+0,\"No error\"\n");
            else if (line == "*OPC?")
                socket->write("1\n");
            else if (line.endsWith('?'))
                measure(socket);
            // commands (configuration) get no reply, as SCPI says
        }
    }

    void measure(QTcpSocket *socket)
    {
        ++measurements;
        switch (m_how) {
        case Misbehaviour::EndlessLine:
            socket->write(QByteArray(1 << 20, '7'));
            break;
        case Misbehaviour::OneByteASecond: {
            auto *drip = new QTimer(socket);
            auto remaining = std::make_shared<QByteArray>("1.234567E+01\n");
            QObject::connect(drip, &QTimer::timeout, socket, [socket, drip, remaining] {
                if (remaining->isEmpty()) {
                    drip->deleteLater();
                    return;
                }
                socket->write(remaining->left(1));
                remaining->remove(0, 1);
            });
            drip->start(1000);
            break;
        }
        case Misbehaviour::ClosesAfterIdn:
            socket->disconnectFromHost();
            break;
        case Misbehaviour::Silent:
            break;
        }
    }

    Misbehaviour m_how;
    QTcpServer m_server;
};

struct RunResult {
    bool ended = false;
    int exitCode = -1;
    QString err;
    std::vector<Reading> readings;
    std::vector<NoteRecord> notes;
};

// The demo setup with the hostile meter in both roles and the virtual bench's programmable load
// (so nobody needs to press Enter), giving up after 2 s of an unresolved pause.
RunResult runAgainst(HostileMeter &meter)
{
    VirtualClock clock(0);
    const Plan plan = planFor(demoSetup());
    VirtualBench bench(virtualBenchOptionsFor(demoSetup(), plan, 3), &clock);
    TcpEndpoint load(bench.loadInstrument());
    QString error;
    EXPECT_TRUE(load.start(0, &error)) << error.toStdString();
    QTemporaryDir dir;
    const QString session = dir.path() + QStringLiteral("/hostile.sagline");
    QProcess cli;
    cli.start(QStringLiteral(SAGLINE_CLI_PATH),
              {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"), QStringLiteral("--meter"),
               QStringLiteral("tcp:127.0.0.1:%1").arg(meter.port()), QStringLiteral("--load"),
               QStringLiteral("tcp:127.0.0.1:%1").arg(load.port()), QStringLiteral("--timeout-ms"), QStringLiteral("300"),
               QStringLiteral("--dwell"), QStringLiteral("0"), QStringLiteral("--give-up-after"), QStringLiteral("2"),
               QStringLiteral("-o"), session});
    cli.closeWriteChannel();
    RunResult result;
    // The bad replies, the reconnects, the stability time (30 s without a valid reading) and the
    // give-up time; generous for a loaded 2-core machine. Before the fix it never ended.
    result.ended = waitUntil([&] { return cli.state() == QProcess::NotRunning; }, 120000);
    if (!result.ended) {
        cli.kill();
        cli.waitForFinished(5000);
        return result;
    }
    result.exitCode = cli.exitCode();
    result.err = QString::fromUtf8(cli.readAllStandardError());
    auto stored = SessionStore::openForReview(session.toStdString());
    EXPECT_TRUE(stored.ok()) << stored.message;
    if (stored.ok()) {
        result.readings = stored.value->readings().value;
        result.notes = stored.value->notes().value;
    }
    return result;
}

bool anyNote(const RunResult &r, const std::string &text)
{
    return std::any_of(r.notes.begin(), r.notes.end(), [&](const NoteRecord &n) { return n.text.find(text) != std::string::npos; });
}

void expectGaveUpCleanly(const RunResult &r)
{
    ASSERT_TRUE(r.ended) << "the run is still waiting";
    EXPECT_EQ(r.exitCode, 4) << r.err.toStdString();
    EXPECT_TRUE(r.err.contains(QStringLiteral("sweep gave up waiting"))) << r.err.toStdString();
    EXPECT_FALSE(r.err.contains(QStringLiteral("SWITCH THE LOAD OFF BY HAND"))) << r.err.toStdString(); // the load answered
    EXPECT_TRUE(r.readings.empty()) << r.readings.size() << " reading(s) taken from bad replies";
    EXPECT_TRUE(anyNote(r, "gave up at step 0 after waiting 2 s")) << r.err.toStdString();
}

} // namespace

TEST(HostileMeterRun, AMeterSendingAMegabyteWithoutANewlineEndsTheRun)
{
    HostileMeter meter(Misbehaviour::EndlessLine);
    const RunResult r = runAgainst(meter);
    expectGaveUpCleanly(r);
    EXPECT_GT(meter.measurements, 0);
    EXPECT_LT(r.err.size(), 200000) << "the megabyte was echoed"; // a message names it, never repeats it
}

TEST(HostileMeterRun, AMeterAnsweringOneByteASecondEndsTheRun)
{
    HostileMeter meter(Misbehaviour::OneByteASecond);
    const RunResult r = runAgainst(meter);
    expectGaveUpCleanly(r);
    EXPECT_GT(meter.measurements, 0);
}

TEST(HostileMeterRun, AMeterClosingAfterItsIdentityEndsTheRunInsteadOfLooping)
{
    HostileMeter meter(Misbehaviour::ClosesAfterIdn);
    const RunResult r = runAgainst(meter);
    expectGaveUpCleanly(r);
    // It came back a few times (more than 3 in one step counts as lost), not for ever.
    EXPECT_GT(meter.connections, 1);
    EXPECT_LT(meter.connections, 30);
}

TEST(HostileMeterRun, AMeterThatStopsAnsweringEndsTheRun)
{
    HostileMeter meter(Misbehaviour::Silent);
    const RunResult r = runAgainst(meter);
    expectGaveUpCleanly(r);
    EXPECT_GT(meter.measurements, 0);
}
