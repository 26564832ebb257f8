// The results as they update with each point: one line per quantity (name, value with unit
// and expanded uncertainty, a short note), and the verdict with its decision rule shown large
// with a symbol, so it reads at arm's length and without colour.
#pragma once

#include "BudgetTable.h"
#include "ConformityDecision.h"

#include <QHash>
#include <QWidget>

#include <vector>

class QGridLayout;
class QLabel;
class QPushButton;

namespace sagline {

// The ILAC-G8 outcomes (ConditionalPass/Fail: within U of a limit; NotJudged: no limit stated),
// and the completeness wrapper's: Provisional, the sweep is still running (k of N steps);
// Incomplete, it ended before its last step. Neither of those shows a pass or a fail.
enum class VerdictState { None, Pass, ConditionalPass, ConditionalFail, Fail, NotJudged, Provisional, Incomplete };
VerdictState verdictStateOf(ConformityOutcome outcome);

struct ResultLine {
    QString key;   // stable name for tests and layout ("series_resistance")
    QString label; // "Series resistance R (secondary)"
    QString value; // "1.952 ± 0.023 Ω"
    QString note;  // "k = 2, 95 %"
    bool warning = false;
};

class ResultsPanel : public QWidget {
    Q_OBJECT
public:
    explicit ResultsPanel(QWidget *parent = nullptr);
    void setLines(const QList<ResultLine> &lines);
    void setVerdict(VerdictState state, const QString &text, const QString &rule);
    void setPlaceholder(const QString &text);
    // The uncertainty budgets behind the lines; "Uncertainty budget…" opens them as tables.
    void setBudgets(std::vector<BudgetTable> budgets);
    const std::vector<BudgetTable> &budgets() const { return m_budgets; }
    QString value(const QString &key) const;
    QString note(const QString &key) const; // the small text under a line's label
    QString verdictText() const;
    QPushButton *budgetButton() const { return m_budgetButton; }

private:
    void showBudgets();

    QGridLayout *m_grid;
    QLabel *m_verdict;
    QLabel *m_rule;
    QLabel *m_placeholder;
    QPushButton *m_budgetButton;
    std::vector<BudgetTable> m_budgets;
    struct Row {
        QLabel *label;
        QLabel *value;
        QLabel *note;
    };
    QList<Row> m_rows;
    QStringList m_keys;
    QHash<QString, QString> m_values;
};

} // namespace sagline
