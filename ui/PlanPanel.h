// The plan as core computed it: key figures, the recommended fuse and the NEC ceiling with
// their notes, defaults used, warnings, the step table, and the Accept action.
#pragma once

#include "Planner.h"

#include <QWidget>

class QLabel;
class QPushButton;
class QTableView;

namespace sagline {

class PlanTableModel;

class PlanPanel : public QWidget {
    Q_OBJECT
public:
    explicit PlanPanel(QWidget *parent = nullptr);
    void setPlan(const std::optional<Plan> &plan);
    void setAccepted(bool accepted);
    QPushButton *acceptButton() const { return m_accept; }
    QTableView *table() const { return m_table; }
    QString summaryText() const;

signals:
    void acceptRequested();

private:
    QLabel *m_summary;
    QLabel *m_warnings;
    QTableView *m_table;
    PlanTableModel *m_model;
    QPushButton *m_accept;
};

} // namespace sagline
