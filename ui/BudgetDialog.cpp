#include "BudgetDialog.h"

#include <QDialogButtonBox>
#include <QHeaderView>
#include <QLabel>
#include <QTableWidget>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString q(const std::string &text)
{
    return QString::fromStdString(text);
}

} // namespace

BudgetDialog::BudgetDialog(const std::vector<BudgetTable> &budgets, QWidget *parent)
    : QDialog(parent), m_table(new QTableWidget(this))
{
    setWindowTitle(tr("Uncertainty budget"));
    setObjectName(QStringLiteral("budgetDialog"));
    auto *layout = new QVBoxLayout(this);
    auto *intro = new QLabel(tr("GUM (JCGM 100:2008): independent inputs; contributions |cᵢ|·u(xᵢ) add in quadrature. "
                                "Type A from the readings' scatter; Type B from the meters' specifications (systematic, "
                                "common to every reading) and the winding temperature. ν_eff by Welch–Satterthwaite "
                                "(GUM G.4); U is the half-width of the 95 % interval of the components' combined "
                                "distribution, k = U/u (t95(ν_eff) unless a rectangular limit dominates)."));
    intro->setWordWrap(true);
    layout->addWidget(intro);

    const int columns = static_cast<int>(std::size(budgetColumnTitles));
    m_table->setColumnCount(columns);
    QStringList headers;
    for (const char *title : budgetColumnTitles)
        headers << QString::fromUtf8(title);
    m_table->setHorizontalHeaderLabels(headers);
    m_table->verticalHeader()->hide();
    m_table->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_table->setWordWrap(false);
    QFont bold = font();
    bold.setBold(true);
    int row = 0;
    for (const BudgetTable &budget : budgets) {
        // A heading row per result: its name and combined uncertainty.
        m_table->insertRow(row);
        auto *heading = new QTableWidgetItem(q(budget.title) + QStringLiteral(": ") + q(budget.summary));
        heading->setFont(bold);
        heading->setData(Qt::UserRole, q(budget.key));
        m_table->setItem(row, 0, heading);
        m_table->setSpan(row, 0, 1, columns);
        ++row;
        for (const BudgetTableRow &line : budget.rows) {
            m_table->insertRow(row);
            const QStringList cells = {q(line.source),      q(line.type),        q(line.distribution),
                                       q(line.standardUncertainty), q(line.sensitivity), q(line.contribution),
                                       q(line.degreesOfFreedom)};
            for (int c = 0; c < columns; ++c) {
                auto *item = new QTableWidgetItem(cells[c]);
                if (c > 0)
                    item->setTextAlignment(Qt::AlignRight | Qt::AlignVCenter);
                m_table->setItem(row, c, item);
            }
            ++row;
        }
    }
    m_table->horizontalHeader()->setSectionResizeMode(0, QHeaderView::Stretch);
    for (int c = 1; c < columns; ++c)
        m_table->horizontalHeader()->setSectionResizeMode(c, QHeaderView::ResizeToContents);
    m_table->resizeRowsToContents();
    layout->addWidget(m_table, 1);
    auto *buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    layout->addWidget(buttons);
    resize(1000, 560);
}

} // namespace sagline
