// sagline-cli fit (DATA.csv | SESSION.sagline) [--method ols|wls|york] [--json] [--budget]
//   [--setup SETUP.json] [--rule simple|guarded|non-binary] [--regulation-limit PERCENT|nameplate]
//   [--winding-temperature C] [--reference-temperature C]
//   [--temperature-constant copper-ieee|copper-iec|aluminium]
// Fits V = V0 - R·I to the readings; with a nameplate (a session's setup, or --setup) it adds
// the analysis at rated current with uncertainty budgets and the verdict against the setup's
// specification. A session goes through core's SessionSummary, so `fit`, `report`, `export` and
// the window show the same numbers.
#include "CliCommands.h"
#include "FitOutput.h"

#include "ConformityAssessment.h"
#include "CsvReadings.h"
#include "SessionSummary.h"
#include "SetupJson.h"

#include <charconv>
#include <cmath>
#include <iostream>

namespace sagline::cli {

namespace {

constexpr const char *usage =
    "usage: sagline-cli fit (DATA.csv | SESSION.sagline) [--method ols|wls|york] [--json] [--budget]\n"
    "         [--setup SETUP.json] [--rule simple|guarded|non-binary] [--regulation-limit PERCENT|nameplate]\n"
    "         [--winding-temperature C] [--reference-temperature C]\n"
    "         [--temperature-constant copper-ieee|copper-iec|aluminium]\n";

struct FitArguments {
    std::string dataPath;
    FitMethod method = FitMethod::Ols;
    bool json = false;
    bool budget = false;
    std::string setupPath;
    std::optional<DecisionRule> rule;  // default: a session's analysis-settings record, else non-binary
    std::optional<RegulationLimitChoice> regulationLimit;
    std::optional<double> windingTemperatureC;
    std::optional<double> referenceTemperatureC;
    std::optional<TemperatureConstant> temperatureConstant;
};

int invalid(const std::string &message)
{
    std::cerr << "sagline-cli fit: " << message << '\n';
    return exitInvalidInput;
}

std::optional<double> parseNumber(const std::string &text)
{
    double value = 0.0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (ec != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

bool endsWith(const std::string &text, const std::string &suffix)
{
    return text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0;
}

// Returns an error message, or nothing when the arguments are valid.
std::optional<std::string> parseArguments(const Arguments &args, FitArguments &out)
{
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &arg = args[i];
        const auto value = [&]() -> std::optional<std::string> {
            if (i + 1 >= args.size())
                return std::nullopt;
            return args[++i];
        };
        if (arg == "--json") {
            out.json = true;
        } else if (arg == "--budget") {
            out.budget = true;
        } else if (arg == "--method" || arg == "--rule" || arg == "--setup" || arg == "--regulation-limit"
                   || arg == "--winding-temperature" || arg == "--reference-temperature"
                   || arg == "--temperature-constant") {
            const auto text = value();
            if (!text)
                return arg + " needs a value";
            if (arg == "--method") {
                const auto method = fitMethodFromString(*text);
                if (!method)
                    return "--method: unknown method '" + *text + "'; use ols, wls or york";
                out.method = *method;
            } else if (arg == "--rule") {
                const auto rule = decisionRuleFromString(*text);
                if (!rule)
                    return "--rule: unknown decision rule '" + *text
                           + "'; use simple, guarded or non-binary (ILAC-G8:09/2019 §4.2.1-4.2.3)";
                out.rule = *rule;
            } else if (arg == "--regulation-limit") {
                out.regulationLimit = regulationLimitFromText(*text);
                if (!out.regulationLimit)
                    return "--regulation-limit: '" + *text
                           + "' is neither a percentage above 0 and at most 100 nor the word nameplate";
            } else if (arg == "--setup") {
                out.setupPath = *text;
            } else if (arg == "--temperature-constant") {
                out.temperatureConstant = temperatureConstantFromString(*text);
                if (!out.temperatureConstant)
                    return "--temperature-constant: use copper-ieee (234.5 °C), copper-iec (235 °C) or aluminium (225 °C)";
            } else {
                const auto number = parseNumber(*text);
                if (!number)
                    return arg + ": not a finite number: '" + *text + "'";
                (arg == "--winding-temperature" ? out.windingTemperatureC : out.referenceTemperatureC) = *number;
            }
        } else if (!arg.empty() && arg[0] == '-') {
            return "unknown option '" + arg + "'";
        } else if (out.dataPath.empty()) {
            out.dataPath = arg;
        } else {
            return "more than one data file given ('" + out.dataPath + "' and '" + arg + "')";
        }
    }
    if (out.dataPath.empty())
        return "no data file given";
    if (!endsWith(out.dataPath, ".sagline") && out.windingTemperatureC.has_value() != out.referenceTemperatureC.has_value())
        return "--winding-temperature and --reference-temperature go together";
    return std::nullopt;
}

// A session: everything from core's summary (the session's setup, temperatures and recorded
// settings, the options given here winning).
int fitSession(const FitArguments &args, FitReport &report)
{
    if (!args.setupPath.empty())
        return invalid("--setup is for a CSV; a session carries its own setup");
    ReviewOptions review;
    review.method = args.method;
    review.rule = args.rule;
    review.regulationLimit = args.regulationLimit;
    review.referenceTemperatureC = args.referenceTemperatureC;
    review.windingTemperatureC = args.windingTemperatureC;
    review.temperatureConstant = args.temperatureConstant;
    auto loaded = loadSessionSummary(args.dataPath, review);
    if (!loaded.ok()) {
        std::cerr << "sagline-cli fit: " << args.dataPath << ": " << loaded.message << '\n';
        return loaded.code == StoreCode::IoError ? exitRuntimeFailure : exitInvalidInput;
    }
    const SessionSummary &summary = loaded.value;
    for (const std::string &notice : summary.recordedSettings.notices)
        report.warnings.push_back(notice);
    report.fit = summary.fit;
    if (!report.fit.ok())
        return invalid(args.dataPath + ": cannot fit (" + toString(report.fit.status) + "): " + report.fit.message);
    report.meters = summary.setup ? summary.setup->meters : std::nullopt;
    report.analysis = summary.analysis;
    report.verdict = summary.verdict;
    if (!summary.setup)
        report.warnings.push_back("no analysis at rated current: " + summary.analysisProblem);
    else if (!summary.analysis)
        report.warnings.push_back("no analysis at rated current: " + summary.analysisProblem);
    report.hasNameplate = summary.setup.has_value();
    report.ruleSource = summary.ruleSource;
    report.regulationLimitSource = summary.regulationLimitSource;
    report.temperatureConstantSource = summary.temperatureConstantSource;
    report.settingsUsed = describeSettingsUsed(summary);
    return exitSuccess;
}

// A CSV: the readings as given, the nameplate, meters and specification from --setup.
int fitCsv(const FitArguments &args, FitReport &report)
{
    const ReadingsCsvParse csv = loadReadingsCsv(args.dataPath);
    if (!csv.ok()) {
        for (const FieldError &e : csv.errors)
            std::cerr << "sagline-cli fit: " << args.dataPath << ", " << e.message() << '\n';
        return exitInvalidInput;
    }
    if (args.method == FitMethod::Wls && !csv.hasVoltageUncertainty)
        return invalid(args.dataPath + ": --method wls needs the column u_voltage_v (standard uncertainty of each voltage)");
    if (args.method == FitMethod::York && !(csv.hasVoltageUncertainty && csv.hasCurrentUncertainty))
        return invalid(args.dataPath + ": --method york needs the columns u_current_a and u_voltage_v (standard uncertainties)");
    report.lineNumbers = csv.lineNumbers;
    std::optional<Setup> setup;
    if (!args.setupPath.empty()) {
        const SetupParse parsed = loadSetupFile(args.setupPath);
        if (!parsed.setup) {
            for (const FieldError &e : parsed.errors)
                std::cerr << "sagline-cli fit: " << args.setupPath << ", " << e.message() << '\n';
            return exitInvalidInput;
        }
        setup = parsed.setup;
    } else if (args.regulationLimit || args.windingTemperatureC || args.rule) {
        return invalid("--rule, --regulation-limit and the temperatures need the nameplate: give --setup SETUP.json "
                       "or a session");
    }
    report.meters = setup ? setup->meters : std::nullopt;
    report.fit = fitReadings(csv.readings, args.method, fitOptionsFor(report.meters));
    if (!report.fit.ok()) {
        std::string message = report.fit.message;
        // Name the CSV line as well as the row.
        const std::size_t at = message.rfind("row ", 0) == 0 ? 4 : std::string::npos;
        if (at != std::string::npos && !report.lineNumbers.empty()) {
            const std::size_t row = std::stoul(message.substr(at));
            if (row < report.lineNumbers.size())
                message = "line " + std::to_string(report.lineNumbers[row]) + " (" + message.substr(0, message.find(':'))
                          + ")" + message.substr(message.find(':'));
        }
        return invalid(args.dataPath + ": cannot fit (" + toString(report.fit.status) + "): " + message);
    }
    if (!setup)
        return exitSuccess;
    report.hasNameplate = true;
    AssessmentOptions options;
    options.rule = args.rule.value_or(DecisionRule::NonBinary);
    options.regulationLimit = args.regulationLimit.value_or(RegulationLimitChoice{});
    options.windingTemperatureC = args.windingTemperatureC;
    options.referenceTemperatureC = args.referenceTemperatureC;
    options.temperatureConstant = args.temperatureConstant;
    const auto sourceOf = [](bool given) { return given ? SettingSource::Option : SettingSource::Default; };
    report.ruleSource = sourceOf(args.rule.has_value());
    report.regulationLimitSource = sourceOf(args.regulationLimit.has_value());
    report.temperatureConstantSource = sourceOf(args.temperatureConstant.has_value());
    Assessment assessment = assessFit(report.fit, *setup, options);
    if (!assessment.analysis.ok()) {
        for (const FieldError &e : assessment.analysis.errors)
            report.warnings.push_back("no analysis at rated current: " + e.message());
        return exitSuccess;
    }
    report.analysis = std::move(assessment.analysis);
    report.verdict = std::move(assessment.verdict);
    return exitSuccess;
}

} // namespace

int runFit(const Arguments &arguments)
{
    FitArguments args;
    if (const auto error = parseArguments(arguments, args)) {
        std::cerr << "sagline-cli fit: " << *error << '\n' << usage;
        return exitInvalidInput;
    }
    FitReport report;
    report.source = args.dataPath;
    report.printBudget = args.budget;
    const int code = endsWith(args.dataPath, ".sagline") ? fitSession(args, report) : fitCsv(args, report);
    if (code != exitSuccess)
        return code;
    for (std::string &warning : fitWarnings(report.fit, report.lineNumbers))
        report.warnings.push_back(std::move(warning));
    if (report.analysis && !report.analysis->regulationPercent.expandedUncertainty)
        report.warnings.push_back("the results have no uncertainty: the fit has too few points to give one");
    if (args.json)
        std::cout << fitReportJson(report).dump(2) << '\n';
    else
        printFitReport(report, std::cout);
    return exitSuccess;
}

} // namespace sagline::cli
