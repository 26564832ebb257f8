// sagline-cli verify SESSION.sagline: is the file intact? SQLite's integrity check, then every
// sign-off's SHA-256 digest recomputed from the file (core/SessionSeal.h). Exit 0 intact (also
// unsigned, or changed after a recorded reopen: said so), 1 altered, 2 not a readable session.
#include "CliCommands.h"
#include "SessionCliSupport.h"

#include "CommandLine.h"

#include "SessionSeal.h"
#include "SessionStore.h"

#include <nlohmann/json.hpp>

#include <iostream>

namespace sagline::cli {

int runVerify(const Arguments &args)
{
    CommandLine line("sagline-cli verify", "SESSION.sagline",
                     "Checks a session file: SQLite's integrity check, then the SHA-256 digest of every sign-off "
                     "recomputed from the file. Prints one line: not signed off, signed off intact, changed after "
                     "sign-off (with who reopened it and why), or ALTERED with what no longer matches. The file is "
                     "opened read-only.");
    line.addPositional("SESSION.sagline", "the session to check");
    line.addFlag({"json"}, "print one JSON object: file, state, summary, findings");
    line.addNote("Exit codes: 0 intact (or changed after a recorded reopen); 1 altered; 2 not a readable session.");
    if (const auto exit = line.parse(args))
        return *exit;
    const std::string &path = line.positionals().front();
    auto store = SessionStore::openForReview(path);
    if (!store.ok()) {
        std::cerr << "sagline-cli verify: " << store.message << '\n';
        return store.code == StoreCode::Corrupt ? exitRuntimeFailure : exitCodeFor(store.code);
    }
    if (const StoreStatus integrity = store.value->integrityCheck(); !integrity.ok()) {
        std::cout << path << ": ALTERED: the file fails SQLite's integrity check: " << integrity.message << '\n';
        return exitRuntimeFailure;
    }
    const auto seal = checkSeal(*store.value);
    if (!seal.ok()) {
        std::cerr << "sagline-cli verify: " << seal.message << '\n';
        return exitRuntimeFailure;
    }
    if (line.isSet("json")) {
        nlohmann::json out = {{"file", path}, {"state", toString(seal.value.state)}, {"summary", seal.value.summary()},
                              {"findings", seal.value.findings}};
        std::cout << out.dump(2, ' ', false, nlohmann::json::error_handler_t::replace) << '\n';
    } else {
        std::cout << path << ": " << seal.value.summary() << '\n';
    }
    return seal.value.state == SealState::Altered ? exitRuntimeFailure : exitSuccess;
}

} // namespace sagline::cli
