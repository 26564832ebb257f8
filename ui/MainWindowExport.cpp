// MainWindow: exports of the open session: the readings CSV (core's SessionExport) and the
// printed test report (ReportWriter), both from what the session file holds.
#include "MainWindow.h"

#include "BuildInfo.h"
#include "OutputFile.h"
#include "ReportWriter.h"
#include "SessionExport.h"
#include "SessionStore.h"
#include "SessionSummary.h"
#include "SetupForm.h"
#include "SweepWorkspace.h"
#include "TypedValue.h"
#include "Units.h"

#include <QDateTime>
#include <QFileDialog>
#include <QFileInfo>

namespace sagline {

namespace {

QString suggestedPath(const QString &sessionPath, const QString &suffix)
{
    const QFileInfo info(sessionPath);
    return info.dir().filePath(info.completeBaseName() + suffix);
}

} // namespace

void MainWindow::exportCsv()
{
    SessionStore *store = m_workspace->store();
    if (!store) {
        showMessage(tr("No session is open."), true);
        return;
    }
    const QString path = QFileDialog::getSaveFileName(this, tr("Export readings"), suggestedPath(m_workspace->sessionPath(), QStringLiteral(".csv")),
                                                      tr("CSV files (*.csv)"));
    if (path.isEmpty())
        return;
    const auto readings = store->readings();
    if (!readings.ok()) {
        showMessage(QString::fromStdString(readings.message), true);
        return;
    }
    if (const QString problem = writeOutputFile(path, QByteArray::fromStdString(readingsToCsv(readings.value)));
        !problem.isEmpty()) {
        showMessage(problem, true);
        return;
    }
    showMessage(tr("%n reading(s) exported to %1", nullptr, static_cast<int>(readings.value.size())).arg(path));
}

void MainWindow::reportPdf()
{
    SessionStore *store = m_workspace->store();
    if (!store) {
        showMessage(tr("No session is open."), true);
        return;
    }
    const QString path = QFileDialog::getSaveFileName(this, tr("Report to PDF"), suggestedPath(m_workspace->sessionPath(), QStringLiteral(".pdf")),
                                                      tr("PDF files (*.pdf)"));
    if (path.isEmpty())
        return;
    const QString error = writeReport(path);
    showMessage(error.isEmpty() ? tr("Report written to %1").arg(path) : error, !error.isEmpty());
}

QString MainWindow::writeReport(const QString &pdfPath)
{
    SessionStore *store = m_workspace->store();
    if (!store)
        return tr("No session is open.");
    // The report judges the results as the window does.
    const VerdictSettings verdict = m_setupForm->verdictSettings();
    ReviewOptions options;
    options.rule = verdict.rule;
    options.regulationLimit = typedRegulationLimit(verdict.regulationLimit);
    options.referenceTemperatureC = typedQuantity(verdict.referenceTemperature, Unit::Celsius);
    options.temperatureConstant = verdict.constant;
    const auto summary = summarizeSession(*store, options);
    if (!summary.ok())
        return QString::fromStdString(summary.message);
    ReportOptions report;
    report.producedBy = QStringLiteral("sagline ") + QString::fromLatin1(buildinfo::version);
    report.generatedUtc = QDateTime::currentDateTimeUtc().toString(Qt::ISODateWithMs);
    return writeSessionReport(summary.value, pdfPath, report);
}

} // namespace sagline
