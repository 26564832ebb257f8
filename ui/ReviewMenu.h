// The "Review" menu the desktop app's main window adds with one call: the review workspace for
// lab leads, and a supervised session from a lab sheet for students. Each opens its own window.
#pragma once

class QMainWindow;

namespace sagline {

void addReviewMenu(QMainWindow *window);

} // namespace sagline
