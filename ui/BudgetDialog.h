// The uncertainty budgets of the results as tables (one per result): each source with its
// evaluation type, distribution, standard uncertainty, sensitivity, contribution and degrees of
// freedom, and the combined u, ν_eff, k and U above it. The numbers come from core
// (core/BudgetTable.h); this only lays them out.
#pragma once

#include "BudgetTable.h"

#include <QDialog>

#include <vector>

class QTableWidget;

namespace sagline {

class BudgetDialog : public QDialog {
    Q_OBJECT
public:
    explicit BudgetDialog(const std::vector<BudgetTable> &budgets, QWidget *parent = nullptr);
    QTableWidget *table() const { return m_table; }

private:
    QTableWidget *m_table;
};

} // namespace sagline
