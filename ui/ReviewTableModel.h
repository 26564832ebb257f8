// The review's comparison table: one row per session (SessionRow from core), every number
// with its unit and expanded uncertainty. Qt::UserRole gives the raw value for sorting, so a
// sort by R is numeric, not by text. Rows whose file could not be opened stay in the table
// with their reason, greyed.
#pragma once

#include "SessionComparison.h"

#include <QAbstractTableModel>

#include <vector>

namespace sagline {

class ReviewTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column {
        Design, File, Unit, Date, Operator, Instruments, Points, Resistance, ResistanceRef, NoLoadVoltage, Regulation,
        EfficiencyAtRated, NoLoadLoss, // from the primary side (compare's columns); "—" without primary readings
        Verdict, Rule, SafetyStops, Review, LabSheet, LimitHits, RobustZ, ColumnCount
    };
    static constexpr int SortRole = Qt::UserRole;      // numbers as double, text as text
    // The verdict's token for the filter: "pass", "conditional-pass", ..., "not-judged", "n/a",
    // "incomplete" or "unreadable"; the table shows the words (outcomeWords) people read everywhere.
    static constexpr int VerdictRole = Qt::UserRole + 1;
    static constexpr int DateRole = Qt::UserRole + 2;    // QDate of the session (UTC)

    explicit ReviewTableModel(QObject *parent = nullptr);

    void clear();
    void appendRows(std::vector<SessionRow> rows);     // keeps statistics up to date
    void replaceRow(int row, SessionRow sessionRow);   // after a sign-off
    const SessionRow &sessionRow(int row) const { return m_rows[static_cast<std::size_t>(row)]; }
    const std::vector<SessionRow> &rows() const { return m_rows; }
    const BatchStatistics &statistics() const { return m_stats; }
    void setReferenceTemperature(double celsius) { m_referenceC = celsius; }
    bool isFarFromBatch(int row) const;

    int rowCount(const QModelIndex &parent = {}) const override;
    int columnCount(const QModelIndex &parent = {}) const override;
    QVariant data(const QModelIndex &index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    QVariant display(const SessionRow &row, int rowIndex, int column) const;
    QVariant sortValue(const SessionRow &row, int rowIndex, int column) const;
    void recomputeStatistics();

    std::vector<SessionRow> m_rows;
    BatchStatistics m_stats;
    double m_referenceC = 75.0;
};

} // namespace sagline
