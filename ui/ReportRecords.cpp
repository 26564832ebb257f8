// Charts, the readings table, and the records (exclusions, safety stops, notes, cautions,
// sign-off) of the session report.
#include "ReportChart.h"
#include "ReportCanvas.h"
#include "ReportReadingRows.h"
#include "ReportSections.h"
#include "ReportText.h"
#include "NoteText.h"
#include "OutlierFlagText.h"
#include "SessionSummary.h"

#include <QPainter>

#include <algorithm>
#include <cmath>

namespace sagline {

using namespace reporttext;

namespace {

// "9 (step 8)": the reading's number and its plan step, as the window shows them.
QString readingAndStep(const SessionSummary &summary, std::int64_t readingId)
{
    const std::size_t number = summary.readingNumber(readingId);
    if (number == 0)
        return QString::number(readingId);
    const int step = summary.readings[number - 1].step;
    return step >= 0 ? QStringLiteral("%1 (step %2)").arg(number).arg(step) : QString::number(number);
}

enum class PointRole { Used, Outlier, Excluded, NotFitted };

PointRole roleOf(const SessionSummary &summary, std::size_t row)
{
    const Reading &reading = summary.readings[row];
    const std::optional<PointFit> point = summary.fit.points.atRow(row);
    if (reading.excluded)
        return PointRole::Excluded;
    if (!point || !point->used)
        return PointRole::NotFitted;
    return point->outlier ? PointRole::Outlier : PointRole::Used;
}

ChartSpec voltageCurrentChart(const SessionSummary &summary)
{
    ChartSpec spec;
    spec.title = QStringLiteral("Secondary voltage against current");
    spec.xLabel = QStringLiteral("secondary current I (A)");
    spec.yLabel = QStringLiteral("secondary voltage V (V)");
    ChartSeriesPoints used{QStringLiteral("used in the fit"), ChartMarker::FilledCircle, {}};
    ChartSeriesPoints outliers{QStringLiteral("outlier"), ChartMarker::OpenSquare, {}};
    ChartSeriesPoints excluded{QStringLiteral("excluded"), ChartMarker::OpenCircleCross, {}};
    ChartSeriesPoints notFitted{QStringLiteral("not fitted (flagged)"), ChartMarker::OpenTriangle, {}};
    double low = 0.0, high = 0.0;
    for (std::size_t row = 0; row < summary.readings.size(); ++row) {
        const Reading &reading = summary.readings[row];
        if (!std::isfinite(reading.currentA) || !std::isfinite(reading.voltageV))
            continue;
        high = std::max(high, reading.currentA);
        low = std::min(low, reading.currentA);
        const QPointF point(reading.currentA, reading.voltageV);
        switch (roleOf(summary, row)) {
        case PointRole::Used: used.points.append(point); break;
        case PointRole::Outlier: outliers.points.append(point); break;
        case PointRole::Excluded: excluded.points.append(point); break;
        case PointRole::NotFitted: notFitted.points.append(point); break;
        }
    }
    if (summary.fit.ok() && high > low) {
        ChartBand band{QStringLiteral("95 % confidence band of the line"), {}, {}};
        constexpr int samples = 48;
        for (int i = 0; i <= samples; ++i) {
            const double current = low + (high - low) * i / samples;
            const LinePrediction prediction = predictVoltage(summary.fit, current);
            if (!prediction.confidence)
                continue;
            band.lower.append(QPointF(current, prediction.confidence->low));
            band.upper.append(QPointF(current, prediction.confidence->high));
        }
        const LinePrediction atTop = predictVoltage(summary.fit, high);
        if (atTop.confidence)
            band.legend += QStringLiteral(" (± %1 at %2)")
                               .arg(q(formatQuantity((atTop.confidence->high - atTop.confidence->low) / 2.0, "V", 2)),
                                    q(formatQuantity(high, "A", 3)));
        if (!band.lower.isEmpty())
            spec.bands.append(band);
        spec.lines.append({QStringLiteral("fitted line V = V0 − R·I"),
                           {QPointF(low, summary.fit.intercept + summary.fit.slope * low),
                            QPointF(high, summary.fit.intercept + summary.fit.slope * high)},
                           false,
                           1.0});
    }
    spec.series = {used, outliers, excluded, notFitted};
    return spec;
}

ChartSpec residualChart(const SessionSummary &summary)
{
    ChartSpec spec;
    spec.title = QStringLiteral("Residuals of the fit (measured − fitted)");
    spec.xLabel = QStringLiteral("secondary current I (A)");
    spec.yLabel = QStringLiteral("residual (mV)");
    spec.includeZeroY = true;
    ChartSeriesPoints used{QStringLiteral("used"), ChartMarker::FilledCircle, {}};
    ChartSeriesPoints outliers{QStringLiteral("outlier"), ChartMarker::OpenSquare, {}};
    ChartSeriesPoints excluded{QStringLiteral("excluded"), ChartMarker::OpenCircleCross, {}};
    double low = 0.0, high = 0.0;
    for (const PointFit &point : summary.fit.points) {
        if (point.row >= summary.readings.size())
            continue;
        const Reading &reading = summary.readings[point.row];
        if (!std::isfinite(reading.currentA) || !std::isfinite(point.residualV))
            continue;
        low = std::min(low, reading.currentA);
        high = std::max(high, reading.currentA);
        const QPointF at(reading.currentA, point.residualV * 1000.0);
        const PointRole role = roleOf(summary, point.row);
        (role == PointRole::Outlier ? outliers : role == PointRole::Excluded ? excluded : used).points.append(at);
    }
    spec.lines.append({QString(), {QPointF(low, 0.0), QPointF(high, 0.0)}, false, 0.8});
    if (summary.fit.residualSdV) {
        const double twoS = 2.0 * *summary.fit.residualSdV * 1000.0;
        spec.lines.append({QStringLiteral("± 2 × residual SD"), {QPointF(low, twoS), QPointF(high, twoS)}, true, 0.6});
        spec.lines.append({QString(), {QPointF(low, -twoS), QPointF(high, -twoS)}, true, 0.6});
    }
    spec.series = {used, outliers, excluded};
    return spec;
}

} // namespace

void drawCharts(ReportCanvas &canvas, const SessionSummary &summary)
{
    canvas.heading(QStringLiteral("Charts"));
    if (summary.readings.empty()) {
        canvas.paragraph(QStringLiteral("No readings were recorded."));
        return;
    }
    const QRectF top = canvas.takeBlock(250.0);
    drawChart(canvas.painter(), top, canvas.toDevice(1.0), voltageCurrentChart(summary));
    canvas.skip(8.0);
    if (summary.fit.ok()) {
        const QRectF bottom = canvas.takeBlock(170.0);
        drawChart(canvas.painter(), bottom, canvas.toDevice(1.0), residualChart(summary));
    }
}

void drawReadingsTable(ReportCanvas &canvas, const SessionSummary &summary)
{
    canvas.heading(QStringLiteral("Readings"));
    const ReadingRowSelection selection = selectReportRows(summary);
    const ReadingRowLimits limits;
    if (!selection.complete())
        canvas.paragraph(QStringLiteral("%1 readings: the first %2, the last %3 and every excluded, flagged, outlier or "
                                        "not fitted reading are printed (up to %4 of those).")
                             .arg(summary.readings.size())
                             .arg(limits.head)
                             .arg(limits.tail)
                             .arg(limits.maxNoteworthy),
                         8.0);
    QList<QStringList> rows;
    std::size_t previous = 0;
    for (const std::size_t row : selection.rows) {
        if (row > previous + 1 || (rows.isEmpty() && row > 0)) {
            const std::size_t gap = rows.isEmpty() ? row : row - previous - 1;
            rows.append({QStringLiteral("…"), QString(), QString(), QString(), QString(), QString(), QString(), QString(),
                         QString(), QString(), QStringLiteral("%1 not printed").arg(gap)});
        }
        previous = row;
        const Reading &r = summary.readings[row];
        const std::optional<PointFit> point = summary.fit.points.atRow(row);
        QString status;
        switch (roleOf(summary, row)) {
        case PointRole::Used: status = QStringLiteral("used"); break;
        case PointRole::Outlier: status = QStringLiteral("used, outlier"); break;
        case PointRole::Excluded:
            if (const SupersessionRecord *retake = r.superseded ? summary.supersessionOf(r.id) : nullptr)
                status = QStringLiteral("superseded by reading %1: %2")
                             .arg(summary.readingNumber(retake->replacementId))
                             .arg(q(retake->reason));
            else
                status = QStringLiteral("excluded: ") + q(summary.exclusionReason(r.id));
            break;
        case PointRole::NotFitted: status = QStringLiteral("not fitted"); break;
        }
        const bool hasResidual = point.has_value() && summary.fit.ok() && std::isfinite(r.currentA);
        // Numbered as the window and sagline-cli number readings (from 1, in recording order).
        rows.append({QString::number(row + 1), r.step >= 0 ? QString::number(r.step) : QString(),
                     r.timeUtc.size() >= 19 ? q(r.timeUtc.substr(11, 8)) : q(r.timeUtc), fixed(r.currentA, 4),
                     fixed(r.uCurrentA, 5), fixed(r.voltageV, 4), fixed(r.uVoltageV, 4),
                     hasResidual ? fixed(point->residualV * 1000.0, 2) : QString(),
                     hasResidual && point->studentized ? fixed(*point->studentized, 2) : QString(), q(flagsToString(r.flags)),
                     status});
    }
    if (!selection.rows.empty() && selection.rows.back() + 1 < summary.readings.size())
        rows.append({QStringLiteral("…"), QString(), QString(), QString(), QString(), QString(), QString(), QString(), QString(),
                     QString(), QStringLiteral("%1 not printed").arg(summary.readings.size() - selection.rows.back() - 1)});
    const auto right = Qt::AlignRight;
    canvas.table({{QStringLiteral("#"), 0.05, right},
                  {QStringLiteral("Step"), 0.05, right},
                  {QStringLiteral("Time UTC"), 0.09},
                  {QStringLiteral("I (A)"), 0.08, right},
                  {QStringLiteral("u(I) (A)"), 0.08, right},
                  {QStringLiteral("V (V)"), 0.09, right},
                  {QStringLiteral("u(V) (V)"), 0.08, right},
                  {QStringLiteral("Resid. (mV)"), 0.09, right},
                  {QStringLiteral("Stud."), 0.06, right},
                  {QStringLiteral("Flags"), 0.11},
                  {QStringLiteral("Status"), 0.22}},
                 rows, 7.0);
    if (!selection.complete()) {
        QString omitted = QStringLiteral("… %1 readings not printed").arg(selection.notPrinted);
        if (selection.noteworthyNotPrinted > 0)
            omitted += QStringLiteral(" (%1 of them excluded, flagged, outliers or not fitted)").arg(selection.noteworthyNotPrinted);
        canvas.paragraph(omitted + QStringLiteral("; the full list is in the CSV export (sagline-cli export SESSION --csv "
                                                  "OUT.csv, or File, Export readings to CSV) and the session file."),
                         8.5, true);
    }
    canvas.paragraph(QStringLiteral("u(I), u(V): standard uncertainties of each reading. Stud.: externally studentized "
                                    "residual. ")
                         + q(outlierScreenFootnote(summary.fit)),
                     7.5, false, true);
}

void drawRecordsAndSignOff(ReportCanvas &canvas, const SessionSummary &summary)
{
    if (!summary.exclusions.empty()) {
        canvas.heading(QStringLiteral("Exclusion history"));
        QList<QStringList> rows;
        for (const ExclusionRecord &e : summary.exclusions)
            rows.append({readableUtc(e.timeUtc), readingAndStep(summary, e.readingId),
                         e.excluded ? QStringLiteral("excluded") : QStringLiteral("restored"), q(e.reason),
                         whoDid(e.author, e.osAccount)});
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("Reading (step)"), 0.11, Qt::AlignRight},
                      {QStringLiteral("Action"), 0.09}, {QStringLiteral("Reason"), 0.37}, {QStringLiteral("By"), 0.25}},
                     rows);
    }
    if (!summary.supersessions.empty()) {
        canvas.heading(QStringLiteral("Steps taken again"));
        QList<QStringList> rows;
        for (const SupersessionRecord &r : summary.supersessions)
            rows.append({readableUtc(r.timeUtc), readingAndStep(summary, r.readingId),
                         QString::number(summary.readingNumber(r.replacementId)), q(r.reason),
                         whoDid(r.actor.person, r.actor.osAccount)});
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("Reading (step)"), 0.11, Qt::AlignRight},
                      {QStringLiteral("Replaced by"), 0.09, Qt::AlignRight}, {QStringLiteral("Reason"), 0.37},
                      {QStringLiteral("By"), 0.25}},
                     rows);
    }
    if (!summary.sweepEvents.empty()) {
        canvas.heading(QStringLiteral("Course of the sweep"));
        QList<QStringList> rows;
        for (const SweepEventRecord &e : summary.sweepEvents)
            rows.append({readableUtc(e.timeUtc), q(toString(e.kind)), e.step >= 0 ? QString::number(e.step) : QString(),
                         q(e.detail), whoDid(e.actor.person, e.actor.osAccount)});
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("Event"), 0.13}, {QStringLiteral("Step"), 0.06, Qt::AlignRight},
                      {QStringLiteral("Detail"), 0.38}, {QStringLiteral("By"), 0.25}},
                     rows);
    }
    canvas.heading(QStringLiteral("Safety stops"));
    if (summary.safetyStops.empty()) {
        canvas.paragraph(QStringLiteral("No safety stop was recorded in this session."), 8.5);
    } else {
        QList<QStringList> rows;
        for (const SafetyStopRecord &s : summary.safetyStops)
            rows.append({readableUtc(s.timeUtc), s.step >= 0 ? QString::number(s.step) : QString(), q(s.rule),
                         q(s.message) + QStringLiteral(" (sweep run by %1)").arg(whoDid(s.actor.person, s.actor.osAccount)),
                         s.measured ? q(formatSignificant(*s.measured, 4)) : QString(),
                         s.limitValue ? q(formatSignificant(*s.limitValue, 4)) : QString()});
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("Step"), 0.06, Qt::AlignRight},
                      {QStringLiteral("Limit"), 0.14}, {QStringLiteral("What happened"), 0.42},
                      {QStringLiteral("Measured"), 0.1, Qt::AlignRight}, {QStringLiteral("Limit value"), 0.1, Qt::AlignRight}},
                     rows);
    }
    // The analysis-settings records as a table of their own, the other notes in words. Notes
    // are capped: a session may hold notes of any length and number (a 15 MB note once took a
    // report 46 s and 1 GB); the session file keeps them whole.
    constexpr qsizetype maxNotes = 300;
    constexpr int maxNoteCharacters = 2000;
    QList<QStringList> settingsRows;
    QList<QStringList> noteRows;
    qsizetype notesLeftOut = 0;
    for (const NoteRecord &n : summary.notes) {
        if (n.author == analysisSettingsNoteAuthor) {
            const AnalysisSettingsParse parsed = parseAnalysisSettings(n.text);
            if (parsed.settings) {
                const AnalysisSettings &a = *parsed.settings;
                settingsRows.append({readableUtc(n.timeUtc),
                                     a.regulationLimitPercent ? q(formatSignificant(*a.regulationLimitPercent, 4)) + " %"
                                                              : QStringLiteral("the nameplate's"),
                                     q(toString(a.rule)),
                                     a.referenceTemperatureC ? q(formatSignificant(*a.referenceTemperatureC, 4)) + " °C"
                                                             : QStringLiteral("default"),
                                     a.temperatureConstant ? q(toString(*a.temperatureConstant))
                                                           : QStringLiteral("per winding material"),
                                     whoDid(n.actor.person, n.actor.osAccount)});
                continue;
            }
        }
        if (noteRows.size() >= maxNotes) {
            ++notesLeftOut;
            continue;
        }
        noteRows.append({readableUtc(n.timeUtc),
                         shortened(noteAuthorName(n), 80)
                             + (n.actor.osAccount.empty() ? QString()
                                                          : QStringLiteral(" (account %1)").arg(shortened(n.actor.osAccount, 40))),
                         shortened(readableNoteText(n), maxNoteCharacters)});
    }
    if (!settingsRows.isEmpty()) {
        canvas.heading(QStringLiteral("Analysis settings recorded"));
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("Regulation limit"), 0.14},
                      {QStringLiteral("Decision rule"), 0.12}, {QStringLiteral("Reference temperature"), 0.14},
                      {QStringLiteral("Temperature constant"), 0.17}, {QStringLiteral("Set by"), 0.25}},
                     settingsRows);
    }
    if (!noteRows.isEmpty()) {
        canvas.heading(QStringLiteral("Notes"));
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("By"), 0.22}, {QStringLiteral("Note"), 0.6}}, noteRows);
        if (notesLeftOut > 0)
            canvas.paragraph(QStringLiteral("%1 more notes are in the session file and not printed here.").arg(notesLeftOut),
                             8.0, false, true);
    }
    canvas.heading(QStringLiteral("Cautions"));
    canvas.paragraph(QStringLiteral(
                         "The primary side of a transformer under test is at mains voltage, which can kill. Work only on a "
                         "fused, isolated supply and switch it off before touching any connection. Use meters and leads rated "
                         "for the measurement category and voltage of the circuit. Never exceed the transformer's rated VA or "
                         "the rheostat's or load's ratings. Fuse and protection figures are planning aids: local electrical "
                         "codes, the manufacturer's data and licensed practice decide."),
                     8.0);
    canvas.heading(QStringLiteral("Sign-off"));
    if (!summary.signOffs.empty()) {
        canvas.paragraph(q(summary.seal.summary()), 9.0, summary.seal.state != SealState::Signed);
        QList<QStringList> rows;
        for (const SignOffRecord &s : summary.signOffs)
            rows.append({readableUtc(s.timeUtc), whoDid(s.reviewer, s.osAccount), q(toString(s.decision)), q(s.comment),
                         s.digest.empty() ? QStringLiteral("none") : q(s.digest.substr(0, 12)) + QStringLiteral("…")});
        canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("Reviewer"), 0.24}, {QStringLiteral("Decision"), 0.1},
                      {QStringLiteral("Comment"), 0.33}, {QStringLiteral("SHA-256"), 0.15}},
                     rows);
        if (!summary.reopens.empty()) {
            QList<QStringList> reopened;
            for (const ReopenRecord &r : summary.reopens)
                reopened.append({readableUtc(r.timeUtc), whoDid(r.actor.person, r.actor.osAccount), q(r.reason)});
            canvas.paragraph(QStringLiteral("Reopened after sign-off (the sign-off before each is superseded):"), 8.5, true);
            canvas.table({{QStringLiteral("Time"), 0.18}, {QStringLiteral("By"), 0.3}, {QStringLiteral("Why"), 0.52}}, reopened);
        }
    }
    canvas.ensureSpace(100.0);
    canvas.signatureLines({QStringLiteral("Tested by (name, signature)"), QStringLiteral("Date")});
    canvas.signatureLines({QStringLiteral("Reviewed by (name, signature)"), QStringLiteral("Date")});
}

} // namespace sagline
