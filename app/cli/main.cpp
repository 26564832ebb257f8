// sagline-cli: dispatches to one command; see `sagline-cli --help`.
#include "CliCommands.h"

#include "BuildInfo.h"
#include "DataDirectory.h"
#include "LargePageHeap.h"
#include "PrintableOutput.h"

#include <csignal>
#include <cstring>
#include <iostream>
#include <optional>

namespace {

struct Command {
    const char *name;
    int (*run)(const sagline::cli::Arguments &);
    const char *synopsis;
};

constexpr Command commands[] = {
    {"plan", sagline::cli::runPlan, "plan SETUP.json [--json]          plan a safe load sweep from the nameplate"},
    {"fit", sagline::cli::runFit, "fit DATA.csv|SESSION.sagline [--method ols|wls|york] [--json] [--setup SETUP.json]\n"
                                  "                                     fit V = V0 - R·I; with a nameplate, regulation and verdict"},
    {"run", sagline::cli::runRun, "run SETUP.json (--sim | --voltmeter ADDR --ammeter ADDR | --meter ADDR) -o SESSION.sagline\n"
            "                                     run a load sweep headless (see run --help)"},
    {"import", sagline::cli::runImport, "import DATA.csv --setup SETUP.json -o SESSION.sagline   readings from a CSV into a new session"},
    {"export", sagline::cli::runExport, "export SESSION.sagline --csv OUT.csv [--fit-csv F.csv] [--json OUT.json]   readings, fit, summary"},
    {"report", sagline::cli::runReport, "report SESSION.sagline -o REPORT.pdf [--page a4|letter]   the printed test report (PDF)"},
    {"compare", sagline::cli::runCompare, "compare FILES_OR_FOLDERS... [--csv OUT.csv] [--json]  compare saved sessions (review)"},
    {"exclude", sagline::cli::runExclude, "exclude SESSION.sagline --reading N --reason TEXT --by NAME   leave a reading out of the fit"},
    {"restore", sagline::cli::runRestore, "restore SESSION.sagline --reading N --reason TEXT --by NAME   bring an excluded reading back"},
    {"note", sagline::cli::runNote, "note SESSION.sagline --text TEXT --by NAME   add a note"},
    {"temperature", sagline::cli::runTemperature, "temperature SESSION.sagline (--winding C | --ambient C) --source TEXT --by NAME\n"
                                                  "                                     record a temperature measured later"},
    {"sign-off", sagline::cli::runSignOff, "sign-off SESSION.sagline --by NAME --decision accept|reject|retest [--comment TEXT]\n"
                                           "                                     sign off and seal (SHA-256 digest of the content)"},
    {"reopen", sagline::cli::runReopen, "reopen SESSION.sagline --by NAME --reason TEXT   lift a sign-off so the session can change"},
    {"labsheet", sagline::cli::runLabSheet, "labsheet check SHEET.json | labsheet new --setup SETUP.json -o SHEET.json\n"
                                            "                                     check a lab sheet, or write one from a setup to edit"},
    {"verify", sagline::cli::runVerify, "verify SESSION.sagline             integrity and sign-off digests (exit 0 intact, 1 altered)"},
};

void printUsage(std::ostream &out)
{
    out << "usage: sagline-cli COMMAND [ARGS...]\n\ncommands:\n";
    for (const auto &command : commands)
        out << "  " << command.synopsis << '\n';
    out << "  help COMMAND                       the usage of one command with every option (as COMMAND --help)\n"
           "  --version                          print the version and the build's git commit\n"
           "\n"
        << sagline::cli::exitCodesNote << '\n';
    if (const auto data = sagline::findDataDirectory(); data.ok())
        out << "Demo setup: " << (data.path / "demo-setup.json").string() << '\n';
}

} // namespace

int main(int argc, char **argv)
{
    sagline::adviseLargePagesForHeap();
    // A file size limit (ulimit -f) would kill the program mid-write with SIGXFSZ, leaving a
    // temporary file behind and saying nothing; ignored, the write fails with EFBIG and is
    // reported like a full disk, with the temporary file removed.
    std::signal(SIGXFSZ, SIG_IGN);
    // What is printed for people is kept printable (a name or a meter reply from elsewhere
    // never drives the terminal); export may write data (CSV) to standard output, left as is.
    sagline::PrintableOutput messages(std::cerr);
    std::optional<sagline::PrintableOutput> text;
    if (argc < 2 || std::strcmp(argv[1], "export") != 0)
        text.emplace(std::cout);
    if (argc < 2) {
        printUsage(std::cerr);
        return sagline::cli::exitInvalidInput;
    }
    const std::string name = argv[1];
    if (name == "--version" || name == "version") {
        std::cout << "sagline-cli " << sagline::buildinfo::version << " (commit " << sagline::buildinfo::gitCommit << ")\n";
        return sagline::cli::exitSuccess;
    }
    if (name == "--help" || name == "-h" || (name == "help" && argc == 2)) {
        printUsage(std::cout);
        return sagline::cli::exitSuccess;
    }
    if (name == "help") {
        // "help COMMAND" says what "COMMAND --help" says.
        for (const auto &command : commands) {
            if (argv[2] == std::string(command.name) && argc == 3)
                return command.run({"--help"});
        }
        std::cerr << "sagline-cli help: " << (argc == 3 ? "unknown command '" + std::string(argv[2]) + "'" : "one command only")
                  << "\n\n";
        printUsage(std::cerr);
        return sagline::cli::exitInvalidInput;
    }
    for (const auto &command : commands) {
        if (name == command.name)
            return command.run(sagline::cli::Arguments(argv + 2, argv + argc));
    }
    std::cerr << "sagline-cli: unknown command '" << name << "'\n\n";
    printUsage(std::cerr);
    return sagline::cli::exitInvalidInput;
}
