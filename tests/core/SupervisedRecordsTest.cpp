// Supervision notes: the lab-sheet stamp, the safety checklist and limit hits survive a trip
// through the session's notes; notes by people are ignored, damaged machine notes counted.
#include "SupervisedRecords.h"

#include <gtest/gtest.h>

using namespace sagline;

TEST(SupervisedRecords, NotesRoundTrip)
{
    LabSheetStamp stamp{"Lab 3", "0123456789abcdef", 0.8, {0.5, FuseType::TimeLag}, "B. Student"};
    SafetyChecklist list = standardSafetyChecklist("B. Student");
    ASSERT_EQ(list.items.size(), 4u);
    EXPECT_FALSE(list.complete());
    for (auto &item : list.items)
        item.ticked = true;
    EXPECT_TRUE(list.complete());
    LimitHit hit{"", "lab-sheet-max-load", "a current of 1.9 A is above the lab sheet's limit", 7, 1.9};

    const std::vector<NoteRecord> notes = {
        {1, "2026-12-01T09:00:00.000Z", labSheetNoteAuthor, labSheetNoteText(stamp), {}},
        {2, "2026-12-01T09:00:01.000Z", "B. Student", "meters warmed up", {}},
        {3, "2026-12-01T09:00:02.000Z", checklistNoteAuthor, checklistNoteText(list), {}},
        {4, "2026-12-01T09:05:00.000Z", limitHitNoteAuthor, limitHitNoteText(hit), {}},
        {5, "2026-12-01T09:06:00.000Z", limitHitNoteAuthor, "{broken", {}},
    };
    const SupervisionSummary summary = summarizeSupervision(notes);
    ASSERT_TRUE(summary.labSheet);
    EXPECT_EQ(summary.labSheet->title, "Lab 3");
    EXPECT_EQ(summary.labSheet->fingerprint, "0123456789abcdef");
    EXPECT_DOUBLE_EQ(summary.labSheet->maxLoadFraction, 0.8);
    EXPECT_EQ(summary.labSheet->student, "B. Student");
    ASSERT_TRUE(summary.checklist);
    EXPECT_TRUE(summary.checklist->complete());
    EXPECT_EQ(summary.checklist->items[3].key, "supervisor-present");
    ASSERT_EQ(summary.limitHits.size(), 1u);
    EXPECT_EQ(summary.limitHits[0].step, 7);
    EXPECT_DOUBLE_EQ(*summary.limitHits[0].currentA, 1.9);
    EXPECT_EQ(summary.limitHits[0].timeUtc, "2026-12-01T09:05:00.000Z");
    EXPECT_EQ(summary.unreadable, 1);
}

TEST(SupervisedRecords, SessionWithoutSupervisionHasNone)
{
    const SupervisionSummary summary = summarizeSupervision({{1, "t", "A. Tester", "{\"lab_sheet\": \"fake\"}", {}}});
    EXPECT_FALSE(summary.labSheet); // only our machine author counts
    EXPECT_FALSE(summary.checklist);
    EXPECT_TRUE(summary.limitHits.empty());
    EXPECT_EQ(summary.unreadable, 0);
}
