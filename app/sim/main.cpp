// sagline-sim: a transformer on a virtual bench, with SCPI meters and a programmable load on
// pseudo-terminals and loopback TCP ports. Prints the paths and ports, then runs until killed.
#include "Clock.h"
#include "SimEndpoints.h"
#include "SimInstrument.h"
#include "VirtualBench.h"

#include "BuildInfo.h"
#include "CommandLine.h"
#include "Planner.h"
#include "SetupJson.h"

#include <QCoreApplication>
#include <QDir>
#include <QFile>
#include <QSocketNotifier>
#include <QTemporaryDir>
#include <QTextStream>
#include <QTimer>

#include <algorithm>
#include <cctype>
#include <csignal>
#include <limits>
#include <cstdio>
#include <iostream>
#include <memory>

using namespace sagline;

namespace {

void stopOnSignal(int)
{
    QCoreApplication::quit();
}

// Commands typed on standard input while the bench runs.
void handleCommand(const QString &line, VirtualBench *bench)
{
    const QStringList words = line.split(QLatin1Char(' '), Qt::SkipEmptyParts);
    if (words.isEmpty())
        return;
    QTextStream out(stdout);
    SimInstrument *target = nullptr;
    if (words.size() >= 2) {
        for (SimInstrument *instrument : bench->instruments()) {
            if (toString(instrument->kind()) == words[1])
                target = instrument;
        }
    }
    if (words[0] == QStringLiteral("state")) {
        const TransformerState s = bench->state();
        out << QStringLiteral("V2 %1 V, I2 %2 A, I1 %3 A, R %4 ohm at %5 C, fuse %6, load %7\n")
                   .arg(s.secondaryVoltageV, 0, 'f', 4)
                   .arg(s.secondaryCurrentA, 0, 'f', 4)
                   .arg(s.primaryCurrentA, 0, 'f', 4)
                   .arg(s.seriesResistanceOhm, 0, 'f', 4)
                   .arg(s.copperTemperatureC, 0, 'f', 2)
                   .arg(bench->isFuseOpen() ? QStringLiteral("OPEN") : QStringLiteral("ok"))
                   .arg(bench->load() ? QString::number(*bench->load()) + QStringLiteral(" ohm") : QStringLiteral("open"));
        out << QStringLiteral("V1 %1 V, P1 %2 W, Q1 %3 var, pf %4, core loss %5 W, copper loss %6 W\n")
                   .arg(s.primaryVoltageV, 0, 'f', 3)
                   .arg(s.primaryPowerW, 0, 'f', 4)
                   .arg(s.primaryReactivePowerVar, 0, 'f', 4)
                   .arg(s.primaryPowerFactor, 0, 'f', 4)
                   .arg(s.coreLossW, 0, 'f', 4)
                   .arg(s.copperLossW, 0, 'f', 4);
    } else if (words[0] == QStringLiteral("fault") && target && words.size() >= 3) {
        const auto fault = simFaultFromString(words[2]);
        if (!fault) {
            out << "unknown fault; drop|garbage|slow|overload|nan|endless|vanish\n";
        } else {
            target->injectFault(*fault, words.size() > 3 ? std::max(1, words[3].toInt()) : 1);
            out << "ok\n";
        }
    } else if (words[0] == QStringLiteral("replace-fuse")) {
        bench->replaceFuse();
        out << "ok\n";
    } else {
        out << "commands: state | fault INSTRUMENT drop|garbage|slow|overload|nan|endless|vanish [COUNT] | replace-fuse\n"
               "instruments: voltmeter ammeter power-meter load primary-meter\n";
    }
    out.flush();
}

CommandLine simCommandLine()
{
    CommandLine line("sagline-sim", "[options] SETUP.json",
                     "The virtual bench: a simulated transformer (from a setup file) with SCPI meters and a "
                     "programmable load on pseudo-terminals and loopback TCP. For demos, training and tests; not a "
                     "real instrument. Prints the paths and ports, then runs until stopped (Ctrl-C).");
    line.addPositional("SETUP.json", "the setup file (nameplate and bench)");
    line.addStandaloneFlag({"help-all"}, "the same as --help (this program takes no toolkit options)");
    line.addStandaloneFlag({"v", "version"}, "print the version and the git commit it was built from");
    line.addOption({"seed"}, "N", "random seed (repeatable runs), default 1");
    line.addOption({"serial-suffix"}, "TEXT",
                   "end the instruments' serial numbers with TEXT (letters, digits, '-'; up to 16) instead of a token "
                   "drawn for this process: a simulator restarted with the same TEXT plays the same meters");
    line.addOption({"tcp-port"}, "PORT",
                   "first TCP port (voltmeter; then ammeter, power meter, load, primary meter); 0 = any free; default 5025");
    line.addFlag({"no-tcp"}, "do not open TCP ports");
    line.addFlag({"no-pty"}, "do not open pseudo-terminals");
    line.addOption({"link-dir"}, "DIR", "folder for the stable pty links (default: a new temporary folder)");
    line.addHeading("changing the simulated transformer");
    line.addOption({"series-resistance"}, "OHM", "series resistance at 20 °C, referred to the secondary");
    line.addOption({"no-load-voltage"}, "V", "secondary no-load voltage (sets the ratio)");
    line.addOption({"magnetizing-current"}, "A", "primary magnetizing current");
    line.addOption({"thermal-tau"}, "S", "copper heating time constant, at least 1 s");
    line.addOption({"rated-rise"}, "K", "steady copper rise at rated load (0: no heating)");
    line.addOption({"ambient"}, "C", "ambient temperature, -40 to 100 °C");
    line.addOption({"fuse-rating"}, "A", "primary fuse rating");
    line.addOption({"noise-v"}, "V", "voltmeter noise, standard deviation");
    line.addOption({"noise-a"}, "A", "ammeter noise, standard deviation");
    line.addHeading("faults, to try how a program copes (probabilities per reply, 0 to 1)");
    line.addOption({"drop"}, "P", "a reply is dropped");
    line.addOption({"garbage"}, "P", "a reply is garbage bytes");
    line.addOption({"slow"}, "P", "a reply is late");
    line.addOption({"slow-ms"}, "MS", "how late a slow reply is, default 3000");
    line.addOption({"overload"}, "P", "a reading is the SCPI overload value 9.9E37");
    line.addOption({"vanish-every"}, "S", "every S seconds one instrument's link vanishes");
    line.addOption({"vanish-for"}, "S", "how long a vanished link stays away, default 3");
    line.addNote("Commands on standard input while it runs: state | fault INSTRUMENT "
                 "drop|garbage|slow|overload|nan|endless|vanish [COUNT] | replace-fuse | help.");
    line.addNote("Exit codes: 0 stopped by a signal; 1 a pseudo-terminal or TCP port could not be opened; 2 invalid "
                 "input (a setup that breaks a rule, an option out of range).");
    return line;
}

bool validSerialSuffix(const std::string &text)
{
    return !text.empty() && text.size() <= 16 && std::all_of(text.begin(), text.end(), [](char c) {
        return std::isalnum(static_cast<unsigned char>(c)) || c == '-';
    });
}

} // namespace

int main(int argc, char **argv)
{
    // Parsed before anything else: --help and mistakes need no event loop.
    CommandLine line = simCommandLine();
    if (const auto exit = line.parse(argc, argv))
        return *exit;
    if (line.isSet("help-all")) {
        std::cout << line.helpText();
        return 0;
    }
    if (line.isSet("version")) {
        std::cout << "sagline-sim " << buildinfo::version << " (commit " << buildinfo::gitCommit << ")\n";
        return 0;
    }
    QCoreApplication app(argc, argv);
    QCoreApplication::setApplicationName(QStringLiteral("sagline-sim"));

    const QString setupPath = QFile::decodeName(QByteArray::fromStdString(line.positionals().front()));
    const SetupParse setupParse = loadSetupFile(line.positionals().front());
    if (!setupParse.setup) {
        for (const FieldError &e : setupParse.errors)
            std::cerr << "sagline-sim: " << (e.field == line.positionals().front() ? std::string() : line.positionals().front() + ": ")
                      << e.message() << '\n';
        return 2;
    }
    const PlanResult planResult = makePlan(*setupParse.setup);
    if (!planResult.plan) {
        for (const FieldError &e : planResult.errors)
            std::cerr << "sagline-sim: plan: " << e.message() << '\n';
        return 2;
    }
    std::optional<std::uint64_t> seedGiven;
    std::optional<std::int64_t> tcpPort;
    if (!line.unsignedInteger("seed", std::numeric_limits<std::uint64_t>::max(), seedGiven)
        || !line.integer("tcp-port", 0, 65535, tcpPort))
        return 2;
    const std::uint64_t seed = seedGiven.value_or(1);
    VirtualBenchOptions bench = virtualBenchOptionsFor(*setupParse.setup, *planResult.plan, seed);
    if (const auto suffix = line.valueIfSet("serial-suffix")) {
        if (!validSerialSuffix(*suffix))
            return line.fail("--serial-suffix: '" + *suffix + "' must be 1 to 16 letters, digits or '-'");
        bench.serialSuffix = QString::fromStdString(*suffix);
    }
    double v0 = bench.transformer.noLoadVoltageV();
    double ratedRise = -1.0;
    double fuseRating = bench.fuse ? bench.fuse->ratingA : 0.0;
    SimFaultRates rates;
    double slowMs = rates.slowDelayMs, vanishEvery = 0.0, vanishFor = 3.0;
    // Every number is range-checked before use (a stalled timer or an overflowing int otherwise).
    const auto read = [&line](const char *name, double min, double max, double &target) {
        std::optional<double> value;
        if (!line.number(name, min, max, value))
            return false;
        if (value)
            target = *value;
        return true;
    };
    const bool ok = read("series-resistance", 0.0, 1e6, bench.transformer.seriesResistanceOhm)
                    && read("no-load-voltage", 1e-3, 1e6, v0)
                    && read("magnetizing-current", 0.0, 1e4, bench.transformer.magnetizingCurrentA)
                    && read("thermal-tau", 1.0, 1e7, bench.transformer.thermalTimeConstantS)
                    && read("rated-rise", 0.0, 1000.0, ratedRise) && read("ambient", -40.0, 100.0, bench.transformer.ambientC)
                    && read("fuse-rating", 0.0, 1e4, fuseRating) && read("noise-v", 0.0, 1e3, bench.voltmeter.noiseSd)
                    && read("noise-a", 0.0, 1e3, bench.ammeter.noiseSd) && read("drop", 0.0, 1.0, rates.drop)
                    && read("garbage", 0.0, 1.0, rates.garbage) && read("slow", 0.0, 1.0, rates.slow)
                    && read("slow-ms", 0.0, 600000.0, slowMs) && read("overload", 0.0, 1.0, rates.overload)
                    && read("vanish-every", 0.0, 86400.0, vanishEvery) && read("vanish-for", 0.0, 86400.0, vanishFor);
    if (!ok)
        return 2;
    bench.transformer.turnsRatio = bench.transformer.primaryVoltageV / v0;
    bench.transformer.referenceTemperatureC = bench.transformer.ambientC;
    if (ratedRise >= 0.0) {
        const double i2 = planResult.plan->ratedSecondaryCurrentA;
        const double loss = i2 * i2 * bench.transformer.seriesResistanceOhm;
        bench.transformer.thermalResistanceKPerW = loss > 0.0 ? ratedRise / loss : 0.0;
    }
    if (bench.fuse)
        bench.fuse->ratingA = fuseRating;
    rates.slowDelayMs = static_cast<int>(slowMs);
    rates.vanishMs = static_cast<int>(vanishFor * 1000.0);

    SystemClock clock;
    VirtualBench virtualBench(bench, &clock);
    for (SimInstrument *instrument : virtualBench.instruments())
        instrument->setFaultRates(rates);

    const bool noPty = line.isSet("no-pty"), noTcp = line.isSet("no-tcp");
    std::unique_ptr<QTemporaryDir> tempDir;
    QString linkDir = QFile::decodeName(QByteArray::fromStdString(line.value("link-dir")));
    if (linkDir.isEmpty() && !noPty) {
        tempDir = std::make_unique<QTemporaryDir>(QDir::tempPath() + QStringLiteral("/sagline-sim-XXXXXX"));
        linkDir = tempDir->path();
    }
    quint16 port = static_cast<quint16>(tcpPort.value_or(5025));
    QString error;

    const TransformerParameters &t = bench.transformer;
    QTextStream out(stdout);
    out << QStringLiteral("sagline-sim %1: virtual bench for %2 (seed %3)\n")
               .arg(QString::fromLatin1(buildinfo::version), setupPath)
               .arg(seed);
    out << QStringLiteral("  transformer: V0 %1 V, R %2 ohm at %3 °C (T_k %4 °C), ratio %5, magnetizing %6 A, "
                          "heating tau %7 s, fuse %8\n")
               .arg(t.noLoadVoltageV(), 0, 'f', 4)
               .arg(t.seriesResistanceOhm, 0, 'f', 4)
               .arg(t.referenceTemperatureC, 0, 'f', 1)
               .arg(t.temperatureConstantC)
               .arg(t.turnsRatio, 0, 'f', 4)
               .arg(t.magnetizingCurrentA, 0, 'f', 4)
               .arg(t.thermalTimeConstantS, 0, 'f', 0)
               .arg(bench.fuse ? QStringLiteral("%1 A %2").arg(bench.fuse->ratingA).arg(QString::fromStdString(toString(bench.fuse->type)))
                               : QStringLiteral("none"));
    out << QStringLiteral("  primary side: core loss P0 %1 W at %2 V, series reactance X %3 ohm (secondary), supply "
                          "impedance %4 + j%5 ohm; the primary meter also answers MEAS:POW:AC?, MEAS:POW:AC:REAC?, "
                          "MEAS:POW:AC:PFAC?\n")
               .arg(t.coreLossW, 0, 'f', 4)
               .arg(t.primaryVoltageV, 0, 'f', 1)
               .arg(t.leakageReactanceOhm, 0, 'f', 4)
               .arg(t.supplyResistanceOhm, 0, 'f', 3)
               .arg(t.supplyReactanceOhm, 0, 'f', 3);
    QList<QObject *> endpoints;
    for (SimInstrument *instrument : virtualBench.instruments()) {
        QString listing = QStringLiteral("  %1").arg(toString(instrument->kind()), -12);
        if (!noPty) {
            auto *pty = new PtyEndpoint(instrument, linkDir + QLatin1Char('/') + toString(instrument->kind()), &app);
            if (!pty->start(&error)) {
                std::cerr << "sagline-sim: " << error.toStdString() << '\n';
                return 1;
            }
            listing += QStringLiteral(" pty %1 (now %2)").arg(pty->linkPath(), pty->ptyPath());
        }
        if (!noTcp) {
            auto *tcp = new TcpEndpoint(instrument, &app);
            if (!tcp->start(port, &error)) {
                std::cerr << "sagline-sim: " << error.toStdString() << " (try --tcp-port 0)\n";
                return 1;
            }
            listing += QStringLiteral("  tcp 127.0.0.1:%1").arg(tcp->port());
            if (port != 0)
                ++port;
        }
        out << listing << '\n';
        out << QStringLiteral("  %1 *IDN? %2\n").arg(QString(), -12).arg(instrument->identity());
    }
    out << "Type 'help' for commands (state, fault, replace-fuse). Ctrl-C stops.\n";
    out.flush();

    if (vanishEvery > 0.0) {
        auto *timer = new QTimer(&app);
        QObject::connect(timer, &QTimer::timeout, &virtualBench, [&virtualBench, rates] {
            const auto list = virtualBench.instruments();
            const auto index = std::uniform_int_distribution<int>(0, static_cast<int>(list.size()) - 1)(virtualBench.random());
            list[index]->vanish(rates.vanishMs);
        });
        timer->start(static_cast<int>(vanishEvery * 1000.0));
    }
    QSocketNotifier input(fileno(stdin), QSocketNotifier::Read);
    QObject::connect(&input, &QSocketNotifier::activated, &app, [&input, &virtualBench] {
        std::string command;
        if (!std::getline(std::cin, command)) {
            input.setEnabled(false); // stdin closed: keep running until a signal
            return;
        }
        handleCommand(QString::fromStdString(command), &virtualBench);
    });
    std::signal(SIGINT, stopOnSignal);
    std::signal(SIGTERM, stopOnSignal);
    return app.exec();
}
