// sagline-cli compare: table and summary, JSON, CSV, bad files listed with their reasons, exit codes.
#include "../core/ReviewTestSupport.h"
#include "RunProgram.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

using sagline::testing::readWholeFile;
using sagline::testing::runProgram;
using namespace sagline::test;

namespace {

const std::string cli = SAGLINE_CLI_PATH;

void makeBatch(const TempFolder &folder)
{
    std::filesystem::create_directories(folder.file("batch/sub"));
    const double resistances[] = {1.150, 1.152, 1.148, 1.151, 1.149, 1.30};
    for (int i = 0; i < 6; ++i) {
        DemoUnit unit;
        unit.serial = "DEMO-000" + std::to_string(i + 1);
        unit.resistanceOhm = resistances[i];
        unit.scatterV = 0.0005;
        makeDemoSession(folder.file(std::string(i % 2 ? "batch/sub/" : "batch/") + "u" + std::to_string(i) + ".sagline"), unit);
    }
}

} // namespace

TEST(CompareCommand, TableSummaryAndFarFromBatchFlag)
{
    TempFolder folder;
    makeBatch(folder);
    const auto r = runProgram(cli, {"compare", folder.file("batch")});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("R (Ω)"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("R at 75 °C (Ω)"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("DEMO-0006"), std::string::npos) << r.out;
    // Six units of one design: the far-from-batch mark is shown, labelled as screening only.
    EXPECT_NE(r.out.find("far (screening only)"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("Iglewicz and Hoaglin 1993"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("fewer than 10 units of one design"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("6 sessions, 0 unreadable"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("non-binary statement"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("not judged 6"), std::string::npos) << r.out;
}

TEST(CompareCommand, JsonAndCsvWithABadFile)
{
    TempFolder folder;
    makeBatch(folder);
    writeBytes(folder.file("batch/broken.sagline"), "SQLite format 3 but not really");
    const std::string csvPath = folder.file("out.csv");
    const auto r = runProgram(cli, {"compare", folder.file("batch"), "--json", "--csv", csvPath});
    EXPECT_EQ(r.exitCode, 2) << "a skipped file makes the run incomplete";
    EXPECT_NE(r.err.find("broken.sagline"), std::string::npos) << r.err;
    const auto json = nlohmann::json::parse(r.out);
    ASSERT_EQ(json.at("sessions").size(), 7u);
    int far = 0, unopened = 0;
    for (const auto &session : json.at("sessions")) {
        if (!session.at("opened").get<bool>()) {
            ++unopened;
            EXPECT_FALSE(session.at("problem").get<std::string>().empty());
            continue;
        }
        if (session.at("far_from_batch").get<bool>()) {
            ++far;
            EXPECT_EQ(session.at("unit_serial"), "DEMO-0006");
        }
        for (const char *key : {"unit_serial", "date_utc", "operator", "instruments", "points_used",
                                "series_resistance_ohm", "series_resistance_u_ohm", "series_resistance_ref_ohm",
                                "no_load_voltage_v", "no_load_voltage_u_v", "regulation_percent",
                                "regulation_u_percent", "verdict", "decision_rule", "safety_stops", "review_state"})
            EXPECT_TRUE(session.contains(key)) << key;
    }
    EXPECT_EQ(far, 1);
    EXPECT_EQ(unopened, 1);
    EXPECT_EQ(json.at("batch").at("resistance_count"), 6);
    const std::string csv = readWholeFile(csvPath);
    EXPECT_EQ(std::count(csv.begin(), csv.end(), '\n'), 8); // header + 7 rows
}

TEST(CompareCommand, UsageErrorsNameTheOption)
{
    auto r = runProgram(cli, {"compare"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("at least one"), std::string::npos);
    r = runProgram(cli, {"compare", "x", "--method", "lsq"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--method"), std::string::npos);
    r = runProgram(cli, {"compare", "x", "--reference-temperature", "hot"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("--reference-temperature"), std::string::npos);
    r = runProgram(cli, {"compare", "/nonexistent/folder"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("does not exist"), std::string::npos);
}
