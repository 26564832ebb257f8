// What a supervised (student) session records besides its readings, so the lab lead can see
// which lab sheet a session came from, that the safety checklist was ticked, and whether a
// limit was hit. Each is a note in the session file (the store keeps notes append-only) whose
// author is a fixed machine name and whose text is one JSON object; a person reading the notes
// still sees plain words in it. No schema change is needed for old readers.
#pragma once

#include "LabSheet.h"
#include "SessionRecords.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

inline constexpr const char *labSheetNoteAuthor = "sagline/lab-sheet";
inline constexpr const char *checklistNoteAuthor = "sagline/safety-checklist";
inline constexpr const char *limitHitNoteAuthor = "sagline/lab-sheet-limit";

// The lab sheet a session was run under, as stamped into the session when it was created.
struct LabSheetStamp {
    std::string title;
    std::string fingerprint;        // labSheetFingerprint of the sheet
    double maxLoadFraction = 1.0;   // of rated secondary current
    FuseSpec requiredFuse;
    std::string student;            // who ran the session (also the session's operator)
};

struct ChecklistItem {
    std::string key;                // stable name, e.g. "fused-isolated-supply"
    std::string text;               // what the student confirms
    bool ticked = false;
};

// The safety checklist a student ticks before the first reading.
struct SafetyChecklist {
    std::string student;
    std::vector<ChecklistItem> items;
    bool complete() const;          // every item ticked
};

// The four items every supervised session starts with (fused and isolated supply, meters and
// leads rated for the measurement category, leads checked, supervisor present), all unticked.
SafetyChecklist standardSafetyChecklist(const std::string &student);

// A reading or step the lab sheet refused.
struct LimitHit {
    std::string timeUtc;            // from the note
    std::string rule;               // "lab-sheet-max-load", ...
    std::string message;
    int step = -1;
    std::optional<double> currentA; // the refused current, A
};

LabSheetStamp labSheetStamp(const LabSheet &sheet, const std::string &student);
std::string labSheetNoteText(const LabSheetStamp &stamp);
std::string checklistNoteText(const SafetyChecklist &checklist);
std::string limitHitNoteText(const LimitHit &hit);

// What the notes of one session say about supervision. Notes by other authors are ignored; a
// note by one of ours whose text does not parse is counted in `unreadable` (never thrown away silently).
struct SupervisionSummary {
    std::optional<LabSheetStamp> labSheet;      // the first lab-sheet note
    std::optional<SafetyChecklist> checklist;   // the latest checklist note
    std::vector<LimitHit> limitHits;            // oldest first
    int unreadable = 0;
};
SupervisionSummary summarizeSupervision(const std::vector<NoteRecord> &notes);

} // namespace sagline
