// One QAction per window action, shared by its menu entry and its button: the button shows
// the action's text and tooltip, clicking it triggers the action, and enabling or disabling
// either one changes both (so a menu item is never live while its button is greyed out).
#pragma once

class QAbstractButton;
class QAction;

namespace sagline {

// Binds `button` to `action` for as long as both live. The button's own enabled state (set
// by code that only knows the button) is carried to the action; a parent disabling the button
// (a locked panel) is not, since it says nothing about the action.
void bindButtonToAction(QAbstractButton *button, QAction *action);

} // namespace sagline
