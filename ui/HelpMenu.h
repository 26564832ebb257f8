// The Help menu of the bench window: a short user guide (a sweep from nameplate to lab sheet,
// typed readings, review, the cautions), the keyboard shortcuts as the window's actions have
// them, and About (version, commit, the libraries used and their licences).
#pragma once

#include <QString>

class QMainWindow;
class QWidget;

namespace sagline {

void addHelpMenu(QMainWindow *window);

QString userGuideHtml();
// Every action of `window` that has a shortcut, as an HTML table sorted by menu; read from the
// actions themselves, so it cannot drift from them.
QString shortcutsHtml(const QWidget *window);
QString aboutHtml();

} // namespace sagline
