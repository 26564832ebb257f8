// The sections of the session report, each drawn onto the page flow in order.
#pragma once

namespace sagline {

class ReportCanvas;
struct ReportOptions;
struct SessionSummary;

void drawTitleBlock(ReportCanvas &canvas, const SessionSummary &summary, const ReportOptions &options);
void drawNameplateAndPlan(ReportCanvas &canvas, const SessionSummary &summary);
void drawResultsAndVerdict(ReportCanvas &canvas, const SessionSummary &summary);
void drawCharts(ReportCanvas &canvas, const SessionSummary &summary);
void drawReadingsTable(ReportCanvas &canvas, const SessionSummary &summary);
void drawRecordsAndSignOff(ReportCanvas &canvas, const SessionSummary &summary);

} // namespace sagline
