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
    full.rule = DecisionRule::Simple;
    full.referenceTemperatureC = 20.0;
    full.temperatureConstant = TemperatureConstant::CopperIec;
    const AnalysisSettingsParse back = parseAnalysisSettings(analysisSettingsNoteText(full));
    ASSERT_TRUE(back.settings) << back.errors.front().message();
    EXPECT_EQ(*back.settings, full);

    const AnalysisSettings defaults; // the specification's limit, non-binary, reader's reference, per material
    const std::string text = analysisSettingsNoteText(defaults);
    EXPECT_NE(text.find("\"regulation_limit_percent\":null"), std::string::npos) << text;
    EXPECT_NE(text.find("\"rule\":\"non-binary\""), std::string::npos) << text;
    const AnalysisSettingsParse plain = parseAnalysisSettings(text);
    ASSERT_TRUE(plain.settings);
    EXPECT_EQ(*plain.settings, defaults);

    // The nameplate's regulation chosen explicitly is stored as such, not as a number.
    AnalysisSettings nameplate;
    nameplate.regulationLimitNameplate = true;
    nameplate.rule = DecisionRule::Guarded;
    const std::string nameplateText = analysisSettingsNoteText(nameplate);
    EXPECT_NE(nameplateText.find("\"regulation_limit_percent\":\"nameplate\""), std::string::npos) << nameplateText;
    const AnalysisSettingsParse nameplateBack = parseAnalysisSettings(nameplateText);
    ASSERT_TRUE(nameplateBack.settings);
    EXPECT_EQ(*nameplateBack.settings, nameplate);
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
    first.rule = DecisionRule::Simple;
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
    // Without a record: the defaults (non-binary; no specification and no limit: not judged).
    const auto plain = loadSessionSummary(writeSession(folder, {}));
    ASSERT_TRUE(plain.ok()) << plain.message;
    ASSERT_TRUE(plain.value.analysis && plain.value.verdict);
    EXPECT_EQ(plain.value.rule, DecisionRule::NonBinary);
    EXPECT_EQ(plain.value.ruleSource, SettingSource::Default);
    EXPECT_EQ(plain.value.regulationLimitSource, SettingSource::Default);
    EXPECT_EQ(plain.value.verdict->outcome, ConformityOutcome::NotJudged);
    EXPECT_TRUE(plain.value.recordedSettings.notices.empty());
    // The record below sets 20 °C: the verdict then uses the regulation referred to 20 °C.
    ReviewOptions at20;
    at20.referenceTemperatureC = 20.0;
    const auto referred = loadSessionSummary(plain.value.path, at20);
    ASSERT_TRUE(referred.ok() && referred.value.analysis && referred.value.analysis->referredRegulationPercent);
    const UncertainValue regulation = *referred.value.analysis->referredRegulationPercent;
    ASSERT_TRUE(regulation.expandedUncertainty);
    const double u = *regulation.expandedUncertainty;
    ASSERT_GT(u, 0.0);

    // A limit half a U above the value: simple acceptance passes (value <= TL, ILAC-G8 §4.2.1),
    // the non-binary rule gives a conditional pass (TL - U < value <= TL, §4.2.3), the binary
    // guarded rule a fail (value > TL - U, §4.2.2).
    std::filesystem::remove(folder.file("settings.sagline"));
    AnalysisSettings simple;
    simple.rule = DecisionRule::Simple;
    simple.regulationLimitPercent = regulation.value + 0.5 * u;
    simple.referenceTemperatureC = 20.0;
    const std::string path = writeSession(folder, {analysisSettingsNoteText(simple), "{broken"});
    const auto recorded = loadSessionSummary(path);
    ASSERT_TRUE(recorded.ok()) << recorded.message;
    ASSERT_TRUE(recorded.value.verdict);
    ASSERT_EQ(recorded.value.verdict->limits.size(), 1u);
    const ConformityDecision &decision = recorded.value.verdict->limits.front();
    EXPECT_EQ(decision.rule, DecisionRule::Simple);
    EXPECT_EQ(decision.outcome, ConformityOutcome::Pass);
    EXPECT_DOUBLE_EQ(*decision.limits.max, *simple.regulationLimitPercent);
    EXPECT_TRUE(recorded.value.verdict->atReferenceTemperature);
    EXPECT_EQ(recorded.value.ruleSource, SettingSource::SessionRecord);
    EXPECT_EQ(recorded.value.regulationLimitSource, SettingSource::SessionRecord);
    EXPECT_EQ(recorded.value.referenceTemperatureSource, SettingSource::SessionRecord);
    EXPECT_EQ(recorded.value.temperatureConstantSource, SettingSource::Default);
    EXPECT_FALSE(recorded.value.referenceTemperatureDefaulted);
    EXPECT_EQ(recorded.value.recordedSettings.notices.size(), 1u); // the broken note, reported
    const std::string used = describeSettingsUsed(recorded.value);
    EXPECT_NE(used.find("decision rule simple (session record)"), std::string::npos) << used;
    EXPECT_NE(used.find("reference temperature 20 °C (session record)"), std::string::npos) << used;

    ReviewOptions nonBinary;
    nonBinary.rule = DecisionRule::NonBinary;
    const auto overridden = loadSessionSummary(path, nonBinary);
    ASSERT_TRUE(overridden.ok() && overridden.value.verdict);
    EXPECT_EQ(overridden.value.verdict->outcome, ConformityOutcome::ConditionalPass);
    EXPECT_EQ(overridden.value.ruleSource, SettingSource::Option);
    EXPECT_EQ(overridden.value.regulationLimitSource, SettingSource::SessionRecord);
    ReviewOptions guarded;
    guarded.rule = DecisionRule::Guarded;
    const auto binary = loadSessionSummary(path, guarded);
    ASSERT_TRUE(binary.ok() && binary.value.verdict);
    EXPECT_EQ(binary.value.verdict->outcome, ConformityOutcome::Fail);
}
