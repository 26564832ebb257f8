// sagline-cli report SESSION.sagline -o REPORT.pdf [--page a4|letter] [review options]: the
// printed test report. The session is opened for review (never changed). Works headless: with
// no display the offscreen platform is used for fonts and painting.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "BuildInfo.h"
#include "ReportWriter.h"
#include "SessionSummary.h"
#include "UtcTime.h"

#include <QGuiApplication>

#include <charconv>
#include <cmath>
#include <cstdlib>
#include <iostream>

namespace sagline::cli {

namespace {

constexpr const char *usage =
    "usage: sagline-cli report SESSION.sagline -o REPORT.pdf [--page a4|letter] [--method ols|wls|york]\n"
    "         [--rule simple|guarded|non-binary] [--regulation-limit PERCENT|nameplate] [--reference-temperature C]\n"
    "         [--temperature-constant copper-ieee|copper-iec|aluminium]\n";

std::optional<double> parseNumber(const std::string &text)
{
    double value = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

// Returns "" or the rule an option broke.
std::string parseArguments(const Arguments &args, std::string &session, std::string &output, ReportOptions &report,
                           ReviewOptions &review)
{
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &arg = args[i];
        const bool takesValue = arg == "-o" || arg == "--output" || arg == "--page" || arg == "--method" || arg == "--rule" ||
                                arg == "--regulation-limit" || arg == "--reference-temperature" ||
                                arg == "--temperature-constant";
        if (!takesValue) {
            if (!arg.empty() && arg[0] == '-')
                return "unknown option '" + arg + "'";
            if (!session.empty())
                return "one session file only, got '" + session + "' and '" + arg + "'";
            session = arg;
            continue;
        }
        if (i + 1 >= args.size())
            return "option " + arg + " needs a value";
        const std::string value = args[++i];
        if (arg == "-o" || arg == "--output") {
            output = value;
        } else if (arg == "--page") {
            if (value == "a4" || value == "A4")
                report.pageSize = QPageSize::A4;
            else if (value == "letter" || value == "Letter")
                report.pageSize = QPageSize::Letter;
            else
                return "--page: expected a4 or letter, got '" + value + "'";
        } else if (arg == "--method") {
            const auto method = fitMethodFromString(value);
            if (!method)
                return "--method: expected ols, wls or york, got '" + value + "'";
            review.method = *method;
        } else if (arg == "--rule") {
            const auto rule = decisionRuleFromString(value);
            if (!rule)
                return "--rule: expected simple, guarded or non-binary, got '" + value + "'";
            review.rule = *rule;
        } else if (arg == "--temperature-constant") {
            const auto constant = temperatureConstantFromString(value);
            if (!constant)
                return "--temperature-constant: expected copper-ieee, copper-iec or aluminium, got '" + value + "'";
            review.temperatureConstant = *constant;
        } else if (arg == "--regulation-limit") {
            const auto limit = regulationLimitFromText(value);
            if (!limit)
                return "--regulation-limit: expected a percentage above 0 and at most 100, or nameplate, got '" + value
                       + "'";
            review.regulationLimit = *limit;
        } else {
            const auto number = parseNumber(value);
            if (!number)
                return arg + ": expected a number, got '" + value + "'";
            if (*number < -273.15 || *number > 1000.0)
                return "--reference-temperature: must be between -273.15 and 1000 °C, got " + value;
            review.referenceTemperatureC = *number;
        }
    }
    if (session.empty() || output.empty())
        return "a session file and -o REPORT.pdf are required";
    return {};
}

} // namespace

int runReport(const Arguments &args)
{
    std::string sessionPath, outputPath;
    ReportOptions report;
    ReviewOptions review;
    if (const std::string problem = parseArguments(args, sessionPath, outputPath, report, review); !problem.empty()) {
        std::cerr << "sagline-cli report: " << problem << '\n' << usage;
        return exitInvalidInput;
    }
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
    if (const auto &v = summary.value.verdict)
        std::cout << "Verdict: " << toString(v->outcome) << " (" << v->ruleName << "; limits: " << v->limitsSource
                  << ")\n";
    std::cout << "Wrote " << outputPath << '\n';
    return exitSuccess;
}

} // namespace sagline::cli
