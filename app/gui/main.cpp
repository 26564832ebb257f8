// sagline: the desktop app (live sweep workspace). Wiring only: names the app, reads the
// command line, builds the main window, runs the event loop.
#include "BuildInfo.h"
#include "CommandLine.h"
#include "DemoSweep.h"
#include "InstrumentsPanel.h"
#include "LargePageHeap.h"
#include "MainWindow.h"
#include "PlanPanel.h"
#include "SetupForm.h"
#include "SetupJson.h"
#include "StartupProbe.h"

#include <QApplication>
#include <QElapsedTimer>
#include <QFile>
#include <QPushButton>
#include <QTextStream>
#include <QTimer>

#include <csignal>
#include <cstdio>
#include <cstring>
#include <optional>

namespace {

// Options Qt itself takes (QGuiApplication, QApplication); QApplication removes them from argv.
constexpr const char *toolkitNote =
    "Qt's own options are accepted too and go to the toolkit: -platform NAME, -style NAME, -stylesheet FILE,\n"
    "-reverse, -qwindowgeometry WxH+X+Y, -qwindowtitle TITLE, -display DISPLAY (X11); see the Qt documentation.";

sagline::CommandLine guiCommandLine()
{
    sagline::CommandLine line("sagline", "[options] [SESSION]",
                              "Plan, run and review the load test of a small mains transformer (the desktop program).");
    line.addPositional("SESSION", "a .sagline session file to open", sagline::Arity::Optional);
    line.addStandaloneFlag({"help-all"}, "this help and a note on the Qt toolkit's own options");
    line.addStandaloneFlag({"v", "version"}, "print the version and the git commit it was built from (no display needed)");
    line.addOption({"session-folder"}, "DIR", "where new session files go");
    line.addFlag({"demo"}, "start a sweep on the virtual bench right away");
    line.addOption({"screenshot"}, "DIR", "run a demo sweep, save the window as PNG into DIR, and quit");
    line.addFlag({"dark"}, "with --screenshot: also save a dark-palette PNG");
    line.addFlag({"typed-demo"}, "with --screenshot: a typed-in demo sweep instead of the virtual bench");
    line.addFlag({"startup-probe"}, "print the milliseconds from the process's start to the first painted window (with "
                                     "SESSION open and drawn, if given), then quit");
    line.addNote("Without a display (neither DISPLAY nor WAYLAND_DISPLAY nor QT_QPA_PLATFORM set) only --help and "
                 "--version work; run sagline-cli for a headless sweep. Exit codes: 0 closed normally or screenshots "
                 "saved; 1 no display, or the demo sweep of --screenshot failed; 2 invalid usage.");
    return line;
}

bool hasDisplay(int argc, char **argv)
{
    for (int i = 1; i < argc; ++i) {
        if (std::strcmp(argv[i], "-platform") == 0 || std::strcmp(argv[i], "--platform") == 0)
            return true;
    }
    return qEnvironmentVariableIsSet("QT_QPA_PLATFORM") || qEnvironmentVariableIsSet("DISPLAY")
           || qEnvironmentVariableIsSet("WAYLAND_DISPLAY");
}

// --help-all and --version; nothing when the program goes on.
std::optional<int> answerRequest(const sagline::CommandLine &line)
{
    if (line.isSet("help-all")) {
        std::fputs((line.helpText() + '\n' + toolkitNote + '\n').c_str(), stdout);
        return 0;
    }
    if (line.isSet("version")) {
        std::printf("sagline %s (commit %s)\n", sagline::buildinfo::version, sagline::buildinfo::gitCommit);
        return 0;
    }
    return std::nullopt;
}

} // namespace

int main(int argc, char **argv)
{
    sagline::adviseLargePagesForHeap(); // before Qt allocates: see app/common/LargePageHeap.h
    // A file size limit fails a write (reported, temporary file removed) instead of killing
    // the program mid-write: see app/cli/main.cpp.
    std::signal(SIGXFSZ, SIG_IGN);
    QElapsedTimer sinceMain; // --startup-probe: also from here to the first painted frame
    sinceMain.start();
    sagline::CommandLine line = guiCommandLine();
    if (!hasDisplay(argc, argv)) {
        // --help and --version answer without a display (bug reports, scripts over ssh).
        if (const auto exit = line.parse(argc, argv))
            return *exit;
        if (const auto exit = answerRequest(line))
            return *exit;
        std::fputs("sagline: no display (neither DISPLAY nor WAYLAND_DISPLAY is set); run sagline-cli for a headless "
                   "sweep, or set QT_QPA_PLATFORM=offscreen\n",
                   stderr);
        return 1;
    }
    QApplication app(argc, argv); // takes the toolkit's own options out of argv
    if (const auto exit = line.parse(argc, argv))
        return *exit;
    if (const auto exit = answerRequest(line))
        return *exit;
    QApplication::setOrganizationName(QStringLiteral("Sagline"));
    QApplication::setApplicationName(QStringLiteral("sagline"));
    QApplication::setApplicationVersion(QStringLiteral("%1 (commit %2)")
                                            .arg(QLatin1String(sagline::buildinfo::version),
                                                 QLatin1String(sagline::buildinfo::gitCommit)));
    const auto pathOption = [&line](const char *name) {
        return QFile::decodeName(QByteArray::fromStdString(line.value(name)));
    };
    const bool takeScreenshot = line.isSet("screenshot");

    sagline::MainWindow window;
    if (line.isSet("session-folder"))
        window.setSessionFolder(pathOption("session-folder"));
    QFile demoSetup(QStringLiteral(":/sagline/demo-setup.json"));
    if (demoSetup.open(QIODevice::ReadOnly)) {
        const auto parsed = sagline::parseSetupJson(demoSetup.readAll().toStdString());
        if (parsed.setup) {
            window.setDefaultSetup(*parsed.setup); // what File > New session starts from
            window.loadSetup(*parsed.setup);
        }
    }
    if (!line.positionals().empty())
        window.openSessionFile(QFile::decodeName(QByteArray::fromStdString(line.positionals().front())));

    if (takeScreenshot) {
        if (!line.isSet("session-folder"))
            window.setSessionFolder(pathOption("screenshot") + QStringLiteral("/sessions"));
        // Nobody is at the keyboard: a question (a no-load reading far from the plan, say) is
        // answered "no" and the sweep stops, instead of a dialog that waits for ever.
        window.setConfirmPrompt([](const QString &, const QString &) { return false; });
        window.setTextPrompt([](const QString &, const QString &) { return std::optional<QString>(); });
        window.resize(1600, 1000);
        window.show();
        // A sweep in progress: two steps still to go.
        const auto result = line.isSet("typed-demo") ? sagline::runTypedDemoSweep(window, 2)
                                                    : sagline::runVirtualBenchDemo(window, 7);
        QTextStream out(stdout);
        if (!result.ok) {
            QTextStream(stderr) << "sagline: demo sweep failed: " << result.message << '\n';
            return 1;
        }
        out << "demo sweep: " << result.points << " points, session " << result.message << '\n';
        for (const QString &path : sagline::saveScreenshots(window, pathOption("screenshot"), line.isSet("dark")))
            out << "screenshot: " << path << '\n';
        return 0;
    }
    if (line.isSet("startup-probe"))
        sagline::quitAfterFirstPaint(window, sinceMain);
    window.show();
    if (line.isSet("demo"))
        QTimer::singleShot(0, &window, [&window] {
            // The session needs an operator and a unit; a demo names them plainly.
            sagline::SessionDetails details = window.setupForm()->sessionDetails();
            if (details.operatorName.isEmpty())
                details.operatorName = qEnvironmentVariableIsSet("USER") ? qEnvironmentVariable("USER") : QStringLiteral("operator");
            if (details.unitSerial.isEmpty())
                details.unitSerial = QStringLiteral("virtual-bench");
            window.setupForm()->setSessionDetails(details);
            window.instrumentsPanel()->setChoice({sagline::ReadingSource::VirtualBench, {}, {}});
            window.setPerson(QStringLiteral("Demo person")); // a demo names who makes the changes
            window.planPanel()->acceptButton()->click();
        });
    return app.exec();
}
