// Asks for a sign-off: reviewer, the reviewer's decision (accept, reject, retest; never called a
// verdict, which is the measurement's) and comment. It only returns the request; ReviewWindow
// asks for confirmation and writes it.
#pragma once

#include "SessionSignOff.h"

#include <QDialog>

class QComboBox;
class QLabel;
class QLineEdit;
class QPlainTextEdit;

namespace sagline {

class SignOffDialog : public QDialog {
    Q_OBJECT
public:
    SignOffDialog(const QString &sessionName, const QString &reviewer, QWidget *parent = nullptr);
    SignOffRequest request() const;

private:
    void check();
    QLineEdit *m_reviewer;
    QComboBox *m_decision;
    QPlainTextEdit *m_comment;
    QLabel *m_problem;
};

} // namespace sagline
