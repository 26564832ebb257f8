// sagline-sim: a transformer on a virtual bench, with SCPI meters and a programmable load on
// pseudo-terminals and loopback TCP ports. Prints the paths and ports, then runs until killed.
#include "Clock.h"
#include "SimEndpoints.h"
#include "SimInstrument.h"
#include "VirtualBench.h"

#include "BuildInfo.h"
#include "Planner.h"
#include "SetupJson.h"

#include <QCommandLineParser>
#include <QCoreApplication>
#include <QDir>
#include <QSocketNotifier>
#include <QTemporaryDir>
#include <QTextStream>
#include <QTimer>

#include <csignal>
#include <cstdio>
#include <iostream>
#include <memory>

using namespace sagline;

namespace {

void stopOnSignal(int)
{
    QCoreApplication::quit();
}

bool readDouble(const QCommandLineParser &parser, const QString &name, double *value, QString *error, double min = 0.0)
{
    if (!parser.isSet(name))
        return true;
    bool ok = false;
    const double v = parser.value(name).toDouble(&ok);
    if (!ok || !std::isfinite(v) || v < min) {
        *error = QStringLiteral("--%1: '%2' must be a number >= %3").arg(name, parser.value(name)).arg(min);
        return false;
    }
    *value = v;
    return true;
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

} // namespace

int main(int argc, char **argv)
{
    QCoreApplication app(argc, argv);
    QCoreApplication::setApplicationName(QStringLiteral("sagline-sim"));
    QCoreApplication::setApplicationVersion(
        QStringLiteral("%1 (commit %2)").arg(QLatin1String(buildinfo::version), QLatin1String(buildinfo::gitCommit)));

    QCommandLineParser parser;
    parser.setApplicationDescription(QStringLiteral(
        "The virtual bench: a simulated transformer (from a setup file) with SCPI meters and a programmable load\n"
        "on pseudo-terminals and loopback TCP. For demos, training and tests; not a real instrument."));
    parser.addHelpOption();
    parser.addVersionOption();
    parser.addPositionalArgument(QStringLiteral("SETUP.json"), QStringLiteral("the setup file (nameplate and bench)"));
    const QList<QCommandLineOption> options{
        {QStringLiteral("seed"), QStringLiteral("random seed (repeatable runs), default 1"), QStringLiteral("N")},
        {QStringLiteral("tcp-port"), QStringLiteral("first TCP port (voltmeter; then ammeter, power meter, load, primary meter); 0 = any free; default 5025"), QStringLiteral("PORT")},
        {QStringLiteral("no-tcp"), QStringLiteral("do not open TCP ports")},
        {QStringLiteral("no-pty"), QStringLiteral("do not open pseudo-terminals")},
        {QStringLiteral("link-dir"), QStringLiteral("folder for the stable pty links (default: a new temporary folder)"), QStringLiteral("DIR")},
        {QStringLiteral("series-resistance"), QStringLiteral("override: series resistance at 20 °C, referred to the secondary"), QStringLiteral("OHM")},
        {QStringLiteral("no-load-voltage"), QStringLiteral("override: secondary no-load voltage (sets the ratio)"), QStringLiteral("V")},
        {QStringLiteral("magnetizing-current"), QStringLiteral("override: primary magnetizing current"), QStringLiteral("A")},
        {QStringLiteral("thermal-tau"), QStringLiteral("override: copper heating time constant"), QStringLiteral("S")},
        {QStringLiteral("rated-rise"), QStringLiteral("override: steady copper rise at rated load, K (0: no heating)"), QStringLiteral("K")},
        {QStringLiteral("ambient"), QStringLiteral("override: ambient temperature, °C"), QStringLiteral("C")},
        {QStringLiteral("fuse-rating"), QStringLiteral("override: primary fuse rating"), QStringLiteral("A")},
        {QStringLiteral("noise-v"), QStringLiteral("voltmeter noise, standard deviation"), QStringLiteral("V")},
        {QStringLiteral("noise-a"), QStringLiteral("ammeter noise, standard deviation"), QStringLiteral("A")},
        {QStringLiteral("drop"), QStringLiteral("fault: probability a reply is dropped"), QStringLiteral("P")},
        {QStringLiteral("garbage"), QStringLiteral("fault: probability a reply is garbage bytes"), QStringLiteral("P")},
        {QStringLiteral("slow"), QStringLiteral("fault: probability a reply is late"), QStringLiteral("P")},
        {QStringLiteral("slow-ms"), QStringLiteral("fault: how late a slow reply is, default 3000"), QStringLiteral("MS")},
        {QStringLiteral("overload"), QStringLiteral("fault: probability a reading is the SCPI overload value 9.9E37"), QStringLiteral("P")},
        {QStringLiteral("vanish-every"), QStringLiteral("fault: every S seconds one instrument's link vanishes"), QStringLiteral("S")},
        {QStringLiteral("vanish-for"), QStringLiteral("fault: how long a vanished link stays away, default 3"), QStringLiteral("S")},
    };
    parser.addOptions(options);
    parser.process(app);

    const QStringList positional = parser.positionalArguments();
    if (positional.size() != 1) {
        std::cerr << "sagline-sim: give one setup file (see --help)\n";
        return 2;
    }
    const SetupParse setupParse = loadSetupFile(positional[0].toStdString());
    if (!setupParse.setup) {
        for (const FieldError &e : setupParse.errors)
            std::cerr << "sagline-sim: " << positional[0].toStdString() << ": " << e.message() << '\n';
        return 2;
    }
    const PlanResult planResult = makePlan(*setupParse.setup);
    if (!planResult.plan) {
        for (const FieldError &e : planResult.errors)
            std::cerr << "sagline-sim: plan: " << e.message() << '\n';
        return 2;
    }
    bool ok = true;
    const quint64 seed = parser.isSet(QStringLiteral("seed")) ? parser.value(QStringLiteral("seed")).toULongLong(&ok) : 1;
    if (!ok) {
        std::cerr << "sagline-sim: --seed must be a non-negative integer\n";
        return 2;
    }
    VirtualBenchOptions bench = virtualBenchOptionsFor(*setupParse.setup, *planResult.plan, seed);
    QString error;
    double v0 = bench.transformer.noLoadVoltageV();
    double ratedRise = -1.0;
    double fuseRating = bench.fuse ? bench.fuse->ratingA : 0.0;
    SimFaultRates rates;
    double slowMs = rates.slowDelayMs, vanishEvery = 0.0, vanishFor = 3.0;
    ok = readDouble(parser, QStringLiteral("series-resistance"), &bench.transformer.seriesResistanceOhm, &error)
         && readDouble(parser, QStringLiteral("no-load-voltage"), &v0, &error, 1e-3)
         && readDouble(parser, QStringLiteral("magnetizing-current"), &bench.transformer.magnetizingCurrentA, &error)
         && readDouble(parser, QStringLiteral("thermal-tau"), &bench.transformer.thermalTimeConstantS, &error, 1.0)
         && readDouble(parser, QStringLiteral("rated-rise"), &ratedRise, &error)
         && readDouble(parser, QStringLiteral("ambient"), &bench.transformer.ambientC, &error, -40.0)
         && readDouble(parser, QStringLiteral("fuse-rating"), &fuseRating, &error)
         && readDouble(parser, QStringLiteral("noise-v"), &bench.voltmeter.noiseSd, &error)
         && readDouble(parser, QStringLiteral("noise-a"), &bench.ammeter.noiseSd, &error)
         && readDouble(parser, QStringLiteral("drop"), &rates.drop, &error)
         && readDouble(parser, QStringLiteral("garbage"), &rates.garbage, &error)
         && readDouble(parser, QStringLiteral("slow"), &rates.slow, &error)
         && readDouble(parser, QStringLiteral("slow-ms"), &slowMs, &error)
         && readDouble(parser, QStringLiteral("overload"), &rates.overload, &error)
         && readDouble(parser, QStringLiteral("vanish-every"), &vanishEvery, &error)
         && readDouble(parser, QStringLiteral("vanish-for"), &vanishFor, &error);
    if (!ok) {
        std::cerr << "sagline-sim: " << error.toStdString() << '\n';
        return 2;
    }
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

    std::unique_ptr<QTemporaryDir> tempDir;
    QString linkDir = parser.value(QStringLiteral("link-dir"));
    if (linkDir.isEmpty() && !parser.isSet(QStringLiteral("no-pty"))) {
        tempDir = std::make_unique<QTemporaryDir>(QDir::tempPath() + QStringLiteral("/sagline-sim-XXXXXX"));
        linkDir = tempDir->path();
    }
    quint16 port = 5025;
    if (parser.isSet(QStringLiteral("tcp-port")))
        port = static_cast<quint16>(parser.value(QStringLiteral("tcp-port")).toUInt());

    const TransformerParameters &t = bench.transformer;
    QTextStream out(stdout);
    out << QStringLiteral("sagline-sim %1: virtual bench for %2 (seed %3)\n")
               .arg(QString::fromLatin1(buildinfo::version), positional[0])
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
    QList<QObject *> endpoints;
    for (SimInstrument *instrument : virtualBench.instruments()) {
        QString line = QStringLiteral("  %1").arg(toString(instrument->kind()), -12);
        if (!parser.isSet(QStringLiteral("no-pty"))) {
            auto *pty = new PtyEndpoint(instrument, linkDir + QLatin1Char('/') + toString(instrument->kind()), &app);
            if (!pty->start(&error)) {
                std::cerr << "sagline-sim: " << error.toStdString() << '\n';
                return 1;
            }
            line += QStringLiteral(" pty %1 (now %2)").arg(pty->linkPath(), pty->ptyPath());
        }
        if (!parser.isSet(QStringLiteral("no-tcp"))) {
            auto *tcp = new TcpEndpoint(instrument, &app);
            if (!tcp->start(port, &error)) {
                std::cerr << "sagline-sim: " << error.toStdString() << " (try --tcp-port 0)\n";
                return 1;
            }
            line += QStringLiteral("  tcp 127.0.0.1:%1").arg(tcp->port());
            if (port != 0)
                ++port;
        }
        out << line << '\n';
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
        std::string line;
        if (!std::getline(std::cin, line)) {
            input.setEnabled(false); // stdin closed: keep running until a signal
            return;
        }
        handleCommand(QString::fromStdString(line), &virtualBench);
    });
    std::signal(SIGINT, stopOnSignal);
    std::signal(SIGTERM, stopOnSignal);
    return app.exec();
}
