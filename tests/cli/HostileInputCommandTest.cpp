// The reproducers of an attack on the programs, run as their users would: each hostile input is
// refused with a clear message naming the field (exit 2), or read without harm; never a crash
// (exit code -1 here), never a hang, never text that drives the terminal.
#include "CliTestSupport.h"

#include "SessionStore.h"
#include "SetupJson.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <chrono>
#include <filesystem>

using namespace sagline::testing;

namespace {

const std::string sim = SAGLINE_SIM_PATH;

class HostileInput : public ScratchFolderTest {
protected:
    HostileInput() : ScratchFolderTest("sagline-cli-hostile-") {}

    std::string demoSetupText() const { return readWholeFile(demoSetup); }

    // A session of the demo readings with a stored setup of our choosing (written by a program
    // other than ours, as far as the readers know).
    std::string sessionWithStoredSetup(const std::string &name, const std::string &setupJson)
    {
        sagline::NewSession session;
        session.setupJson = setupJson;
        session.planJson = "{}";
        session.operatorName = "Attacker";
        session.unitSerial = "X-1";
        auto store = sagline::SessionStore::create(path(name), session);
        EXPECT_TRUE(store.ok()) << store.message;
        for (int k = 0; k < 5; ++k) {
            sagline::Reading reading;
            reading.step = k;
            reading.currentA = 0.5 * k;
            reading.voltageV = 19.6 - 0.48 * 0.5 * k;
            EXPECT_TRUE(store.value->appendReading(reading).ok());
        }
        return path(name);
    }
};

std::string nested(std::size_t depth)
{
    return std::string(depth, '[') + "1" + std::string(depth, ']');
}

} // namespace

TEST_F(HostileInput, ADeeplyNestedSetupIsRefusedByEveryProgram)
{
    std::string text = demoSetupText();
    text.replace(text.find("\"rated_power_va\": 60"), std::string("\"rated_power_va\": 60").size(),
                 "\"rated_power_va\": " + nested(50000));
    const std::string setup = write("deep.json", text);
    for (const std::vector<std::string> &args :
         {std::vector<std::string>{"plan", setup}, std::vector<std::string>{"run", setup, "--sim", "-o", path("d.sagline")},
          std::vector<std::string>{"import", demoReadings, "--setup", setup, "-o", path("i.sagline")}}) {
        const auto r = runProgram(cli, args);
        EXPECT_EQ(r.exitCode, 2) << args[0] << ": " << r.err.substr(0, 300);
        EXPECT_NE(r.err.find("nested more than 32 levels deep"), std::string::npos) << r.err.substr(0, 300);
    }
    const auto simulator = runProgram(sim, {setup});
    EXPECT_EQ(simulator.exitCode, 2) << simulator.err.substr(0, 300);
    EXPECT_FALSE(std::filesystem::exists(path("d.sagline")));
}

TEST_F(HostileInput, ADeeplyNestedStoredSetupHarmsNoReader)
{
    // Reproducer: the same JSON inside a session's stored setup crashed fit, export, report and
    // a whole compare batch.
    const std::string hostile = sessionWithStoredSetup("deep.sagline", R"({"nameplate": )" + nested(50000) + "}");
    const std::string fine = path("fine.sagline");
    ASSERT_EQ(runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", fine}).exitCode, 0);
    const auto fit = runProgram(cli, {"fit", hostile, "--json"});
    EXPECT_EQ(fit.exitCode, 0) << fit.err.substr(0, 300);
    EXPECT_TRUE(nlohmann::json::accept(fit.out)) << fit.out.substr(0, 300);
    EXPECT_GE(runProgram(cli, {"export", hostile, "--json", path("out.json")}).exitCode, 0);
    EXPECT_GE(runProgram(cli, {"report", hostile, "-o", path("out.pdf")}).exitCode, 0);
    const auto compared = runProgram(cli, {"compare", hostile, fine, "--json"});
    EXPECT_GE(compared.exitCode, 0) << compared.err.substr(0, 300);
    const auto batch = nlohmann::json::parse(compared.out);
    EXPECT_EQ(batch["sessions"].size(), 2u); // the other session is still compared
}

TEST_F(HostileInput, FoldersDevicesAndDuplicatesAreNamedPlainly)
{
    const auto folder = runProgram(cli, {"plan", path("")});
    EXPECT_EQ(folder.exitCode, 2);
    EXPECT_NE(folder.err.find("is a folder, not a file"), std::string::npos) << folder.err;
    EXPECT_EQ(folder.err.find("not valid JSON"), std::string::npos) << folder.err;
    // Reproducer: plan /dev/zero grew memory at 100 MB/s.
    const auto start = std::chrono::steady_clock::now();
    const auto zero = runProgram(cli, {"plan", "/dev/zero"});
    EXPECT_EQ(zero.exitCode, 2);
    EXPECT_NE(zero.err.find("not a regular file"), std::string::npos) << zero.err;
    EXPECT_LT(std::chrono::steady_clock::now() - start, std::chrono::seconds(30)); // it returns at once; a hang fails here
    std::string text = demoSetupText();
    text.insert(text.find("\"rated_power_va\""), "\"rated_power_va\": 6000, ");
    const auto duplicate = runProgram(cli, {"plan", write("dup.json", text)});
    EXPECT_EQ(duplicate.exitCode, 2);
    EXPECT_NE(duplicate.err.find("the key \"rated_power_va\" appears twice in \"nameplate\""), std::string::npos) << duplicate.err;
}

TEST_F(HostileInput, EscapesInASetupNeverReachTheTerminalRaw)
{
    std::string text = demoSetupText();
    const std::string from = "\"construction\": \"laminated\"";
    ASSERT_NE(text.find(from), std::string::npos);
    text.replace(text.find(from), from.size(), "\"construction\": \"\\u001b[2J\\u001b[31mwiped\"");
    const auto r = runProgram(cli, {"plan", write("ansi.json", text)});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_EQ(r.err.find('\x1b'), std::string::npos) << "a raw escape reached the terminal";
    EXPECT_NE(r.err.find("\\x1B[2J\\x1B[31mwiped"), std::string::npos) << r.err;
}

TEST_F(HostileInput, NamesThatAreNotUtf8KeepJsonOutputValid)
{
    // Reproducer: a non-UTF-8 operator name aborted compare --json and fit --json.
    const std::string session = path("latin1.sagline");
    const auto imported = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", session, "--operator",
                                           "Jos\xe9 \xff", "--serial", "N\xb0" "7"});
    ASSERT_EQ(imported.exitCode, 0) << imported.err;
    const auto compared = runProgram(cli, {"compare", session, "--json"});
    ASSERT_EQ(compared.exitCode, 0) << compared.err;
    const auto batch = nlohmann::json::parse(compared.out);
    EXPECT_EQ(batch["sessions"][0]["operator"], "Jos\xEF\xBF\xBD \xEF\xBF\xBD");
    const auto fit = runProgram(cli, {"fit", session, "--json"});
    ASSERT_EQ(fit.exitCode, 0) << fit.err;
    EXPECT_TRUE(nlohmann::json::accept(fit.out)) << fit.out.substr(0, 300);
    const auto table = runProgram(cli, {"compare", session});
    EXPECT_EQ(table.exitCode, 0);
    EXPECT_NE(table.out.find("Jos\xEF\xBF\xBD"), std::string::npos) << table.out;
}

TEST_F(HostileInput, ALineThatRisesGetsNoVerdictAnywhere)
{
    // Reproducer: rising readings fitted R = -500 mΩ and were judged PASS by fit, report and compare.
    std::string csv = "current_a,voltage_v\n";
    for (int k = 0; k <= 6; ++k)
        csv += std::to_string(0.5 * k) + "," + std::to_string(18.0 + 0.25 * k) + "\n";
    const std::string readings = write("rising.csv", csv);
    const auto fit = runProgram(cli, {"fit", readings, "--setup", demoSetup});
    EXPECT_EQ(fit.exitCode, 0) << fit.err;
    EXPECT_NE(fit.out.find("the voltage does not fall with the current"), std::string::npos) << fit.out;
    const auto fitJson = nlohmann::json::parse(runProgram(cli, {"fit", readings, "--setup", demoSetup, "--json"}).out);
    EXPECT_TRUE(!fitJson.contains("verdict") || fitJson["verdict"].is_null()) << fitJson.dump();
    const std::string session = path("rising.sagline");
    ASSERT_EQ(runProgram(cli, {"import", readings, "--setup", demoSetup, "-o", session}).exitCode, 0);
    const auto compared = nlohmann::json::parse(runProgram(cli, {"compare", session, "--json"}).out);
    EXPECT_NE(compared["sessions"][0].dump().find("does not fall"), std::string::npos) << compared.dump(2);
    EXPECT_EQ(compared["batch"]["verdicts"]["pass"], 0) << compared["batch"].dump();
    const auto report = runProgram(cli, {"report", session, "-o", path("rising.pdf")});
    EXPECT_EQ(report.exitCode, 0) << report.err;
    EXPECT_EQ(report.out.find("Verdict on regulation: pass"), std::string::npos) << report.out;
}

TEST_F(HostileInput, AHugeNoteIsCappedInTheReport)
{
    // Reproducer: a 15 MB note made report take 46 s and 1 GB.
    const std::string session = path("noted.sagline");
    ASSERT_EQ(runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", session}).exitCode, 0);
    {
        auto store = sagline::SessionStore::openForWriting(session);
        ASSERT_TRUE(store.ok()) << store.message;
        ASSERT_TRUE(store.value->addNote("someone", std::string(15 * 1024 * 1024, 'n')).ok());
    }
    const auto report = runProgram(cli, {"report", session, "-o", path("noted.pdf")});
    ASSERT_EQ(report.exitCode, 0) << report.err;
    EXPECT_LT(std::filesystem::file_size(path("noted.pdf")), 2u * 1024 * 1024);
}
