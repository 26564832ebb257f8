// The planned load steps (core's Plan) as a read-only table, every number with its unit.
#pragma once

#include "Planner.h"

#include <QAbstractTableModel>

namespace sagline {

class PlanTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column { Step, Current, Voltage, LoadResistance, LoadPower, OutputVa, CopperLoss, PrimaryCurrent,
                  VaMargin, Rheostat, Fuse, ColumnCount };

    explicit PlanTableModel(QObject *parent = nullptr);
    void setPlan(const std::optional<Plan> &plan);

    int rowCount(const QModelIndex &parent = {}) const override;
    int columnCount(const QModelIndex &parent = {}) const override;
    QVariant data(const QModelIndex &index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    std::vector<PlanStep> m_steps;
};

} // namespace sagline
