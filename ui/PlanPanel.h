// The plan as core computed it: key figures, the recommended fuse and the NEC ceiling with
// their notes, defaults used, warnings, the step table, and the Accept action.
#pragma once

#include "Planner.h"

#include <QPointer>
#include <QWidget>

#include <functional>

class QAction;
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
    // Keeps Accept disabled with the reason shown beside it ("" lifts the block). With
    // `unsafeSteps`, offers to use only the safe steps or to override with a reason.
    void setAcceptBlocked(const QString &reason, bool unsafeSteps);
    QString acceptBlockedReason() const;
    QPushButton *acceptButton() const { return m_accept; }
    QAction *acceptAction() const { return m_acceptAction; } // shared with the Sweep menu
    QPushButton *safeStepsButton() const { return m_safeSteps; }
    QPushButton *overrideButton() const { return m_override; }
    QTableView *table() const { return m_table; }
    QString summaryText() const;
    // How a setup key ("bench.fuse_factor") is named on the form, for "Defaults used".
    void setFieldLabels(std::function<QString(const QString &)> labelFor) { m_fieldLabel = std::move(labelFor); }
    QPushButton *everyColumnButton() const { return m_everyColumn; }
    QWidget *everyColumnDialog() const { return m_everyColumnDialog; } // the last one opened, while open

public slots:
    void showEveryColumn(); // the step table with every column, in a window of its own

signals:
    void acceptRequested();
    void safeStepsRequested();
    void overrideRequested();

private:
    void fitTableWidth();
    QLabel *m_summary;
    QLabel *m_warnings;
    QTableView *m_table;
    PlanTableModel *m_model;
    QPushButton *m_accept;
    QAction *m_acceptAction;
    QLabel *m_blocked;
    QPushButton *m_safeSteps;
    QPushButton *m_override;
    QPushButton *m_everyColumn;
    QPointer<QWidget> m_everyColumnDialog;
    std::function<QString(const QString &)> m_fieldLabel;
    bool m_isBlocked = false;
    bool m_hasPlan = false;
};

} // namespace sagline
