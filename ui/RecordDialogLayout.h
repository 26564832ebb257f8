// The layout the dialogs that add a record to a session share: the form, a note on what is
// recorded, the line saying what still keeps it from being recorded, and OK / Cancel with OK
// named for the action. Returns the OK button, which the dialog enables as its fields check.
#pragma once

#include <QString>

class QDialog;
class QFormLayout;
class QLabel;
class QPushButton;

namespace sagline {

QPushButton *layOutRecordDialog(QDialog *dialog, QFormLayout *form, const QString &note, QLabel *problem,
                                const QString &okText);

} // namespace sagline
