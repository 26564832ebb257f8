// sagline-cli labsheet check SHEET.json | labsheet new --setup SETUP.json -o SHEET.json: a
// supervisor writes a lab sheet from a setup and checks it before handing it to students.
// `check` names every bad field and exits 2; `new` writes a sheet that passes `check`.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "LabSheet.h"
#include "LabSheetDraft.h"
#include "NumberFormat.h"
#include "SetupJson.h"

#include <iostream>
#include <string>

#include <unistd.h>

namespace sagline::cli {

namespace {

CommandLine labSheetCommandLine()
{
    CommandLine line("sagline-cli labsheet", "(check SHEET.json | new --setup SETUP.json -o SHEET.json) [options]",
                     "Lab sheets: what a supervisor hands students for a supervised session (format in the manual page "
                     "and the README). `check` checks a sheet's format, setup, locks and limits and that the plan "
                     "stays within them: it prints what the sheet fixes and exits 0, or names every bad field and "
                     "exits 2. `new` writes a sheet to edit from a setup: the plan fixed, the load limit at the plan's "
                     "top step, the bench's fuse (or the recommended one) required, readings typed in, and "
                     "instructions listing each plan step with the current to set and the voltage to expect; the "
                     "sheet passes `check`.");
    line.addPositional("ACTION", "check or new");
    line.addPositional("SHEET.json", "check: the lab sheet to check", Arity::Optional);
    line.addOption({"setup"}, "SETUP.json", "new: the setup the sheet's plan is made from");
    line.addOption({"o", "output"}, "SHEET.json", "new: the lab sheet to write");
    line.addOption({"title"}, "TEXT", "new: the sheet's title (default: \"Load test of a <design> transformer\")");
    line.addFlag({"supervisor-pin"}, "new: read a PIN of 4 to 12 digits from standard input; the sheet keeps only its "
                                     "salted hash (PBKDF2-HMAC-SHA-256) and the supervisor gives it to start a session");
    line.addFlag({"force"}, "new: replace an existing file");
    line.addNote(exitCodesNote);
    return line;
}

int runCheck(const CommandLine &line)
{
    if (line.positionals().size() != 2)
        return line.fail("check needs the lab sheet: labsheet check SHEET.json");
    for (const char *option : {"setup", "output", "title", "supervisor-pin", "force"})
        if (line.isSet(option))
            return line.fail(std::string("--") + option + " belongs to labsheet new, not check");
    const std::string path = line.positionals()[1];
    const LabSheetParse parsed = loadLabSheetFile(path);
    if (!parsed.sheet) {
        for (const FieldError &error : parsed.errors)
            std::cerr << "sagline-cli labsheet check: " << path << ": " << error.message() << '\n';
        std::cerr << "sagline-cli labsheet check: " << path << ": not a usable lab sheet (" << parsed.errors.size()
                  << (parsed.errors.size() == 1 ? " problem" : " problems") << ")\n";
        return exitInvalidInput;
    }
    const LabSheet &sheet = *parsed.sheet;
    const PlanResult plan = makePlan(sheet.setup);
    std::cout << path << ": a valid lab sheet\n"
              << "  title: " << sheet.title << '\n'
              << "  steps: " << (plan.plan ? plan.plan->steps.size() : 0) << " (plan step 0 is the open circuit)\n"
              << "  load limit: " << formatQuantity(labSheetMaxCurrentA(sheet), "A") << " ("
              << formatSignificant(sheet.locks.maxLoadFraction * 100.0, 3) << " % of rated secondary current)\n"
              << "  required fuse: " << formatQuantity(sheet.locks.requiredFuse.ratingA, "A") << " "
              << toString(sheet.locks.requiredFuse.type) << '\n'
              << "  plan fixed: " << (sheet.locks.planFixed ? "yes" : "no")
              << "; readings typed in only: " << (sheet.locks.typedInOnly ? "yes" : "no") << '\n'
              << "  supervisor: confirms by name" << (sheet.locks.supervisorPin ? " and PIN (stored hashed)" : "") << '\n'
              << "  fingerprint: " << labSheetFingerprint(sheet) << '\n';
    return exitSuccess;
}

int runNew(const CommandLine &line)
{
    if (line.positionals().size() != 1)
        return line.fail("new takes no file name of its own: labsheet new --setup SETUP.json -o SHEET.json");
    const std::string setupPath = line.value("setup");
    const std::string output = line.value("output");
    if (setupPath.empty() || output.empty())
        return line.fail("--setup and -o are required");
    if (const auto refused = refuseOutputs("labsheet new", {output}, {setupPath}, line.isSet("force")))
        return *refused;
    const SetupParse setup = loadSetupFile(setupPath);
    if (!setup.setup) {
        for (const FieldError &error : setup.errors)
            std::cerr << "sagline-cli labsheet new: " << setupPath << ": " << error.message() << '\n';
        return exitInvalidInput;
    }
    LabSheetDraft draft = draftLabSheet(*setup.setup, line.value("title"));
    if (!draft.sheet) {
        for (const FieldError &error : draft.errors)
            std::cerr << "sagline-cli labsheet new: " << setupPath << ": " << error.message() << '\n';
        return exitInvalidInput;
    }
    if (line.isSet("supervisor-pin")) {
        std::string pin;
        if (std::cin.good() && isatty(0))
            std::cerr << "Supervisor's PIN (4 to 12 digits): " << std::flush;
        std::getline(std::cin, pin);
        while (!pin.empty() && (pin.back() == '\r' || pin.back() == ' '))
            pin.pop_back();
        if (const std::string error = supervisorPinError(pin); !error.empty())
            return line.fail("the supervisor's PIN (standard input) " + error);
        draft.sheet->locks.supervisorPin = makeSupervisorPinLock(pin);
    }
    if (const std::string problem = writeOutput(output, labSheetToJson(*draft.sheet) + "\n"); !problem.empty()) {
        std::cerr << "sagline-cli labsheet new: " << problem << '\n';
        return exitRuntimeFailure;
    }
    std::cout << "Wrote " << output << ": \"" << draft.sheet->title << "\", " << draft.sheet->setup.bench.steps + 1
              << " plan steps. Edit it, then run: sagline-cli labsheet check " << output << '\n';
    return exitSuccess;
}

} // namespace

int runLabSheet(const Arguments &args)
{
    CommandLine line = labSheetCommandLine();
    if (const auto exit = line.parse(args))
        return *exit;
    const std::string action = line.positionals().front();
    if (action == "check")
        return runCheck(line);
    if (action == "new")
        return runNew(line);
    return line.fail("ACTION must be check or new, got '" + action + "'");
}

} // namespace sagline::cli
