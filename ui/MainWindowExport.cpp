// MainWindow: exports of the open session: the readings CSV (core's SessionExport) and the
// printed test report (ReportWriter), both from what the session file holds.
#include "MainWindow.h"

#include "BuildInfo.h"
#include "OutputExtension.h"
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
#include <QFile>
#include <QDir>
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
    if (!m_workspace->store()) {
        showMessage(tr("No session is open."), true);
        return;
    }
    const QString path = m_savePathPrompt(tr("Export readings"), suggestedPath(m_workspace->sessionPath(), QStringLiteral(".csv")),
                                          tr("CSV files (*.csv)"));
    if (path.isEmpty())
        return;
    const QString problem = exportCsvTo(path);
    if (!problem.isEmpty())
        showMessage(problem, true);
}

QString MainWindow::exportCsvTo(const QString &requestedPath)
{
    SessionStore *store = m_workspace->store();
    if (!store)
        return tr("No session is open.");
    const OutputName name = outputNameFor(QFile::encodeName(requestedPath).toStdString(), "CSV", {"csv"});
    if (!name.ok())
        return QFile::decodeName(QByteArray::fromStdString(name.error));
    const QString path = QFile::decodeName(QByteArray::fromStdString(name.path));
    // The session's own export (as sagline-cli export writes it): every reading with who
    // recorded it, the exclusion reason and who excluded it, the retake's reason.
    const auto summary = summarizeSession(*store, reviewOptions());
    if (!summary.ok())
        return QString::fromStdString(summary.message);
    if (const QString problem = writeOutputFile(path, QByteArray::fromStdString(sessionReadingsToCsv(summary.value)));
        !problem.isEmpty())
        return problem;
    showMessage(tr("%n reading(s) exported to %1", nullptr, static_cast<int>(summary.value.readings.size())).arg(path));
    return {};
}

ReviewOptions MainWindow::reviewOptions() const
{
    // Exports and the report judge the results as the window does.
    const VerdictSettings verdict = m_setupForm->verdictSettings();
    ReviewOptions options;
    options.rule = verdict.rule;
    options.regulationLimit = typedRegulationLimit(verdict.regulationLimit);
    options.referenceTemperatureC = typedQuantity(verdict.referenceTemperature, Unit::Celsius);
    options.temperatureConstant = verdict.constant;
    return options;
}

void MainWindow::reportPdf()
{
    SessionStore *store = m_workspace->store();
    if (!store) {
        showMessage(tr("No session is open."), true);
        return;
    }
    const QString chosen = m_savePathPrompt(tr("Report to PDF"), suggestedPath(m_workspace->sessionPath(), QStringLiteral(".pdf")),
                                            tr("PDF files (*.pdf)"));
    if (chosen.isEmpty())
        return;
    const OutputName name = outputNameFor(QFile::encodeName(chosen).toStdString(), "PDF", {"pdf"});
    if (!name.ok()) {
        showMessage(QFile::decodeName(QByteArray::fromStdString(name.error)), true);
        return;
    }
    const QString path = QFile::decodeName(QByteArray::fromStdString(name.path));
    const QString error = writeReport(path);
    showMessage(error.isEmpty() ? tr("Report written to %1").arg(path) : error, !error.isEmpty());
}

QString MainWindow::writeReport(const QString &pdfPath)
{
    SessionStore *store = m_workspace->store();
    if (!store)
        return tr("No session is open.");
    const auto summary = summarizeSession(*store, reviewOptions());
    if (!summary.ok())
        return QString::fromStdString(summary.message);
    ReportOptions report;
    report.producedBy = QStringLiteral("sagline ") + QString::fromLatin1(buildinfo::version);
    report.generatedUtc = QDateTime::currentDateTimeUtc().toString(Qt::ISODateWithMs);
    return writeSessionReport(summary.value, pdfPath, report);
}

} // namespace sagline
