// sagline-cli run: a whole load sweep, headless. One line per recorded point on stdout
// (step, I, V, live R), instructions and notices on stderr, then the final fit.
// With --sim the virtual bench runs in this process (its load is programmable; simulated time
// unless --sim-realtime); with real meters the operator sets the load and presses Enter.
#include "CliCommands.h"
#include "FitOutput.h"
#include "VirtualBenchTruth.h"

#include "CommandLine.h"

#include "BuildInfo.h"
#include "Clock.h"
#include "ConformityAssessment.h"
#include "InstrumentRig.h"
#include "LineFitLiveFit.h"
#include "LinkAddress.h"
#include "PlanGates.h"
#include "PlanJson.h"
#include "Planner.h"
#include "ResultAnalysis.h"
#include "SessionStore.h"
#include "SessionStoreSink.h"
#include "SessionSummary.h"
#include "SetupJson.h"
#include "SweepController.h"
#include "VirtualBench.h"

#include <QCoreApplication>
#include <QDateTime>
#include <QFileInfo>
#include <QSocketNotifier>
#include <QTimer>

#include <algorithm>
#include <cerrno>
#include <csignal>
#include <cstdio>
#include <cstring>
#include <unistd.h>
#include <iostream>
#include <limits>
#include <memory>
#include <optional>

namespace sagline::cli {

namespace {

// How long a headless run waits on a pause nobody resolves (common practice for unattended
// scripts: long enough for a meter to be re-plugged, short enough not to leave a load on).
constexpr std::int64_t defaultGiveUpAfterS = 120;

struct RunArguments {
    std::string setupPath;
    std::string outputPath;
    bool sim = false;
    bool simRealtime = false;
    bool simSingleMeter = false;
    bool simPrimaryMeter = false;             // the mains-side analyser on the virtual bench
    std::optional<double> simSupplyRegulation; // % the simulated supply sags at rated primary current
    std::uint64_t seed = 1;
    std::optional<double> simFuseRatingA;
    RigAddresses addresses;
    std::optional<double> dwellS;
    std::optional<double> readIntervalS;
    std::string operatorName;
    std::string person;          // --by: recorded with every record
    std::string overrideReason;  // --override-limits
    bool truncateToSafe = false;
    std::string unitSerial;
    std::optional<double> ambientC;
    std::int64_t giveUpAfterMs = defaultGiveUpAfterS * 1000; // 0 = never
};

CommandLine runCommandLine()
{
    CommandLine line("sagline-cli run", "SETUP.json (--sim | --voltmeter ADDR --ammeter ADDR | --meter ADDR) -o SESSION.sagline [options]",
                     "Runs a whole load sweep without a display and records it in a new session file. One line per "
                     "recorded point on standard output (step, I, V, live R), once it is committed to the file; "
                     "instructions and notices on standard error; then the final fit. With meters but no programmable "
                     "load, it says which load to set at each step and waits for Enter.");
    line.addPositional("SETUP.json", "the setup file (nameplate and bench)");
    line.addOption({"o", "output"}, "SESSION.sagline", "the session file to create (never an existing file)");
    line.addHeading("instruments");
    line.addFlag({"sim"}, "the virtual bench inside this program, in simulated time, with its programmable load");
    line.addOption({"voltmeter"}, "ADDR", "the secondary voltmeter (with --ammeter)");
    line.addOption({"ammeter"}, "ADDR", "the secondary ammeter (with --voltmeter)");
    line.addOption({"meter"}, "ADDR", "one meter in both roles");
    line.addOption({"load"}, "ADDR", "a programmable SCPI load (real instruments only)");
    line.addOption({"timeout-ms"}, "MS", "how long to wait for a meter's reply, 50 to 600000 (default 2000)");
    line.addFlag({"reset"}, "send *RST to each meter on connecting");
    line.addHeading("the session");
    line.addOption({"operator"}, "NAME", "who runs the test (default: $USER)");
    line.addOption({"by"}, "NAME", "the person recorded with every reading and event (the OS account is recorded too)");
    line.addOption({"serial"}, "UNIT", "the unit's serial number");
    line.addOption({"ambient"}, "C", "ambient temperature, -60 to 80 °C");
    line.addHeading("steps the rheostat or the fuse cannot take (refused before connecting otherwise)");
    line.addFlag({"truncate-to-safe"}, "run only the safe steps (recorded in the session)");
    line.addOption({"override-limits"}, "REASON", "run every step anyway, with --by; the reason is recorded (the hard "
                                                  "stops still apply)");
    line.addHeading("timing");
    line.addOption({"dwell"}, "S", "seconds to wait at each step, 0 to 86400, instead of the setup's");
    line.addOption({"read-interval"}, "S", "seconds between readings, 0 to 3600");
    line.addOption({"give-up-after"}, "S|never",
                   "a pause nobody resolves (a load or meter that stopped answering, no valid reading, a link that "
                   "keeps dropping) ends the run after S seconds, 1 to 604800, with the load switched off and exit "
                   "code 4 (default 120; never: wait)");
    line.addHeading("the virtual bench (--sim)");
    line.addOption({"seed"}, "N", "random seed, for repeatable runs (default 1)");
    line.addFlag({"sim-realtime"}, "real time instead of simulated time");
    line.addFlag({"sim-single-meter"}, "one meter (the power meter) in both roles");
    line.addOption({"sim-fuse-rating"}, "A", "another primary fuse rating, above 0 to 1000 A");
    line.addFlag({"sim-primary-meter"},
                 "a power analyser on the primary too (voltage, current, active and reactive power): losses, "
                 "efficiency and the series reactance in the results");
    line.addOption({"sim-supply-regulation"}, "PERCENT",
                   "a supply with its own resistance that sags by PERCENT (0 to 20) at rated primary current "
                   "(default 0, a stiff supply)");
    line.addNote("ADDR: a serial port PORT[,BAUD[,8N1[,rtscts|xonxoff]]] or tcp:HOST[:PORT] (SCPI raw socket, "
                 "port 5025 by default).");
    line.addNote(exitCodesNote);
    return line;
}

// Reads the parsed words into `out`; returns an exit code when they are not usable.
std::optional<int> readArguments(const CommandLine &line, RunArguments *out)
{
    out->setupPath = line.positionals().front();
    out->outputPath = line.value("output");
    out->simRealtime = line.isSet("sim-realtime");
    out->simSingleMeter = line.isSet("sim-single-meter");
    out->simPrimaryMeter = line.isSet("sim-primary-meter");
    out->sim = line.isSet("sim") || out->simRealtime || out->simSingleMeter || out->simPrimaryMeter;
    out->addresses.voltmeter = QString::fromLocal8Bit(line.value("voltmeter"));
    out->addresses.ammeter = QString::fromLocal8Bit(line.value("ammeter"));
    out->addresses.meter = QString::fromLocal8Bit(line.value("meter"));
    out->addresses.load = QString::fromLocal8Bit(line.value("load"));
    out->addresses.resetOnConnect = line.isSet("reset");
    out->operatorName = line.value("operator");
    out->person = line.value("by");
    out->overrideReason = line.value("override-limits");
    out->truncateToSafe = line.isSet("truncate-to-safe");
    if (line.isSet("override-limits") && out->overrideReason.find_first_not_of(" \t") == std::string::npos)
        return line.fail("--override-limits: give the reason the limits are overridden");
    if (!out->overrideReason.empty() && out->person.find_first_not_of(" \t") == std::string::npos)
        return line.fail("--by: an override of the limits needs the name of the person who decides it");
    if (!out->overrideReason.empty() && out->truncateToSafe)
        return line.fail("--truncate-to-safe and --override-limits: choose one");
    out->unitSerial = line.value("serial");
    std::optional<std::int64_t> timeoutMs;
    std::optional<std::uint64_t> seed;
    // Ranges that keep every later conversion (to milliseconds, to int) exact and every wait finite.
    if (!line.number("sim-fuse-rating", 1e-6, 1000.0, out->simFuseRatingA) || !line.number("ambient", -60.0, 80.0, out->ambientC)
        || !line.number("sim-supply-regulation", 0.0, 20.0, out->simSupplyRegulation)
        || !line.number("dwell", 0.0, 86400.0, out->dwellS) || !line.number("read-interval", 0.0, 3600.0, out->readIntervalS)
        || !line.integer("timeout-ms", 50, 600000, timeoutMs)
        || !line.unsignedInteger("seed", std::numeric_limits<std::uint64_t>::max(), seed))
        return exitInvalidInput;
    if (timeoutMs)
        out->addresses.timeoutMs = static_cast<int>(*timeoutMs);
    if (line.value("give-up-after") == "never") {
        out->giveUpAfterMs = 0;
    } else {
        std::optional<double> giveUpS;
        if (!line.number("give-up-after", 1.0, 604800.0, giveUpS))
            return exitInvalidInput;
        if (giveUpS)
            out->giveUpAfterMs = static_cast<std::int64_t>(*giveUpS * 1000.0);
    }
    if (seed)
        out->seed = *seed;
    if (out->outputPath.empty())
        return line.fail("give the session file to write with -o SESSION.sagline");
    const bool meters = !out->addresses.voltmeter.isEmpty() || !out->addresses.ammeter.isEmpty() || !out->addresses.meter.isEmpty();
    if (out->sim == meters)
        return line.fail("give either --sim or the meters (--voltmeter and --ammeter, or --meter)");
    if (out->sim && !out->addresses.load.isEmpty())
        return line.fail("--load is for real instruments; the virtual bench has its own load");
    return std::nullopt;
}

QString formatPoint(const Reading &reading, const LiveFitSnapshot &fit)
{
    QString r = fit.valid ? QStringLiteral("%1 Ω").arg(fit.seriesResistanceOhm, 0, 'f', 4) : QStringLiteral("-");
    QString line = QStringLiteral("%1  I %2 A  V %3 V  live R %4")
                       .arg(reading.step, 2)
                       .arg(reading.currentA, 8, 'f', 4)
                       .arg(reading.voltageV, 8, 'f', 4)
                       .arg(r);
    const std::string flags = flagsToString(reading.flags & ~static_cast<std::uint32_t>(flagSimulated));
    if (!flags.empty())
        line += QStringLiteral("  [%1]").arg(QString::fromStdString(flags));
    return line;
}

// Ctrl-C or SIGTERM during a sweep: stop it the normal way (a programmable load is switched
// off, the stop is recorded) instead of dying with the load on. Self-pipe: the handler only writes.
int interruptPipe[2] = {-1, -1};

void handleInterrupt(int)
{
    const char byte = 1;
    [[maybe_unused]] const ssize_t written = ::write(interruptPipe[1], &byte, 1);
}

} // namespace

int runRun(const Arguments &rawArgs)
{
    CommandLine line = runCommandLine();
    if (const auto exit = line.parse(rawArgs))
        return *exit;
    RunArguments args;
    if (const auto exit = readArguments(line, &args))
        return *exit;
    const SetupParse parsed = loadSetupFile(args.setupPath);
    if (!parsed.setup) {
        for (const FieldError &e : parsed.errors)
            // A whole-file error names the file already; a field error gets the file in front.
            std::cerr << "sagline-cli run: " << (e.field == args.setupPath ? std::string() : args.setupPath + ", ") << e.message()
                      << '\n';
        return exitInvalidInput;
    }
    const Setup &setup = *parsed.setup;
    const PlanResult planned = makePlan(setup);
    if (!planned.plan) {
        for (const FieldError &e : planned.errors)
            std::cerr << "sagline-cli run: plan refused: " << e.message() << '\n';
        return exitInvalidInput;
    }
    Plan plan = *planned.plan;
    // A plan with steps the bench cannot take is refused before anything is connected, unless
    // cut to its safe steps or overridden by a named person with a reason (both recorded).
    const std::vector<UnsafeStep> unsafe = unsafeSteps(plan);
    std::optional<std::pair<SweepEventKind, std::string>> gateRecord;
    if (!unsafe.empty()) {
        const std::string steps = describeUnsafeSteps(unsafe);
        if (args.truncateToSafe) {
            plan = truncatedToSafe(plan);
            gateRecord = {SweepEventKind::Truncated, "removed " + steps};
            std::cerr << "sagline-cli run: running the safe steps only; removed " << steps << '\n';
        } else if (!args.overrideReason.empty()) {
            gateRecord = {SweepEventKind::LimitOverride, steps + "; reason: " + args.overrideReason};
            std::cerr << "sagline-cli run: WARNING: limits overridden by " << args.person << " (" << args.overrideReason
                      << "): " << steps << '\n';
        } else {
            std::cerr << "sagline-cli run: refused before connecting: the bench cannot take " << steps
                      << ". Fix the setup, run the safe steps with --truncate-to-safe, or override with --override-limits "
                         "REASON --by NAME\n";
            return exitInvalidInput;
        }
        if (plan.steps.empty()) {
            std::cerr << "sagline-cli run: refused: no step of the plan is safe\n";
            return exitInvalidInput;
        }
    }
    if (QFileInfo::exists(QString::fromStdString(args.outputPath))) {
        std::cerr << "sagline-cli run: " << args.outputPath << " already exists; a session file is never overwritten\n";
        return exitInvalidInput;
    }

    int argc = 1;
    char name[] = "sagline-cli";
    char *argv[] = {name, nullptr};
    QCoreApplication app(argc, argv);

    // Instruments first: no session file for a bench that is not there.
    std::unique_ptr<Clock> clock;
    VirtualClock *virtualClock = nullptr;
    std::unique_ptr<VirtualBench> bench;
    std::unique_ptr<InstrumentRig> rig;
    if (args.sim && !args.simRealtime) {
        auto vc = std::make_unique<VirtualClock>(QDateTime::currentMSecsSinceEpoch());
        virtualClock = vc.get();
        clock = std::move(vc);
    } else {
        clock = std::make_unique<SystemClock>();
    }
    if (args.sim) {
        VirtualBenchOptions options = virtualBenchOptionsFor(setup, plan, args.seed);
        if (args.simFuseRatingA && options.fuse)
            options.fuse->ratingA = *args.simFuseRatingA;
        if (args.simSupplyRegulation && plan.ratedPrimaryCurrentA > 0.0)
            options.transformer.supplyResistanceOhm =
                *args.simSupplyRegulation / 100.0 * setup.nameplate.primaryVoltageV / plan.ratedPrimaryCurrentA;
        bench = std::make_unique<VirtualBench>(options, clock.get());
        rig.reset(makeVirtualBenchRig(bench.get(), args.simSingleMeter, nullptr, args.simPrimaryMeter));
    } else {
        QString error;
        rig.reset(makeRig(args.addresses, &error));
        if (!rig)
            return line.fail(error.toStdString());
    }
    if (const QString problem = rig->validate(); !problem.isEmpty())
        return line.fail(problem.toStdString());

    std::optional<QString> connectError;
    bool connected = false;
    QObject::connect(rig.get(), &InstrumentRig::ready, [&] { connected = true; app.quit(); });
    QObject::connect(rig.get(), &InstrumentRig::connectFailed, [&](const QString &m) { connectError = m; app.quit(); });
    QObject::connect(rig.get(), &InstrumentRig::instrumentError,
                     [](const QString &m) { std::cerr << "instrument: " << m.toStdString() << '\n'; });
    rig->connectAll();
    app.exec();
    if (!connected) {
        std::cerr << "sagline-cli run: cannot connect: " << connectError.value_or(QStringLiteral("unknown error")).toStdString() << '\n';
        return exitRuntimeFailure;
    }
    for (ScpiInstrument *instrument : rig->instruments())
        std::cerr << "connected " << instrument->name().toStdString() << ": " << instrument->identityText().toStdString()
                  << " (" << instrument->link()->description().toStdString() << ")\n";

    // The meters' own accuracy rules go into the session's setup: the analysis propagates their
    // gain and offset once per result (core/FitBudget.h).
    Setup recordedSetup = setup;
    if (auto specs = rig->meterSpecs(setup.meters ? setup.meters->windingTemperatureUncertaintyC : std::nullopt))
        recordedSetup.meters = specs;
    NewSession session;
    session.setupJson = setupToJson(recordedSetup);
    session.planJson = planToJson(plan);
    session.operatorName = !args.operatorName.empty() ? args.operatorName
                           : qEnvironmentVariableIsSet("USER") ? qEnvironmentVariable("USER").toStdString()
                                                               : std::string("operator");
    session.unitSerial = !args.unitSerial.empty() ? args.unitSerial
                         : args.sim ? "virtual-bench-seed-" + std::to_string(args.seed)
                                    : std::string("unspecified");
    session.ambientTemperatureC = args.ambientC;
    session.softwareVersion = std::string("sagline-cli ") + buildinfo::version;
    session.createdBy = {args.person, ""};
    auto created = SessionStore::create(args.outputPath, session);
    if (!created.ok()) {
        std::cerr << "sagline-cli run: " << args.outputPath << ": " << created.status().message << '\n';
        return created.status().code == StoreCode::FileExists ? exitInvalidInput : exitRuntimeFailure;
    }
    std::unique_ptr<SessionStore> store = std::move(created.value);
    if (gateRecord) {
        const auto recorded = store->recordSweepEvent(gateRecord->first, -1, gateRecord->second);
        if (!recorded.ok()) {
            std::cerr << "sagline-cli run: " << recorded.message << '\n';
            return exitRuntimeFailure;
        }
    }
    SessionStoreSink sink(store.get(), QStringLiteral("sagline-cli run"));
    LineFitLiveFit fit;

    SweepOptions options = sweepOptionsFor(setup, plan);
    options.simulated = args.sim;
    if (args.dwellS)
        options.dwellMs = static_cast<std::int64_t>(*args.dwellS * 1000.0);
    if (args.readIntervalS)
        options.readIntervalMs = static_cast<std::int64_t>(*args.readIntervalS * 1000.0);
    options.giveUpAfterMs = args.giveUpAfterMs;
    SweepController controller(plan, options, rig.get(), &sink, &fit, clock.get());
    const std::string giveUpNote =
        args.giveUpAfterMs > 0 ? " (the run gives up after " + std::to_string(args.giveUpAfterMs / 1000) + " s unless resolved)"
                               : std::string();

    std::optional<SweepOutcome> outcome;
    const bool waitForEnter = !controller.hasProgrammableLoad();
    // Enter confirms the load only while a step waits for it; an Enter pressed earlier (during
    // a dwell, say) is dropped so that it cannot skip the next step's setting. Read with
    // read(2), not std::cin, whose buffer would hide lines from the notifier.
    QSocketNotifier stdinNotifier(STDIN_FILENO, QSocketNotifier::Read);
    stdinNotifier.setEnabled(waitForEnter);
    QObject::connect(&stdinNotifier, &QSocketNotifier::activated, [&] {
        char buffer[256];
        const ssize_t n = ::read(STDIN_FILENO, buffer, sizeof buffer);
        if (n < 0 && (errno == EAGAIN || errno == EINTR))
            return;
        if (n <= 0) {
            if (n < 0)
                std::cerr << "standard input: " << std::strerror(errno) << '\n';
            stdinNotifier.setEnabled(false);
            if (controller.state() != SweepState::Finished && controller.state() != SweepState::Stopped) {
                std::cerr << "standard input closed: stopping the sweep\n";
                controller.stop();
            }
            return;
        }
        if (!std::memchr(buffer, '\n', static_cast<std::size_t>(n)))
            return;
        if (controller.state() == SweepState::WaitingForLoad)
            controller.confirmLoadSet();
        else if (controller.state() == SweepState::Paused)
            controller.resume(); // the operator checked the meters (a lost link waits for itself)
    });
    QObject::connect(&controller, &SweepController::stepStarted, [&](int step, const QString &text) {
        // A step started again (link restored, resumed) asks to check the load, not to set it.
        const bool recheck = text.startsWith(QStringLiteral("link restored")) || text.startsWith(QStringLiteral("resumed"));
        std::cerr << "step " << step << ": " << text.toStdString()
                  << (!waitForEnter ? ""
                      : recheck     ? " -- press Enter to confirm"
                                    : " -- press Enter when it is set")
                  << '\n';
    });
    QObject::connect(&controller, &SweepController::pointRecorded, [](const Reading &reading, const LiveFitSnapshot &snapshot) {
        std::cout << formatPoint(reading, snapshot).toStdString() << std::endl;
    });
    QObject::connect(&controller, &SweepController::notice, [](const QString &m) { std::cerr << "note: " << m.toStdString() << '\n'; });
    QObject::connect(&controller, &SweepController::linkLost,
                     [&](const QString &m) { std::cerr << "PAUSED: " << m.toStdString() << giveUpNote << '\n'; });
    // Without a programmable load the restored step waits for Enter again (stepStarted says so):
    // the rheostat may have been moved while the meters were away.
    QObject::connect(&controller, &SweepController::linkRestored, [&](const QString &m) {
        std::cerr << "link restored (" << m.toStdString() << ")"
                  << (waitForEnter ? "; check the load, then press Enter to resume\n" : "; setting the load again and resuming\n");
    });
    QObject::connect(&controller, &SweepController::paused, [&](const QString &reason) {
        if (!controller.isManual() && reason.startsWith(QStringLiteral("link lost")))
            return; // waits for the link by itself
        if (reason.startsWith(QStringLiteral("could not record"))) {
            std::cerr << "PAUSED: " << reason.toStdString() << '\n';
            // A headless run cannot wait for someone to free the disk: it ends, load off.
            controller.abandon(reason);
            return;
        }
        std::cerr << "PAUSED: " << reason.toStdString() << (waitForEnter ? " -- press Enter to resume" : "")
                  << giveUpNote << '\n';
    });
    QObject::connect(&controller, &SweepController::safetyStop, [](const SafetyTrip &trip, const Reading &reading) {
        std::cerr << "SAFETY STOP at step " << reading.step << " (" << toString(trip.limit) << "): " << trip.message << '\n';
    });
    // A programmable load is switched off at every end; leave only once it said so, or after
    // its reply time. A load that never confirms is reported loudly below.
    std::optional<std::pair<bool, QString>> loadOff;
    QObject::connect(&controller, &SweepController::loadSwitchedOff, [&](bool ok, const QString &error) {
        loadOff = {ok, error};
        if (outcome)
            app.quit();
    });
    QObject::connect(&controller, &SweepController::finished, [&](SweepOutcome o) {
        outcome = o;
        if (!controller.hasProgrammableLoad() || loadOff)
            QTimer::singleShot(0, &app, &QCoreApplication::quit);
        else
            QTimer::singleShot(args.addresses.timeoutMs + 1000, &app, &QCoreApplication::quit);
    });
    std::unique_ptr<QSocketNotifier> interruptNotifier;
    if (::pipe(interruptPipe) == 0) {
        interruptNotifier = std::make_unique<QSocketNotifier>(interruptPipe[0], QSocketNotifier::Read);
        QObject::connect(interruptNotifier.get(), &QSocketNotifier::activated, [&] {
            char byte;
            [[maybe_unused]] const ssize_t n = ::read(interruptPipe[0], &byte, 1);
            std::cerr << "interrupted: stopping the sweep\n";
            if (controller.state() == SweepState::Finished || controller.state() == SweepState::Stopped)
                app.quit();
            else
                controller.stop();
        });
        std::signal(SIGINT, handleInterrupt);
        std::signal(SIGTERM, handleInterrupt);
    }
    if (virtualClock)
        virtualClock->setAutoAdvance(true);
    QTimer::singleShot(0, &controller, &SweepController::start);
    app.exec();
    std::signal(SIGINT, SIG_DFL);
    std::signal(SIGTERM, SIG_DFL);
    if (virtualClock)
        virtualClock->setAutoAdvance(false);

    const SweepOutcome result = outcome.value_or(SweepOutcome::Failed);
    std::cerr << "sweep " << toString(result).toStdString() << "; " << controller.recordedCount() << " points recorded in "
              << args.outputPath << '\n';
    if (controller.hasProgrammableLoad() && !(loadOff && loadOff->first))
        std::cerr << "\n*** WARNING: the programmable load did not confirm it is switched off ("
                  << (loadOff ? loadOff->second.toStdString() : std::string("no answer"))
                  << "). SWITCH THE LOAD OFF BY HAND NOW. ***\n\n";
    else if (!controller.hasProgrammableLoad() && result != SweepOutcome::Completed)
        std::cerr << "\n*** The load is set by hand and is still connected: switch the supply off or open the load by "
                     "hand now. ***\n\n";

    auto readings = store->includedReadings();
    if (readings.ok()) {
        FitReport report;
        report.source = args.outputPath;
        // The setup as recorded (with the meters' accuracy rules) and core's one assessment, so
        // these are the numbers `fit SESSION` prints for the new file: on the readings referred to
        // the rated supply where the primary voltage was read.
        const double ratedPrimaryV = recordedSetup.nameplate.primaryVoltageV;
        report.supply = assessSupply(readings.value, ratedPrimaryV, FitVoltages::Referred, defaultSupplyDriftTolerancePercent,
                                     primaryVoltmeterOf(recordedSetup.meters));
        report.fit = fitReadings(columnsToFit(readings.value, report.supply->fitVoltages, ratedPrimaryV), FitMethod::Ols,
                                 fitOptionsFor(recordedSetup.meters));
        if (report.fit.ok()) {
            report.warnings = fitWarnings(report.fit, {});
            report.meters = recordedSetup.meters;
            report.hasNameplate = true;
            if (std::any_of(readings.value.begin(), readings.value.end(), [](const Reading &r) { return r.primary.hasAny(); })) {
                AnalysisInput analysisInput = analysisInputFor(recordedSetup);
                analysisInput.referralGainUPercent = report.supply->referralGainUPercent;
                report.primarySide = analysePrimarySide(readings.value, &report.fit, &analysisInput,
                                                        primarySideInputFor(recordedSetup.nameplate));
            }
            AssessmentOptions assessmentOptions;
            assessmentOptions.referralGainUPercent = report.supply->referralGainUPercent;
            const Assessment assessment = assessFit(report.fit, recordedSetup, assessmentOptions);
            // `run` judges with the defaults only; `fit SESSION` says the same of the new file.
            SettingsUsed used;
            used.rule = assessmentOptions.rule;
            report.settingsUsed = describeSettingsUsed(used);
            if (assessment.analysis.ok()) {
                report.analysis = assessment.analysis;
                report.verdict = assessment.verdict;
            } else {
                report.warnings.push_back("no analysis at rated current: " + assessment.analysis.errors.front().message());
            }
            std::cout << '\n';
            printFitReport(report, std::cout);
        } else {
            std::cout << "\nno fit: " << report.fit.message << '\n';
        }
    }
    if (bench) {
        const TransformerParameters &t = bench->options().transformer;
        const TransformerState s = bench->state();
        std::cout << "\nvirtual bench (seed " << args.seed << "): V0 " << QString::number(t.noLoadVoltageV(), 'f', 4).toStdString()
                  << " V, R " << QString::number(t.seriesResistanceOhm, 'f', 4).toStdString() << " Ω at "
                  << t.referenceTemperatureC << " °C; copper now " << QString::number(s.copperTemperatureC, 'f', 2).toStdString()
                  << " °C (R " << QString::number(s.seriesResistanceOhm, 'f', 4).toStdString() << " Ω)"
                  << (bench->isFuseOpen() ? "; primary fuse OPEN" : "") << '\n';
        // What a perfect fit would give through these meters: V0 x gV and R x gV / gI.
        const double gv = bench->voltmeterGain();
        const double gi = bench->ammeterGain();
        std::cout << "  meter gain errors: voltmeter " << QString::number((gv - 1.0) * 100.0, 'f', 3).toStdString()
                  << " %, ammeter " << QString::number((gi - 1.0) * 100.0, 'f', 3).toStdString()
                  << " %; seen through them: V0 " << QString::number(t.noLoadVoltageV() * gv, 'f', 4).toStdString() << " V, R "
                  << QString::number(t.seriesResistanceOhm * gv / gi, 'f', 4).toStdString() << " Ω at 20 °C\n";
        // The fit is on readings referred to the rated supply through the analyser's own voltmeter
        // (V2 and I2 × V1,rated/V1 read): V0 is seen × 1/g1 more, R is not.
        if (args.simPrimaryMeter)
            std::cout << "  referred through the primary analyser's voltmeter (gain error "
                      << QString::number((bench->primaryVoltmeterGain() - 1.0) * 100.0, 'f', 3).toStdString() << " %): V0 "
                      << QString::number(t.noLoadVoltageV() * gv / bench->primaryVoltmeterGain(), 'f', 4).toStdString()
                      << " V\n";
        printVirtualBenchTruth(*bench, plan.ratedSecondaryCurrentA, args.simPrimaryMeter, std::cout);
    }
    switch (result) {
    case SweepOutcome::Completed: return exitSuccess;
    case SweepOutcome::SafetyStop: return exitSafetyStop;
    case SweepOutcome::GaveUp: return exitGaveUp;
    default: return exitRuntimeFailure;
    }
}

} // namespace sagline::cli
