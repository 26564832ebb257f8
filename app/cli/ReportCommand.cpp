// sagline-cli report SESSION.sagline -o REPORT.pdf [--page a4|letter] [review options]: the
// printed test report. The session is opened for review (never changed). Works headless: with
// no display the offscreen platform is used for fonts and painting.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "BuildInfo.h"
#include "ReportWriter.h"
#include "SessionSummary.h"
#include "UtcTime.h"

#include <QGuiApplication>

#include <cstdlib>
#include <iostream>

namespace sagline::cli {

namespace {

CommandLine reportCommandLine()
{
    CommandLine line("sagline-cli report", "SESSION.sagline -o REPORT.pdf [options]",
                     "Writes the printed test report of a session as PDF: results with their uncertainties, the "
                     "verdict and its decision rule, the voltage-current and residual charts, the readings, "
                     "exclusions, safety stops, notes and the sign-off. The session is opened for review and never "
                     "changed. Works without a display.");
    line.addPositional("SESSION.sagline", "the session to report");
    line.addOption({"o", "output"}, "REPORT.pdf", "the PDF to write");
    line.addOption({"page"}, "a4|letter", "the paper size (default a4)");
    line.addOption({"method"}, "ols|wls|york", "the fit method (default ols)");
    line.addOption({"rule"}, "simple|guarded|non-binary",
                   "the decision rule of the verdict (ILAC-G8:09/2019 §4.2.1-4.2.3; default non-binary)");
    line.addOption({"regulation-limit"}, "PERCENT|nameplate",
                   "judge regulation against this limit instead of the setup's specification; \"nameplate\" takes the "
                   "nameplate's own regulation, labelled so");
    line.addOption({"reference-temperature"}, "C", "refer R to this temperature, -273.15 to 1000 °C");
    line.addOption({"temperature-constant"}, "copper-ieee|copper-iec|aluminium",
                   "T_k: 234.5 °C (IEEE C57.12.90), 235 °C (IEC 60076-1) or 225 °C");
    line.addFlag({"force"}, "replace an existing file (never a session, never the session read)");
    line.addNote("The PDF is written whole or not at all (a temporary file renamed into place).");
    line.addNote("Settings stored in the session by the desktop app are used where no option is given; the report "
                 "prints each setting and where it came from.");
    line.addNote(exitCodesNote);
    return line;
}

// Returns "" or the rule an option broke.
std::string readArguments(const CommandLine &line, ReportOptions &report, ReviewOptions &review)
{
    if (const auto value = line.valueIfSet("page")) {
        if (*value == "a4" || *value == "A4")
            report.pageSize = QPageSize::A4;
        else if (*value == "letter" || *value == "Letter")
            report.pageSize = QPageSize::Letter;
        else
            return "--page: expected a4 or letter, got '" + *value + "'";
    }
    if (const auto value = line.valueIfSet("method")) {
        const auto method = fitMethodFromString(*value);
        if (!method)
            return "--method: expected ols, wls or york, got '" + *value + "'";
        review.method = *method;
    }
    if (const auto value = line.valueIfSet("rule")) {
        const auto rule = decisionRuleFromString(*value);
        if (!rule)
            return "--rule: expected simple, guarded or non-binary, got '" + *value + "'";
        review.rule = *rule;
    }
    if (const auto value = line.valueIfSet("regulation-limit")) {
        review.regulationLimit = regulationLimitFromText(*value);
        if (!review.regulationLimit)
            return "--regulation-limit: expected a percentage above 0 and at most 100, or nameplate, got '" + *value + "'";
    }
    if (const auto value = line.valueIfSet("temperature-constant")) {
        const auto constant = temperatureConstantFromString(*value);
        if (!constant)
            return "--temperature-constant: expected copper-ieee, copper-iec or aluminium, got '" + *value + "'";
        review.temperatureConstant = *constant;
    }
    if (line.value("output").empty())
        return "give the PDF to write with -o REPORT.pdf";
    return {};
}

} // namespace

int runReport(const Arguments &args)
{
    CommandLine line = reportCommandLine();
    if (const auto exit = line.parse(args))
        return *exit;
    ReportOptions report;
    ReviewOptions review;
    if (!line.number("reference-temperature", -273.15, 1000.0, review.referenceTemperatureC))
        return exitInvalidInput;
    if (const std::string problem = readArguments(line, report, review); !problem.empty())
        return line.fail(problem);
    const std::string sessionPath = line.positionals().front();
    const std::string outputPath = line.value("output");
    if (const auto refused = refuseOutputs("report", {outputPath}, {sessionPath}, line.isSet("force")))
        return *refused;
    const auto summary = loadSessionSummary(sessionPath, review);
    if (!summary.ok()) {
        std::cerr << "sagline-cli report: " << summary.message << '\n';
        return exitCodeFor(summary.code);
    }
    if (!summary.value.notice.empty())
        std::cerr << "sagline-cli report: note: " << summary.value.notice << '\n';

    // Fonts and painting need a QGuiApplication; without a display, use the offscreen platform.
    const bool hasDisplay = std::getenv("DISPLAY") != nullptr || std::getenv("WAYLAND_DISPLAY") != nullptr;
    if (!hasDisplay && !qEnvironmentVariableIsSet("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    // Run as a service or by root without a login session, Qt notes on stderr that it picked a
    // runtime folder itself: not the user's concern (the PDF needs none), so only that is dropped.
    static QtMessageHandler qtHandler = nullptr;
    qtHandler = qInstallMessageHandler([](QtMsgType type, const QMessageLogContext &context, const QString &text) {
        if (type == QtWarningMsg && text.startsWith(QLatin1String("QStandardPaths: XDG_RUNTIME_DIR not set")))
            return;
        if (qtHandler)
            qtHandler(type, context, text);
    });
    int argc = 1;
    char name[] = "sagline-cli";
    char *argv[] = {name, nullptr};
    QGuiApplication application(argc, argv);

    report.producedBy = QStringLiteral("sagline-cli %1").arg(QString::fromLatin1(buildinfo::version));
    report.generatedUtc = QString::fromStdString(utcNow());
    const QString problem = writeSessionReport(summary.value, QString::fromStdString(outputPath), report);
    if (!problem.isEmpty()) {
        std::cerr << "sagline-cli report: " << problem.toStdString() << '\n';
        return exitRuntimeFailure;
    }
    for (const std::string &notice : summary.value.recordedSettings.notices)
        std::cerr << "sagline-cli report: note: " << notice << '\n';
    std::cout << "Judged with: " << describeSettingsUsed(summary.value) << '\n';
    // In the words the window and the PDF use; a session that is not complete gets no verdict word.
    if (const auto &v = summary.value.verdict)
        std::cout << "Verdict: "
                  << summary.value.progress.verdictText(outcomeWords(v->outcome)) << " (" << v->ruleName << "; limits: " << v->limitsSource
                  << ")\n";
    std::cout << "Wrote " << outputPath << '\n';
    return exitSuccess;
}

} // namespace sagline::cli
