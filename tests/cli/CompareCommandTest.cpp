// sagline-cli compare: table and summary, JSON, CSV, bad files listed with their reasons, exit codes.
#include "../core/ReviewTestSupport.h"
#include "RunProgram.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <set>

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
    EXPECT_NE(r.out.find("fewer than 10 units of the design"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("6 sessions, 1 design, 0 unreadable"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("non-binary statement"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("NOT JUDGED 6"), std::string::npos) << r.out;
    // Rows carry the file name and the start time, so two sessions of one unit can be told apart.
    EXPECT_NE(r.out.find("started (UTC)"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("u5.sagline"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("Design: 50 VA 230/24 V 50 Hz toroidal copper (6 sessions)"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("Control chart: centre"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("reviewer's decision"), std::string::npos) << r.out;
}

TEST(CompareCommand, GroupsAFolderOfThreeDesigns)
{
    // 20, 60 and 100 VA units of one family (scenario of our own), plus two named by the setup's
    // design name although their nameplates match the 60 VA units.
    TempFolder folder;
    std::filesystem::create_directories(folder.file("lab"));
    struct Spec {
        double va;
        double r;
        const char *design;
    };
    const Spec specs[] = {{20, 6.10, ""}, {60, 0.631, ""}, {100, 0.301, ""}, {20, 6.05, ""}, {60, 0.628, ""},
                          {100, 0.299, ""}, {20, 6.12, ""}, {60, 0.634, ""}, {100, 0.303, ""},
                          {60, 0.70, "PT-60 rev B"}, {60, 0.71, "PT-60 rev B"}};
    int i = 0;
    for (const Spec &spec : specs) {
        DemoUnit unit;
        unit.serial = "LAB-" + std::to_string(++i);
        unit.resistanceOhm = spec.r;
        unit.ratedPowerVa = spec.va;
        unit.design = spec.design;
        unit.scatterV = 0.0005;
        makeDemoSession(folder.file("lab/unit" + std::to_string(i) + ".sagline"), unit);
    }
    // The same unit tested twice: the rows differ by file and start time.
    DemoUnit again;
    again.serial = "LAB-1";
    again.resistanceOhm = 6.08;
    again.ratedPowerVa = 20;
    makeDemoSession(folder.file("lab/unit1-retest.sagline"), again);

    const std::string csvPath = folder.file("lab.csv");
    const auto r = runProgram(cli, {"compare", folder.file("lab"), "--json", "--csv", csvPath});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto json = nlohmann::json::parse(r.out);
    const auto &designs = json.at("batch").at("designs");
    ASSERT_EQ(designs.size(), 4u) << designs.dump(2);
    EXPECT_TRUE(json.at("batch").at("mean_ohm").is_null()) << "no mean across designs";
    std::set<std::string> names;
    for (const auto &design : designs) {
        names.insert(design.at("design").get<std::string>());
        const auto &chart = design.at("control_chart");
        for (const char *key : {"centre_ohm", "average_moving_range_ohm", "sigma_ohm", "upper_limit_ohm",
                                "lower_limit_ohm", "points_in_time_order", "preliminary", "note"})
            EXPECT_TRUE(chart.contains(key)) << key;
    }
    EXPECT_EQ(names, (std::set<std::string>{"20 VA 230/24 V 50 Hz toroidal copper", "60 VA 230/24 V 50 Hz toroidal copper",
                                            "100 VA 230/24 V 50 Hz toroidal copper", "PT-60 rev B"}));
    std::set<std::string> files;
    for (const auto &session : json.at("sessions")) {
        EXPECT_FALSE(session.at("far_from_batch").get<bool>()) << session.at("file") << " flagged across designs";
        EXPECT_FALSE(session.at("design").get<std::string>().empty());
        EXPECT_FALSE(session.at("started_utc").get<std::string>().empty());
        files.insert(session.at("file").get<std::string>());
    }
    EXPECT_EQ(files.size(), 12u);
    // The 20 VA design's chart: 4 sessions (one unit twice), limits from the hand formula.
    for (const auto &design : designs) {
        if (design.at("design") != "20 VA 230/24 V 50 Hz toroidal copper")
            continue;
        EXPECT_EQ(design.at("control_chart").at("n"), 4);
        const double centre = design.at("control_chart").at("centre_ohm").get<double>();
        const double mr = design.at("control_chart").at("average_moving_range_ohm").get<double>();
        EXPECT_NEAR(design.at("control_chart").at("upper_limit_ohm").get<double>(), centre + 3.0 * mr / 1.128, 1e-9);
    }
    const std::string csv = readWholeFile(csvPath);
    EXPECT_EQ(csv.rfind("file,design,unit_serial,started_utc,", 0), 0u) << csv.substr(0, 200);
    EXPECT_NE(csv.find("PT-60 rev B"), std::string::npos);
    EXPECT_NE(csv.find("review_decision"), std::string::npos);

    const auto table = runProgram(cli, {"compare", folder.file("lab")});
    ASSERT_EQ(table.exitCode, 0) << table.err;
    EXPECT_NE(table.out.find("Design: PT-60 rev B (2 sessions)"), std::string::npos) << table.out;
    EXPECT_NE(table.out.find("4 designs"), std::string::npos) << table.out;
    EXPECT_NE(table.out.find("never across designs"), std::string::npos) << table.out;
    EXPECT_NE(table.out.find("unit1-retest.sagline"), std::string::npos) << table.out;
    EXPECT_EQ(table.out.find(" FAR"), std::string::npos) << table.out;
    EXPECT_EQ(table.out.find("far (screening only)"), std::string::npos) << table.out;
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
        for (const char *key : {"design", "unit_serial", "started_utc", "operator", "instruments", "points_used",
                                "series_resistance_ohm", "series_resistance_u_ohm", "series_resistance_ref_ohm",
                                "no_load_voltage_v", "no_load_voltage_u_v", "regulation_percent",
                                "regulation_u_percent", "verdict", "decision_rule", "safety_stops", "review_decision"})
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
