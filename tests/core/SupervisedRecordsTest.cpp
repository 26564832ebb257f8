// Supervision notes: the lab-sheet stamp, the safety checklist and limit hits survive a trip
// through the session's notes; notes by people are ignored, damaged machine notes counted.
#include "SupervisedRecords.h"

#include <gtest/gtest.h>

using namespace sagline;

TEST(SupervisedRecords, NotesRoundTrip)
{
    LabSheetStamp stamp{"Lab 3", "0123456789abcdef", 0.8, {0.5, FuseType::TimeLag}, "B. Student"};
    SafetyChecklist list = standardSafetyChecklist("B. Student");
    ASSERT_EQ(list.items.size(), 3u); // the supervisor confirms for themselves, not by the student's tick
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
        {6, "2026-12-01T09:00:03.000Z", supervisorNoteAuthor,
         supervisorNoteText({"C. Supervisor", "B. Student", true, ""}), {}},
    };
    const SupervisionSummary summary = summarizeSupervision(notes);
    ASSERT_TRUE(summary.labSheet);
    EXPECT_EQ(summary.labSheet->title, "Lab 3");
    EXPECT_EQ(summary.labSheet->fingerprint, "0123456789abcdef");
    EXPECT_DOUBLE_EQ(summary.labSheet->maxLoadFraction, 0.8);
    EXPECT_EQ(summary.labSheet->student, "B. Student");
    ASSERT_TRUE(summary.checklist);
    EXPECT_TRUE(summary.checklist->complete());
    EXPECT_EQ(summary.checklist->items[2].key, "leads-checked");
    ASSERT_TRUE(summary.supervisor);
    EXPECT_EQ(summary.supervisor->supervisor, "C. Supervisor");
    EXPECT_EQ(summary.supervisor->student, "B. Student");
    EXPECT_TRUE(summary.supervisor->pinChecked);
    EXPECT_EQ(summary.supervisor->timeUtc, "2026-12-01T09:00:03.000Z");
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

TEST(SupervisedRecords, SupervisorMustNameThemselvesAndNotBeTheStudent)
{
    EXPECT_EQ(supervisorConfirmationError({"C. Supervisor", "B. Student", false, ""}), "");
    EXPECT_NE(supervisorConfirmationError({"  ", "B. Student", false, ""}).find("supervisor:"), std::string::npos);
    EXPECT_NE(supervisorConfirmationError({"b. student ", "B. Student", false, ""}).find("cannot confirm their own"),
              std::string::npos);
    EXPECT_NE(supervisorConfirmationError({"C.\nSupervisor", "B. Student", false, ""}).find("printable"), std::string::npos);
}

TEST(SupervisedRecords, SessionFileNamedFromStudentUnitAndTime)
{
    EXPECT_EQ(supervisedSessionFileName("Ada Lovelace", "TT-40/017", "20261202-153012"),
              "Ada-Lovelace_TT-40-017_20261202-153012Z.sagline");
    EXPECT_EQ(supervisedSessionFileName("../../etc", "", "20261202-153012"), "etc_unit_20261202-153012Z.sagline");
    EXPECT_EQ(supervisedSessionFileName("", "  ", "20261202-153012"), "student_unit_20261202-153012Z.sagline");
    EXPECT_EQ(supervisedSessionFileName(std::string(60, 'x'), "u", "20261202-153012").size(), 40u + 1 + 1 + 1 + 16 + 8);
}
