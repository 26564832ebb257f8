// sagline-cli fit (DATA.csv | SESSION.sagline) [--method ols|wls|york] [--json] [--setup SETUP.json]
//   [--rule simple|guarded] [--regulation-limit PERCENT] [--winding-temperature C]
//   [--reference-temperature C] [--temperature-constant copper-ieee|copper-iec|aluminium]
// Fits V = V0 - R·I to the readings; with a nameplate (a session's setup, or --setup) it adds
// the analysis at rated current and the verdict against the nameplate's regulation.
#include "CliCommands.h"
#include "FitOutput.h"

#include "CommandLine.h"

#include "CsvReadings.h"
#include "OutputText.h"
#include "SessionStore.h"
#include "SetupJson.h"

#include <cmath>
#include <iostream>

namespace sagline::cli {

namespace {

struct FitArguments {
    std::string dataPath;
    FitMethod method = FitMethod::Ols;
    bool json = false;
    std::string setupPath;
    std::optional<DecisionRule> rule;  // default: a session's analysis-settings record, else guarded
    std::optional<double> regulationLimit;
    std::optional<double> windingTemperatureC;
    std::optional<double> referenceTemperatureC;
    std::optional<TemperatureConstant> temperatureConstant;
};

int invalid(const std::string &message)
{
    std::cerr << "sagline-cli fit: " << message << '\n';
    return exitInvalidInput;
}

CommandLine fitCommandLine()
{
    CommandLine line("sagline-cli fit", "(DATA.csv | SESSION.sagline) [options]",
                     "Fits V = V0 - R·I to the readings of a CSV file or a session: series resistance and no-load "
                     "voltage with their uncertainties, R², outliers and the curvature check; with a nameplate (a "
                     "session's setup, or --setup) also regulation and copper loss at rated current and the verdict.");
    line.addPositional("DATA.csv|SESSION.sagline",
                       "readings: a CSV (current_a,voltage_v[,u_current_a,u_voltage_v]) or a session file");
    line.addOption({"method"}, "ols|wls|york", "ordinary (default), weighted or York's errors-in-both-variables fit");
    line.addFlag({"json"}, "print one JSON object instead of the text");
    line.addOption({"setup"}, "SETUP.json", "the nameplate for a CSV file");
    line.addOption({"rule"}, "simple|guarded", "the decision rule of the verdict (ILAC-G8:09/2019)");
    line.addOption({"regulation-limit"}, "PERCENT", "judge against this regulation limit instead of the nameplate's");
    line.addOption({"winding-temperature"}, "C", "with --reference-temperature: the winding temperature during the test");
    line.addOption({"reference-temperature"}, "C", "refer R to this temperature (with --winding-temperature)");
    line.addOption({"temperature-constant"}, "copper-ieee|copper-iec|aluminium",
                   "T_k for that correction: 234.5 °C (IEEE C57.12.90), 235 °C (IEC 60076-1) or 225 °C");
    line.addNote(exitCodesNote);
    return line;
}

// Returns an error message, or nothing when the arguments are valid.
std::optional<std::string> readArguments(const CommandLine &line, FitArguments &out)
{
    out.dataPath = line.positionals().front();
    out.json = line.isSet("json");
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
            return "--rule: unknown decision rule '" + *text + "'; use simple or guarded";
        out.rule = *rule;
    }
    if (const auto text = line.valueIfSet("temperature-constant")) {
        out.temperatureConstant = temperatureConstantFromString(*text);
        if (!out.temperatureConstant)
            return "--temperature-constant: use copper-ieee (234.5 °C), copper-iec (235 °C) or aluminium (225 °C)";
    }
    if (out.windingTemperatureC.has_value() != out.referenceTemperatureC.has_value())
        return "--winding-temperature and --reference-temperature go together";
    return std::nullopt;
}

bool endsWith(const std::string &text, const std::string &suffix)
{
    return text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0;
}

// Loads the readings (and a session's setup). Returns an exit code on failure.
std::optional<int> loadData(const FitArguments &args, std::vector<Reading> &readings, FitReport &report,
                            std::optional<Setup> &setup, std::optional<AnalysisSettings> &recorded)
{
    if (endsWith(args.dataPath, ".sagline")) {
        auto store = SessionStore::openForReview(args.dataPath);
        if (!store.ok()) {
            std::cerr << "sagline-cli fit: " << args.dataPath << ": " << store.message << '\n';
            return store.code == StoreCode::IoError ? exitRuntimeFailure : exitInvalidInput;
        }
        auto stored = store.value->readings();
        auto info = store.value->info();
        if (!stored.ok() || !info.ok()) {
            std::cerr << "sagline-cli fit: " << args.dataPath << ": " << (stored.ok() ? info.message : stored.message) << '\n';
            return exitRuntimeFailure;
        }
        readings = std::move(stored.value);
        if (const auto notes = store.value->notes(); notes.ok()) {
            const RecordedAnalysisSettings latest = latestAnalysisSettings(notes.value);
            for (const std::string &notice : latest.notices)
                report.warnings.push_back(notice);
            recorded = latest.settings;
        } else {
            report.warnings.push_back("the session's notes could not be read (" + notes.message
                                      + "); judged with the options and defaults");
        }
        const SetupParse parsed = parseSetupJson(info.value.setupJson);
        if (parsed.setup)
            setup = parsed.setup;
        return std::nullopt;
    }
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
    readings = csv.readings;
    report.lineNumbers = csv.lineNumbers;
    return std::nullopt;
}

} // namespace

int runFit(const Arguments &arguments)
{
    CommandLine line = fitCommandLine();
    if (const auto exit = line.parse(arguments))
        return *exit;
    FitArguments args;
    // Ranges: a limit is a percentage above 0; temperatures a winding can have (°C).
    if (!line.number("regulation-limit", 1e-6, 1000.0, args.regulationLimit)
        || !line.number("winding-temperature", -60.0, 400.0, args.windingTemperatureC)
        || !line.number("reference-temperature", -60.0, 400.0, args.referenceTemperatureC))
        return exitInvalidInput;
    if (const auto error = readArguments(line, args))
        return line.fail(*error);
    FitReport report;
    report.source = args.dataPath;
    std::vector<Reading> readings;
    std::optional<Setup> setup;
    std::optional<AnalysisSettings> recorded;
    if (const auto code = loadData(args, readings, report, setup, recorded))
        return *code;
    if (!args.setupPath.empty()) {
        const SetupParse parsed = loadSetupFile(args.setupPath);
        if (!parsed.setup) {
            for (const FieldError &e : parsed.errors)
                std::cerr << "sagline-cli fit: " << args.setupPath << ", " << e.message() << '\n';
            return exitInvalidInput;
        }
        setup = parsed.setup;
    }

    report.fit = fitReadings(readings, args.method);
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
    for (std::string &warning : fitWarnings(report.fit, report.lineNumbers))
        report.warnings.push_back(std::move(warning));

    // Options first, then the session's record, then the defaults. The record's reference
    // temperature is not used: the fit command refers R only to a winding temperature given here.
    const auto sourceOf = [&](bool given, bool inRecord) {
        return given ? SettingSource::Option : inRecord ? SettingSource::SessionRecord : SettingSource::Default;
    };
    report.ruleSource = sourceOf(args.rule.has_value(), recorded.has_value());
    report.regulationLimitSource = sourceOf(args.regulationLimit.has_value(), recorded && recorded->regulationLimitPercent);
    report.temperatureConstantSource =
        sourceOf(args.temperatureConstant.has_value(), recorded && recorded->temperatureConstant);
    DecisionRule rule = DecisionRule::GuardedAcceptance;
    std::optional<double> limit = args.regulationLimit;
    std::optional<TemperatureConstant> constant = args.temperatureConstant;
    if (recorded) {
        rule = recorded->rule;
        if (!limit)
            limit = recorded->regulationLimitPercent;
        if (!constant)
            constant = recorded->temperatureConstant;
    }
    if (args.rule)
        rule = *args.rule;
    if (setup) {
        AnalysisInput input = analysisInputFor(setup->nameplate);
        input.windingTemperatureC = args.windingTemperatureC;
        input.referenceTemperatureC = args.referenceTemperatureC;
        if (constant)
            input.temperatureConstant = *constant;
        report.analysis = analyseFit(report.fit, input);
        if (!report.analysis->ok()) {
            for (const FieldError &e : report.analysis->errors)
                report.warnings.push_back("no analysis at rated current: " + e.message());
        }
        report.regulationLimitPercent = limit ? limit : nameplateRegulationPercent(setup->nameplate);
    } else if (args.regulationLimit || args.windingTemperatureC) {
        return invalid("--regulation-limit and the temperatures need the nameplate: give --setup SETUP.json or a session");
    }
    if (report.analysis && report.analysis->ok() && report.regulationLimitPercent) {
        const UncertainValue &reg = report.analysis->regulationPercent;
        report.decision = decideAgainstUpperLimit(reg.value, reg.expandedUncertainty, *report.regulationLimitPercent,
                                                  rule);
        if (!reg.expandedUncertainty)
            report.warnings.push_back("the regulation has no uncertainty: the fit has too few points to give one");
    }

    if (args.json)
        std::cout << jsonText(fitReportJson(report), 2) << '\n';
    else
        printFitReport(report, std::cout);
    return exitSuccess;
}

} // namespace sagline::cli
