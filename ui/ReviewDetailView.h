// One session in full, read-only: results with uncertainties and the verdict (the desktop
// app's ResultsPanel), every reading with its residual (ReadingsTableModel), the sign-off
// history, safety stops, and for a supervised session its lab sheet, checklist and limit hits.
#pragma once

#include "SessionComparison.h"

#include <QWidget>

class QLabel;
class QTableView;

namespace sagline {

class ReadingsTableModel;
class ResultsPanel;

class ReviewDetailView : public QWidget {
    Q_OBJECT
public:
    explicit ReviewDetailView(QWidget *parent = nullptr);
    void showSession(const SessionRow *row); // nullptr: nothing selected
    QString historyText() const;
    ResultsPanel *results() const { return m_results; }
    ReadingsTableModel *readings() const { return m_readings; }

private:
    QLabel *m_heading;
    ResultsPanel *m_results;
    ReadingsTableModel *m_readings;
    QTableView *m_readingsView;
    QLabel *m_history;
};

} // namespace sagline
