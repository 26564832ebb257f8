// The student's window for a supervised session from a lab sheet: the sheet's instructions,
// the locked setup (each locked control says why it is locked), the safety checklist that
// must be ticked before the first reading, then step-by-step typed-in entry with the bench's
// validation and the sheet's limits (SupervisedSession does the work).
#pragma once

#include "SupervisedSession.h"

#include <QList>
#include <QWidget>

#include <memory>

class QCheckBox;
class QLabel;
class QLineEdit;
class QPushButton;
class QGroupBox;
class QTableView;

namespace sagline {

class ReadingsTableModel;

class SupervisedWindow : public QWidget {
    Q_OBJECT
public:
    explicit SupervisedWindow(const LabSheet &sheet, QWidget *parent = nullptr);

    SupervisedSession &session() { return *m_session; }
    // What a student does, also used by tests: tick, start, enter.
    void setChecklistTicked(int item, bool ticked);
    QString startSession(const QString &path, const QString &student, const QString &unitSerial);
    SupervisedSession::Outcome enterReading(const QString &voltage, const QString &current);

    QPushButton *startButton() const { return m_start; }
    QPushButton *recordButton() const { return m_record; }
    QLineEdit *voltageField() const { return m_voltage; }
    QLineEdit *currentField() const { return m_current; }
    QString messageText() const;
    QString instructionText() const;
    QList<QWidget *> lockedControls() const { return m_locked; }

private:
    QGroupBox *createSheetBox();
    QGroupBox *createStartBox();
    QGroupBox *createEntryBox();
    void refresh();
    void showOutcome(const SupervisedSession::Outcome &outcome);

    std::unique_ptr<SupervisedSession> m_session;
    QList<QWidget *> m_locked;
    QList<QCheckBox *> m_checks;
    QLineEdit *m_student;
    QLineEdit *m_serial;
    QLineEdit *m_path;
    QPushButton *m_start;
    QLabel *m_instruction;
    QLineEdit *m_voltage;
    QLineEdit *m_current;
    QPushButton *m_record;
    QLabel *m_message;
    ReadingsTableModel *m_readings;
    QTableView *m_readingsView;
};

} // namespace sagline
