// Lab sheets: parsing with field-named errors, round trip, and the pure limit checks that a
// supervised session applies. The demo sheet is invented (50 VA, 230 V to 24 V unit).
#include "LabSheet.h"
#include "LabSheetFolder.h"
#include "Planner.h"

#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>

#include <unistd.h>

using namespace sagline;

namespace {

nlohmann::json demoSheet()
{
    return nlohmann::json::parse(R"({
      "format": "sagline-lab-sheet", "version": 1, "title": "Lab 3: load test of a 50 VA toroid",
      "setup": {"nameplate": {"rated_power_va": 50, "primary_voltage_v": 230, "secondary_voltage_v": 24,
                              "secondary_no_load_voltage_v": 26.4, "construction": "toroidal"},
                "bench": {"steps": 8, "top_fraction": 0.8}},
      "locks": {"plan_fixed": true, "max_load_fraction": "80 %", "required_fuse": {"rating_a": "500 mA", "type": "time-lag"},
                "typed_in_only": true},
      "instructions": "Step the rheostat down one position at a time."})");
}

bool hasError(const LabSheetParse &parse, const std::string &field, const std::string &word)
{
    for (const auto &error : parse.errors)
        if (error.field == field && error.rule.find(word) != std::string::npos)
            return true;
    return false;
}

std::string allErrors(const LabSheetParse &parse)
{
    std::string text;
    for (const auto &error : parse.errors)
        text += error.message() + "\n";
    return text;
}

} // namespace

TEST(LabSheet, ParsesAndRoundTrips)
{
    const LabSheetParse parse = parseLabSheetJson(demoSheet().dump());
    ASSERT_TRUE(parse.sheet) << allErrors(parse);
    const LabSheet &sheet = *parse.sheet;
    EXPECT_EQ(sheet.title, "Lab 3: load test of a 50 VA toroid");
    EXPECT_DOUBLE_EQ(sheet.locks.maxLoadFraction, 0.8);
    EXPECT_DOUBLE_EQ(sheet.locks.requiredFuse.ratingA, 0.5);
    ASSERT_TRUE(sheet.setup.bench.fuse); // taken from the required fuse
    EXPECT_DOUBLE_EQ(sheet.setup.bench.fuse->ratingA, 0.5);

    const LabSheetParse again = parseLabSheetJson(labSheetToJson(sheet));
    ASSERT_TRUE(again.sheet) << allErrors(again);
    EXPECT_EQ(labSheetToJson(*again.sheet), labSheetToJson(sheet));
    EXPECT_EQ(labSheetFingerprint(*again.sheet), labSheetFingerprint(sheet));
    EXPECT_EQ(labSheetFingerprint(sheet).size(), 16u);
    LabSheet changed = sheet;
    changed.locks.maxLoadFraction = 0.7;
    EXPECT_NE(labSheetFingerprint(changed), labSheetFingerprint(sheet));
}

TEST(LabSheet, ErrorsNameTheField)
{
    nlohmann::json doc = demoSheet();
    doc["locks"]["max_load_fraction"] = 2.0;
    doc["locks"]["required_fuse"]["type"] = "slow";
    doc["locks"].erase("typed_in_only");
    doc["locks"]["colour"] = "red";
    doc["title"] = "  ";
    doc["setup"]["nameplate"]["rated_power_va"] = -5;
    doc["extra"] = 1;
    const LabSheetParse parse = parseLabSheetJson(doc.dump());
    EXPECT_FALSE(parse.sheet);
    EXPECT_TRUE(hasError(parse, "locks.max_load_fraction", "at most 1.5")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "locks.required_fuse.type", "time-lag")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "locks.typed_in_only", "required")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "locks.colour", "not a lock")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "title", "empty")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "setup.nameplate.rated_power_va", "")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "extra", "not a lab-sheet field")) << allErrors(parse);
}

TEST(LabSheet, PlanMayNotGoBeyondTheSheetAndFuseMustMatch)
{
    nlohmann::json doc = demoSheet();
    doc["setup"]["bench"]["top_fraction"] = 1.0;
    doc["setup"]["bench"]["fuse"] = {{"rating_a", 1.0}, {"type", "time-lag"}};
    const LabSheetParse parse = parseLabSheetJson(doc.dump());
    EXPECT_FALSE(parse.sheet);
    EXPECT_TRUE(hasError(parse, "setup.bench.top_fraction", "max_load_fraction")) << allErrors(parse);
    EXPECT_TRUE(hasError(parse, "setup.bench.fuse", "required fuse")) << allErrors(parse);
}

TEST(LabSheet, RefusesOtherFilesAndNewerVersions)
{
    EXPECT_TRUE(hasError(parseLabSheetJson("{\"nameplate\": {}}"), "format", "not a lab sheet"));
    EXPECT_TRUE(hasError(parseLabSheetJson("[1, 2"), "lab sheet", "not valid JSON"));
    nlohmann::json doc = demoSheet();
    doc["version"] = 2;
    EXPECT_TRUE(hasError(parseLabSheetJson(doc.dump()), "version", "newer"));
    EXPECT_TRUE(hasError(loadLabSheetFile("/nonexistent/sheet.json"), "/nonexistent/sheet.json", "no such file"));
}

TEST(LabSheet, LimitChecks)
{
    const LabSheet sheet = *parseLabSheetJson(demoSheet().dump()).sheet;
    // Rated secondary current 50 VA / 24 V = 2.08333 A; 80 % of it = 1.66667 A; with the 5 %
    // allowance for a hand-set load, readings are refused above 1.75 A.
    EXPECT_NEAR(labSheetMaxCurrentA(sheet), 1.666667, 1e-6);
    EXPECT_TRUE(checkReadingAgainstSheet(sheet, 1.70).allowed);
    EXPECT_TRUE(checkReadingAgainstSheet(sheet, 1.749).allowed);
    const LimitCheck over = checkReadingAgainstSheet(sheet, 1.76);
    EXPECT_FALSE(over.allowed);
    EXPECT_EQ(over.rule, "lab-sheet-max-load");
    EXPECT_NE(over.message.find("1.760 A"), std::string::npos) << over.message;
    EXPECT_FALSE(checkReadingAgainstSheet(sheet, std::nan("")).allowed);

    // Every step of the sheet's own plan is within the limit; a step of the full-load plan is not.
    const Plan plan = *makePlan(sheet.setup).plan;
    for (const PlanStep &step : plan.steps)
        EXPECT_TRUE(checkStepAgainstSheet(sheet, step).allowed) << step.index;
    PlanStep beyond = plan.steps.back();
    beyond.currentA = 50.0 / 24.0;
    EXPECT_FALSE(checkStepAgainstSheet(sheet, beyond).allowed);

    EXPECT_TRUE(checkFuseAgainstSheet(sheet, {0.5, FuseType::TimeLag}).allowed);
    EXPECT_FALSE(checkFuseAgainstSheet(sheet, {0.5, FuseType::QuickActing}).allowed);
    EXPECT_FALSE(checkFuseAgainstSheet(sheet, {1.0, FuseType::TimeLag}).allowed);
}

TEST(LabSheet, TheRequiredFuseHasTheSetupsRange)
{
    // Found by the setup-reader fuzzer: a sheet requiring a 2 mA fuse was accepted, but the
    // fuse it hands to its setup is refused there (bench.fuse: at least 10 mA), so the sheet's
    // own canonical form did not read back. One range for both.
    nlohmann::json sheet = demoSheet();
    sheet["locks"]["required_fuse"]["rating_a"] = "002 mA";
    const LabSheetParse tiny = parseLabSheetJson(sheet.dump());
    EXPECT_FALSE(tiny.sheet);
    EXPECT_TRUE(hasError(tiny, "locks.required_fuse.rating_a", "at least 10.00 mA")) << allErrors(tiny);

    sheet["locks"]["required_fuse"]["rating_a"] = "10 mA"; // the floor itself is a fuse rating
    const LabSheetParse floor = parseLabSheetJson(sheet.dump());
    for (const FieldError &error : floor.errors)
        EXPECT_NE(error.field, "locks.required_fuse.rating_a") << error.message();
}

TEST(LabSheet, SupervisorPinIsReadCheckedAndRoundTrips)
{
    nlohmann::json document = demoSheet();
    const SupervisorPinLock lock = makeSupervisorPinLock("2468", std::vector<std::uint8_t>(16, 7), 2000);
    document["locks"]["supervisor_pin"] = {{"scheme", lock.scheme}, {"iterations", lock.iterations},
                                           {"salt", lock.saltHex}, {"hash", lock.hashHex}};
    const LabSheetParse parse = parseLabSheetJson(document.dump());
    ASSERT_TRUE(parse.sheet) << allErrors(parse);
    ASSERT_TRUE(parse.sheet->locks.supervisorPin);
    EXPECT_TRUE(supervisorPinMatches(*parse.sheet->locks.supervisorPin, "2468"));
    const LabSheetParse again = parseLabSheetJson(labSheetToJson(*parse.sheet));
    ASSERT_TRUE(again.sheet && again.sheet->locks.supervisorPin) << allErrors(again);
    EXPECT_EQ(again.sheet->locks.supervisorPin->hashHex, lock.hashHex);

    // A PIN written into the sheet in the clear, and other mistakes, are named.
    document["locks"]["supervisor_pin"] = "2468";
    EXPECT_TRUE(hasError(parseLabSheetJson(document.dump()), "locks.supervisor_pin", "never the PIN itself"));
    document["locks"]["supervisor_pin"] = {{"scheme", "md5"}, {"iterations", 10}, {"salt", "xyz"}, {"hash", "00"},
                                           {"pin", "2468"}};
    const LabSheetParse bad = parseLabSheetJson(document.dump());
    EXPECT_TRUE(hasError(bad, "locks.supervisor_pin.scheme", "pbkdf2")) << allErrors(bad);
    EXPECT_TRUE(hasError(bad, "locks.supervisor_pin.iterations", "1000")) << allErrors(bad);
    EXPECT_TRUE(hasError(bad, "locks.supervisor_pin.salt", "hexadecimal")) << allErrors(bad);
    EXPECT_TRUE(hasError(bad, "locks.supervisor_pin.hash", "hexadecimal")) << allErrors(bad);
    EXPECT_TRUE(hasError(bad, "locks.supervisor_pin.pin", "not a PIN field")) << allErrors(bad);
}

TEST(LabSheet, FolderListsUsableSheetsAndSaysWhyTheOthersAreNot)
{
    const auto folder = std::filesystem::temp_directory_path() / ("sagline-sheets-" + std::to_string(::getpid()));
    std::filesystem::create_directories(folder / "sub");
    const auto write = [](const std::filesystem::path &path, const std::string &text) {
        std::ofstream(path, std::ios::binary) << text;
    };
    write(folder / "b-lab.json", demoSheet().dump());
    nlohmann::json broken = demoSheet();
    broken["locks"]["max_load_fraction"] = 7;
    write(folder / "a-broken.json", broken.dump());
    write(folder / "notes.txt", "not json");
    write(folder / "sub" / "c-lab.json", demoSheet().dump()); // subfolders are not searched
    const auto sheets = findLabSheets(folder.string());
    ASSERT_EQ(sheets.size(), 2u);
    EXPECT_NE(sheets[0].path.find("a-broken.json"), std::string::npos);
    EXPECT_FALSE(sheets[0].sheet.has_value());
    EXPECT_NE(sheets[0].problem.find("locks.max_load_fraction"), std::string::npos) << sheets[0].problem;
    ASSERT_TRUE(sheets[1].sheet.has_value());
    EXPECT_EQ(sheets[1].sheet->title, "Lab 3: load test of a 50 VA toroid");
    std::string error;
    EXPECT_TRUE(findLabSheets((folder / "missing").string(), &error).empty());
    EXPECT_FALSE(error.empty());
    std::filesystem::remove_all(folder);
}
