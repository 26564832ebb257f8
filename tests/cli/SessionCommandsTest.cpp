// sagline-cli import and export: a CSV goes into a session and comes back out unchanged; bad
// input names the line and column; nothing is overwritten; exit codes follow DESIGN.md.
#include "CliTestSupport.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <filesystem>

using namespace sagline::testing;

namespace {

class SessionCommands : public ScratchFolderTest {
protected:
    SessionCommands() : ScratchFolderTest("sagline-cli-session-") {}
};

} // namespace

TEST_F(SessionCommands, ImportThenExportGivesTheSameReadings)
{
    const auto imported = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", path("s.sagline"),
                                           "--serial", "T60-0421", "--operator", "R. Okafor", "--ambient", "22.5 °C"});
    ASSERT_EQ(imported.exitCode, 0) << imported.err;
    EXPECT_NE(imported.out.find("Recorded 9 readings"), std::string::npos) << imported.out;

    const auto exported = runProgram(cli, {"export", path("s.sagline"), "--csv", path("out.csv"), "--json", path("out.json")});
    ASSERT_EQ(exported.exitCode, 0) << exported.err;
    // The exported CSV imports again (it is the DESIGN.md readings format) and fits the same.
    const auto again = runProgram(cli, {"import", path("out.csv"), "--setup", demoSetup, "-o", path("again.sagline")});
    ASSERT_EQ(again.exitCode, 0) << again.err;
    const auto json = nlohmann::json::parse(readWholeFile(path("out.json")));
    EXPECT_EQ(json["session"]["unit_serial"], "T60-0421");
    EXPECT_EQ(json["session"]["operator"], "R. Okafor");
    EXPECT_EQ(json["readings"]["total"], 9);
    EXPECT_EQ(json["temperatures"][0]["celsius"], 22.5);
    EXPECT_EQ(json["fit"]["n"], 9);
    for (const char *key : {"slope", "intercept", "series_resistance_ohm", "series_resistance_se_ohm", "no_load_voltage_v",
                            "no_load_voltage_se_v", "r_squared", "residual_sd_v", "series_resistance_ci95_ohm", "outliers",
                            "curvature_p"})
        EXPECT_TRUE(json["fit"].contains(key)) << key;
    EXPECT_EQ(json["setup"]["nameplate"]["rated_power_va"], 60);
    EXPECT_FALSE(json["plan"]["steps"].empty());

    // Values survive import and export bit for bit, in the shortest digits that do
    // (std::to_chars round trip): "0.417", not "0.41699999999999998".
    const std::string csv = readWholeFile(path("out.csv"));
    // The import columns first, then who did what (which import skips).
    EXPECT_EQ(csv.rfind("current_a,voltage_v,u_current_a,u_voltage_v,step,time_utc,flags,excluded,exclusion_reason,"
                        "excluded_by,superseded_reason,recorded_by,recorded_account\r\n",
                        0),
              0u)
        << csv;
    EXPECT_NE(csv.find("\r\n0.417,19.373,"), std::string::npos) << csv;
}

TEST_F(SessionCommands, ImportReadsBomCrlfBlankLinesAndSpaces)
{
    const std::string csv = write("messy.csv", "\xEF\xBB\xBF current_a , voltage_v \r\n 0 , 12.6 \r\n0.5,12.1\r\n1.0 ,11.7\r\n\r\n\r\n");
    const auto r = runProgram(cli, {"import", csv, "--setup", demoSetup, "-o", path("m.sagline")});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("Recorded 3 readings"), std::string::npos) << r.out;
}

TEST_F(SessionCommands, ImportNamesLineAndColumnAndLeavesNoFile)
{
    const std::string csv = write("bad.csv", "current_a,voltage_v\n0,12.6\n0.5,twelve\n");
    const auto r = runProgram(cli, {"import", csv, "--setup", demoSetup, "-o", path("bad.sagline")});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("line 3"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("voltage_v"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(path("bad.sagline")));
}

TEST_F(SessionCommands, ImportKeepsExclusionsWithAReason)
{
    const std::string csv = write("ex.csv", "current_a,voltage_v,excluded\n0,12.6,no\n0.5,12.1,yes\n1.0,11.7,\n");
    ASSERT_EQ(runProgram(cli, {"import", csv, "--setup", demoSetup, "-o", path("ex.sagline")}).exitCode, 0);
    const auto r = runProgram(cli, {"export", path("ex.sagline"), "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto json = nlohmann::json::parse(r.out);
    EXPECT_EQ(json["readings"]["excluded"], 1);
    EXPECT_EQ(json["fit"]["n"], 2);
    ASSERT_EQ(json["exclusions"].size(), 1u);
    EXPECT_NE(json["exclusions"][0]["reason"].get<std::string>().find("ex.csv line 3"), std::string::npos);
}

TEST_F(SessionCommands, ImportNeverOverwrites)
{
    const std::string existing = write("taken.sagline", "precious");
    const auto r = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", existing});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("already exists"), std::string::npos) << r.err;
    EXPECT_EQ(readWholeFile(existing), "precious");
}

TEST_F(SessionCommands, ImportNamesTheSetupField)
{
    const std::string setup = write("setup.json", R"({"nameplate":{"rated_power_va":-5}})");
    const auto r = runProgram(cli, {"import", demoReadings, "--setup", setup, "-o", path("x.sagline")});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("nameplate.rated_power_va"), std::string::npos) << r.err;
}

TEST_F(SessionCommands, ExportRefusesFilesThatAreNotSessions)
{
    const auto r = runProgram(cli, {"export", demoReadings, "--csv", path("o.csv")});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("not a Sagline session"), std::string::npos) << r.err;
    EXPECT_FALSE(std::filesystem::exists(path("o.csv")));
    const auto usage = runProgram(cli, {"export", demoReadings});
    EXPECT_EQ(usage.exitCode, 2);
    EXPECT_NE(usage.err.find("usage"), std::string::npos);
}

TEST_F(SessionCommands, FitOnASessionNamesAFlaggedReadingByItsNumberFromOne)
{
    // Invented readings on V = 19.6 V - 0.48 Ohm * I with a ±2 mV pattern; the fifth reads 0.3 V
    // low. The window, the report and `exclude --reading N` count readings from 1: so does fit.
    std::string csv = "current_a,voltage_v\n";
    const double pattern[] = {0.002, -0.001, 0.0, -0.002, 0.001, 0.002, -0.001, 0.0, -0.002};
    for (int i = 0; i < 9; ++i) {
        const double current = 0.4 * i;
        const double voltage = 19.6 - 0.48 * current + pattern[i] - (i == 4 ? 0.3 : 0.0);
        csv += std::to_string(current) + "," + std::to_string(voltage) + "\n";
    }
    const std::string data = write("flag.csv", csv);
    ASSERT_EQ(runProgram(cli, {"import", data, "--setup", demoSetup, "-o", path("flag.sagline")}).exitCode, 0);
    const auto r = runProgram(cli, {"fit", path("flag.sagline")});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("flagged: reading 5"), std::string::npos) << r.out;
    EXPECT_EQ(r.out.find("row 4"), std::string::npos) << r.out;
    // The CSV itself names the file's line (the header is line 1).
    const auto direct = runProgram(cli, {"fit", data});
    EXPECT_NE(direct.out.find("line 6"), std::string::npos) << direct.out;
}

TEST_F(SessionCommands, AReadingNoSweepCouldTakeIsRefusedByImportAndFit)
{
    // 417 typed for 0.417 A (invented readings against the demo nameplate): import writes no
    // session and fit with the nameplate gives no verdict; both name the line.
    const std::string data = write("typo.csv", "current_a,voltage_v\n0,19.6\n0.5,19.3\n417,18.9\n1.5,18.8\n");
    const auto imported = runProgram(cli, {"import", data, "--setup", demoSetup, "-o", path("typo.sagline")});
    EXPECT_EQ(imported.exitCode, 2);
    EXPECT_NE(imported.err.find("line 4, column current_a"), std::string::npos) << imported.err;
    EXPECT_FALSE(std::filesystem::exists(path("typo.sagline")));
    const auto fitted = runProgram(cli, {"fit", data, "--setup", demoSetup});
    EXPECT_EQ(fitted.exitCode, 2);
    EXPECT_NE(fitted.err.find("line 4, column current_a"), std::string::npos) << fitted.err;
    EXPECT_EQ(fitted.out.find("Verdict"), std::string::npos) << fitted.out;
    // Marked excluded, the row comes in and stays out of the fit.
    const std::string marked = write("marked.csv", "current_a,voltage_v,excluded\n0,19.6,\n0.5,19.3,\n417,18.9,yes\n1.5,18.8,\n");
    EXPECT_EQ(runProgram(cli, {"import", marked, "--setup", demoSetup, "-o", path("marked.sagline")}).exitCode, 0);
}
