// sagline: the desktop app (live sweep workspace). Wiring only: names the app, reads the
// command line, builds the main window, runs the event loop.
#include "BuildInfo.h"
#include "DemoSweep.h"
#include "InstrumentsPanel.h"
#include "MainWindow.h"
#include "PlanPanel.h"
#include "SetupForm.h"
#include "SetupJson.h"
#include "StartupProbe.h"

#include <QApplication>
#include <QCommandLineParser>
#include <QElapsedTimer>
#include <QFile>
#include <QPushButton>
#include <QTextStream>
#include <QTimer>

#include <cstdio>
#include <cstring>

namespace {

bool hasDisplay()
{
    return qEnvironmentVariableIsSet("QT_QPA_PLATFORM") || qEnvironmentVariableIsSet("DISPLAY")
           || qEnvironmentVariableIsSet("WAYLAND_DISPLAY");
}

} // namespace

int main(int argc, char **argv)
{
    QElapsedTimer sinceMain; // --startup-probe: also from here to the first painted frame
    sinceMain.start();
    // --version answers without a display too (bug reports, scripts over ssh).
    if (argc == 2 && (std::strcmp(argv[1], "--version") == 0 || std::strcmp(argv[1], "-v") == 0)) {
        std::printf("sagline %s (commit %s)\n", sagline::buildinfo::version, sagline::buildinfo::gitCommit);
        return 0;
    }
    if (!hasDisplay()) {
        std::fputs("sagline: no display (neither DISPLAY nor WAYLAND_DISPLAY is set); run sagline-cli for a headless "
                   "sweep, or set QT_QPA_PLATFORM=offscreen\n",
                   stderr);
        return 1;
    }
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Sagline"));
    QApplication::setApplicationName(QStringLiteral("sagline"));
    QApplication::setApplicationVersion(QStringLiteral("%1 (commit %2)")
                                            .arg(QLatin1String(sagline::buildinfo::version),
                                                 QLatin1String(sagline::buildinfo::gitCommit)));

    QCommandLineParser parser;
    parser.setApplicationDescription(QStringLiteral("Plan, run and review the load test of a small mains transformer."));
    parser.addHelpOption();
    parser.addVersionOption();
    QCommandLineOption screenshot(QStringLiteral("screenshot"),
                                  QStringLiteral("Run a demo sweep, save the window as PNG into DIR, and quit."),
                                  QStringLiteral("DIR"));
    QCommandLineOption dark(QStringLiteral("dark"), QStringLiteral("With --screenshot: also save a dark-palette PNG."));
    QCommandLineOption demo(QStringLiteral("demo"), QStringLiteral("Start a sweep on the virtual bench right away."));
    QCommandLineOption typedDemo(QStringLiteral("typed-demo"),
                                 QStringLiteral("With --screenshot: a typed-in demo sweep instead of the virtual bench."));
    QCommandLineOption folder(QStringLiteral("session-folder"), QStringLiteral("Where new session files go."),
                              QStringLiteral("DIR"));
    QCommandLineOption startupProbe(QStringLiteral("startup-probe"),
                                    QStringLiteral("Print the milliseconds from process start to the first painted window\n"
                                                   "(with SESSION open and drawn, if given), then quit."));
    parser.addOptions({screenshot, dark, demo, typedDemo, folder, startupProbe});
    parser.addPositionalArgument(QStringLiteral("SESSION"), QStringLiteral("A .sagline session file to open."),
                                 QStringLiteral("[SESSION]"));
    parser.process(app);

    sagline::MainWindow window;
    if (parser.isSet(folder))
        window.setSessionFolder(parser.value(folder));
    QFile demoSetup(QStringLiteral(":/sagline/demo-setup.json"));
    if (demoSetup.open(QIODevice::ReadOnly)) {
        const auto parsed = sagline::parseSetupJson(demoSetup.readAll().toStdString());
        if (parsed.setup)
            window.loadSetup(*parsed.setup);
    }
    if (!parser.positionalArguments().isEmpty())
        window.openSessionFile(parser.positionalArguments().front());

    if (parser.isSet(screenshot)) {
        if (!parser.isSet(folder))
            window.setSessionFolder(parser.value(screenshot) + QStringLiteral("/sessions"));
        window.resize(1600, 1000);
        window.show();
        // A sweep in progress: two steps still to go.
        const auto result = parser.isSet(typedDemo) ? sagline::runTypedDemoSweep(window, 2)
                                                    : sagline::runVirtualBenchDemo(window, 7);
        QTextStream out(stdout);
        if (!result.ok) {
            QTextStream(stderr) << "sagline: demo sweep failed: " << result.message << '\n';
            return 1;
        }
        out << "demo sweep: " << result.points << " points, session " << result.message << '\n';
        for (const QString &path : sagline::saveScreenshots(window, parser.value(screenshot), parser.isSet(dark)))
            out << "screenshot: " << path << '\n';
        return 0;
    }
    if (parser.isSet(startupProbe))
        sagline::quitAfterFirstPaint(window, sinceMain);
    window.show();
    if (parser.isSet(demo))
        QTimer::singleShot(0, &window, [&window] {
            // The session needs an operator and a unit; a demo names them plainly.
            sagline::SessionDetails details = window.setupForm()->sessionDetails();
            if (details.operatorName.isEmpty())
                details.operatorName = qEnvironmentVariableIsSet("USER") ? qEnvironmentVariable("USER") : QStringLiteral("operator");
            if (details.unitSerial.isEmpty())
                details.unitSerial = QStringLiteral("virtual-bench");
            window.setupForm()->setSessionDetails(details);
            window.instrumentsPanel()->setChoice({sagline::ReadingSource::VirtualBench, {}, {}});
            window.planPanel()->acceptButton()->click();
        });
    return app.exec();
}
