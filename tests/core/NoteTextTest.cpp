// Program records kept as notes read as words, never raw JSON (core/NoteText).
#include "AnalysisSettingsRecord.h"
#include "NoteText.h"

#include <gtest/gtest.h>

using namespace sagline;

TEST(NoteText, ProgramRecordsReadAsWords)
{
    AnalysisSettings settings;
    settings.regulationLimitPercent = 5.0;
    settings.rule = DecisionRule::Simple;
    const NoteRecord note{1, "2026-12-02T10:00:00.000Z", analysisSettingsNoteAuthor, analysisSettingsNoteText(settings), {}};
    EXPECT_TRUE(isProgramNote(note));
    const std::string text = readableNoteText(note);
    EXPECT_EQ(text.find('{'), std::string::npos) << text;
    EXPECT_NE(text.find("regulation limit percent: 5"), std::string::npos) << text;
    EXPECT_NE(text.find("rule: simple"), std::string::npos) << text;
    EXPECT_EQ(noteAuthorName(note), "analysis-settings (recorded by Sagline)");
}

TEST(NoteText, PersonsNotesStayAsWritten)
{
    const NoteRecord note{2, "2026-12-02T10:00:00.000Z", "B. Operator", "{not json, just braces}", {}};
    EXPECT_FALSE(isProgramNote(note));
    EXPECT_EQ(readableNoteText(note), "{not json, just braces}");
    EXPECT_EQ(noteAuthorName(note), "B. Operator");
}
