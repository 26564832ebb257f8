// A note as people read it. A program's record kept as a note (analysis settings, lab sheet,
// safety checklist, lab-sheet limit: one JSON object each, by an author "sagline/...") is
// printed as words ("rule: guarded; regulation limit percent: 5"), never as raw JSON; a
// person's note stays as written.
#pragma once

#include "SessionRecords.h"

#include <string>

namespace sagline {

bool isProgramNote(const NoteRecord &note); // author "sagline/..."
// "analysis settings", "lab sheet", ... for a program's note; the author otherwise.
std::string noteAuthorName(const NoteRecord &note);
std::string readableNoteText(const NoteRecord &note);

} // namespace sagline
