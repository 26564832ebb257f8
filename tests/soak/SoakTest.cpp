// A long, faulty day in simulated time: a sweep of 100 000 readings on the virtual bench (its
// programmable load steps itself), with a fault every few hundred readings in turn: a link that
// drops, a garbage reply, a reply too slow for the link's timeout, and a meter that comes back
// with another identity (about 50 faults in all). Checked against the session file: no reading lost or duplicated, every
// step recorded once and in order, every fault in the notes; and memory stays flat: the resident
// set at the end within 25 MB of what it was after the first 1 000 readings.
// Label "soak" (about a minute): `ctest --preset soak`, run by scripts/test.sh after the suite.
#include "InstrumentsTestSupport.h"

#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "LinkAddress.h"
#include "ScpiLink.h"
#include "SessionStore.h"
#include "SessionStoreSink.h"
#include "SimInstrument.h"
#include "SweepController.h"
#include "VirtualBench.h"

#include <QEventLoop>
#include <QTemporaryDir>
#include <QTimer>

#include <fstream>
#include <unistd.h>

using namespace sagline;
using namespace sagline::test;

namespace {

const int totalReadings = qEnvironmentVariableIntValue("SAGLINE_SOAK_READINGS") > 0
                              ? qEnvironmentVariableIntValue("SAGLINE_SOAK_READINGS") : 100000; // smaller for a quick look
const int faultEvery = qEnvironmentVariableIntValue("SAGLINE_SOAK_FAULT_EVERY") > 0
                           ? qEnvironmentVariableIntValue("SAGLINE_SOAK_FAULT_EVERY") : 1999; // readings between two faults
constexpr double rssMarginBytes = 25.0 * 1024 * 1024; // allowed growth after the first 1 000

double residentBytes()
{
    std::ifstream statm("/proc/self/statm");
    long pages = 0, resident = 0;
    statm >> pages >> resident;
    return static_cast<double>(resident) * static_cast<double>(::sysconf(_SC_PAGESIZE));
}

// The demo plan's steps over and over, renumbered 0..n-1: one reading per step.
Plan longPlan(const Plan &demo, int steps)
{
    Plan plan = demo;
    plan.steps.clear();
    for (int k = 0; k < steps; ++k) {
        PlanStep step = demo.steps[static_cast<std::size_t>(k) % demo.steps.size()];
        step.index = k;
        plan.steps.push_back(step);
    }
    return plan;
}

// Session files go where a durable commit is cheap (a RAM disk) when there is one: this test is
// about the controller and the links, not about the disk's fsync.
QString sessionFolderBase()
{
    return QFileInfo(QStringLiteral("/dev/shm")).isWritable() ? QStringLiteral("/dev/shm") : QDir::tempPath();
}

enum class Fault { LinkDrop, Garbage, Slow, OtherIdentity };

} // namespace

TEST(Soak, AHundredThousandReadingsWithPeriodicFaultsLoseNothing)
{
    const sagline::Setup setup = demoSetup();
    const Plan demo = planFor(setup);
    const Plan plan = longPlan(demo, totalReadings);
    VirtualClock clock(0);
    VirtualBenchOptions benchOptions = virtualBenchOptionsFor(setup, demo, 5);
    benchOptions.transformer.thermalResistanceKPerW = 0.0; // a day of simulated load would heat it
    benchOptions.fuse.reset();
    VirtualBench bench(benchOptions, &clock);
    SimFaultRates rates;
    rates.vanishMs = 40;     // a dropped link stays away this long (wall time)
    rates.slowDelayMs = 250; // later than the link's timeout below
    for (SimInstrument *instrument : bench.instruments())
        instrument->setFaultRates(rates);
    std::unique_ptr<InstrumentRig> rig(makeVirtualBenchRig(&bench, false));
    for (ScpiInstrument *instrument : rig->instruments()) {
        instrument->setReconnectIntervalMs(30);
        instrument->link()->setTimeoutMs(100);
    }
    rig->connectAll();
    ASSERT_TRUE(waitUntil([&] { return rig->isReady(); }));

    QTemporaryDir folder(sessionFolderBase() + QStringLiteral("/sagline-soak-XXXXXX"));
    ASSERT_TRUE(folder.isValid());
    const std::string path = folder.filePath(QStringLiteral("soak.sagline")).toStdString();
    NewSession session;
    session.setupJson = setupToJson(setup);
    session.operatorName = "soak test";
    session.unitSerial = "SOAK-1";
    auto created = SessionStore::create(path, session);
    ASSERT_TRUE(created.ok()) << created.message;
    SessionStoreSink sink(created.value.get(), QStringLiteral("soak test"));
    LineFitLiveFit fit;
    SweepOptions options = sweepOptionsFor(setup, plan);
    options.simulated = true;
    options.readIntervalMs = 100;
    SweepController controller(plan, options, rig.get(), &sink, &fit, &clock);

    int recorded = 0, lastStep = -1, outOfOrder = 0;
    double rssAfterFirstThousand = 0.0;
    std::map<Fault, int> injected;
    const Fault order[] = {Fault::LinkDrop, Fault::Garbage, Fault::Slow, Fault::OtherIdentity};
    std::optional<SweepOutcome> outcome;
    QObject::connect(&controller, &SweepController::finished, [&](SweepOutcome o) { outcome = o; });
    QObject::connect(&controller, &SweepController::pointRecorded, [&](const Reading &reading, const LiveFitSnapshot &) {
        outOfOrder += reading.step != lastStep + 1;
        lastStep = reading.step;
        ++recorded;
        if (recorded == 1000)
            rssAfterFirstThousand = residentBytes();
        if (recorded % faultEvery != 0)
            return;
        const Fault fault = order[(recorded / faultEvery) % 4];
        ++injected[fault];
        SimInstrument *voltmeter = bench.voltmeter();
        switch (fault) {
        case Fault::LinkDrop: voltmeter->vanish(rates.vanishMs); break;
        case Fault::Garbage: bench.ammeter()->injectFault(SimFault::Garbage, 1); break;
        case Fault::Slow: voltmeter->injectFault(SimFault::Slow, 1); break;
        case Fault::OtherIdentity: {
            // Away, and back as another meter (a different one each time) for a while; then the
            // original returns.
            const QString serial = voltmeter->serialNumber();
            voltmeter->setSerialNumber(QStringLiteral("STRANGER-%1").arg(injected[fault]));
            voltmeter->vanish(rates.vanishMs);
            QTimer::singleShot(150, voltmeter, [voltmeter, serial] { voltmeter->setSerialNumber(serial); });
            break;
        }
        }
    });
    clock.setAutoAdvance(true);
    controller.start();
    // One event loop until the end, as the CLI's --sim runs (a polling wait would add its own
    // wall-clock tick to every simulated timer). About a minute on an idle machine; the bound
    // is for a loaded one.
    {
        QEventLoop loop;
        QObject::connect(&controller, &SweepController::finished, &loop, &QEventLoop::quit);
        QTimer::singleShot(900000, &loop, &QEventLoop::quit);
        loop.exec();
    }
    ASSERT_TRUE(outcome.has_value())
        << recorded << " readings; state " << toString(controller.state()).toStdString() << ": "
        << controller.pauseReason().toStdString();
    const double rssAtEnd = residentBytes();
    EXPECT_EQ(*outcome, SweepOutcome::Completed);
    EXPECT_EQ(recorded, totalReadings);
    EXPECT_EQ(outOfOrder, 0);

    // The session file: every step once, in order, nothing lost or duplicated.
    created.value.reset();
    auto stored = SessionStore::openForReview(path);
    ASSERT_TRUE(stored.ok()) << stored.message;
    const auto readings = stored.value->readings();
    ASSERT_TRUE(readings.ok()) << readings.message;
    ASSERT_EQ(readings.value.size(), static_cast<std::size_t>(totalReadings));
    for (int k = 0; k < totalReadings; ++k) {
        if (readings.value[static_cast<std::size_t>(k)].step != k) {
            ADD_FAILURE() << "reading " << k << " is of step " << readings.value[static_cast<std::size_t>(k)].step;
            break;
        }
    }
    // Every fault in the notes.
    const auto notes = stored.value->notes();
    ASSERT_TRUE(notes.ok());
    std::map<Fault, int> noted;
    for (const NoteRecord &note : notes.value) {
        const auto has = [&note](const char *words) { return note.text.find(words) != std::string::npos; };
        noted[Fault::LinkDrop] += has("link lost at step") && has("voltmeter");
        noted[Fault::OtherIdentity] += has("a different instrument answered after reconnecting and is not used");
        noted[Fault::Garbage] += has("secondary ammeter: reply") && has("is not a reading");
        noted[Fault::Slow] += has("secondary voltmeter: no reply to");
    }
    // A drop and an identity change each lose the link (both counted as drops above).
    EXPECT_GE(noted[Fault::LinkDrop], injected[Fault::LinkDrop] + injected[Fault::OtherIdentity]);
    EXPECT_GE(noted[Fault::OtherIdentity], injected[Fault::OtherIdentity]);
    EXPECT_GE(noted[Fault::Garbage], injected[Fault::Garbage]);
    EXPECT_GE(noted[Fault::Slow], injected[Fault::Slow]);
    for (Fault fault : order)
        EXPECT_GE(injected[fault], totalReadings / faultEvery / 4 - 1) << static_cast<int>(fault);
    RecordProperty("rss_after_1000_mb", static_cast<int>(rssAfterFirstThousand / 1048576.0));
    RecordProperty("rss_at_end_mb", static_cast<int>(rssAtEnd / 1048576.0));
    EXPECT_LT(rssAtEnd - rssAfterFirstThousand, rssMarginBytes)
        << "RSS grew from " << rssAfterFirstThousand / 1048576.0 << " MB to " << rssAtEnd / 1048576.0 << " MB";
}
