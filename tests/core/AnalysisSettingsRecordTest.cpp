// The analysis-settings record: round trip, field-named errors, the latest readable record
// wins, a malformed one is ignored with a notice, and the session summary uses it unless an
// option overrides it. Decision rules: ILAC-G8:09/2019 §4.2.1 (simple) and §4.2.2 (guarded).
#include "AnalysisSettingsRecord.h"
#include "SessionSummary.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

namespace {

NoteRecord note(std::int64_t id, const std::string &author, const std::string &text)
{
    return {id, "2026-12-02T10:00:0" + std::to_string(id) + ".000Z", author, text, {}};
}

bool mentions(const FieldErrors &errors, const std::string &field)
{
    for (const FieldError &error : errors)
        if (error.field == field)
            return true;
    return false;
}

} // namespace

TEST(AnalysisSettingsRecord, RoundTripsEveryField)
{
    AnalysisSettings full;
    full.regulationLimitPercent = 7.25;
    full.rule = DecisionRule::SimpleAcceptance;
    full.referenceTemperatureC = 20.0;
    full.temperatureConstant = TemperatureConstant::CopperIec;
    const AnalysisSettingsParse back = parseAnalysisSettings(analysisSettingsNoteText(full));
    ASSERT_TRUE(back.settings) << back.errors.front().message();
    EXPECT_EQ(*back.settings, full);

    const AnalysisSettings defaults; // nameplate limit, guarded, reader's reference, per material
    const std::string text = analysisSettingsNoteText(defaults);
    EXPECT_NE(text.find("\"regulation_limit_percent\":null"), std::string::npos) << text;
    const AnalysisSettingsParse plain = parseAnalysisSettings(text);
    ASSERT_TRUE(plain.settings);
    EXPECT_EQ(*plain.settings, defaults);
}

TEST(AnalysisSettingsRecord, BadRecordsNameTheKey)
{
    EXPECT_TRUE(mentions(parseAnalysisSettings("not json").errors, "analysis_settings"));
    EXPECT_TRUE(mentions(parseAnalysisSettings("[1]").errors, "analysis_settings"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"rule":"simple"})").errors, "analysis_settings"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":2,"rule":"simple"})").errors, "analysis_settings"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":1,"rule":"strict"})").errors, "rule"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":1})").errors, "rule"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":1,"rule":"simple","regulation_limit_percent":0})").errors,
                         "regulation_limit_percent"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":1,"rule":"simple","regulation_limit_percent":"5"})").errors,
                         "regulation_limit_percent"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":1,"rule":"simple","reference_temperature_c":1e300})").errors,
                         "reference_temperature_c"));
    EXPECT_TRUE(mentions(parseAnalysisSettings(R"({"analysis_settings":1,"rule":"simple","temperature_constant":"silver"})").errors,
                         "temperature_constant"));
    EXPECT_FALSE(parseAnalysisSettings(R"({"analysis_settings":1,"rule":"guarded","temperature_constant":7})").settings);
}

TEST(AnalysisSettingsRecord, LatestReadableRecordWinsAndBadOnesAreReported)
{
    AnalysisSettings first;
    first.rule = DecisionRule::SimpleAcceptance;
    first.regulationLimitPercent = 4.0;
    AnalysisSettings second = first;
    second.regulationLimitPercent = 6.0;
    const std::vector<NoteRecord> notes = {
        note(1, analysisSettingsNoteAuthor, analysisSettingsNoteText(first)),
        note(2, "A. Tester", analysisSettingsNoteText(AnalysisSettings{})), // a person's note: not a record
        note(3, analysisSettingsNoteAuthor, analysisSettingsNoteText(second)),
        note(4, analysisSettingsNoteAuthor, R"({"analysis_settings":1,"rule":"lenient"})"),
    };
    const RecordedAnalysisSettings recorded = latestAnalysisSettings(notes);
    ASSERT_TRUE(recorded.settings);
    EXPECT_EQ(*recorded.settings, second);
    EXPECT_EQ(recorded.recordedUtc, notes[2].timeUtc);
    ASSERT_EQ(recorded.notices.size(), 1u);
    EXPECT_NE(recorded.notices.front().find("note 4"), std::string::npos) << recorded.notices.front();
    EXPECT_NE(recorded.notices.front().find("rule"), std::string::npos) << recorded.notices.front();

    const RecordedAnalysisSettings none = latestAnalysisSettings({note(1, "someone", "hello")});
    EXPECT_FALSE(none.settings);
    EXPECT_TRUE(none.notices.empty());
}

namespace {

// A session of the invented demo unit with a slightly noisy
// straight line, so the regulation has an uncertainty for the guarded rule to use.
std::string writeSession(const test::TempFolder &folder, const std::vector<std::string> &settingsNotes)
{
    const std::string path = folder.file("settings.sagline");
    auto created = SessionStore::create(path, test::sampleSession());
    EXPECT_TRUE(created.ok()) << created.message;
    const double noise[] = {0.012, -0.009, 0.004, -0.015, 0.010, -0.002, 0.007, -0.008};
    for (int i = 0; i < 8; ++i) {
        const double current = 0.3 * i;
        EXPECT_TRUE(created.value->appendReading(test::sampleReading(i, current, 26.4 - 0.45 * current + noise[i])).ok());
    }
    for (const std::string &text : settingsNotes)
        EXPECT_TRUE(created.value->addNote(analysisSettingsNoteAuthor, text).ok());
    return path;
}

} // namespace

TEST(AnalysisSettingsRecord, SummaryJudgesByTheRecordUnlessAnOptionSaysOtherwise)
{
    test::TempFolder folder;
    // Without a record: the defaults (guarded, the nameplate's regulation as the limit).
    const auto plain = loadSessionSummary(writeSession(folder, {}));
    ASSERT_TRUE(plain.ok()) << plain.message;
    ASSERT_TRUE(plain.value.analysis);
    EXPECT_EQ(plain.value.rule, DecisionRule::GuardedAcceptance);
    EXPECT_EQ(plain.value.ruleSource, SettingSource::Default);
    EXPECT_EQ(plain.value.regulationLimitSource, SettingSource::Default);
    EXPECT_TRUE(plain.value.recordedSettings.notices.empty());
    const UncertainValue regulation = plain.value.analysis->regulationPercent;
    ASSERT_TRUE(regulation.expandedUncertainty);
    const double u = *regulation.expandedUncertainty;
    ASSERT_GT(u, 0.0);

    // A limit half a U above the value: simple acceptance passes (value <= TL, ILAC-G8 §4.2.1),
    // guarded acceptance cannot decide (TL - U < value <= TL + U, §4.2.2).
    std::filesystem::remove(folder.file("settings.sagline"));
    AnalysisSettings simple;
    simple.rule = DecisionRule::SimpleAcceptance;
    simple.regulationLimitPercent = regulation.value + 0.5 * u;
    simple.referenceTemperatureC = 20.0;
    const std::string path = writeSession(folder, {analysisSettingsNoteText(simple), "{broken"});
    const auto recorded = loadSessionSummary(path);
    ASSERT_TRUE(recorded.ok()) << recorded.message;
    ASSERT_TRUE(recorded.value.decision);
    EXPECT_EQ(recorded.value.decision->rule, DecisionRule::SimpleAcceptance);
    EXPECT_EQ(recorded.value.decision->outcome, ConformityOutcome::Pass);
    EXPECT_DOUBLE_EQ(recorded.value.decision->upperLimit, *simple.regulationLimitPercent);
    EXPECT_EQ(recorded.value.ruleSource, SettingSource::SessionRecord);
    EXPECT_EQ(recorded.value.regulationLimitSource, SettingSource::SessionRecord);
    EXPECT_EQ(recorded.value.referenceTemperatureSource, SettingSource::SessionRecord);
    EXPECT_EQ(recorded.value.temperatureConstantSource, SettingSource::Default);
    EXPECT_FALSE(recorded.value.referenceTemperatureDefaulted);
    EXPECT_EQ(recorded.value.recordedSettings.notices.size(), 1u); // the broken note, reported
    const std::string used = describeSettingsUsed(recorded.value);
    EXPECT_NE(used.find("decision rule simple (session record)"), std::string::npos) << used;
    EXPECT_NE(used.find("reference temperature 20 °C (session record)"), std::string::npos) << used;

    ReviewOptions guarded;
    guarded.rule = DecisionRule::GuardedAcceptance;
    const auto overridden = loadSessionSummary(path, guarded);
    ASSERT_TRUE(overridden.ok() && overridden.value.decision);
    EXPECT_EQ(overridden.value.decision->outcome, ConformityOutcome::CannotDecide);
    EXPECT_EQ(overridden.value.ruleSource, SettingSource::Option);
    EXPECT_EQ(overridden.value.regulationLimitSource, SettingSource::SessionRecord);
}
