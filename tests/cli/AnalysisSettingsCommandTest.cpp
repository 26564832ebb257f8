// A session's analysis-settings record (core/AnalysisSettingsRecord.h) decides how `fit` and
// `report` judge it; a command-line option still overrides it. Decision rules of
// ILAC-G8:09/2019: simple acceptance §4.2.1 (pass when value <= TL), binary guarded §4.2.2
// (pass when value <= TL - U, else fail), non-binary §4.2.3 (conditional pass up to TL,
// conditional fail up to TL + U).
#include "AnalysisSettingsRecord.h"
#include "CliTestSupport.h"
#include "SessionStore.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

using namespace sagline;
using namespace sagline::testing;

namespace {

class AnalysisSettingsCommands : public ScratchFolderTest {
protected:
    AnalysisSettingsCommands() : ScratchFolderTest("sagline-cli-settings-") {}

    void SetUp() override
    {
        ScratchFolderTest::SetUp();
        session = path("s.sagline");
        ASSERT_EQ(runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", session, "--winding", "23"}).exitCode,
                  0);
        const auto plain = runProgram(cli, {"fit", session, "--json"});
        ASSERT_EQ(plain.exitCode, 0) << plain.err;
        const auto regulation = nlohmann::json::parse(plain.out).at("analysis").at("regulation_percent");
        value = regulation.at("value").get<double>();
        expanded = regulation.at("expanded_uncertainty").get<double>();
        ASSERT_GT(expanded, 0.0);
    }

    void addRecord(const std::string &text) const
    {
        auto store = SessionStore::openForWriting(session);
        ASSERT_TRUE(store.ok()) << store.message;
        ASSERT_TRUE(store.value->addNote(analysisSettingsNoteAuthor, text).ok());
    }

    nlohmann::json fitJson(const std::vector<std::string> &extra = {}) const
    {
        std::vector<std::string> args = {"fit", session, "--json"};
        args.insert(args.end(), extra.begin(), extra.end());
        const auto r = runProgram(cli, args);
        EXPECT_EQ(r.exitCode, 0) << r.err;
        return nlohmann::json::parse(r.out);
    }

    std::string session;
    double value = 0.0;    // regulation, %
    double expanded = 0.0; // its U (95 %), %
};

} // namespace

TEST_F(AnalysisSettingsCommands, FitAndReportJudgeByTheRecordedSimpleRule)
{
    // Half a U above the value: pass by the simple rule, conditional pass by the non-binary one.
    AnalysisSettings settings;
    settings.rule = DecisionRule::Simple;
    settings.regulationLimitPercent = value + 0.5 * expanded;
    addRecord(analysisSettingsNoteText(settings));

    const auto j = fitJson();
    EXPECT_EQ(j.at("verdict").at("rule"), "simple");
    EXPECT_EQ(j.at("verdict").at("outcome"), "pass");
    EXPECT_DOUBLE_EQ(j.at("verdict").at("regulation_limit_percent").get<double>(), *settings.regulationLimitPercent);
    EXPECT_EQ(j.at("settings_source").at("rule"), "session record");
    EXPECT_EQ(j.at("settings_source").at("regulation_limit"), "session record");

    const auto report = runProgram(cli, {"report", session, "-o", path("r.pdf")});
    ASSERT_EQ(report.exitCode, 0) << report.err;
    EXPECT_NE(report.out.find("Verdict: PASS ("), std::string::npos) << report.out;
    EXPECT_NE(report.out.find("decision rule simple (session record)"), std::string::npos) << report.out;
    EXPECT_NE(report.out.find("(session record); reference temperature 75 °C (default)"), std::string::npos)
        << report.out;
}

TEST_F(AnalysisSettingsCommands, OptionsOverrideTheRecord)
{
    AnalysisSettings settings;
    settings.rule = DecisionRule::Simple;
    settings.regulationLimitPercent = value + 0.5 * expanded;
    addRecord(analysisSettingsNoteText(settings));

    const auto nonBinary = fitJson({"--rule", "non-binary"});
    EXPECT_EQ(nonBinary.at("verdict").at("rule"), "non-binary");
    EXPECT_EQ(nonBinary.at("verdict").at("outcome"), "conditional-pass");
    EXPECT_EQ(nonBinary.at("settings_source").at("rule"), "option");
    // The binary guarded rule cannot say "conditional": within U of the limit is a fail.
    const auto guarded = fitJson({"--rule", "guarded"});
    EXPECT_EQ(guarded.at("verdict").at("rule"), "guarded");
    EXPECT_EQ(guarded.at("verdict").at("outcome"), "fail");

    // A limit below the value fails by either rule; the option's limit is the one used.
    const std::string lower = std::to_string(value - 2.0 * expanded);
    const auto limited = fitJson({"--regulation-limit", lower});
    EXPECT_EQ(limited.at("verdict").at("outcome"), "fail");
    EXPECT_EQ(limited.at("verdict").at("rule"), "simple"); // still the record's rule
    EXPECT_EQ(limited.at("settings_source").at("regulation_limit"), "option");

    const auto report = runProgram(cli, {"report", session, "-o", path("g.pdf"), "--rule", "non-binary"});
    ASSERT_EQ(report.exitCode, 0) << report.err;
    EXPECT_NE(report.out.find("Verdict: CONDITIONAL PASS ("), std::string::npos) << report.out;
    EXPECT_NE(report.out.find("decision rule non-binary (option)"), std::string::npos) << report.out;
}

TEST_F(AnalysisSettingsCommands, MalformedRecordIsIgnoredWithANotice)
{
    const auto before = fitJson();
    addRecord(R"({"analysis_settings":1,"rule":"lenient","regulation_limit_percent":-3})");
    const auto r = runProgram(cli, {"fit", session, "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j.at("settings_source").at("rule"), "default");
    EXPECT_EQ(j.value("verdict", nlohmann::json()), before.value("verdict", nlohmann::json()));
    EXPECT_NE(j.at("warnings").dump().find("analysis settings note"), std::string::npos) << j.at("warnings").dump();

    const auto report = runProgram(cli, {"report", session, "-o", path("m.pdf")});
    ASSERT_EQ(report.exitCode, 0) << report.err;
    EXPECT_NE(report.err.find("ignored"), std::string::npos) << report.err;
    EXPECT_NE(report.out.find("decision rule non-binary (default)"), std::string::npos) << report.out;
}

TEST_F(AnalysisSettingsCommands, CompareJudgesEachSessionByItsRecordUnlessARuleIsGiven)
{
    AnalysisSettings settings;
    settings.rule = DecisionRule::Simple;
    settings.regulationLimitPercent = value + 0.5 * expanded;
    addRecord(analysisSettingsNoteText(settings));

    const auto recorded = runProgram(cli, {"compare", session, "--json"});
    ASSERT_EQ(recorded.exitCode, 0) << recorded.err;
    const auto row = nlohmann::json::parse(recorded.out).at("sessions").at(0);
    EXPECT_EQ(row.at("decision_rule"), "simple");
    EXPECT_EQ(row.at("verdict"), "pass");
    EXPECT_TRUE(row.at("settings_from_record").get<bool>());

    const auto nonBinary = runProgram(cli, {"compare", session, "--json", "--rule", "non-binary"});
    ASSERT_EQ(nonBinary.exitCode, 0) << nonBinary.err;
    const auto optionRow = nlohmann::json::parse(nonBinary.out).at("sessions").at(0);
    EXPECT_EQ(optionRow.at("decision_rule"), "non-binary");
    EXPECT_EQ(optionRow.at("verdict"), "conditional-pass");
}
