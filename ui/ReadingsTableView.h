// The readings table as the bench and the student's windows show it: one row per reading
// numbered from 1, fixed column widths (measuring rows would walk every row on each insert),
// and flags, exclusion and note joined in a last "Remarks" column that takes the rest of the
// width, so the table never needs a sideways scroll bar.
#pragma once

class QTableView;

namespace sagline {

class ReadingsTableModel;

void setUpReadingsTable(QTableView *view, ReadingsTableModel *model);

// The narrowest the table may be with every column readable (a six-digit reading number, its
// scroll bar, "▲ outlier" in Remarks): the minimum width of the column holding it.
int readingsTableMinimumWidth(const QTableView *view);

} // namespace sagline
