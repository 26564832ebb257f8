// sagline-cli plan: exit codes, messages and the JSON keys DESIGN.md promises.
#include "RunProgram.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>

using sagline::testing::runProgram;

namespace {

const std::string cli = SAGLINE_CLI_PATH;
const std::string demoSetup = std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json";

std::string writeTemp(const std::string &name, const std::string &text)
{
    const auto path = std::filesystem::temp_directory_path() / name;
    std::ofstream(path) << text;
    return path.string();
}

} // namespace

TEST(PlanCommand, JsonHasEveryDesignKey)
{
    const auto r = runProgram(cli, {"plan", demoSetup, "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto plan = nlohmann::json::parse(r.out);
    for (const char *key : {"rated_secondary_current_a", "rated_primary_current_a", "turns_ratio", "series_resistance_ohm",
                            "regulation_percent", "recommended_fuse", "max_primary_protection_a", "defaults_used",
                            "warnings", "steps"})
        EXPECT_TRUE(plan.contains(key)) << key;
    for (const char *key : {"rating_a", "type", "factor"})
        EXPECT_TRUE(plan["recommended_fuse"].contains(key)) << key;
    ASSERT_FALSE(plan["steps"].empty());
    for (const auto &step : plan["steps"]) {
        for (const char *key : {"index", "current_a", "predicted_voltage_v", "load_resistance_ohm", "load_power_w",
                                "output_va", "copper_loss_w", "primary_current_a", "va_margin", "rheostat_ok",
                                "fuse_outlook"})
            EXPECT_TRUE(step.contains(key)) << key;
        const std::string outlook = step["fuse_outlook"];
        EXPECT_TRUE(outlook == "holds" || outlook == "may-open" || outlook == "opens") << outlook;
    }
    EXPECT_TRUE(plan["steps"][0]["load_resistance_ohm"].is_null());
    EXPECT_TRUE(plan["steps"][1]["load_resistance_ohm"].is_number());
}

TEST(PlanCommand, TableHasUnitsAndCautions)
{
    const auto r = runProgram(cli, {"plan", demoSetup});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("Recommended fuse"), std::string::npos);
    EXPECT_NE(r.out.find("NEC 450.3(B)"), std::string::npos);
    EXPECT_NE(r.out.find("mains voltage"), std::string::npos);
    EXPECT_NE(r.out.find(" VA"), std::string::npos);
}

TEST(PlanCommand, InvalidFieldExitsTwoAndNamesTheField)
{
    const std::string path = writeTemp("sagline-bad-setup.json", R"({"nameplate": {"rated_power_va": -50,
        "primary_voltage_v": 230, "secondary_voltage_v": "12 A", "secondary_no_load_voltage_v": 13}})");
    const auto r = runProgram(cli, {"plan", path});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("nameplate.rated_power_va"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("nameplate.secondary_voltage_v"), std::string::npos) << r.err;
    EXPECT_TRUE(r.out.empty());
}

TEST(PlanCommand, RefusedOverloadExitsTwoAndSaysWhatToChange)
{
    const std::string path = writeTemp("sagline-overload-setup.json", R"({"nameplate": {"rated_power_va": 50,
        "primary_voltage_v": 230, "secondary_voltage_v": 12, "secondary_no_load_voltage_v": 13},
        "bench": {"top_fraction": 1.3}})");
    const auto r = runProgram(cli, {"plan", path});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("bench.top_fraction"), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("allow_overload"), std::string::npos) << r.err;
}

TEST(PlanCommand, MissingFileAndBadUsageExitTwo)
{
    EXPECT_EQ(runProgram(cli, {"plan", "/nonexistent.json"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"plan"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"plan", demoSetup, "--bogus"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"no-such-command"}).exitCode, 2);
    const auto notJson = runProgram(cli, {"plan", writeTemp("sagline-not-json.json", "{ nameplate: ")});
    EXPECT_EQ(notJson.exitCode, 2);
    EXPECT_NE(notJson.err.find("line 1"), std::string::npos) << notJson.err;
}

TEST(PlanCommand, VersionPrintsVersionAndCommit)
{
    const auto r = runProgram(cli, {"--version"});
    EXPECT_EQ(r.exitCode, 0);
    EXPECT_NE(r.out.find("sagline-cli"), std::string::npos);
    EXPECT_NE(r.out.find("commit"), std::string::npos);
}
