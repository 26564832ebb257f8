#include "ReviewFilterModel.h"

#include "NaturalOrder.h"
#include "ReviewTableModel.h"

namespace sagline {

ReviewFilterModel::ReviewFilterModel(QObject *parent) : QSortFilterProxyModel(parent)
{
    setSortRole(ReviewTableModel::SortRole);
}

void ReviewFilterModel::setVerdict(const QString &verdict)
{
    m_verdict = verdict;
    invalidateFilter();
}

void ReviewFilterModel::setDateRange(const QDate &from, const QDate &to)
{
    m_from = from;
    m_to = to;
    invalidateFilter();
}

void ReviewFilterModel::setText(const QString &text)
{
    m_text = text.trimmed();
    invalidateFilter();
}

bool ReviewFilterModel::filterAcceptsRow(int sourceRow, const QModelIndex &sourceParent) const
{
    const QAbstractItemModel *model = sourceModel();
    if (!model)
        return true;
    if (!m_verdict.isEmpty()
        && model->index(sourceRow, 0, sourceParent).data(ReviewTableModel::VerdictRole).toString() != m_verdict)
        return false;
    if (m_from.isValid() || m_to.isValid()) {
        const QDate date = model->index(sourceRow, 0, sourceParent).data(ReviewTableModel::DateRole).toDate();
        if (!date.isValid() || (m_from.isValid() && date < m_from) || (m_to.isValid() && date > m_to))
            return false;
    }
    if (!m_text.isEmpty()) {
        for (int column : {ReviewTableModel::Design, ReviewTableModel::File, ReviewTableModel::Unit, ReviewTableModel::Operator,
                           ReviewTableModel::Instruments, ReviewTableModel::LabSheet, ReviewTableModel::Review}) {
            if (model->index(sourceRow, column, sourceParent).data().toString().contains(m_text, Qt::CaseInsensitive))
                return true;
        }
        return false;
    }
    return true;
}

bool ReviewFilterModel::lessThan(const QModelIndex &left, const QModelIndex &right) const
{
    const QVariant a = left.data(ReviewTableModel::SortRole);
    const QVariant b = right.data(ReviewTableModel::SortRole);
    // Empty values (no fit, unreadable) sort after every number, whichever way.
    if (!a.isValid() || !b.isValid()) {
        if (a.isValid() == b.isValid())
            return false;
        return sortOrder() == Qt::AscendingOrder ? a.isValid() : !a.isValid();
    }
    if (a.typeId() == QMetaType::Double || b.typeId() == QMetaType::Double)
        return a.toDouble() < b.toDouble();
    if (a.typeId() == QMetaType::Int || a.typeId() == QMetaType::ULongLong)
        return a.toLongLong() < b.toLongLong();
    // Numbers in text by value ("20 VA ..." before "100 VA ..."), as compare orders designs.
    return naturalLess(a.toString().toStdString(), b.toString().toStdString());
}

} // namespace sagline
