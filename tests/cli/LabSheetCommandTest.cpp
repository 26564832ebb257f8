// sagline-cli labsheet check / new: the example sheets pass, every bad field is named with exit
// 2, a new sheet from a setup lists the plan's steps and passes check, the PIN is stored hashed.
#include "../core/SessionTestSupport.h"
#include "RunProgram.h"

#include "LabSheet.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>

using sagline::testing::readWholeFile;
using sagline::testing::runProgram;
using namespace sagline::test;

namespace {

const std::string cli = SAGLINE_CLI_PATH;
const std::string resources = std::string(SAGLINE_SOURCE_DIR) + "/resources/";
const std::string demoSetup = resources + "demo-setup.json";

void writeText(const std::string &path, const std::string &text)
{
    std::ofstream out(path, std::ios::binary);
    out << text;
}

} // namespace

TEST(LabSheetCommand, TheExampleSheetsPassTheCheck)
{
    for (const char *name : {"lab-sheet-40va-toroid.json", "lab-sheet-12va-laminated.json"}) {
        const auto r = runProgram(cli, {"labsheet", "check", resources + name});
        EXPECT_EQ(r.exitCode, 0) << name << ": " << r.err;
        EXPECT_NE(r.out.find("a valid lab sheet"), std::string::npos) << r.out;
        EXPECT_NE(r.out.find("required fuse:"), std::string::npos) << r.out;
    }
    const auto pin = runProgram(cli, {"labsheet", "check", resources + "lab-sheet-12va-laminated.json"});
    EXPECT_NE(pin.out.find("and PIN (stored hashed)"), std::string::npos) << pin.out;
    // The example's PIN is the one the README and the manual page give.
    const auto sheet = sagline::loadLabSheetFile(resources + "lab-sheet-12va-laminated.json");
    ASSERT_TRUE(sheet.sheet && sheet.sheet->locks.supervisorPin);
    EXPECT_TRUE(sagline::supervisorPinMatches(*sheet.sheet->locks.supervisorPin, "2468"));
    EXPECT_FALSE(sagline::supervisorPinMatches(*sheet.sheet->locks.supervisorPin, "2469"));
}

TEST(LabSheetCommand, EveryBadFieldIsNamedWithExitTwo)
{
    TempFolder folder;
    auto sheet = nlohmann::json::parse(readWholeFile(resources + "lab-sheet-40va-toroid.json"));
    sheet["locks"]["max_load_fraction"] = 2.5;
    sheet["locks"]["required_fuse"]["type"] = "slow";
    sheet["locks"]["plan_fixd"] = true;
    sheet["setup"]["nameplate"]["rated_power_va"] = -40;
    sheet.erase("title");
    const std::string path = folder.file("bad.json");
    writeText(path, sheet.dump(2));
    const auto r = runProgram(cli, {"labsheet", "check", path});
    EXPECT_EQ(r.exitCode, 2) << r.out;
    for (const char *field : {"locks.max_load_fraction", "locks.required_fuse.type", "locks.plan_fixd",
                              "setup.nameplate.rated_power_va", "title"})
        EXPECT_NE(r.err.find(std::string(path) + ": " + field), std::string::npos) << field << "\n" << r.err;
    EXPECT_TRUE(r.out.empty()) << r.out;

    // Not a lab sheet at all, and a file that is not there.
    writeText(path, demoSetup.empty() ? "" : readWholeFile(demoSetup));
    const auto setup = runProgram(cli, {"labsheet", "check", path});
    EXPECT_EQ(setup.exitCode, 2);
    EXPECT_NE(setup.err.find("format"), std::string::npos) << setup.err;
    const auto missing = runProgram(cli, {"labsheet", "check", folder.file("none.json")});
    EXPECT_EQ(missing.exitCode, 2);
    EXPECT_NE(missing.err.find("none.json"), std::string::npos) << missing.err;
    // A limit the plan goes beyond: the setup's top step above the sheet's limit.
    auto beyond = nlohmann::json::parse(readWholeFile(resources + "lab-sheet-40va-toroid.json"));
    beyond["locks"]["max_load_fraction"] = 0.5;
    writeText(path, beyond.dump());
    const auto over = runProgram(cli, {"labsheet", "check", path});
    EXPECT_EQ(over.exitCode, 2);
    EXPECT_NE(over.err.find("setup.bench.top_fraction"), std::string::npos) << over.err;
}

TEST(LabSheetCommand, UsageErrorsNameTheRule)
{
    EXPECT_EQ(runProgram(cli, {"labsheet"}).exitCode, 2);
    const auto unknown = runProgram(cli, {"labsheet", "print", "x.json"});
    EXPECT_EQ(unknown.exitCode, 2);
    EXPECT_NE(unknown.err.find("check or new"), std::string::npos) << unknown.err;
    const auto noSheet = runProgram(cli, {"labsheet", "check"});
    EXPECT_EQ(noSheet.exitCode, 2);
    const auto wrongOption = runProgram(cli, {"labsheet", "check", "x.json", "--setup", "s.json"});
    EXPECT_EQ(wrongOption.exitCode, 2);
    EXPECT_NE(wrongOption.err.find("belongs to labsheet new"), std::string::npos) << wrongOption.err;
    const auto noOutput = runProgram(cli, {"labsheet", "new", "--setup", demoSetup});
    EXPECT_EQ(noOutput.exitCode, 2);
    EXPECT_NE(noOutput.err.find("-o"), std::string::npos) << noOutput.err;
}

TEST(LabSheetCommand, NewWritesASheetWithThePlansStepsThatPassesTheCheck)
{
    TempFolder folder;
    const std::string sheetPath = folder.file("lab.json");
    const auto r = runProgram(cli, {"labsheet", "new", "--setup", demoSetup, "-o", sheetPath, "--title", "Lab 1: demo unit"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("9 plan steps"), std::string::npos) << r.out; // demo setup: 8 steps plus the open circuit
    const auto sheet = nlohmann::json::parse(readWholeFile(sheetPath));
    EXPECT_EQ(sheet.at("format"), "sagline-lab-sheet");
    EXPECT_EQ(sheet.at("title"), "Lab 1: demo unit");
    EXPECT_EQ(sheet.at("locks").at("plan_fixed"), true);
    EXPECT_EQ(sheet.at("locks").at("typed_in_only"), true);
    EXPECT_DOUBLE_EQ(sheet.at("locks").at("max_load_fraction").get<double>(), 1.0);
    EXPECT_DOUBLE_EQ(sheet.at("locks").at("required_fuse").at("rating_a").get<double>(), 0.5); // the demo bench's fuse
    EXPECT_FALSE(sheet.at("locks").contains("supervisor_pin"));
    const std::string instructions = sheet.at("instructions");
    EXPECT_NE(instructions.find("mains voltage"), std::string::npos);
    // Every plan step by its number, the open circuit first: rated current 60 VA / 18 V = 3.333 A.
    EXPECT_NE(instructions.find("step 0: no load"), std::string::npos) << instructions;
    EXPECT_NE(instructions.find("step 8: 3.333 A"), std::string::npos) << instructions;
    const auto check = runProgram(cli, {"labsheet", "check", sheetPath});
    EXPECT_EQ(check.exitCode, 0) << check.err;
    EXPECT_NE(check.out.find("steps: 9"), std::string::npos) << check.out;

    // An existing file is kept unless --force.
    const auto again = runProgram(cli, {"labsheet", "new", "--setup", demoSetup, "-o", sheetPath});
    EXPECT_EQ(again.exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"labsheet", "new", "--setup", demoSetup, "-o", sheetPath, "--force"}).exitCode, 0);
}

TEST(LabSheetCommand, NewStoresOnlyTheHashOfTheSupervisorsPin)
{
    TempFolder folder;
    const std::string sheetPath = folder.file("pin.json");
    const auto r = runProgram(cli, {"labsheet", "new", "--setup", demoSetup, "-o", sheetPath, "--supervisor-pin"}, "97531\n");
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const std::string text = readWholeFile(sheetPath);
    EXPECT_EQ(text.find("97531"), std::string::npos) << "the PIN itself is never written";
    const auto parsed = sagline::loadLabSheetFile(sheetPath);
    ASSERT_TRUE(parsed.sheet && parsed.sheet->locks.supervisorPin);
    EXPECT_TRUE(sagline::supervisorPinMatches(*parsed.sheet->locks.supervisorPin, "97531"));
    EXPECT_FALSE(sagline::supervisorPinMatches(*parsed.sheet->locks.supervisorPin, "97532"));
    // Two sheets with the same PIN differ (a fresh salt each time).
    const std::string second = folder.file("pin2.json");
    ASSERT_EQ(runProgram(cli, {"labsheet", "new", "--setup", demoSetup, "-o", second, "--supervisor-pin"}, "97531\n").exitCode, 0);
    const auto other = sagline::loadLabSheetFile(second);
    ASSERT_TRUE(other.sheet && other.sheet->locks.supervisorPin);
    EXPECT_NE(other.sheet->locks.supervisorPin->saltHex, parsed.sheet->locks.supervisorPin->saltHex);
    // A PIN that breaks the rule is refused, nothing written.
    const auto bad = runProgram(cli, {"labsheet", "new", "--setup", demoSetup, "-o", folder.file("bad.json"), "--supervisor-pin"}, "12a4\n");
    EXPECT_EQ(bad.exitCode, 2);
    EXPECT_NE(bad.err.find("digits"), std::string::npos) << bad.err;
    EXPECT_FALSE(std::filesystem::exists(folder.file("bad.json")));
}
