// Sorting and filtering of the review table: by verdict, by date range (UTC dates, inclusive),
// and by text found in the file name, unit serial, operator, instruments or lab sheet. Sorting
// uses the model's SortRole, so numbers sort as numbers.
#pragma once

#include <QDate>
#include <QSortFilterProxyModel>

namespace sagline {

class ReviewFilterModel : public QSortFilterProxyModel {
    Q_OBJECT
public:
    explicit ReviewFilterModel(QObject *parent = nullptr);

    // "" for every verdict; else a verdict token ("pass", "conditional-pass", ...), "n/a",
    // "incomplete" or "unreadable".
    void setVerdict(const QString &verdict);
    void setDateRange(const QDate &from, const QDate &to); // an invalid date leaves that end open
    void setText(const QString &text);

protected:
    bool filterAcceptsRow(int sourceRow, const QModelIndex &sourceParent) const override;
    bool lessThan(const QModelIndex &left, const QModelIndex &right) const override;

private:
    QString m_verdict;
    QDate m_from, m_to;
    QString m_text;
};

} // namespace sagline
