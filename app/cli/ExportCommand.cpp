// sagline-cli export SESSION.sagline --csv OUT.csv [--fit-csv FIT.csv] [--json OUT.json]:
// the readings (re-importable CSV), the fit results and a one-object JSON summary. The session
// is opened for review, so exporting never changes it.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "SessionExport.h"
#include "SessionSummary.h"

#include <iostream>

namespace sagline::cli {

int runExport(const Arguments &args)
{
    CommandLine line("sagline-cli export", "SESSION.sagline [--csv OUT.csv] [--fit-csv FIT.csv] [--json OUT.json] [options]",
                     "Writes what a session holds, without changing it (the file is opened for review): the readings "
                     "as CSV that import reads back, the fit results as CSV, and a summary as one JSON object. An "
                     "output named - goes to standard output.");
    line.addPositional("SESSION.sagline", "the session to export");
    line.addOption({"csv"}, "OUT.csv", "the readings, with step, UTC time, flags and exclusions");
    line.addOption({"fit-csv"}, "FIT.csv", "the fit results");
    line.addOption({"json"}, "OUT.json", "the summary: setup, plan, fit and analysis");
    line.addOption({"method"}, "ols|wls|york", "the fit method for the results (default ols)");
    line.addFlag({"force"}, "replace an existing output file (never a session, never the session read)");
    line.addNote("Outputs are written whole or not at all (a temporary file renamed into place).");
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    const std::string sessionPath = line.positionals().front();
    const std::string csvPath = line.value("csv"), fitCsvPath = line.value("fit-csv"), jsonPath = line.value("json");
    ReviewOptions options;
    if (const auto text = line.valueIfSet("method")) {
        const auto parsed = fitMethodFromString(*text);
        if (!parsed)
            return line.fail("--method: expected ols, wls or york, got '" + *text + "'");
        options.method = *parsed;
    }
    if (csvPath.empty() && fitCsvPath.empty() && jsonPath.empty())
        return line.fail("give at least one of --csv, --fit-csv, --json");
    if (const auto refused = refuseOutputs("export", {csvPath, fitCsvPath, jsonPath}, {sessionPath}, line.isSet("force")))
        return *refused;

    const auto summary = loadSessionSummary(sessionPath, options);
    if (!summary.ok()) {
        std::cerr << "sagline-cli export: " << summary.message << '\n';
        return exitCodeFor(summary.code);
    }
    if (!summary.value.notice.empty())
        std::cerr << "sagline-cli export: note: " << summary.value.notice << '\n';
    if (!summary.value.fit.ok())
        std::cerr << "sagline-cli export: warning: no fit (" << summary.value.fit.message << "); readings exported as recorded\n";

    const std::pair<const std::string *, std::string> outputs[] = {
        {&csvPath, csvPath.empty() ? std::string() : sessionReadingsToCsv(summary.value)},
        {&fitCsvPath, fitCsvPath.empty() ? std::string() : fitResultsToCsv(summary.value)},
        {&jsonPath, jsonPath.empty() ? std::string() : sessionSummaryToJson(summary.value) + "\n"},
    };
    for (const auto &[path, text] : outputs) {
        if (path->empty())
            continue;
        if (const std::string problem = writeOutput(*path, text); !problem.empty()) {
            std::cerr << "sagline-cli export: " << problem << '\n';
            return exitRuntimeFailure;
        }
    }
    return exitSuccess;
}

} // namespace sagline::cli
