// sagline-cli compare FILES_OR_FOLDERS... [--csv OUT.csv] [--json]: one row per session, batch
// statistics and the far-from-batch flag, for a lab lead's review. Every file is opened
// untrusted and read-only; a bad file is listed with its reason and the others are compared.
// Exit code 0 when every input was compared, 2 when some input could not be (the rest is still
// printed and written), 1 when the CSV cannot be written.
#include "CliCommands.h"
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

// Display width of UTF-8 text: one column per code point (enough for Ω, ±, °).
std::size_t displayWidth(const std::string &text)
{
    std::size_t width = 0;
    for (unsigned char c : text)
        width += (c & 0xC0) != 0x80 ? 1 : 0;
    return width;
}

std::string pad(const std::string &text, std::size_t width, bool right = false)
{
    const std::size_t w = displayWidth(text);
    const std::string fill(w < width ? width - w : 0, ' ');
    return right ? fill + text : text + fill;
}

// "1.952 ± 0.023": U to two significant digits, the value to the same decimal place (GUM 7.2.6).
// Absent values are NaN here (value_or), which also spares GCC 12 a false "maybe uninitialized".
std::string withUncertainty(double value, double expanded)
{
    if (!std::isfinite(value))
        return "n/a";
    if (!std::isfinite(expanded) || expanded <= 0.0)
        return formatSignificant(value, 4);
    const int magnitude = static_cast<int>(std::floor(std::log10(expanded)));
    const int decimals = std::max(0, std::min(9, 1 - magnitude));
    return formatFixed(value, decimals) + " ± " + formatFixed(expanded, decimals);
}

// "75", "72.5": a temperature as typed, without padding zeros.
std::string plainNumber(double value)
{
    std::string text = formatSignificant(value, 4);
    if (text.find('.') != std::string::npos) {
        while (text.back() == '0')
            text.pop_back();
        if (text.back() == '.')
            text.pop_back();
    }
    return text;
}

constexpr double absent = std::numeric_limits<double>::quiet_NaN();

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

void printTable(const std::vector<SessionRow> &rows, const BatchStatistics &stats, const ComparisonOptions &options,
                std::ostream &out)
{
    const std::string refTitle = "R at " + plainNumber(options.figures.referenceTemperatureC) + " °C (Ω)";
    const std::vector<std::string> titles = {"unit",    "date (UTC)", "operator", "points",  "R (Ω)",  refTitle,
                                             "V0 (V)",  "regulation (%)", "verdict", "stops", "review", "z"};
    std::vector<std::vector<std::string>> cells;
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const SessionRow &row = rows[i];
        if (!row.opened)
            continue;
        const SessionFigures &f = row.figures;
        const double r = f.ok ? f.resistanceOhm : absent;
        const double v0 = f.ok ? f.noLoadVoltageV : absent;
        const double z = stats.robustZ[i].value_or(absent);
        bool far = false;
        for (auto k : stats.farFromBatch)
            far = far || k == i;
        cells.push_back({row.unitSerial, row.createdUtc.substr(0, 10), row.operatorName,
                         std::to_string(row.pointsUsed) + "/" + std::to_string(row.readingCount),
                         withUncertainty(r, f.resistanceUOhm.value_or(absent)),
                         withUncertainty(f.resistanceRefOhm.value_or(absent), f.resistanceRefUOhm.value_or(absent)),
                         withUncertainty(v0, f.noLoadVoltageUV.value_or(absent)),
                         withUncertainty(f.regulationPercent.value_or(absent), f.regulationUPercent.value_or(absent)),
                         row.verdictShown(), std::to_string(row.safetyStops.size()), row.reviewState(),
                         (std::isfinite(z) ? formatFixed(z, 2) : std::string("n/a"))
                             + (far ? (stats.screeningOnly ? " far (screening only)" : " FAR") : "")});
    }
    std::vector<std::size_t> widths(titles.size());
    for (std::size_t c = 0; c < titles.size(); ++c) {
        widths[c] = displayWidth(titles[c]);
        for (const auto &line : cells)
            widths[c] = std::max(widths[c], displayWidth(line[c]));
    }
    auto printLine = [&](const std::vector<std::string> &line) {
        std::string text;
        for (std::size_t c = 0; c < line.size(); ++c)
            text += (c ? "  " : "") + pad(line[c], widths[c], c >= 3 && c <= 7);
        while (!text.empty() && text.back() == ' ')
            text.pop_back();
        out << text << '\n';
    };
    printLine(titles);
    for (const auto &line : cells)
        printLine(line);
}

void printSummary(const std::vector<SessionRow> &rows, const BatchStatistics &stats, const ComparisonOptions &options, std::ostream &out)
{
    const std::string basis = stats.atReferenceTemperature
                                  ? "at " + plainNumber(options.figures.referenceTemperatureC) + " °C"
                                  : "as measured (not every session has a winding temperature)";
    out << "\nBatch: " << stats.sessions << " sessions, " << stats.unreadable << " unreadable, " << stats.withoutFit
        << " without a fit\n";
    if (stats.meanOhm) {
        out << "  R " << basis << ": mean " << formatQuantity(*stats.meanOhm, "Ω");
        if (stats.sdOhm)
            out << ", standard deviation " << formatQuantity(*stats.sdOhm, "Ω");
        out << ", median " << formatQuantity(*stats.medianOhm, "Ω") << ", range " << formatQuantity(*stats.minOhm, "Ω")
            << " to " << formatQuantity(*stats.maxOhm, "Ω") << " (" << stats.resistanceCount << " units)\n";
    }
    // Sessions judged by their own recorded rule may differ; then the table's rule column says which.
    std::string ruleName;
    for (const auto &row : rows) {
        if (!row.opened)
            continue;
        if (ruleName.empty())
            ruleName = row.figures.ruleName;
        else if (ruleName != row.figures.ruleName)
            ruleName = "each session's recorded rule";
    }
    out << "  Verdicts against each session's specification (" << (ruleName.empty() ? toString(options.figures.rule) : ruleName)
        << "):\n    " << verdictCountsText(stats) << '\n';
    out << "  Review: accepted " << stats.accepted << ", rejected " << stats.rejected << ", retest " << stats.retest
        << ", not reviewed " << stats.notReviewed << ", changed after sign-off " << stats.changedAfterSignOff << "; safety stops in " << stats.safetyStopped
        << " sessions; lab-sheet limit hit in " << stats.limitHit << '\n';
    out << "  Far from the batch: " << stats.ruleNote << '\n';
    out << "  Fit: " << toString(options.method) << "; U: expanded uncertainties at 95 % coverage, k from each result's "
        << "own budget (GUM G.4)\n";
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
        printTable(rows, stats, options.comparison, std::cout);
        printSummary(rows, stats, options.comparison, std::cout);
    }
    return incomplete || found.files.empty() ? exitInvalidInput : exitSuccess;
}

} // namespace sagline::cli
