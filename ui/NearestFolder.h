// Where a file dialog should open for a folder that may not exist yet (the session folder
// before the first sweep makes it): QFileDialog takes a path that does not exist as a file name
// in its current folder, so "Documents/Sagline sessions" showed up as the name to open.
#pragma once

#include <QString>

namespace sagline {

// `folder` when it is a folder; otherwise its nearest ancestor that is one; the home folder
// when none is (an empty or relative path that leads nowhere).
QString nearestExistingFolder(const QString &folder);

} // namespace sagline
