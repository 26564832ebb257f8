// MainWindow: exports of the open session (readings CSV, PDF report).
#include "MainWindow.h"

namespace sagline {

void MainWindow::exportCsv() { showMessage(tr("CSV export: waiting for the session export in core."), true); }

void MainWindow::reportPdf() { showMessage(tr("PDF report: waiting for the report renderer."), true); }

} // namespace sagline
