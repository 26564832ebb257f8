// The sections of the session report, each drawn onto the page flow in order, and the PDF page
// set-up that every report (one session, or a review of several) shares.
#pragma once

class QPdfWriter;

namespace sagline {

class ReportCanvas;
struct ReportOptions;
struct SessionSummary;

void drawTitleBlock(ReportCanvas &canvas, const SessionSummary &summary, const ReportOptions &options);
void drawNameplateAndPlan(ReportCanvas &canvas, const SessionSummary &summary);
void drawResultsAndVerdict(ReportCanvas &canvas, const SessionSummary &summary);
// The supply, open-circuit quantities, efficiency and every step's loss balance (ReportPrimarySide.cpp).
void drawPrimarySide(ReportCanvas &canvas, const SessionSummary &summary);
void drawUncertaintyBudget(ReportCanvas &canvas, const SessionSummary &summary);
void drawCharts(ReportCanvas &canvas, const SessionSummary &summary);
void drawReadingsTable(ReportCanvas &canvas, const SessionSummary &summary);
void drawRecordsAndSignOff(ReportCanvas &canvas, const SessionSummary &summary);

// Every section above, in the printed order: one session's whole report.
void drawSessionReport(ReportCanvas &canvas, const SessionSummary &summary, const ReportOptions &options);

// Page size, margins, resolution and creator of a report PDF, set before painting begins.
void setUpReportPdf(QPdfWriter &writer, const ReportOptions &options);

} // namespace sagline
