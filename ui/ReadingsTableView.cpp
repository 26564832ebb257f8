#include "ReadingsTableView.h"

#include "ReadingsTableModel.h"

#include <QHeaderView>
#include <QStyle>
#include <QTableView>

#include <algorithm>

namespace sagline {

void setUpReadingsTable(QTableView *view, ReadingsTableModel *model)
{
    view->setModel(model);
    view->setSelectionBehavior(QAbstractItemView::SelectRows);
    view->setSelectionMode(QAbstractItemView::SingleSelection);
    view->setEditTriggers(QAbstractItemView::NoEditTriggers);
    // Row headers are the readings' numbers, as the report, the export and sagline-cli count them.
    view->verticalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    view->verticalHeader()->setDefaultSectionSize(view->fontMetrics().height() + 6);
    view->horizontalHeader()->setStretchLastSection(true);
    view->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    view->setTextElideMode(Qt::ElideRight); // a long remark ends in "…"; its tooltip has it whole
    view->setAccessibleName(QObject::tr("Readings"));

    const QFontMetrics metrics = view->fontMetrics();
    const int padding = metrics.horizontalAdvance(QStringLiteral("MM"));
    const auto widthOf = [&](const QString &sample, int column) {
        const QString header = model->headerData(column, Qt::Horizontal).toString();
        return std::max(metrics.horizontalAdvance(sample), metrics.horizontalAdvance(header)) + padding;
    };
    auto *header = view->horizontalHeader();
    header->resizeSection(ReadingsTableModel::Step, widthOf(QStringLiteral("99"), ReadingsTableModel::Step));
    header->resizeSection(ReadingsTableModel::Time, widthOf(QStringLiteral("00:00:00"), ReadingsTableModel::Time));
    header->resizeSection(ReadingsTableModel::Current, widthOf(QStringLiteral("10.0000 A"), ReadingsTableModel::Current));
    header->resizeSection(ReadingsTableModel::Voltage, widthOf(QStringLiteral("250.000 V"), ReadingsTableModel::Voltage));
    header->resizeSection(ReadingsTableModel::Residual, widthOf(QStringLiteral("−12.3 mV"), ReadingsTableModel::Residual));
    for (const int column : {ReadingsTableModel::Flags, ReadingsTableModel::Excluded, ReadingsTableModel::Note})
        view->setColumnHidden(column, true); // shown joined, in Remarks
}

int readingsTableMinimumWidth(const QTableView *view)
{
    const QFontMetrics metrics = view->fontMetrics();
    int width = 2 * view->frameWidth() + view->style()->pixelMetric(QStyle::PM_ScrollBarExtent)
                + metrics.horizontalAdvance(QStringLiteral("999999")) + 12;
    for (int column = ReadingsTableModel::Step; column <= ReadingsTableModel::Residual; ++column)
        width += view->horizontalHeader()->sectionSize(column);
    return width + metrics.horizontalAdvance(QStringLiteral("▲ outlier")) + metrics.horizontalAdvance(QStringLiteral("MM"));
}

} // namespace sagline
