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
inline constexpr const char *supervisorNoteAuthor = "sagline/supervisor-confirmation";

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

// The three items every supervised session starts with (fused and isolated supply, meters and
// leads rated for the measurement category, leads checked), all unticked. That a supervisor
// checked the set-up is not the student's tick: the supervisor confirms it (SupervisorConfirmation).
SafetyChecklist standardSafetyChecklist(const std::string &student);

// The supervisor's own confirmation of the set-up, given before the session can start: their
// name, and whether the sheet's PIN was asked for and matched (a session is never started with
// a PIN that did not match).
struct SupervisorConfirmation {
    std::string supervisor;         // required, as they typed it
    std::string student;            // whom they confirmed it for
    bool pinChecked = false;        // the sheet asked for a PIN and it matched
    std::string timeUtc;            // from the note, when read back
};
// "" when the confirmation may be recorded; else the field and the rule ("supervisor: ...").
// A supervisor must not be the student.
std::string supervisorConfirmationError(const SupervisorConfirmation &confirmation);
std::string supervisorNoteText(const SupervisorConfirmation &confirmation);

// The file name of a supervised session: "<student>_<unit>_<yyyymmdd-hhmmss>Z.sagline", each
// part reduced to letters, digits, '-', '_' and '.' (other characters become '-'), at most 40
// characters each, so a folder of sessions sorts by student and a second student never meets
// "already exists". `utcStamp` is "20261202-153012".
std::string supervisedSessionFileName(const std::string &student, const std::string &unitSerial,
                                      const std::string &utcStamp);

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
    std::optional<SupervisorConfirmation> supervisor; // the latest confirmation
    int unreadable = 0;
};
SupervisionSummary summarizeSupervision(const std::vector<NoteRecord> &notes);

} // namespace sagline
