// The printed test report of one session (PDF through Qt's own writer, A4 or Letter): title
// block, nameplate and plan, results with uncertainties, the verdict and its decision rule,
// the V–I and residual charts, the readings table, exclusions, safety stops, notes, cautions
// and sign-off lines. Everything shown is computed by core (SessionSummary); this only draws.
#pragma once

#include <QPageSize>
#include <QString>

namespace sagline {

struct SessionSummary;

struct ReportOptions {
    QPageSize::PageSizeId pageSize = QPageSize::A4; // A4 or Letter
    QString producedBy;                             // program and version for the footer
    QString generatedUtc;                           // when the report was made (ISO 8601 UTC)
};

// Writes the report to `pdfPath` (replacing it). Returns "" or the reason it failed.
// Needs a QGuiApplication (fonts); the offscreen platform is enough.
QString writeSessionReport(const SessionSummary &summary, const QString &pdfPath, const ReportOptions &options);

} // namespace sagline
