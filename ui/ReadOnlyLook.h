// A read-only field that looks read-only: its background takes the window's colour, so a locked
// value (a signed session's, or a session detail fixed when the session started) does not look
// like a box to type into. Light and dark palettes alike; unlocking restores the inherited look.
#pragma once

class QLineEdit;

namespace sagline {

void setReadOnlyShown(QLineEdit *edit, bool readOnly);

} // namespace sagline
