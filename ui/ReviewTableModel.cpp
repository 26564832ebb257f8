#include "ReviewTableModel.h"

#include "UncertaintyFormat.h"

#include <QBrush>
#include <QDate>
#include <QFileInfo>
#include <QFont>
#include <QPalette>

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

QString text(const std::string &s) { return QString::fromStdString(s); }

QString withU(bool ok, double value, const std::optional<double> &expanded, const std::optional<double> &k,
              const char *unit)
{
    if (!ok || !std::isfinite(value))
        return QStringLiteral("—");
    return text(formatWithCoverage(value, expanded, k, unit));
}

// "2026-12-01 09:00:05" from the stored "2026-12-01T09:00:05.000Z"; other text as stored.
QString startedText(const std::string &utc)
{
    if (utc.size() < 19 || utc[10] != 'T')
        return text(utc);
    return text(utc.substr(0, 10) + " " + utc.substr(11, 8));
}

// The primary side's efficiency at rated load or no-load loss, as `compare` writes them.
QString primaryText(const std::optional<UncertainValue> &value, const char *unit)
{
    if (!value)
        return QStringLiteral("—");
    return withU(true, value->value, value->expandedUncertainty, value->coverageFactor, unit);
}

QVariant primaryNumber(const std::optional<UncertainValue> &value)
{
    return value && std::isfinite(value->value) ? QVariant(value->value) : QVariant();
}

// Why a primary-side cell is blank.
QString primaryMissing(const SessionRow &row, bool efficiency)
{
    if (!row.primarySide)
        return QObject::tr("No primary-side readings in this session: the mains-side meters were not read");
    return efficiency ? QObject::tr("Not computed: it needs the primary power at the loaded steps and a fit")
                      : QObject::tr("Not computed: it needs the no-load step (step 0) with the primary power read");
}

QVariant number(bool ok, double value)
{
    return ok && std::isfinite(value) ? QVariant(value) : QVariant();
}

// Every U in the table is at 95 % with the k of its own budget, printed beside it.
QString coverageNote()
{
    return QObject::tr("± U: expanded uncertainty at 95 % coverage with the k of the result's own budget, shown "
                       "beside each value: k = U/u, t95(ν_eff) (GUM G.4) unless a rectangular meter limit dominates");
}

} // namespace

ReviewTableModel::ReviewTableModel(QObject *parent) : QAbstractTableModel(parent) {}

void ReviewTableModel::clear()
{
    beginResetModel();
    m_rows.clear();
    m_stats = {};
    endResetModel();
}

void ReviewTableModel::appendRows(std::vector<SessionRow> rows)
{
    if (rows.empty())
        return;
    const int first = static_cast<int>(m_rows.size());
    beginInsertRows({}, first, first + static_cast<int>(rows.size()) - 1);
    for (auto &row : rows)
        m_rows.push_back(std::move(row));
    endInsertRows();
    recomputeStatistics();
}

void ReviewTableModel::replaceRow(int row, SessionRow sessionRow)
{
    if (row < 0 || row >= rowCount())
        return;
    m_rows[static_cast<std::size_t>(row)] = std::move(sessionRow);
    recomputeStatistics();
    emit dataChanged(index(row, 0), index(row, ColumnCount - 1));
}

void ReviewTableModel::recomputeStatistics()
{
    m_stats = summarizeBatch(m_rows);
    // The z column and the flag depend on every row.
    if (!m_rows.empty())
        emit dataChanged(index(0, RobustZ), index(rowCount() - 1, RobustZ));
}

bool ReviewTableModel::isFarFromBatch(int row) const
{
    return std::find(m_stats.farFromBatch.begin(), m_stats.farFromBatch.end(), static_cast<std::size_t>(row))
           != m_stats.farFromBatch.end();
}

int ReviewTableModel::rowCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_rows.size());
}

int ReviewTableModel::columnCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant ReviewTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal)
        return role == Qt::DisplayRole ? QVariant(section + 1) : QVariant();
    if (role == Qt::ToolTipRole) {
        switch (section) {
        case Resistance: return tr("Series resistance referred to the secondary, at the measured winding temperature, %1").arg(coverageNote());
        case ResistanceRef: return tr("Series resistance at the reference temperature, R_ref = R (T_k + T_ref)/(T_k + T_m), %1").arg(coverageNote());
        case NoLoadVoltage: return tr("No-load voltage V0 from the fit, %1").arg(coverageNote());
        case Regulation: return tr("Regulation at rated current, (V0 - V_fl)/V_fl × 100, %1").arg(coverageNote());
        case EfficiencyAtRated:
            return tr("Efficiency at rated load from the primary side, η = P2/P1 of the model V = V0 - R·I with the "
                      "no-load loss (the same number as compare's efficiency_at_rated_percent), %1")
                .arg(coverageNote());
        case NoLoadLoss:
            return tr("No-load (core) loss P0 at the rated primary voltage, from step 0 (compare's no_load_loss_w), %1")
                .arg(coverageNote());
        case RobustZ:
            return tr("Modified z-score 0.6745 (R - median)/MAD within the row's design; above 3.5 in magnitude the unit is "
                      "far from the batch (Iglewicz and Hoaglin 1993). A statement about the batch needs at least 10 units "
                      "of the design; below that the mark says \"screening only\"");
        case Points: return tr("Readings used by the fit / readings recorded");
        case Design: return tr("The setup's design name, or its nameplate (rating, voltages, frequency, construction, winding); "
                               "statistics and far-from-batch marks are taken within one design only");
        case Date: return tr("When the session was started (UTC)");
        case Verdict: return tr("The measurement verdict from the metrology rules (ILAC-G8 decision rule)");
        case Review: return tr("The reviewer's decision at sign-off: accepted, rejected or retest");
        default: return {};
        }
    }
    if (role != Qt::DisplayRole)
        return {};
    switch (section) {
    case Design: return tr("Design");
    case File: return tr("File");
    case Unit: return tr("Unit serial");
    case Date: return tr("Started (UTC)");
    case Operator: return tr("Operator");
    case Instruments: return tr("Instruments");
    case Points: return tr("Points");
    case Resistance: return tr("R ± U");
    case ResistanceRef: return tr("R at %1 °C ± U").arg(m_referenceC);
    case NoLoadVoltage: return tr("V0 ± U");
    case Regulation: return tr("Regulation ± U");
    case EfficiencyAtRated: return tr("η at rated ± U");
    case NoLoadLoss: return tr("No-load loss ± U");
    case Verdict: return tr("Verdict");
    case Rule: return tr("Decision rule");
    case SafetyStops: return tr("Safety stops");
    case Review: return tr("Reviewer's decision");
    case LabSheet: return tr("Lab sheet");
    case LimitHits: return tr("Limit hits");
    case RobustZ: return tr("Robust z");
    default: return {};
    }
}

QVariant ReviewTableModel::display(const SessionRow &row, int rowIndex, int column) const
{
    const SessionFigures &f = row.figures;
    if (column == File)
        return QFileInfo(text(row.path)).fileName();
    if (!row.opened)
        // The reason is long: it goes in the tooltip and the "Not compared" list, not in a column.
        return column == Unit ? QVariant(tr("(unreadable)")) : column == Verdict ? QVariant(tr("cannot be opened")) : QVariant();
    switch (column) {
    case Design: return text(row.design.empty() ? std::string(unknownDesignLabel) : row.design);
    case Unit: return text(row.unitSerial);
    case Date: return startedText(row.createdUtc);
    case Operator: return text(row.operatorName);
    case Instruments: return row.instruments.empty() ? tr("typed in") : text(row.instruments);
    case Points: return QStringLiteral("%1 / %2").arg(row.pointsUsed).arg(row.readingCount);
    case Resistance: return withU(f.ok, f.resistanceOhm, f.resistanceUOhm, f.resistanceK, "Ω");
    case ResistanceRef:
        return f.resistanceRefOhm ? withU(true, *f.resistanceRefOhm, f.resistanceRefUOhm, f.resistanceRefK, "Ω")
                                  : tr("no temperature");
    case NoLoadVoltage: return withU(f.ok, f.noLoadVoltageV, f.noLoadVoltageUV, f.noLoadVoltageK, "V");
    case Regulation:
        return f.regulationPercent ? withU(true, *f.regulationPercent, f.regulationUPercent, f.regulationK, "%")
                                   : QStringLiteral("—");
    case EfficiencyAtRated: return primaryText(row.efficiencyAtRated(), "%");
    case NoLoadLoss: return primaryText(row.noLoadLoss(), "W");
    case Verdict: return f.ok ? text(row.verdictWords()) : text(f.message);
    case Rule: return text(toString(f.rule));
    case SafetyStops: return static_cast<int>(row.safetyStops.size());
    case Review: {
        if (row.seal.state == SealState::ChangedAfterSignOff || row.seal.state == SealState::Altered)
            return text(row.reviewState());
        if (row.signOffs.empty())
            return tr("unreviewed");
        const SignOffRecord &last = row.signOffs.back();
        return tr("%1 by %2").arg(text(toString(last.decision)), text(last.reviewer));
    }
    case LabSheet: return row.supervision.labSheet ? text(row.supervision.labSheet->title) : QString();
    case LimitHits: return row.supervision.labSheet ? QVariant(static_cast<int>(row.supervision.limitHits.size())) : QVariant();
    case RobustZ: {
        const auto &z = m_stats.robustZ;
        if (static_cast<std::size_t>(rowIndex) >= z.size() || !z[static_cast<std::size_t>(rowIndex)])
            return QStringLiteral("—");
        const QString value = QString::number(*z[static_cast<std::size_t>(rowIndex)], 'f', 2);
        if (!isFarFromBatch(rowIndex))
            return value;
        // Screening only by the row's own design's count (the CLI, CSV and PDF say the same).
        const DesignStatistics *design = m_stats.designOfRow(static_cast<std::size_t>(rowIndex));
        return !design || design->screeningOnly ? tr("%1  ▲ far from batch (screening only)").arg(value)
                                                : tr("%1  ▲ far from batch").arg(value);
    }
    default: return {};
    }
}

QVariant ReviewTableModel::sortValue(const SessionRow &row, int rowIndex, int column) const
{
    const SessionFigures &f = row.figures;
    if (!row.opened && column != File)
        return {}; // unreadable rows sort last, whichever the order
    switch (column) {
    case Points: return static_cast<qulonglong>(row.pointsUsed);
    case Resistance: return number(row.opened && f.ok, f.resistanceOhm);
    case ResistanceRef: return number(row.opened && f.resistanceRefOhm.has_value(), f.resistanceRefOhm.value_or(0.0));
    case NoLoadVoltage: return number(row.opened && f.ok, f.noLoadVoltageV);
    case Regulation: return number(row.opened && f.regulationPercent.has_value(), f.regulationPercent.value_or(0.0));
    case EfficiencyAtRated: return primaryNumber(row.efficiencyAtRated());
    case NoLoadLoss: return primaryNumber(row.noLoadLoss());
    case SafetyStops: return static_cast<int>(row.safetyStops.size());
    case LimitHits: return static_cast<int>(row.supervision.limitHits.size());
    case RobustZ: {
        const auto &z = m_stats.robustZ;
        if (static_cast<std::size_t>(rowIndex) < z.size() && z[static_cast<std::size_t>(rowIndex)])
            return *z[static_cast<std::size_t>(rowIndex)];
        return {};
    }
    default: return display(row, rowIndex, column);
    }
}

QVariant ReviewTableModel::data(const QModelIndex &index, int role) const
{
    if (!index.isValid() || index.row() >= rowCount())
        return {};
    const SessionRow &row = m_rows[static_cast<std::size_t>(index.row())];
    switch (role) {
    case Qt::DisplayRole: return display(row, index.row(), index.column());
    case SortRole: return sortValue(row, index.row(), index.column());
    case VerdictRole:
        return !row.opened                  ? QStringLiteral("unreadable")
               : !row.progress.isComplete() ? QStringLiteral("incomplete")
                                            : text(row.figures.verdictText());
    case DateRole: return QDate::fromString(text(row.createdUtc.substr(0, 10)), Qt::ISODate);
    case Qt::TextAlignmentRole: {
        const int c = index.column();
        const bool numeric = c == Points || c == Resistance || c == ResistanceRef || c == NoLoadVoltage
                             || c == Regulation || c == EfficiencyAtRated || c == NoLoadLoss || c == SafetyStops || c == LimitHits || c == RobustZ;
        return QVariant::fromValue(Qt::Alignment((numeric ? Qt::AlignRight : Qt::AlignLeft) | Qt::AlignVCenter));
    }
    case Qt::ToolTipRole:
        if (!row.opened)
            return text(row.path + ": " + row.problem);
        if (index.column() == EfficiencyAtRated && !row.efficiencyAtRated())
            return primaryMissing(row, true);
        if (index.column() == NoLoadLoss && !row.noLoadLoss())
            return primaryMissing(row, false);
        if (!row.notice.empty())
            return text(row.notice);
        if (index.column() == File)
            return text(row.path);
        if (index.column() == Rule)
            return text(row.figures.ruleName);
        return {};
    case Qt::FontRole:
        if (index.column() == Verdict || (index.column() == RobustZ && isFarFromBatch(index.row()))) {
            QFont font;
            font.setBold(true);
            return font;
        }
        return {};
    case Qt::ForegroundRole:
        if (!row.opened)
            return QBrush(QPalette().color(QPalette::Disabled, QPalette::Text));
        return {};
    default: return {};
    }
}

} // namespace sagline
