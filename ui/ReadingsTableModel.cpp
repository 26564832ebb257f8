#include "ReadingsTableModel.h"

#include "UiFormat.h"

#include <QColor>

#include <algorithm>
#include <cmath>

namespace sagline {

ReadingsTableModel::ReadingsTableModel(QObject *parent) : QAbstractTableModel(parent) {}

void ReadingsTableModel::append(std::span<const Reading> readings)
{
    if (readings.empty())
        return;
    const int row = static_cast<int>(m_rows.size());
    beginInsertRows({}, row, row + static_cast<int>(readings.size()) - 1);
    for (const Reading &reading : readings)
        m_rows.push_back({reading, {}, {}});
    endInsertRows();
}

void ReadingsTableModel::clear()
{
    beginResetModel();
    m_rows.clear();
    endResetModel();
}

void ReadingsTableModel::setResidualFunction(ResidualFunction residual)
{
    m_residual = std::move(residual);
    if (!m_rows.empty())
        emit dataChanged(index(0, Residual), index(rowCount() - 1, Residual), {Qt::DisplayRole});
}

void ReadingsTableModel::setOutliers(const std::vector<std::size_t> &rows, const std::vector<QString> &explanations)
{
    if (rows == m_outliers && explanations == m_outlierTexts)
        return;
    m_outliers = rows;
    m_outlierTexts = explanations;
    m_outlierTexts.resize(m_outliers.size());
    if (!m_rows.empty())
        emit dataChanged(index(0, Flags), index(rowCount() - 1, Flags),
                         {Qt::DisplayRole, Qt::ForegroundRole, Qt::ToolTipRole});
}

bool ReadingsTableModel::isOutlier(int row) const
{
    return std::binary_search(m_outliers.begin(), m_outliers.end(), static_cast<std::size_t>(row));
}

QString ReadingsTableModel::outlierExplanation(int row) const
{
    const auto at = std::lower_bound(m_outliers.begin(), m_outliers.end(), static_cast<std::size_t>(row));
    if (at == m_outliers.end() || *at != static_cast<std::size_t>(row))
        return {};
    return m_outlierTexts[static_cast<std::size_t>(at - m_outliers.begin())];
}

void ReadingsTableModel::setExcluded(int row, bool excluded, const QString &reason)
{
    if (row < 0 || row >= rowCount())
        return;
    auto &r = m_rows[static_cast<std::size_t>(row)];
    r.reading.excluded = excluded;
    r.reason = reason;
    emit dataChanged(index(row, 0), index(row, ColumnCount - 1));
}

void ReadingsTableModel::setSuperseded(int row, const QString &reason)
{
    if (row < 0 || row >= rowCount())
        return;
    auto &r = m_rows[static_cast<std::size_t>(row)];
    r.reading.excluded = true;
    r.reading.superseded = true;
    r.reason = reason;
    emit dataChanged(index(row, 0), index(row, ColumnCount - 1));
}

void ReadingsTableModel::setNote(int row, const QString &note)
{
    if (row < 0 || row >= rowCount())
        return;
    m_rows[static_cast<std::size_t>(row)].note = note;
    emit dataChanged(index(row, Note), index(row, Note));
}

int ReadingsTableModel::rowCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_rows.size());
}

int ReadingsTableModel::columnCount(const QModelIndex &parent) const { return parent.isValid() ? 0 : ColumnCount; }

QVariant ReadingsTableModel::data(const QModelIndex &index, int role) const
{
    if (!index.isValid() || index.row() >= rowCount())
        return {};
    const Row &row = m_rows[static_cast<std::size_t>(index.row())];
    const Reading &r = row.reading;
    if (index.column() == Remarks && (role == Qt::DisplayRole || role == Qt::ToolTipRole || role == Qt::ForegroundRole)) {
        if (role == Qt::ForegroundRole)
            return data(index.siblingAtColumn(Flags), role).isValid() ? data(index.siblingAtColumn(Flags), role)
                                                                      : data(index.siblingAtColumn(Excluded), role);
        QStringList parts;
        for (const int column : {Flags, Excluded, Note}) {
            QString part = data(index.siblingAtColumn(column), role).toString();
            if (part.isEmpty() && role == Qt::ToolTipRole)
                part = data(index.siblingAtColumn(column), Qt::DisplayRole).toString();
            if (!part.isEmpty())
                parts << part;
        }
        return parts.join(role == Qt::ToolTipRole ? QStringLiteral("\n") : QStringLiteral(" · "));
    }
    if (role == Qt::TextAlignmentRole) {
        const int c = index.column();
        return (c == Current || c == Voltage || c == Residual || c == Step) ? int(Qt::AlignRight | Qt::AlignVCenter)
                                                                             : int(Qt::AlignLeft | Qt::AlignVCenter);
    }
    if (role == Qt::ForegroundRole && r.excluded)
        return QColor(0x80, 0x80, 0x80);
    if (role == Qt::ForegroundRole && index.column() == Flags && isOutlier(index.row()))
        return QColor(0xb3, 0x50, 0x00); // as the results' warnings; the ▲ carries it without colour
    if (role == Qt::ToolTipRole && index.column() == Excluded && r.excluded)
        return row.reason;
    if (role == Qt::ToolTipRole && index.column() == Flags && isOutlier(index.row()))
        return outlierExplanation(index.row());
    if (role == Qt::ToolTipRole && index.column() == Time)
        return QString::fromStdString(r.timeUtc);
    if (role != Qt::DisplayRole)
        return {};
    switch (index.column()) {
    case Step: return r.step >= 0 ? QVariant(r.step) : QVariant(QStringLiteral("–"));
    case Time: {
        // The time of day is what matters at the bench; the full UTC stamp is the tooltip.
        const QString full = QString::fromStdString(r.timeUtc);
        const qsizetype t = full.indexOf(QLatin1Char('T'));
        return t >= 0 ? full.mid(t + 1, 8) : full;
    }
    // Fixed decimals so the column lines up (mA and mV resolution, as bench meters show).
    case Current: return formatFixed(r.currentA, 4, Unit::Ampere);
    case Voltage: return formatFixed(r.voltageV, 3, Unit::Volt);
    case Residual: {
        if (!m_residual)
            return QStringLiteral("—");
        const double residual = m_residual(r.currentA, r.voltageV);
        return std::isfinite(residual) ? formatQuantity(residual * 1000.0, Unit::None, 3) + QStringLiteral(" mV")
                                       : QStringLiteral("—");
    }
    case Flags: {
        // Words for people: the file's "manual|confirmed" reads "manual, confirmed" here.
        const QString flags = QString::fromStdString(flagsToString(r.flags)).replace(QLatin1Char('|'), QStringLiteral(", "));
        if (!isOutlier(index.row()))
            return flags;
        return flags.isEmpty() ? tr("▲ outlier") : tr("▲ outlier, %1").arg(flags);
    }
    case Excluded:
        if (r.superseded)
            return tr("superseded: %1").arg(row.reason); // a retake of its step replaced it
        return r.excluded ? tr("excluded: %1").arg(row.reason) : QString();
    case Note: return row.note;
    case Remarks: break; // above
    }
    return {};
}

QVariant ReadingsTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation == Qt::Vertical && role == Qt::DisplayRole)
        return section + 1; // the reading's number, as the report, the export and sagline-cli use it
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole)
        return QAbstractTableModel::headerData(section, orientation, role);
    switch (section) {
    case Step: return tr("Step");
    case Time: return tr("Time (UTC)");
    case Current: return tr("Current");
    case Voltage: return tr("Voltage");
    case Residual: return tr("Residual");
    case Flags: return tr("Flags");
    case Excluded: return tr("Fit");
    case Note: return tr("Note");
    case Remarks: return tr("Remarks");
    }
    return {};
}

} // namespace sagline
