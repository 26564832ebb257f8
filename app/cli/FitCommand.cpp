// sagline-cli fit (DATA.csv | SESSION.sagline) [--method ols|wls|york] [--json] [--budget]
//   [--points] [--setup SETUP.json] [--rule simple|guarded|non-binary] [--regulation-limit PERCENT|nameplate]
//   [--winding-temperature C] [--reference-temperature C]
//   [--temperature-constant copper-ieee|copper-iec|aluminium]
// Fits V = V0 - R·I to the readings; with a nameplate (a session's setup, or --setup) it adds
// the analysis at rated current with uncertainty budgets and the verdict against the setup's
// specification. A session goes through core's SessionSummary, so `fit`, `report`, `export` and
// the window show the same numbers.
#include "CliCommands.h"
#include "FitOutput.h"

#include "CommandLine.h"

#include "ConformityAssessment.h"
#include "CsvReadings.h"
#include "OutputText.h"
#include "ReadingPlausibility.h"
#include "SessionSummary.h"
#include "SetupJson.h"

#include <algorithm>
#include <cmath>
#include <iostream>
#include <optional>

namespace sagline::cli {

namespace {

struct FitArguments {
    std::string dataPath;
    FitMethod method = FitMethod::Ols;
    bool json = false;
    bool points = false; // --points: the JSON also holds every reading's residuals and flags
    bool budget = false;
    std::string setupPath;
    std::optional<DecisionRule> rule;  // default: a session's analysis-settings record, else non-binary
    std::optional<RegulationLimitChoice> regulationLimit;
    std::optional<double> windingTemperatureC;
    std::optional<double> referenceTemperatureC;
    std::optional<TemperatureConstant> temperatureConstant;
    FitVoltages fitVoltages = FitVoltages::Referred;
    double powerFactor = defaultRegulationPowerFactor;
    bool leading = false;
};

int invalid(const std::string &message)
{
    std::cerr << "sagline-cli fit: " << message << '\n';
    return exitInvalidInput;
}

bool endsWith(const std::string &text, const std::string &suffix)
{
    return text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0;
}

CommandLine fitCommandLine()
{
    CommandLine line("sagline-cli fit", "(DATA.csv | SESSION.sagline) [options]",
                     "Fits V = V0 - R·I to the readings of a CSV file or a session: series resistance and no-load "
                     "voltage with their uncertainty budgets, R², the outlier screen and the curvature check; with a "
                     "nameplate (a session's setup, or --setup) also regulation and copper loss at rated current and "
                     "the verdict against the setup's specification.");
    line.addPositional("DATA.csv|SESSION.sagline",
                       "readings: a CSV (current_a,voltage_v[,u_current_a,u_voltage_v]) or a session file");
    line.addOption({"method"}, "ols|wls|york", "ordinary (default), weighted or York's errors-in-both-variables fit");
    line.addFlag({"json"}, "print one JSON object instead of the text (outliers as row indices)");
    line.addFlag({"points"}, "with --json: also a \"points\" array with every reading's residual, studentized "
                             "residual, screening statistic and flags (about 230 bytes a reading)");
    line.addFlag({"budget"}, "also print every result's uncertainty budget table");
    line.addOption({"setup"}, "SETUP.json", "the nameplate, meters and specification for a CSV file");
    line.addOption({"rule"}, "simple|guarded|non-binary",
                   "the decision rule of the verdict (ILAC-G8:09/2019 §4.2.1-4.2.3; default non-binary)");
    line.addOption({"regulation-limit"}, "PERCENT|nameplate",
                   "judge regulation against this limit instead of the specification's; \"nameplate\" takes the "
                   "nameplate's own regulation, labelled so");
    line.addOption({"winding-temperature"}, "C", "the winding temperature during the test, -60 to 400 °C");
    line.addOption({"reference-temperature"}, "C",
                   "refer R (and regulation, full-load voltage, copper loss) to this temperature and judge there");
    line.addOption({"temperature-constant"}, "copper-ieee|copper-iec|aluminium",
                   "T_k for that correction: 234.5 °C (IEEE C57.12.90), 235 °C (IEC 60076-1) or 225 °C");
    line.addFlag({"raw-voltages"}, "fit the secondary voltages as read, not referred to the rated primary voltage");
    line.addOption({"power-factor"}, "PF",
                   "predict the regulation at this load power factor, 0.05 to 1 (default 0.8, common practice)");
    line.addFlag({"leading"}, "that power factor is leading (capacitive load); lagging otherwise");
    line.addNote("With primary readings (primary_voltage_v, primary_current_a, primary_power_w, "
                 "primary_power_factor, primary_reactive_power_var) and a nameplate: no-load loss and current, "
                 "efficiency per step and at rated load, the peak-efficiency load, the series reactance and the "
                 "regulation at the chosen power factor. Where the primary voltage was read, the fit is made on the "
                 "secondary voltages referred to the rated primary voltage unless --raw-voltages.");
    line.addNote("Without a specification in the setup and without --regulation-limit there is no pass or fail: the "
                 "verdict is not-judged and the measured regulation is shown beside the nameplate's.");
    line.addNote(exitCodesNote);
    return line;
}

// Returns an error message, or nothing when the arguments are valid.
std::optional<std::string> readArguments(const CommandLine &line, FitArguments &out)
{
    out.dataPath = line.positionals().front();
    out.json = line.isSet("json");
    out.points = line.isSet("points");
    if (out.points && !out.json)
        return std::string("--points needs --json: the text lists the outliers and has no per-reading table");
    out.budget = line.isSet("budget");
    out.fitVoltages = line.isSet("raw-voltages") ? FitVoltages::Raw : FitVoltages::Referred;
    out.leading = line.isSet("leading");
    out.setupPath = line.value("setup");
    if (const auto text = line.valueIfSet("method")) {
        const auto method = fitMethodFromString(*text);
        if (!method)
            return "--method: unknown method '" + *text + "'; use ols, wls or york";
        out.method = *method;
    }
    if (const auto text = line.valueIfSet("rule")) {
        const auto rule = decisionRuleFromString(*text);
        if (!rule)
            return "--rule: unknown decision rule '" + *text
                   + "'; use simple, guarded or non-binary (ILAC-G8:09/2019 §4.2.1-4.2.3)";
        out.rule = *rule;
    }
    if (const auto text = line.valueIfSet("regulation-limit")) {
        out.regulationLimit = regulationLimitFromText(*text);
        if (!out.regulationLimit)
            return "--regulation-limit: '" + *text + "' is neither a percentage above 0 and at most 100 nor the word "
                   "nameplate";
    }
    if (const auto text = line.valueIfSet("temperature-constant")) {
        out.temperatureConstant = temperatureConstantFromString(*text);
        if (!out.temperatureConstant)
            return "--temperature-constant: use copper-ieee (234.5 °C), copper-iec (235 °C) or aluminium (225 °C)";
    }
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
    review.fitVoltages = args.fitVoltages;
    review.regulationPowerFactor = args.powerFactor;
    review.leadingPowerFactor = args.leading;
    auto loaded = loadSessionSummary(args.dataPath, review);
    if (!loaded.ok()) {
        std::cerr << "sagline-cli fit: " << args.dataPath << ": " << loaded.message << '\n';
        return loaded.code == StoreCode::IoError ? exitRuntimeFailure : exitInvalidInput;
    }
    SessionSummary &summary = loaded.value;
    for (const std::string &notice : summary.recordedSettings.notices)
        report.warnings.push_back(notice);
    report.fit = std::move(summary.fit); // the per-point results are the bulk: moved, not copied
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
    report.progress = summary.progress;
    if (summary.setup) {
        report.supply = summary.supply;
        report.primarySide = summary.primarySide;
    }
    return exitSuccess;
}

// A CSV's fit failed: the message names the file's line as well as the row.
int csvFitFailure(const FitArguments &args, const FitReport &report)
{
    std::string message = report.fit.message;
    const std::size_t at = message.rfind("row ", 0) == 0 ? 4 : std::string::npos;
    if (at != std::string::npos && !report.lineNumbers.empty()) {
        const std::size_t row = std::stoul(message.substr(at));
        if (row < report.lineNumbers.size())
            message = "line " + std::to_string(report.lineNumbers[row]) + " (" + message.substr(0, message.find(':'))
                      + ")" + message.substr(message.find(':'));
    }
    return invalid(args.dataPath + ": cannot fit (" + toString(report.fit.status) + "): " + message);
}

// A CSV the fit cannot use: its errors (each naming the line), or a method whose columns are
// missing. The exit code to return, or nothing when the fit can go on. For whole readings and
// for the fit's columns alike.
template <typename CsvParse>
std::optional<int> refuseCsv(const FitArguments &args, const CsvParse &csv)
{
    if (!csv.ok()) {
        for (const FieldError &e : csv.errors)
            std::cerr << "sagline-cli fit: " << args.dataPath << ", " << e.message() << '\n';
        return exitInvalidInput;
    }
    if (args.method == FitMethod::Wls && !csv.hasVoltageUncertainty)
        return invalid(args.dataPath + ": --method wls needs the column u_voltage_v (standard uncertainty of each voltage)");
    if (args.method == FitMethod::York && !(csv.hasVoltageUncertainty && csv.hasCurrentUncertainty))
        return invalid(args.dataPath + ": --method york needs the columns u_current_a and u_voltage_v (standard uncertainties)");
    return std::nullopt;
}

// A CSV with --setup: whole readings (the primary side, the supply referral), the nameplate, meters and
// specification from the setup.
int fitCsvWithSetup(const FitArguments &args, FitReport &report)
{
    const ReadingsCsvParse csv = loadReadingsCsv(args.dataPath);
    if (const auto refused = refuseCsv(args, csv))
        return *refused;
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
        // A fit and a verdict must not rest on a reading no sweep of this nameplate could take.
        const FieldErrors implausible = implausibleReadings(csv.readings, csv.lineNumbers, *setup);
        for (const FieldError &e : implausible)
            std::cerr << "sagline-cli fit: " << args.dataPath << ", " << e.message() << '\n';
        if (!implausible.empty())
            return exitInvalidInput;
    } else if (args.regulationLimit || args.windingTemperatureC || args.rule) {
        return invalid("--rule, --regulation-limit and the temperatures need the nameplate: give --setup SETUP.json "
                       "or a session");
    }
    report.meters = setup ? setup->meters : std::nullopt;
    if (setup) {
        report.supply = assessSupply(csv.readings, setup->nameplate.primaryVoltageV, args.fitVoltages,
                                     defaultSupplyDriftTolerancePercent, primaryVoltmeterOf(setup->meters));
        report.fit = fitReadings(columnsToFit(csv.readings, report.supply->fitVoltages, setup->nameplate.primaryVoltageV),
                                 args.method, fitOptionsFor(report.meters));
    } else {
        report.fit = fitReadings(columnsToFit(csv.readings, FitVoltages::Raw, 0.0), args.method, fitOptionsFor(report.meters));
    }
    if (!report.fit.ok())
        return csvFitFailure(args, report);
    if (!setup)
        return exitSuccess;
    report.hasNameplate = true;
    AssessmentOptions options;
    options.rule = args.rule.value_or(DecisionRule::NonBinary);
    options.regulationLimit = args.regulationLimit.value_or(RegulationLimitChoice{});
    options.windingTemperatureC = args.windingTemperatureC;
    options.referenceTemperatureC = args.referenceTemperatureC;
    options.temperatureConstant = args.temperatureConstant;
    options.referralGainUPercent = report.supply ? report.supply->referralGainUPercent : std::nullopt;
    const auto sourceOf = [](bool given) { return given ? SettingSource::Option : SettingSource::Default; };
    report.ruleSource = sourceOf(args.rule.has_value());
    report.regulationLimitSource = sourceOf(args.regulationLimit.has_value());
    report.temperatureConstantSource = sourceOf(args.temperatureConstant.has_value());
    report.settingsUsed = describeSettingsUsed(SettingsUsed{
        options.rule, report.ruleSource, args.regulationLimit, report.regulationLimitSource, args.referenceTemperatureC,
        sourceOf(args.referenceTemperatureC.has_value()), args.temperatureConstant, report.temperatureConstantSource});
    Assessment assessment = assessFit(report.fit, *setup, options);
    if (!assessment.analysis.ok()) {
        for (const FieldError &e : assessment.analysis.errors)
            report.warnings.push_back("no analysis at rated current: " + e.message());
        return exitSuccess;
    }
    report.analysis = std::move(assessment.analysis);
    report.verdict = std::move(assessment.verdict);
    const bool anyPrimary = std::any_of(csv.readings.begin(), csv.readings.end(),
                                        [](const Reading &r) { return r.primary.hasAny(); });
    if (anyPrimary) {
        AnalysisInput analysisInput = analysisInputFor(*setup);
        analysisInput.referralGainUPercent = options.referralGainUPercent;
        PrimarySideInput input = primarySideInputFor(setup->nameplate);
        input.regulationPowerFactor = args.powerFactor;
        input.leading = args.leading;
        report.primarySide = analysePrimarySide(csv.readings, &report.fit, &analysisInput, input);
    }
    return exitSuccess;
}

// A CSV without a setup: only the line, from the fit's columns of each reading.
int fitCsvLineOnly(const FitArguments &args, FitReport &report)
{
    // Only the fit's columns of each reading are kept: a million rows take 37 MB, not 150.
    ReadingColumnsCsvParse csv = loadReadingColumnsCsv(args.dataPath);
    if (const auto refused = refuseCsv(args, csv))
        return *refused;
    report.lineNumbers = std::move(csv.lineNumbers);
    report.fit = fitReadings(csv.columns, args.method, fitOptionsFor(std::nullopt));
    csv.columns.clear(); // the fit has what it needs; the output needs only the line numbers
    if (!report.fit.ok())
        return csvFitFailure(args, report);
    return exitSuccess;
}

// A CSV: the line alone from its columns (fast, small), or with --setup everything the nameplate allows.
int fitCsv(const FitArguments &args, FitReport &report)
{
    if (!args.setupPath.empty())
        return fitCsvWithSetup(args, report);
    if (args.regulationLimit || args.windingTemperatureC || args.rule)
        return invalid("--rule, --regulation-limit and the temperatures need the nameplate: give --setup SETUP.json "
                       "or a session");
    return fitCsvLineOnly(args, report);
}

} // namespace

int runFit(const Arguments &arguments)
{
    CommandLine line = fitCommandLine();
    if (const auto exit = line.parse(arguments))
        return *exit;
    FitArguments args;
    // Ranges: temperatures a winding can have (°C).
    std::optional<double> powerFactor;
    if (!line.number("winding-temperature", -60.0, 400.0, args.windingTemperatureC)
        || !line.number("reference-temperature", -60.0, 400.0, args.referenceTemperatureC)
        || !line.number("power-factor", 0.05, 1.0, powerFactor))
        return exitInvalidInput;
    args.powerFactor = powerFactor.value_or(defaultRegulationPowerFactor);
    if (const auto error = readArguments(line, args))
        return line.fail(*error);
    FitReport report;
    report.source = args.dataPath;
    report.printBudget = args.budget;
    report.pointsInJson = args.points;
    const int code = endsWith(args.dataPath, ".sagline") ? fitSession(args, report) : fitCsv(args, report);
    if (code != exitSuccess)
        return code;
    for (std::string &warning : fitWarnings(report.fit, report.lineNumbers))
        report.warnings.push_back(std::move(warning));
    if (report.analysis && !report.analysis->regulationPercent.expandedUncertainty)
        report.warnings.push_back("the results have no uncertainty: the fit has too few points to give one");
    if (args.json)
        writeFitReportJson(report, std::cout);
    else
        printFitReport(report, std::cout);
    return exitSuccess;
}

} // namespace sagline::cli
