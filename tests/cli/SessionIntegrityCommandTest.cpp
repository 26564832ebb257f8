// sagline-cli exclude, restore, note, sign-off, reopen and verify (sealed sign-off), and the
// plausibility and unsafe-step gates of plan and run, with their exit codes.
#include "CliTestSupport.h"

#include <nlohmann/json.hpp>
#include <sqlite3.h>

#include <fstream>
#include <functional>

using namespace sagline::testing;

namespace {

class SessionIntegrityCommand : public ScratchFolderTest {
protected:
    SessionIntegrityCommand() : ScratchFolderTest("sagline-integrity-") {}

    // A complete virtual-bench sweep of the demo transformer (9 readings).
    std::string sweep(const std::string &name = "unit.sagline")
    {
        const auto r = runProgram(cli, {"run", demoSetup, "--sim", "-o", path(name), "--by", "R. Okafor", "--serial", "T60-1"});
        EXPECT_EQ(r.exitCode, 0) << r.err;
        return path(name);
    }

    // The demo setup with one change, written into the scratch folder.
    std::string setupWith(const std::string &name, const std::function<void(nlohmann::json &)> &change)
    {
        std::ifstream in(demoSetup);
        nlohmann::json setup = nlohmann::json::parse(in);
        change(setup);
        return write(name, setup.dump(2));
    }

    static void rawSql(const std::string &file, const char *sql)
    {
        sqlite3 *db = nullptr;
        ASSERT_EQ(sqlite3_open(file.c_str(), &db), SQLITE_OK);
        EXPECT_EQ(sqlite3_exec(db, sql, nullptr, nullptr, nullptr), SQLITE_OK);
        sqlite3_close(db);
    }
};

} // namespace

TEST_F(SessionIntegrityCommand, ChangesNeedAPersonAndAReason)
{
    const std::string session = sweep();
    auto r = runProgram(cli, {"exclude", session, "--reading", "9", "--reason", "clip fell off"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--by: the name of the person"), std::string::npos) << r.err;
    r = runProgram(cli, {"exclude", session, "--reading", "9", "--by", "L. Lead"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--reason"), std::string::npos) << r.err;
    r = runProgram(cli, {"exclude", session, "--reading", "10", "--reason", "x", "--by", "L. Lead"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("reading: 10 is not a reading of this session (it has 9"), std::string::npos) << r.err;
    r = runProgram(cli, {"restore", session, "--reading", "9", "--reason", "x", "--by", "L. Lead"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("not excluded"), std::string::npos) << r.err;
    r = runProgram(cli, {"note", session, "--by", "L. Lead"});
    EXPECT_EQ(r.exitCode, 2);
}

// A winding temperature read after the sweep: recorded with how and by whom, the latest used for
// R at the reference temperature, refused with the option named when mistyped or when sealed.
TEST_F(SessionIntegrityCommand, ATemperatureMeasuredLaterIsRecordedAndUsed)
{
    const std::string session = sweep();
    auto r = runProgram(cli, {"temperature", session, "--winding", "4150", "--source", "thermocouple", "--by", "B. Eng"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--winding: '4150' must be a number from -60 to 400"), std::string::npos) << r.err;
    r = runProgram(cli, {"temperature", session, "--winding", "41.5", "--ambient", "21", "--source", "x", "--by", "B. Eng"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("give one of them"), std::string::npos) << r.err;
    r = runProgram(cli, {"temperature", session, "--winding", "41.5", "--by", "B. Eng"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--source"), std::string::npos) << r.err;
    r = runProgram(cli, {"temperature", session, "--winding", "41.5", "--source", "thermocouple after the sweep", "--by",
                         "B. Eng"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto exported = nlohmann::json::parse(runProgram(cli, {"export", session, "--json", "-"}).out);
    const auto &last = exported["temperatures"].back();
    EXPECT_EQ(last["kind"], "winding");
    EXPECT_DOUBLE_EQ(last["celsius"].get<double>(), 41.5);
    EXPECT_EQ(last["source"], "thermocouple after the sweep");
    EXPECT_EQ(last["person"], "B. Eng");
    // Copper, IEEE C57.12.90 T_k = 234.5 °C: R(75) / R(41.5) = 309.5 / 276 = 1.1214 (worked by hand).
    const auto fit = runProgram(cli, {"fit", session});
    EXPECT_NE(fit.out.find("R × 1.1214"), std::string::npos) << fit.out;
    ASSERT_EQ(runProgram(cli, {"sign-off", session, "--by", "L. Lead", "--decision", "accept"}).exitCode, 0);
    r = runProgram(cli, {"temperature", session, "--winding", "40", "--source", "again", "--by", "B. Eng"});
    EXPECT_NE(r.exitCode, 0);
    EXPECT_NE(r.err.find("signed off"), std::string::npos) << r.err;
}

TEST_F(SessionIntegrityCommand, ExcludeRestoreAndNoteRecordWhoDidIt)
{
    const std::string session = sweep();
    EXPECT_EQ(runProgram(cli, {"exclude", session, "--reading", "9", "--reason", "clip fell off", "--by", "L. Lead"}).exitCode, 0);
    EXPECT_EQ(runProgram(cli, {"exclude", session, "--reading", "9", "--reason", "again", "--by", "L. Lead"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"restore", session, "--reading", "9", "--reason", "clip was fine", "--by", "M. Second"}).exitCode, 0);
    EXPECT_EQ(runProgram(cli, {"note", session, "--text", "fan on", "--by", "M. Second"}).exitCode, 0);
    const auto exported = runProgram(cli, {"export", session, "--json", "-"});
    ASSERT_EQ(exported.exitCode, 0) << exported.err;
    const auto json = nlohmann::json::parse(exported.out);
    ASSERT_EQ(json["exclusions"].size(), 2u);
    EXPECT_EQ(json["exclusions"][0]["author"], "L. Lead");
    EXPECT_EQ(json["exclusions"][1]["author"], "M. Second");
    EXPECT_FALSE(json["exclusions"][1]["os_account"].get<std::string>().empty());
    EXPECT_EQ(json["notes"].back()["author"], "M. Second");
}

TEST_F(SessionIntegrityCommand, SignOffSealsReopenUnsealsAndVerifyTellsAlteredFromIntact)
{
    const std::string session = sweep();
    auto r = runProgram(cli, {"verify", session});
    EXPECT_EQ(r.exitCode, 0);
    EXPECT_NE(r.out.find("not signed off"), std::string::npos) << r.out;

    r = runProgram(cli, {"sign-off", session, "--by", "L. Lead", "--decision", "reject"});
    EXPECT_EQ(r.exitCode, 2); // a rejection says why
    EXPECT_NE(r.err.find("--comment"), std::string::npos) << r.err;
    EXPECT_EQ(runProgram(cli, {"sign-off", session, "--by", "L. Lead", "--decision", "maybe"}).exitCode, 2);
    ASSERT_EQ(runProgram(cli, {"sign-off", session, "--by", "L. Lead", "--decision", "accept"}).exitCode, 0);
    r = runProgram(cli, {"verify", session});
    EXPECT_EQ(r.exitCode, 0);
    EXPECT_NE(r.out.find("signed off by L. Lead"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("digest intact"), std::string::npos) << r.out;

    // Sealed: no change and no second sign-off until reopened with a reason.
    r = runProgram(cli, {"exclude", session, "--reading", "9", "--reason", "late", "--by", "L. Lead"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("signed off; reopen it"), std::string::npos) << r.err;
    EXPECT_EQ(runProgram(cli, {"note", session, "--text", "x", "--by", "L. Lead"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"sign-off", session, "--by", "L. Lead", "--decision", "accept"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"reopen", session, "--by", "L. Lead"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"reopen", session, "--reason", "misread"}).exitCode, 2);

    // An intact copy, then altered outside Sagline.
    const std::string altered = path("altered.sagline");
    std::filesystem::copy_file(session, altered);
    rawSql(altered, "UPDATE reading SET voltage_v = voltage_v + 0.01 WHERE id = 4");
    r = runProgram(cli, {"verify", altered});
    EXPECT_EQ(r.exitCode, 1);
    EXPECT_NE(r.out.find("ALTERED"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("SHA-256"), std::string::npos) << r.out;

    ASSERT_EQ(runProgram(cli, {"reopen", session, "--by", "L. Lead", "--reason", "full-load point misread"}).exitCode, 0);
    EXPECT_EQ(runProgram(cli, {"exclude", session, "--reading", "9", "--reason", "misread", "--by", "L. Lead"}).exitCode, 0);
    r = runProgram(cli, {"verify", session});
    EXPECT_EQ(r.exitCode, 0);
    EXPECT_NE(r.out.find("changed after sign-off"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("full-load point misread"), std::string::npos) << r.out;
    // compare and the export say so too; the altered copy is named as altered.
    r = runProgram(cli, {"compare", session, altered, "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto compared = nlohmann::json::parse(r.out);
    EXPECT_EQ(compared["sessions"][0]["review_decision"], "changed after sign-off");
    EXPECT_EQ(compared["sessions"][1]["review_decision"], "ALTERED after sign-off");
    EXPECT_EQ(compared["batch"]["review"]["changed_after_sign_off"], 2);
    const auto exported = nlohmann::json::parse(runProgram(cli, {"export", session, "--json", "-"}).out);
    EXPECT_EQ(exported["seal"]["state"], "changed after sign-off");

    EXPECT_EQ(runProgram(cli, {"verify", demoSetup}).exitCode, 2); // not a session
}

TEST_F(SessionIntegrityCommand, PlanRefusesAVoltageTypedInMillivoltsNamingTheField)
{
    const std::string setup = setupWith("mv.json", [](nlohmann::json &s) { s["nameplate"]["secondary_voltage_v"] = "18 mV"; });
    const auto r = runProgram(cli, {"plan", setup});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("nameplate.secondary_voltage_v"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("typed in mV?"), std::string::npos) << r.err;
    EXPECT_TRUE(r.out.empty());
    const auto run = runProgram(cli, {"run", setup, "--sim", "-o", path("mv.sagline")});
    EXPECT_EQ(run.exitCode, 2);
    EXPECT_FALSE(std::filesystem::exists(path("mv.sagline")));
}

TEST_F(SessionIntegrityCommand, UnsafeStepsAreRefusedOrCutToTheSafeOnes)
{
    const std::string setup = setupWith("rheostat.json", [](nlohmann::json &s) {
        s["bench"]["rheostat"] = {{"total_resistance_ohm", 100}, {"power_rating_w", 100}}; // safe to 1 A
    });
    auto r = runProgram(cli, {"plan", setup});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("steps 3 to 8: current above the rheostat's safe 1.00 A"), std::string::npos) << r.err;

    r = runProgram(cli, {"plan", setup, "--truncate-to-safe", "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto plan = nlohmann::json::parse(r.out);
    EXPECT_EQ(plan["steps"].size(), 3u); // steps 0, 1 and 2
    EXPECT_EQ(plan["steps"].back()["index"], 2);

    // run refuses before connecting: no session file is made.
    r = runProgram(cli, {"run", setup, "--sim", "-o", path("refused.sagline")});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("refused before connecting"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(path("refused.sagline")));
    EXPECT_EQ(runProgram(cli, {"run", setup, "--sim", "-o", path("o.sagline"), "--override-limits", "rated to 5 A"}).exitCode, 2);

    r = runProgram(cli, {"run", setup, "--sim", "-o", path("safe.sagline"), "--truncate-to-safe", "--by", "R. Okafor"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto exported = runProgram(cli, {"export", path("safe.sagline"), "--json", "-"});
    const auto json = nlohmann::json::parse(exported.out);
    EXPECT_EQ(json["readings"]["total"], 3);
    ASSERT_FALSE(json["sweep_events"].empty());
    EXPECT_EQ(json["sweep_events"][0]["kind"], "truncated");
    EXPECT_EQ(json["sweep_events"][0]["person"], "R. Okafor");
}

TEST_F(SessionIntegrityCommand, AnOverrideIsRecordedWithThePersonAndTheReason)
{
    const std::string setup = setupWith("rheostat.json", [](nlohmann::json &s) {
        s["bench"]["rheostat"] = {{"total_resistance_ohm", 100}, {"power_rating_w", 100}};
    });
    // The controller's hard stop still applies: the rheostat's safe current stops the sweep.
    const auto r = runProgram(cli, {"run", setup, "--sim", "-o", path("over.sagline"), "--override-limits",
                                    "rheostat fan-cooled, checked by the lab lead", "--by", "L. Lead"});
    EXPECT_EQ(r.exitCode, 3) << r.err;
    const auto exported = runProgram(cli, {"export", path("over.sagline"), "--json", "-"});
    const auto json = nlohmann::json::parse(exported.out);
    EXPECT_EQ(json["sweep_events"][0]["kind"], "limit-override");
    EXPECT_NE(json["sweep_events"][0]["detail"].get<std::string>().find("fan-cooled"), std::string::npos);
    EXPECT_EQ(json["sweep_events"][0]["person"], "L. Lead");
    // Stopped before its last step: incomplete everywhere, and no verdict.
    EXPECT_EQ(json["progress"]["state"], "stopped");
    EXPECT_EQ(json["verdict"]["as_shown"].get<std::string>().rfind("incomplete (", 0), 0u) << json["verdict"].dump();
    // No pass in the exports either: the outcomes read "incomplete", the partial data's beside them.
    EXPECT_EQ(json["verdict"]["outcome"], "incomplete");
    EXPECT_TRUE(json["verdict"].contains("outcome_on_partial_data"));
    // Its explanation says so first, not "Judged on 4 limits" as if there were a verdict.
    EXPECT_EQ(json["verdict"]["explanation"].get<std::string>().rfind("Incomplete (3 of 9 steps; safety stop", 0), 0u)
        << json["verdict"]["explanation"];
    EXPECT_NE(json["verdict"]["explanation"].get<std::string>().find("no verdict. On the partial data: judged on"),
              std::string::npos)
        << json["verdict"]["explanation"];
    for (const auto &limit : json["verdict"]["limits"])
        EXPECT_EQ(limit["outcome"], "incomplete") << limit.dump();
    // `fit SESSION` says the same: no PASS on the Verdict line or any limit's line, text or JSON.
    const auto fitRun = runProgram(cli, {"fit", path("over.sagline")});
    EXPECT_EQ(fitRun.exitCode, 0) << fitRun.err;
    EXPECT_NE(fitRun.out.find("Sweep: incomplete (3 of 9 steps; safety stop"), std::string::npos) << fitRun.out;
    EXPECT_NE(fitRun.out.find("Verdict                 Incomplete (3 of 9 steps; safety stop"), std::string::npos)
        << fitRun.out;
    EXPECT_NE(fitRun.out.find("For information only, on the partial data"), std::string::npos) << fitRun.out;
    EXPECT_EQ(fitRun.out.find("PASS"), std::string::npos) << fitRun.out;
    const auto fitJson = nlohmann::json::parse(runProgram(cli, {"fit", path("over.sagline"), "--json"}).out);
    EXPECT_EQ(fitJson["progress"]["state"], "stopped");
    EXPECT_EQ(fitJson["verdict"]["outcome"], "incomplete");
    for (const auto &limit : fitJson["verdict"]["limits"])
        EXPECT_EQ(limit["outcome"], "incomplete") << limit.dump();
    ASSERT_EQ(runProgram(cli, {"export", path("over.sagline"), "--fit-csv", path("fit.csv")}).exitCode, 0);
    std::ifstream fitCsv(path("fit.csv"));
    const std::string fitText((std::istreambuf_iterator<char>(fitCsv)), std::istreambuf_iterator<char>());
    EXPECT_NE(fitText.find("verdict_non-binary,incomplete (3 of 9 steps; safety stop"), std::string::npos) << fitText;
    EXPECT_EQ(fitText.find(",pass"), std::string::npos) << fitText;
    const auto compared = nlohmann::json::parse(runProgram(cli, {"compare", path("over.sagline"), "--json"}).out);
    EXPECT_EQ(compared["sessions"][0]["verdict"].get<std::string>().rfind("incomplete (", 0), 0u) << compared.dump();
    EXPECT_EQ(compared["batch"]["verdicts"]["incomplete"], 1);
    EXPECT_EQ(compared["batch"]["verdicts"]["pass"], 0);
}
