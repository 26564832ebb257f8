// Form controls that keep their values: a combo box or spin box scrolled over with the mouse
// wheel while the page scrolls must not change (a fuse type turned from time-lag to
// quick-acting without notice). Guarded controls take the wheel only when they have focus
// (clicked or tabbed into); otherwise the wheel goes to the scroll area around them.
#pragma once

class QWidget;

namespace sagline {

// Guards every QComboBox and QAbstractSpinBox inside `root` (and `root` itself, if one).
// Safe to call again after adding controls: each is guarded once.
void guardWheelInside(QWidget *root);

} // namespace sagline
