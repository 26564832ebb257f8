// sagline-cli compare FILES_OR_FOLDERS... [--csv OUT.csv] [--json]: one row per session, grouped by
// design, with each design's statistics, far-from-batch flag and control chart, for a lab lead's review. Every file is opened
// untrusted and read-only; a bad file is listed with its reason and the others are compared.
// Exit code 0 when every input was compared, 2 when some input could not be (the rest is still
// printed and written), 1 when the CSV cannot be written.
#include "CliCommands.h"
#include "CompareTable.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "ComparisonExport.h"
#include "ConformityAssessment.h"
#include "NumberFormat.h"
#include "SessionComparison.h"
#include "SessionScan.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <iostream>
#include <sstream>

namespace sagline::cli {

namespace {

struct Options {
    std::vector<std::string> inputs;
    std::string csvPath;
    bool asJson = false;
    ComparisonOptions comparison;
};

CommandLine compareCommandLine()
{
    CommandLine line("sagline-cli compare", "FILES_OR_FOLDERS... [--csv OUT.csv] [--json] [options]",
                     "Compares saved sessions for a lab lead's review: one row per session, statistics of the batch, "
                     "and a flag on units far from the rest. Folders are searched for *.sagline files; every file is "
                     "opened untrusted and read-only. A file that cannot be read is listed with its reason and the "
                     "others are still compared (the exit code is then 2).");
    line.addPositional("FILES_OR_FOLDERS...", "session files, and folders to search recursively", Arity::OneOrMore);
    line.addOption({"csv"}, "OUT.csv", "also write the table as CSV (whole or not at all)");
    line.addFlag({"force"}, "replace an existing CSV file (never a session, never an input)");
    line.addFlag({"json"}, "print one JSON object instead of the table");
    line.addOption({"method"}, "ols|wls|york", "the fit method (default ols)");
    line.addOption({"reference-temperature"}, "C", "the batch's reference temperature, -50 to 250 °C (default 75)");
    line.addOption({"convention"}, "iec|ieee", "copper's T_k: 235 °C (IEC 60076-1) or 234.5 °C (IEEE C57.12.90)");
    line.addOption({"rule"}, "simple|guarded|non-binary",
                   "the decision rule of the verdicts (ILAC-G8:09/2019 §4.2.1-4.2.3; default non-binary)");
    line.addOption({"regulation-limit"}, "PERCENT|nameplate",
                   "judge regulation against this limit instead of each session's specification; \"nameplate\" takes "
                   "each nameplate's own regulation, labelled so");
    line.addNote(exitCodesNote);
    return line;
}

// Reads the parsed words; an error message names the option and the rule.
std::string readArguments(const CommandLine &line, Options &options)
{
    options.inputs = line.positionals();
    options.asJson = line.isSet("json");
    if (const auto text = line.valueIfSet("csv")) {
        if (text->empty())
            return "--csv needs a file name";
        options.csvPath = *text;
    }
    if (const auto text = line.valueIfSet("method")) {
        const auto method = fitMethodFromString(*text);
        if (!method)
            return "--method must be ols, wls or york, got '" + *text + "'";
        options.comparison.method = *method;
    }
    if (const auto text = line.valueIfSet("convention")) {
        if (*text != "iec" && *text != "ieee")
            return "--convention must be iec (copper 235 °C, IEC 60076-1) or ieee (copper 234.5 °C, IEEE C57.12.90)";
        options.comparison.figures.copperConstant = *text == "iec" ? TemperatureConstant::CopperIec : TemperatureConstant::CopperIeee;
        options.comparison.constantChosen = true;
    }
    if (const auto text = line.valueIfSet("rule")) {
        const auto rule = decisionRuleFromString(*text);
        if (!rule)
            return "--rule must be simple, guarded or non-binary (ILAC-G8:09/2019 §4.2 decision rules)";
        options.comparison.figures.rule = *rule;
        options.comparison.ruleChosen = true;
    }
    if (const auto text = line.valueIfSet("regulation-limit")) {
        const auto limit = regulationLimitFromText(*text);
        if (!limit)
            return "--regulation-limit must be a percentage above 0 and at most 100, or nameplate, got '" + *text + "'";
        options.comparison.figures.regulationLimit = *limit;
        options.comparison.limitChosen = true;
    }
    return {};
}

} // namespace

int runCompare(const Arguments &args)
{
    CommandLine line = compareCommandLine();
    if (const auto exit = line.parse(args))
        return *exit;
    Options options;
    std::optional<double> referenceC;
    if (!line.number("reference-temperature", -50.0, 250.0, referenceC))
        return exitInvalidInput;
    if (referenceC) {
        options.comparison.figures.referenceTemperatureC = *referenceC;
        options.comparison.figures.judgeAtReferenceTemperature = true;
    }
    if (const std::string error = readArguments(line, options); !error.empty())
        return line.fail(error);
    const SessionFileList found = findSessionFiles(options.inputs);
    std::vector<std::string> inputs = options.inputs;
    inputs.insert(inputs.end(), found.files.begin(), found.files.end());
    if (const auto refused = refuseOutputs("compare", {options.csvPath}, inputs, line.isSet("force")))
        return *refused;
    const std::vector<SessionRow> rows = loadSessionRows(found.files, options.comparison);
    const BatchStatistics stats = summarizeBatch(rows);

    bool incomplete = !found.problems.empty();
    for (const auto &problem : found.problems)
        std::cerr << "sagline-cli compare: " << problem.path << ": " << problem.reason << '\n';
    for (const auto &row : rows) {
        if (!row.opened) {
            incomplete = true;
            std::cerr << "sagline-cli compare: skipped " << row.path << ": " << row.problem << '\n';
        } else if (!row.notice.empty()) {
            std::cerr << "sagline-cli compare: note: " << row.notice << '\n';
        }
    }
    if (found.files.empty())
        std::cerr << "sagline-cli compare: no session files (*.sagline) found\n";

    if (!options.csvPath.empty()) {
        if (const std::string problem = writeOutput(options.csvPath, comparisonCsv(rows, stats)); !problem.empty()) {
            std::cerr << "sagline-cli compare: " << problem << '\n';
            return exitRuntimeFailure;
        }
    }
    if (options.asJson) {
        std::cout << comparisonJson(rows, stats, options.comparison) << '\n';
    } else {
        printComparison(rows, stats, options.comparison, std::cout);
    }
    return incomplete || found.files.empty() ? exitInvalidInput : exitSuccess;
}

} // namespace sagline::cli
