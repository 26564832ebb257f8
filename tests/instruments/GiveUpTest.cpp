// Bounded waits: a pause nobody resolves (a programmable load that stopped answering, a meter
// whose replies never parse, a link that keeps dropping and coming back) ends a headless sweep
// after SweepOptions::giveUpAfterMs, with the reason recorded and the load switched off where it
// can be (said loudly where it cannot); with no limit (the window) the sweep keeps waiting and
// says how long. Reproducers: `sagline-cli run` printed "PAUSED: could not set the load" and
// waited 150 s until interrupted; a meter that closes after *IDN? made it loop "link lost ...
// restored" for ever.
#include "OperatorSweep.h"

#include "ScpiLink.h"
#include "SessionStore.h"
#include "SimEndpoints.h"

#include <QProcess>
#include <QTcpServer>
#include <QTcpSocket>
#include <QTemporaryDir>

using namespace sagline;
using namespace sagline::test;

namespace {

void giveUpAfterAMinute(SweepOptions &options)
{
    options.giveUpAfterMs = 60000;
}

bool noted(const MemorySink &sink, const QString &text)
{
    return std::any_of(sink.events.begin(), sink.events.end(), [&](const QString &e) { return e.contains(text); });
}

// A programmable load that answers while it is connected (*IDN?, the error queue) and then
// never again: the load whose replies stopped mid-sweep.
class SilentLoad {
public:
    SilentLoad()
    {
        QObject::connect(&m_server, &QTcpServer::newConnection, [this] {
            while (QTcpSocket *socket = m_server.nextPendingConnection()) {
                QObject::connect(socket, &QTcpSocket::readyRead, socket, [this, socket] {
                    while (socket->canReadLine()) {
                        const QByteArray line = socket->readLine().trimmed();
                        ++lines;
                        if (m_silent)
                            continue;
                        if (line == "*IDN?")
                            socket->write("Test Maker,Electronic load EL-9,TL-0001,1.0\n");
                        else if (line.startsWith("SYST"))
                            socket->write("+0,\"No error\"\n");
                        else
                            m_silent = true; // the first real command: it answers nothing from now on
                    }
                });
            }
        });
        EXPECT_TRUE(m_server.listen(QHostAddress::LocalHost, 0));
    }
    quint16 port() const { return m_server.serverPort(); }
    int lines = 0;

private:
    QTcpServer m_server;
    bool m_silent = false;
};

} // namespace

TEST(GiveUp, AProgrammableLoadThatStopsAnsweringEndsTheSweepAndIsReported)
{
    OperatorSweep sweep(LoadKind::Programmable, giveUpAfterAMinute);
    for (ScpiInstrument *instrument : sweep.rig->instruments())
        instrument->link()->setTimeoutMs(100);
    std::optional<std::pair<bool, QString>> switchedOff;
    QObject::connect(sweep.controller.get(), &SweepController::loadSwitchedOff,
                     [&](bool ok, const QString &error) { switchedOff = {ok, error}; });
    sweep.bench->loadInstrument()->injectFault(SimFault::Drop, 1000000); // from now on, no reply
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.outcome.has_value() && switchedOff.has_value(); }, 20000))
        << toString(sweep.controller->state()).toStdString();
    EXPECT_EQ(*sweep.outcome, SweepOutcome::GaveUp);
    EXPECT_TRUE(sweep.recorded.empty());
    EXPECT_TRUE(noted(sweep.sink, QStringLiteral("gave up at step 0 after waiting 60 s"))) << sweep.sink.events.join('\n').toStdString();
    // It could not be switched off either: the caller is told so, to tell the operator.
    EXPECT_FALSE(switchedOff->first);
}

TEST(GiveUp, AMeterWhoseRepliesNeverParseEndsTheSweep)
{
    OperatorSweep sweep(LoadKind::Operator, giveUpAfterAMinute);
    SimFaultRates garbage;
    garbage.garbage = 1.0;
    sweep.bench->voltmeter()->setFaultRates(garbage);
    for (ScpiInstrument *instrument : sweep.rig->instruments())
        instrument->link()->setTimeoutMs(100);
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.outcome.has_value(); }, 20000))
        << toString(sweep.controller->state()).toStdString() << ": " << sweep.controller->pauseReason().toStdString();
    EXPECT_EQ(*sweep.outcome, SweepOutcome::GaveUp);
    EXPECT_TRUE(noted(sweep.sink, QStringLiteral("gave up at step 0"))) << sweep.sink.events.join('\n').toStdString();
}

TEST(GiveUp, ALinkThatKeepsComingBackCountsAsLost)
{
    // No give-up here: the vanishing link's wall-time timers would let the simulated clock run
    // ahead to it; what matters is that the sweep stops resuming, then waits for someone.
    OperatorSweep sweep(LoadKind::Operator);
    // The meter drops its link again each time it has come back (as one that closes after *IDN?):
    // as soon as step 2 starts again, before its (simulated) dwell is over.
    int drops = 0;
    bool flapping = true;
    QObject::connect(sweep.controller.get(), &SweepController::stepStarted, [&](int step, const QString &text) {
        if (flapping && step == 2 && text.startsWith(QStringLiteral("link restored")) && drops < 20) {
            ++drops;
            QTimer::singleShot(0, sweep.bench.get(), [&] { sweep.bench->voltmeter()->vanish(30); });
        }
    });
    sweep.onceAfterConfirming(2, [&] { sweep.bench->voltmeter()->vanish(30); });
    const auto countedAsLost = [&] {
        return sweep.controller->pauseReason().contains(QStringLiteral("counted as lost"));
    };
    ASSERT_TRUE(sweep.runUntil(countedAsLost, 20000))
        << toString(sweep.controller->state()).toStdString() << ": " << sweep.controller->pauseReason().toStdString();
    EXPECT_TRUE(noted(sweep.sink, QStringLiteral("step 2: the link dropped and came back 4 times; counted as lost")))
        << sweep.sink.events.join('\n').toStdString();
    flapping = false;
    waitUntil([] { return false; }, 300);
    EXPECT_EQ(sweep.controller->state(), SweepState::Paused);
    // Lost four times, restarted after three returns; the fourth return is not resumed.
    EXPECT_EQ(drops, 3) << "the sweep kept resuming on a link that keeps dropping";
    EXPECT_EQ(sweep.recorded.size(), 2u); // steps 0 and 1; step 2 never read
    // Someone checks the cable and resumes: the step's load is confirmed again and the sweep ends.
    ASSERT_TRUE(waitUntil([&] { return sweep.rig->isReady(); }));
    sweep.controller->resume();
    EXPECT_TRUE(sweep.completesEveryStepInOrder());
}

TEST(GiveUp, WithoutALimitTheSweepWaitsAndSaysHowLong)
{
    // The window's way: its operator decides; the time waited is there to be shown.
    OperatorSweep sweep(LoadKind::Programmable);
    for (ScpiInstrument *instrument : sweep.rig->instruments())
        instrument->link()->setTimeoutMs(100);
    sweep.bench->loadInstrument()->injectFault(SimFault::Drop, 1000000);
    ASSERT_TRUE(sweep.runUntil([&] { return sweep.controller->state() == SweepState::Paused; }, 20000));
    EXPECT_GE(sweep.controller->pausedForMs(), 0);
    sweep.clock.setAutoAdvance(false);
    const std::int64_t before = sweep.controller->pausedForMs();
    sweep.clock.advance(600000);
    waitUntil([] { return false; }, 200);
    EXPECT_EQ(sweep.controller->state(), SweepState::Paused);
    EXPECT_FALSE(sweep.outcome.has_value());
    EXPECT_GE(sweep.controller->pausedForMs() - before, 600000);
    sweep.controller->stop();
    EXPECT_EQ(sweep.controller->pausedForMs(), -1);
}

TEST(GiveUp, TheCliExitsFourSwitchesTheLoadOffOrSaysLoudlyItCouldNot)
{
    // Real meters over loopback TCP and a load that stops answering after connecting; the run
    // gives up after 1 s of wall time instead of waiting for ever.
    VirtualClock clock(0);
    const Plan plan = planFor(demoSetup());
    VirtualBench bench(virtualBenchOptionsFor(demoSetup(), plan, 3), &clock);
    TcpEndpoint voltmeter(bench.voltmeter()), ammeter(bench.ammeter());
    QString error;
    ASSERT_TRUE(voltmeter.start(0, &error) && ammeter.start(0, &error)) << error.toStdString();
    SilentLoad load;
    QTemporaryDir dir;
    const QString session = dir.path() + QStringLiteral("/gave-up.sagline");
    QProcess cli;
    cli.start(QStringLiteral(SAGLINE_CLI_PATH),
              {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"), QStringLiteral("--voltmeter"),
               QStringLiteral("tcp:127.0.0.1:%1").arg(voltmeter.port()), QStringLiteral("--ammeter"),
               QStringLiteral("tcp:127.0.0.1:%1").arg(ammeter.port()), QStringLiteral("--load"),
               QStringLiteral("tcp:127.0.0.1:%1").arg(load.port()), QStringLiteral("--timeout-ms"), QStringLiteral("200"),
               QStringLiteral("--give-up-after"), QStringLiteral("1"), QStringLiteral("-o"), session});
    cli.closeWriteChannel();
    // Several load timeouts, the give-up second and the switch-off attempt; generous for a loaded machine.
    ASSERT_TRUE(waitUntil([&] { return cli.state() == QProcess::NotRunning; }, 30000)) << "the run is still waiting";
    const QString err = QString::fromUtf8(cli.readAllStandardError());
    EXPECT_EQ(cli.exitCode(), 4) << err.toStdString();
    EXPECT_TRUE(err.contains(QStringLiteral("gives up after 1 s unless resolved"))) << err.toStdString();
    EXPECT_TRUE(err.contains(QStringLiteral("sweep gave up waiting"))) << err.toStdString();
    EXPECT_TRUE(err.contains(QStringLiteral("SWITCH THE LOAD OFF BY HAND NOW"))) << err.toStdString();
    EXPECT_GT(load.lines, 2);
    // The stop and its reason are in the session.
    auto stored = SessionStore::openForReview(session.toStdString());
    ASSERT_TRUE(stored.ok()) << stored.message;
    bool recorded = false;
    for (const NoteRecord &note : stored.value->notes().value)
        recorded = recorded || note.text.find("gave up at step 0 after waiting 1 s") != std::string::npos;
    EXPECT_TRUE(recorded);
}

TEST(GiveUp, TheCliRefusesAGiveUpTimeOutOfRange)
{
    for (const char *bad : {"0", "-1", "1e300", "soon"}) {
        QProcess cli;
        cli.start(QStringLiteral(SAGLINE_CLI_PATH), {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"),
                                                     QStringLiteral("--sim"), QStringLiteral("-o"), QStringLiteral("/nonexistent/x.sagline"),
                                                     QStringLiteral("--give-up-after"), QString::fromLatin1(bad)});
        ASSERT_TRUE(cli.waitForFinished(10000));
        EXPECT_EQ(cli.exitCode(), 2) << bad;
        EXPECT_TRUE(QString::fromUtf8(cli.readAllStandardError()).contains(QStringLiteral("--give-up-after"))) << bad;
    }
}
