// Asks for a temperature measured after the session began: which (winding or ambient), the
// value as typed ("41.5 °C"), and how it was measured. Checked as typed by core's rule
// (SessionChanges: plausibleTemperatureRange, a required source); it only returns the entry,
// the window records it.
#pragma once

#include "SessionRecords.h"

#include <QDialog>

#include <optional>

class QComboBox;
class QLabel;
class QLineEdit;
class QPushButton;

namespace sagline {

struct TemperatureEntry {
    TemperatureKind kind = TemperatureKind::Winding;
    double celsius = 0.0;
    QString source; // how it was measured
};

class TemperatureDialog : public QDialog {
    Q_OBJECT
public:
    explicit TemperatureDialog(QWidget *parent = nullptr);
    // The entry when every field reads, else nothing (problem() says why).
    std::optional<TemperatureEntry> entry() const;
    QString problem() const;

    QComboBox *kindBox() const { return m_kind; }
    QLineEdit *valueEdit() const { return m_value; }
    QLineEdit *sourceEdit() const { return m_source; }
    QPushButton *recordButton() const { return m_record; }

private:
    void check();
    QComboBox *m_kind;
    QLineEdit *m_value;
    QLineEdit *m_source;
    QLabel *m_problem;
    QPushButton *m_record = nullptr;
};

} // namespace sagline
