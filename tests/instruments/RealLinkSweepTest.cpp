// Whole sweeps over real pseudo-terminals and loopback TCP in wall time (short dwell): a link
// unplugged mid-sweep, the pairing window, and the CLI on the virtual bench (also asking for
// Enter again after a link came back).
#include "InstrumentsTestSupport.h"

#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "SerialLink.h"
#include "SimEndpoints.h"
#include "SimInstrument.h"
#include "SweepController.h"
#include "TcpLink.h"
#include "VirtualBench.h"

#include <QProcess>
#include <QRegularExpression>
#include <QTemporaryDir>

#include <functional>
#include <memory>

using namespace sagline;
using namespace sagline::test;

namespace {

// The step of every "step N: ... press Enter" prompt in the CLI's stderr so far, in order
// (stderr may arrive in pieces, so the caller keeps all of it and counts what it answered).
QList<int> promptedSteps(const QString &err)
{
    static const QRegularExpression prompt(QStringLiteral("step (\\d+): .*press Enter"));
    QList<int> steps;
    for (auto it = prompt.globalMatch(err); it.hasNext();)
        steps << it.next().captured(1).toInt();
    return steps;
}

// The bench's voltmeter and ammeter on loopback TCP and `sagline-cli run` of the demo setup on
// them (short dwell and read interval) without the load: the test is the operator, who sets the
// bench's load and presses Enter at each prompt; `afterEnter` runs after each Enter.
struct CliOnTcpMeters {
    explicit CliOnTcpMeters(bool heating) : plan(planFor(demoSetup()))
    {
        VirtualBenchOptions options = virtualBenchOptionsFor(demoSetup(), plan, 2);
        if (!heating)
            options.transformer.thermalResistanceKPerW = 0.0;
        bench = std::make_unique<VirtualBench>(options, &clock);
        voltmeter = std::make_unique<TcpEndpoint>(bench->voltmeter());
        ammeter = std::make_unique<TcpEndpoint>(bench->ammeter());
        QObject::connect(&cli, &QProcess::readyReadStandardError, [this] {
            err += QString::fromUtf8(cli.readAllStandardError());
            for (const int step : promptedSteps(err).mid(enters)) {
                bench->setLoad(plan.steps[step].loadResistanceOhm); // the operator sets the load...
                cli.write("\n");                                    // ...and presses Enter
                ++enters;
                if (afterEnter)
                    afterEnter(step);
            }
        });
    }

    bool start(QString *error)
    {
        if (!voltmeter->start(0, error) || !ammeter->start(0, error))
            return false;
        cli.start(QStringLiteral(SAGLINE_CLI_PATH),
                  {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"), QStringLiteral("--voltmeter"),
                   QStringLiteral("tcp:127.0.0.1:%1").arg(voltmeter->port()), QStringLiteral("--ammeter"),
                   QStringLiteral("127.0.0.1:%1").arg(ammeter->port()), QStringLiteral("--dwell"), QStringLiteral("0.02"),
                   QStringLiteral("--read-interval"), QStringLiteral("0.01"), QStringLiteral("--operator"), QStringLiteral("test"),
                   QStringLiteral("-o"), dir.path() + QStringLiteral("/bench.sagline")});
        return true;
    }

    bool finishes(int timeoutMs) { return waitUntil([this] { return cli.state() == QProcess::NotRunning; }, timeoutMs); }

    VirtualClock clock{0};
    Plan plan;
    std::unique_ptr<VirtualBench> bench;
    std::unique_ptr<TcpEndpoint> voltmeter;
    std::unique_ptr<TcpEndpoint> ammeter;
    QTemporaryDir dir;
    QString err; // all of the CLI's stderr so far (prompts may arrive in pieces)
    int enters = 0;
    std::function<void(int)> afterEnter;
    QProcess cli; // last: gone before anything its handler uses
};

// The virtual bench served on a pty (voltmeter), TCP (ammeter) and a pty (load), with a rig of
// real SerialLink / TcpLink instruments on the other side.
struct WiredBench {
    WiredBench()
    {
        const sagline::Setup setup = demoSetup();
        plan = planFor(setup);
        bench = std::make_unique<VirtualBench>(virtualBenchOptionsFor(setup, plan, 11), &clock);
        voltmeterPty = std::make_unique<PtyEndpoint>(bench->voltmeter(), dir.path() + QStringLiteral("/voltmeter"));
        loadPty = std::make_unique<PtyEndpoint>(bench->loadInstrument(), dir.path() + QStringLiteral("/load"));
        ammeterTcp = std::make_unique<TcpEndpoint>(bench->ammeter());
        QString error;
        EXPECT_TRUE(voltmeterPty->start(&error) && loadPty->start(&error) && ammeterTcp->start(0, &error))
            << error.toStdString();

        auto serial = [](const QString &path) {
            SerialSettings settings;
            settings.portName = path;
            settings.baudRate = 115200;
            auto *link = new SerialLink(settings);
            link->setTimeoutMs(400);
            return link;
        };
        auto *voltmeter = new ScpiInstrument(QStringLiteral("voltmeter"), serial(voltmeterPty->linkPath()));
        voltmeter->setRoles({defaultRoleConfig(MeterRole::SecondaryVoltage)});
        auto *tcp = new TcpLink(QStringLiteral("127.0.0.1"), ammeterTcp->port());
        tcp->setTimeoutMs(400);
        auto *ammeter = new ScpiInstrument(QStringLiteral("ammeter"), tcp);
        ammeter->setRoles({defaultRoleConfig(MeterRole::SecondaryCurrent)});
        rig = std::make_unique<InstrumentRig>();
        rig->addInstrument(voltmeter);
        rig->addInstrument(ammeter);
        rig->setLoadInstrument(new ScpiInstrument(QStringLiteral("load"), serial(loadPty->linkPath())));
        for (ScpiInstrument *i : rig->instruments())
            i->setReconnectIntervalMs(50);
        rig->connectAll();
        EXPECT_TRUE(waitUntil([this] { return rig->isReady(); }));

        options = sweepOptionsFor(setup, plan);
        options.dwellMs = 20;
        options.readIntervalMs = 10;
        options.stability.maxTimeS = 1.0;
    }

    SystemClock clock;
    QTemporaryDir dir;
    Plan plan;
    std::unique_ptr<VirtualBench> bench;
    std::unique_ptr<PtyEndpoint> voltmeterPty;
    std::unique_ptr<PtyEndpoint> loadPty;
    std::unique_ptr<TcpEndpoint> ammeterTcp;
    std::unique_ptr<InstrumentRig> rig;
    SweepOptions options;
    MemorySink sink;
    LineFitLiveFit fit;
};

} // namespace

TEST(RealLinkSweep, UnpluggedMidSweepItPausesAndResumesWithNothingLost)
{
    WiredBench w;
    SweepController c(w.plan, w.options, w.rig.get(), &w.sink, &w.fit, &w.clock);
    std::vector<int> steps;
    int lost = 0;
    int restored = 0;
    std::optional<SweepOutcome> outcome;
    QObject::connect(&c, &SweepController::pointRecorded, [&](const Reading &r, const LiveFitSnapshot &) {
        steps.push_back(r.step);
        if (r.step == 4)
            w.bench->voltmeter()->vanish(400); // the voltmeter's cable is pulled for 0.4 s
    });
    QObject::connect(&c, &SweepController::linkLost, [&](const QString &) { ++lost; });
    QObject::connect(&c, &SweepController::linkRestored, [&](const QString &) { ++restored; });
    QObject::connect(&c, &SweepController::finished, [&](SweepOutcome o) { outcome = o; });
    c.start();
    ASSERT_TRUE(waitUntil([&] { return outcome.has_value(); }, 20000)) << toString(c.state()).toStdString();
    EXPECT_EQ(*outcome, SweepOutcome::Completed);
    EXPECT_EQ(lost, 1);
    EXPECT_EQ(restored, 1);
    ASSERT_EQ(steps.size(), w.plan.steps.size());
    for (std::size_t i = 0; i < steps.size(); ++i)
        EXPECT_EQ(steps[i], static_cast<int>(i));
    EXPECT_EQ(w.sink.readings.size(), w.plan.steps.size());
}

TEST(RealLinkSweep, VoltageAndCurrentReadTooFarApartAreNotPaired)
{
    WiredBench w;
    w.options.pairWindowMs = 100;
    SimFaultRates rates;
    rates.slowDelayMs = 250; // within the 400 ms timeout, beyond the 100 ms window
    w.bench->ammeter()->setFaultRates(rates);
    SweepController c(w.plan, w.options, w.rig.get(), &w.sink, &w.fit, &w.clock);
    QStringList notices;
    std::optional<SweepOutcome> outcome;
    QObject::connect(&c, &SweepController::notice, [&](const QString &m) { notices << m; });
    QObject::connect(&c, &SweepController::stepStarted, [&](int step, const QString &) {
        if (step == 2)
            w.bench->ammeter()->injectFault(SimFault::Slow);
    });
    QObject::connect(&c, &SweepController::finished, [&](SweepOutcome o) { outcome = o; });
    c.start();
    ASSERT_TRUE(waitUntil([&] { return outcome.has_value(); }, 20000));
    EXPECT_EQ(*outcome, SweepOutcome::Completed);
    EXPECT_TRUE(notices.join('\n').contains(QStringLiteral("ms apart"))) << notices.join('\n').toStdString();
    EXPECT_EQ(w.sink.readings.size(), w.plan.steps.size());
}

TEST(RunCommand, ASimulatedSweepFitsTheSimulatedTransformer)
{
    QTemporaryDir dir;
    const QString session = dir.path() + QStringLiteral("/demo.sagline");
    QProcess cli;
    cli.start(QStringLiteral(SAGLINE_CLI_PATH),
              {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"), QStringLiteral("--sim"),
               QStringLiteral("--seed"), QStringLiteral("5"), QStringLiteral("-o"), session});
    ASSERT_TRUE(cli.waitForFinished(30000));
    const QString out = QString::fromUtf8(cli.readAllStandardOutput());
    const QString err = QString::fromUtf8(cli.readAllStandardError());
    ASSERT_EQ(cli.exitCode(), 0) << err.toStdString();
    // One line per point, starting with its step number.
    const QRegularExpression pointLine(QStringLiteral("^ ?(\\d+)  I +([0-9.]+) A  V +([0-9.]+) V  live R"),
                                       QRegularExpression::MultilineOption);
    int points = 0;
    for (auto it = pointLine.globalMatch(out); it.hasNext(); it.next())
        ++points;
    EXPECT_EQ(points, 9) << out.toStdString();
    // The final fit against the simulated transformer (demo: V0 19.6 V, R 0.48 Ω at 20 °C):
    // within the fit's expanded uncertainty plus the meters' fixed gain errors (<= 0.17 % V,
    // 0.33 % I) and a little copper heating.
    const QRegularExpression r(QStringLiteral("Series resistance R +([0-9.]+) mΩ ± ([0-9.]+) mΩ"));
    const QRegularExpression v0(QStringLiteral("No-load voltage V0 +([0-9.]+) V ± ([0-9.]+) V"));
    const auto rm = r.match(out);
    const auto vm = v0.match(out);
    ASSERT_TRUE(rm.hasMatch() && vm.hasMatch()) << out.toStdString();
    EXPECT_NEAR(rm.captured(1).toDouble(), 480.0, rm.captured(2).toDouble() + 0.006 * 480.0 + 5.0);
    EXPECT_NEAR(vm.captured(1).toDouble(), 19.6, vm.captured(2).toDouble() + 0.002 * 19.6);
    EXPECT_TRUE(QFile::exists(session));
}

TEST(RunCommand, ASafetyStopExitsWithThree)
{
    QTemporaryDir dir;
    QProcess cli;
    cli.start(QStringLiteral(SAGLINE_CLI_PATH),
              {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"), QStringLiteral("--sim"),
               QStringLiteral("--sim-fuse-rating"), QStringLiteral("0.1"), QStringLiteral("-o"),
               dir.path() + QStringLiteral("/stop.sagline")});
    ASSERT_TRUE(cli.waitForFinished(30000));
    EXPECT_EQ(cli.exitCode(), 3);
    EXPECT_TRUE(QString::fromUtf8(cli.readAllStandardError()).contains(QStringLiteral("SAFETY STOP at step")));
}

TEST(RunCommand, BadArgumentsExitWithTwoAndSayWhy)
{
    QProcess cli;
    cli.start(QStringLiteral(SAGLINE_CLI_PATH), {QStringLiteral("run"), QStringLiteral("x.json"), QStringLiteral("--sim")});
    ASSERT_TRUE(cli.waitForFinished(10000));
    EXPECT_EQ(cli.exitCode(), 2);
    EXPECT_TRUE(QString::fromUtf8(cli.readAllStandardError()).contains(QStringLiteral("-o SESSION.sagline")));
    cli.start(QStringLiteral(SAGLINE_CLI_PATH), {QStringLiteral("run"), QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"),
                                                 QStringLiteral("--voltmeter"), QStringLiteral("tcp:localhost:99999"),
                                                 QStringLiteral("--ammeter"), QStringLiteral("/dev/null"), QStringLiteral("-o"),
                                                 QStringLiteral("/tmp/never.sagline")});
    ASSERT_TRUE(cli.waitForFinished(10000));
    EXPECT_EQ(cli.exitCode(), 2);
    EXPECT_TRUE(QString::fromUtf8(cli.readAllStandardError()).contains(QStringLiteral("voltmeter address")));
}

TEST(RunCommand, WithRealMetersItWaitsForEnterAtEachStep)
{
    // The bench's meters on loopback TCP; its load is not given to the CLI, so a person (here
    // the test) sets it and presses Enter at each step.
    CliOnTcpMeters run(true);
    QString error;
    ASSERT_TRUE(run.start(&error)) << error.toStdString();
    ASSERT_TRUE(run.finishes(8000)) << run.err.toStdString() << QString::fromUtf8(run.cli.readAllStandardOutput()).toStdString();
    EXPECT_EQ(run.cli.exitCode(), 0) << run.err.toStdString();
    EXPECT_EQ(run.enters, 9);
    const QString out = QString::fromUtf8(run.cli.readAllStandardOutput());
    EXPECT_TRUE(out.contains(QStringLiteral(" 8  I "))) << out.toStdString();
    EXPECT_TRUE(run.err.contains(QStringLiteral("connected voltmeter: Sagline Virtual Bench,VB-V1")));
}

TEST(RunCommand, AfterALinkIsRestoredItWaitsForEnterAgainBeforeReading)
{
    // As above; at step 3 the voltmeter's link goes away just as Enter is pressed, and someone
    // turns the rheostat to twice the resistance while it is away. Once the link is back the CLI
    // asks again; the test (the operator) puts the load right and presses Enter.
    CliOnTcpMeters run(false);
    const Plan &plan = run.plan;
    bool pulled = false;
    run.afterEnter = [&](int step) {
        if (step == 3 && !pulled) {
            pulled = true;
            run.bench->voltmeter()->vanish(300);
            run.bench->setLoad(2.0 * *plan.steps[3].loadResistanceOhm);
        }
    };
    QString error;
    ASSERT_TRUE(run.start(&error)) << error.toStdString();
    ASSERT_TRUE(run.finishes(15000)) << run.err.toStdString();
    const QString &err = run.err;
    EXPECT_EQ(run.cli.exitCode(), 0) << err.toStdString();
    EXPECT_TRUE(pulled);
    EXPECT_EQ(run.enters, 10) << err.toStdString(); // nine steps and step 3 once more
    // Whether the Enter reached the CLI before the link went or not, it asks again for step 3.
    EXPECT_TRUE(err.contains(QRegularExpression(QStringLiteral("step 3: link restored: .*-- press Enter to confirm"))))
        << err.toStdString();
    EXPECT_TRUE(err.contains(QStringLiteral("check the load, then press Enter to resume"))) << err.toStdString();
    // Step 3's point is at the planned load (twice the resistance would give about half the current).
    const QString out = QString::fromUtf8(run.cli.readAllStandardOutput());
    const QRegularExpression step3(QStringLiteral("^ ?3  I +([0-9.]+) A"), QRegularExpression::MultilineOption);
    const auto m = step3.match(out);
    ASSERT_TRUE(m.hasMatch()) << out.toStdString();
    EXPECT_NEAR(m.captured(1).toDouble(), plan.steps[3].currentA, 0.05 * plan.steps[3].currentA);
}
