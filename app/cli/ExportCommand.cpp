// sagline-cli export SESSION.sagline --csv OUT.csv [--fit-csv FIT.csv] [--json OUT.json]:
// the readings (re-importable CSV), the fit results and a one-object JSON summary. The session
// is opened for review, so exporting never changes it.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "SessionExport.h"
#include "SessionSummary.h"

#include <iostream>

namespace sagline::cli {

namespace {

constexpr const char *usage =
    "usage: sagline-cli export SESSION.sagline [--csv OUT.csv] [--fit-csv FIT.csv] [--json OUT.json]\n"
    "                          [--method ols|wls|york]     (\"-\" writes to standard output)\n";

} // namespace

int runExport(const Arguments &args)
{
    std::string sessionPath, csvPath, fitCsvPath, jsonPath;
    ReviewOptions options;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &arg = args[i];
        if (arg == "--csv" || arg == "--fit-csv" || arg == "--json" || arg == "--method") {
            const auto value = optionValue(args, i, "export");
            if (!value)
                return exitInvalidInput;
            if (arg == "--csv")
                csvPath = *value;
            else if (arg == "--fit-csv")
                fitCsvPath = *value;
            else if (arg == "--json")
                jsonPath = *value;
            else if (const auto parsed = fitMethodFromString(*value))
                options.method = *parsed;
            else {
                std::cerr << "sagline-cli export: --method: expected ols, wls or york, got '" << *value << "'\n";
                return exitInvalidInput;
            }
        } else if (!arg.empty() && arg[0] == '-') {
            std::cerr << "sagline-cli export: unknown option '" << arg << "'\n" << usage;
            return exitInvalidInput;
        } else if (sessionPath.empty()) {
            sessionPath = arg;
        } else {
            std::cerr << "sagline-cli export: one session file only, got '" << sessionPath << "' and '" << arg << "'\n";
            return exitInvalidInput;
        }
    }
    if (sessionPath.empty() || (csvPath.empty() && fitCsvPath.empty() && jsonPath.empty())) {
        std::cerr << "sagline-cli export: a session file and at least one of --csv, --fit-csv, --json are required\n" << usage;
        return exitInvalidInput;
    }

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
        {&csvPath, csvPath.empty() ? std::string() : readingsToCsv(summary.value.readings)},
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
