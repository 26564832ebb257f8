#include "PlanTableModel.h"

#include "UiFormat.h"

#include <QColor>

namespace sagline {

PlanTableModel::PlanTableModel(QObject *parent) : QAbstractTableModel(parent) {}

void PlanTableModel::setPlan(const std::optional<Plan> &plan)
{
    beginResetModel();
    m_steps = plan ? plan->steps : std::vector<PlanStep>{};
    endResetModel();
}

int PlanTableModel::rowCount(const QModelIndex &parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_steps.size());
}

int PlanTableModel::columnCount(const QModelIndex &parent) const { return parent.isValid() ? 0 : ColumnCount; }

QVariant PlanTableModel::data(const QModelIndex &index, int role) const
{
    if (!index.isValid() || index.row() >= rowCount())
        return {};
    const PlanStep &s = m_steps[static_cast<std::size_t>(index.row())];
    const bool rheostatBad = !s.rheostatOk;
    const bool fuseBad = s.fuseOutlook != FuseOutlook::Holds;
    const bool overVa = s.vaMargin < 0.0;
    if (role == Qt::TextAlignmentRole)
        return index.column() >= Rheostat ? int(Qt::AlignCenter) : int(Qt::AlignRight | Qt::AlignVCenter);
    if (role == Qt::ForegroundRole) {
        if ((index.column() == Rheostat && rheostatBad) || (index.column() == Fuse && fuseBad)
            || (index.column() == VaMargin && overVa))
            return QColor(0xd5, 0x5e, 0x00);
        return {};
    }
    if (role != Qt::DisplayRole)
        return {};
    switch (index.column()) {
    case Step: return s.index;
    case Current: return formatQuantity(s.currentA, Unit::Ampere);
    case Voltage: return formatQuantity(s.predictedVoltageV, Unit::Volt);
    case LoadResistance: return s.loadResistanceOhm ? formatQuantity(*s.loadResistanceOhm, Unit::Ohm) : tr("open");
    case LoadPower: return formatQuantity(s.loadPowerW, Unit::Watt, 3);
    case OutputVa: return formatQuantity(s.outputVa, Unit::VoltAmpere, 3);
    case CopperLoss: return formatQuantity(s.copperLossW, Unit::Watt, 3);
    case PrimaryCurrent: return formatQuantity(s.primaryCurrentA, Unit::Ampere, 3);
    case VaMargin: return formatQuantity(s.vaMargin, Unit::VoltAmpere, 3);
    // Words and symbols, not colour alone.
    case Rheostat: return rheostatBad ? tr("✖ over") : tr("✔ ok");
    case Fuse:
        switch (s.fuseOutlook) {
        case FuseOutlook::Holds: return tr("✔ holds");
        case FuseOutlook::MayOpen: return tr("▲ may open");
        case FuseOutlook::Opens: return tr("✖ opens");
        }
    }
    return {};
}

QVariant PlanTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole)
        return QAbstractTableModel::headerData(section, orientation, role);
    switch (section) {
    case Step: return tr("Step");
    case Current: return tr("Current");
    case Voltage: return tr("Expected V");
    case LoadResistance: return tr("Set load to");
    case LoadPower: return tr("Load power");
    case OutputVa: return tr("Output");
    case CopperLoss: return tr("Copper loss");
    case PrimaryCurrent: return tr("Primary I");
    case VaMargin: return tr("VA margin");
    case Rheostat: return tr("Rheostat");
    case Fuse: return tr("Fuse");
    }
    return {};
}

} // namespace sagline
