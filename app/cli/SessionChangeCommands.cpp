// The changes a person makes to a recorded session, for scripts: exclude, restore, note,
// temperature, sign-off and reopen. Each names the person (--by); the OS account is recorded beside it.
// They share core's rules with the window (core/SessionChanges, the store's seal): a reason is
// required, a signed-off session refuses every change until it is reopened with a reason.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "SessionChanges.h"
#include "SessionSignOff.h"
#include "SessionStore.h"

#include <iostream>

namespace sagline::cli {

namespace {

constexpr const char *byText = "who makes the change (required; recorded with the OS account)";

// Opens the session for writing with the person as its actor; nullptr after a message.
std::unique_ptr<SessionStore> openAs(const CommandLine &line, const std::string &path, int *exitCode)
{
    const std::string person = line.value("by");
    if (const std::string error = personError(person); !error.empty()) {
        *exitCode = line.fail("--" + error);
        return nullptr;
    }
    auto opened = SessionStore::openForWriting(path);
    if (!opened.ok()) {
        std::cerr << line.program() << ": " << opened.message << '\n';
        *exitCode = exitCodeFor(opened.code);
        return nullptr;
    }
    opened.value->setActor({person, ""});
    return std::move(opened.value);
}

int report(const CommandLine &line, const StoreResult<std::int64_t> &result, const std::string &done)
{
    if (!result.ok()) {
        std::cerr << line.program() << ": " << result.message << '\n';
        return exitCodeFor(result.code);
    }
    std::cout << done << '\n';
    return exitSuccess;
}

int excludeOrRestore(const Arguments &args, bool exclude)
{
    const std::string name = exclude ? "exclude" : "restore";
    CommandLine line("sagline-cli " + name, "SESSION.sagline --reading N --reason TEXT --by NAME",
                     exclude ? "Leaves one reading out of the fit, with the reason and who decided it. The reading "
                               "stays in the session; restore brings it back."
                             : "Brings an excluded reading back into the fit, with the reason and who decided it.");
    line.addPositional("SESSION.sagline", "the session to change");
    line.addOption({"reading"}, "N", "the reading's number, from 1 in recording order (as the report and export list them)");
    line.addOption({"reason"}, "TEXT", "why (required)");
    line.addOption({"by"}, "NAME", byText);
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    std::optional<std::int64_t> number;
    if (!line.integer("reading", 1, std::int64_t(1) << 40, number))
        return exitInvalidInput;
    if (!number)
        return line.fail("--reading: give the reading's number (from 1)");
    if (!line.isSet("reason"))
        return line.fail("--reason: say why the reading is " + std::string(exclude ? "excluded" : "restored"));
    int exitCode = exitSuccess;
    auto store = openAs(line, line.positionals().front(), &exitCode);
    if (!store)
        return exitCode;
    const auto result = exclude ? excludeReadingNumber(*store, *number, line.value("reason"))
                                : restoreReadingNumber(*store, *number, line.value("reason"));
    return report(line, result, "reading " + std::to_string(*number) + (exclude ? " excluded" : " restored"));
}

} // namespace

int runExclude(const Arguments &args) { return excludeOrRestore(args, true); }

int runRestore(const Arguments &args) { return excludeOrRestore(args, false); }

int runNote(const Arguments &args)
{
    CommandLine line("sagline-cli note", "SESSION.sagline --text TEXT --by NAME",
                     "Adds a note to a session, with who wrote it.");
    line.addPositional("SESSION.sagline", "the session to change");
    line.addOption({"text"}, "TEXT", "the note (required)");
    line.addOption({"by"}, "NAME", byText);
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    if (!line.isSet("text"))
        return line.fail("--text: the note to add is required");
    int exitCode = exitSuccess;
    auto store = openAs(line, line.positionals().front(), &exitCode);
    if (!store)
        return exitCode;
    return report(line, addPersonNote(*store, line.value("text")), "note added");
}

// A temperature measured after the session was created (the winding's, read right after the
// sweep, is what the resistance is corrected from): a new record, the latest of its kind wins.
int runTemperature(const Arguments &args)
{
    CommandLine line("sagline-cli temperature", "SESSION.sagline (--winding C | --ambient C) --source TEXT --by NAME",
                     "Records a winding or ambient temperature measured after the session began, with how it was "
                     "measured and who measured it. The latest of each kind is the one the fit and report use; "
                     "earlier ones stay in the record.");
    line.addPositional("SESSION.sagline", "the session to change");
    line.addOption({"winding"}, "C", "the winding temperature, -60 to 400 °C");
    line.addOption({"ambient"}, "C", "the ambient temperature, -60 to 80 °C");
    line.addOption({"source"}, "TEXT", "how it was measured, e.g. 'thermocouple on the outer layer, 2 min after the "
                                       "last step' (required)");
    line.addOption({"by"}, "NAME", byText);
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    std::optional<double> winding;
    std::optional<double> ambient;
    const TemperatureRange windingRange = plausibleTemperatureRange(TemperatureKind::Winding);
    const TemperatureRange ambientRange = plausibleTemperatureRange(TemperatureKind::Ambient);
    if (!line.number("winding", windingRange.lowC, windingRange.highC, winding)
        || !line.number("ambient", ambientRange.lowC, ambientRange.highC, ambient))
        return exitInvalidInput;
    if (winding.has_value() == ambient.has_value())
        return line.fail("--winding or --ambient: give one of them (one temperature per record)");
    if (!line.isSet("source") || line.value("source").find_first_not_of(" \t") == std::string::npos)
        return line.fail("--source: say how the temperature was measured (required)");
    int exitCode = exitSuccess;
    auto store = openAs(line, line.positionals().front(), &exitCode);
    if (!store)
        return exitCode;
    const TemperatureKind kind = winding ? TemperatureKind::Winding : TemperatureKind::Ambient;
    const double celsius = winding ? *winding : *ambient;
    return report(line, recordPersonTemperature(*store, kind, celsius, line.value("source")),
                  std::string(toString(kind)) + " temperature " + line.value(winding ? "winding" : "ambient") +
                      " °C recorded");
}

int runSignOff(const Arguments &args)
{
    CommandLine line("sagline-cli sign-off", "SESSION.sagline --by NAME --decision accept|reject|retest [--comment TEXT]",
                     "Signs a session off and seals it: the SHA-256 digest of its content is stored with the "
                     "sign-off, and the session refuses every change until it is reopened (see reopen, verify).");
    line.addPositional("SESSION.sagline", "the session to sign off");
    line.addOption({"by"}, "NAME", "the reviewer (required)");
    line.addOption({"decision"}, "accept|reject|retest", "the decision (required)");
    line.addOption({"comment"}, "TEXT", "why; required for reject and retest");
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    SignOffRequest request;
    request.reviewer = line.value("by");
    request.comment = line.value("comment");
    const std::string decision = line.value("decision");
    if (decision == "accept")
        request.decision = ReviewDecision::Accepted;
    else if (decision == "reject")
        request.decision = ReviewDecision::Rejected;
    else if (decision == "retest")
        request.decision = ReviewDecision::Retest;
    else
        return line.fail("--decision: expected accept, reject or retest, got '" + decision + "'");
    if (const std::string error = signOffRequestError(request); !error.empty())
        return line.fail("--" + (error.rfind("reviewer", 0) == 0 ? "by" + error.substr(8) : error));
    return report(line, signOffSession(line.positionals().front(), request), "signed off (" + decision + ") and sealed");
}

int runReopen(const Arguments &args)
{
    CommandLine line("sagline-cli reopen", "SESSION.sagline --by NAME --reason TEXT",
                     "Lifts the sign-off of a session so that it can be changed again. Who and why are recorded; "
                     "the sign-off is then superseded and everything that shows the session says \"changed after "
                     "sign-off\".");
    line.addPositional("SESSION.sagline", "the signed-off session");
    line.addOption({"by"}, "NAME", byText);
    line.addOption({"reason"}, "TEXT", "why the signed session must change (required)");
    line.addNote(exitCodesNote);
    if (const auto exit = line.parse(args))
        return *exit;
    if (!line.isSet("reason"))
        return line.fail("--reason: say why the signed session must change");
    int exitCode = exitSuccess;
    auto store = openAs(line, line.positionals().front(), &exitCode);
    if (!store)
        return exitCode;
    return report(line, store->reopen(line.value("reason")), "reopened; the sign-off is superseded");
}

} // namespace sagline::cli
