// Every recorded reading as a table: step, UTC time, I, V, residual, flags, exclusion (with
// its reason) and a note. Residuals come from core through a function set by the workspace;
// they are looked up when a row is drawn, so adding a point never walks the whole table.
#pragma once

#include "Reading.h"

#include <QAbstractTableModel>

#include <functional>
#include <span>
#include <vector>

namespace sagline {

class ReadingsTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    // Remarks joins Flags, Excluded and Note in one column, so the bench window's narrow table
    // shows them all without a sideways scroll bar (the three stay for tests and wide views).
    enum Column { Step, Time, Current, Voltage, Residual, Flags, Excluded, Note, Remarks, ColumnCount };
    using ResidualFunction = std::function<double(double, double)>; // (I, V) -> residual, V

    explicit ReadingsTableModel(QObject *parent = nullptr);

    void append(std::span<const Reading> readings); // one row insertion for all of them
    void append(const Reading &reading) { append(std::span<const Reading>(&reading, 1)); }
    void clear();
    void setResidualFunction(ResidualFunction residual);
    // Rows the batch fit flags as outliers (ascending): marked in the flags column, so the
    // reading behind "Outliers flagged" in the results can be found and judged. explanations
    // (parallel to rows, core's outlierFlagText) are the flag's tooltip: statistic, rule, source.
    void setOutliers(const std::vector<std::size_t> &rows, const std::vector<QString> &explanations = {});
    QString outlierExplanation(int row) const; // "" when the row is not flagged
    void setExcluded(int row, bool excluded, const QString &reason);
    // A retake replaced this row's reading: it shows as superseded, with the retake's reason.
    void setSuperseded(int row, const QString &reason);
    void setNote(int row, const QString &note);
    const Reading &reading(int row) const { return m_rows[static_cast<std::size_t>(row)].reading; }
    QString exclusionReason(int row) const { return m_rows[static_cast<std::size_t>(row)].reason; }
    QString note(int row) const { return m_rows[static_cast<std::size_t>(row)].note; }

    int rowCount(const QModelIndex &parent = {}) const override;
    int columnCount(const QModelIndex &parent = {}) const override;
    QVariant data(const QModelIndex &index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    struct Row {
        Reading reading;
        QString reason;
        QString note;
    };
    std::vector<Row> m_rows;
    ResidualFunction m_residual;
    std::vector<std::size_t> m_outliers;
    std::vector<QString> m_outlierTexts; // parallel to m_outliers
    bool isOutlier(int row) const;
};

} // namespace sagline
