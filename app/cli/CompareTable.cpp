#include "CompareTable.h"

#include "ConformityDecision.h"
#include "NumberFormat.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

namespace sagline::cli {

namespace {

constexpr double absent = std::numeric_limits<double>::quiet_NaN();

// Display width of UTF-8 text: one column per code point (enough for Ω, ±, °).
std::size_t displayWidth(const std::string &text)
{
    std::size_t width = 0;
    for (unsigned char c : text)
        width += (c & 0xC0) != 0x80 ? 1 : 0;
    return width;
}

std::string pad(const std::string &text, std::size_t width, bool right = false)
{
    const std::size_t w = displayWidth(text);
    const std::string fill(w < width ? width - w : 0, ' ');
    return right ? fill + text : text + fill;
}

// "1.952 ± 0.023": U to two significant digits, the value to the same decimal place (GUM 7.2.6).
// Absent values are NaN here (value_or), which also spares GCC 12 a false "maybe uninitialized".
std::string withUncertainty(double value, double expanded)
{
    if (!std::isfinite(value))
        return "n/a";
    if (!std::isfinite(expanded) || expanded <= 0.0)
        return formatSignificant(value, 4);
    const int magnitude = static_cast<int>(std::floor(std::log10(expanded)));
    const int decimals = std::max(0, std::min(9, 1 - magnitude));
    return formatFixed(value, decimals) + " ± " + formatFixed(expanded, decimals);
}

// "75", "72.5": a temperature as typed, without padding zeros.
std::string plainNumber(double value)
{
    std::string text = formatSignificant(value, 4);
    if (text.find('.') != std::string::npos) {
        while (text.back() == '0')
            text.pop_back();
        if (text.back() == '.')
            text.pop_back();
    }
    return text;
}

// The file's own name: the folder is the same for most rows and would push the table wide.
std::string fileName(const std::string &path)
{
    const auto slash = path.find_last_of('/');
    return slash == std::string::npos ? path : path.substr(slash + 1);
}

// "2026-12-01 09:00:05" from "2026-12-01T09:00:05.000Z"; other text unchanged.
std::string startedText(const std::string &utc)
{
    if (utc.size() < 19 || utc[10] != 'T')
        return utc;
    return utc.substr(0, 10) + " " + utc.substr(11, 8);
}

// Where the unit lies against its design's control limits: "above", "below" or "".
std::string chartMark(const DesignStatistics &group, std::size_t rowIndex, const std::vector<SessionRow> &rows,
                      bool atReference)
{
    const IndividualsChart &chart = group.chart;
    if (!chart.hasLimits())
        return {};
    const auto r = rows[rowIndex].comparedResistanceOhm(atReference);
    if (!r)
        return {};
    if (*r > *chart.upper)
        return "above UCL";
    if (*r < *chart.lower)
        return "below LCL";
    return {};
}

void printSection(const DesignStatistics &group, const std::vector<SessionRow> &rows, const BatchStatistics &stats,
                  const ComparisonOptions &options, std::ostream &out)
{
    const std::string refTitle = "R at " + plainNumber(options.figures.referenceTemperatureC) + " °C (Ω)";
    const std::vector<std::string> titles = {"file",   "started (UTC)",  "unit",    "operator", "points",
                                             "R (Ω)",  refTitle,         "V0 (V)",  "regulation (%)",
                                             "verdict", "stops", "reviewer's decision", "z", "control chart"};
    std::vector<std::vector<std::string>> cells;
    for (std::size_t i : group.rows) {
        const SessionRow &row = rows[i];
        const SessionFigures &f = row.figures;
        const double r = f.ok ? f.resistanceOhm : absent;
        const double v0 = f.ok ? f.noLoadVoltageV : absent;
        const double z = stats.robustZ[i].value_or(absent);
        const std::string far = stats.isFarFromBatch(i) ? (group.screeningOnly ? " far (screening only)" : " FAR") : "";
        cells.push_back({fileName(row.path), startedText(row.createdUtc), row.unitSerial, row.operatorName,
                         std::to_string(row.pointsUsed) + "/" + std::to_string(row.readingCount),
                         withUncertainty(r, f.resistanceUOhm.value_or(absent)),
                         withUncertainty(f.resistanceRefOhm.value_or(absent), f.resistanceRefUOhm.value_or(absent)),
                         withUncertainty(v0, f.noLoadVoltageUV.value_or(absent)),
                         withUncertainty(f.regulationPercent.value_or(absent), f.regulationUPercent.value_or(absent)),
                         row.verdictWords(), std::to_string(row.safetyStops.size()), row.reviewState(),
                         (std::isfinite(z) ? formatFixed(z, 2) : std::string("n/a")) + far,
                         chartMark(group, i, rows, stats.atReferenceTemperature)});
    }
    std::vector<std::size_t> widths(titles.size());
    for (std::size_t c = 0; c < titles.size(); ++c) {
        widths[c] = displayWidth(titles[c]);
        for (const auto &line : cells)
            widths[c] = std::max(widths[c], displayWidth(line[c]));
    }
    auto printLine = [&](const std::vector<std::string> &line) {
        std::string text;
        for (std::size_t c = 0; c < line.size(); ++c)
            text += (c ? "  " : "") + pad(line[c], widths[c], c >= 4 && c <= 8);
        while (!text.empty() && text.back() == ' ')
            text.pop_back();
        out << text << '\n';
    };
    out << "Design: " << group.design << " (" << group.rows.size() << " session" << (group.rows.size() == 1 ? "" : "s")
        << ")\n";
    printLine(titles);
    for (const auto &line : cells)
        printLine(line);

    const std::string basis = stats.atReferenceTemperature
                                  ? "at " + plainNumber(options.figures.referenceTemperatureC) + " °C"
                                  : "as measured (not every session has a winding temperature)";
    if (group.meanOhm) {
        out << "  R " << basis << ": mean " << formatQuantity(*group.meanOhm, "Ω");
        if (group.sdOhm)
            out << ", standard deviation " << formatQuantity(*group.sdOhm, "Ω");
        out << ", median " << formatQuantity(*group.medianOhm, "Ω") << ", range " << formatQuantity(*group.minOhm, "Ω")
            << " to " << formatQuantity(*group.maxOhm, "Ω") << " (" << unitsInStatisticsText(group) << ")\n";
    }
    out << "  Far from the batch (this design only): " << group.ruleNote << '\n';
    const IndividualsChart &chart = group.chart;
    if (chart.hasLimits()) {
        out << "  Control chart: centre " << formatQuantity(*chart.centre, "Ω") << ", limits "
            << formatQuantity(*chart.lower, "Ω") << " to " << formatQuantity(*chart.upper, "Ω") << " (σ "
            << formatQuantity(*chart.sigma, "Ω") << " = average moving range " << formatQuantity(*chart.averageMovingRange, "Ω")
            << " / 1.128); " << chart.outside.size() << " outside" << (chart.preliminary ? "; preliminary (fewer than 20 units)" : "")
            << '\n';
    } else {
        out << "  Control chart: " << chart.note << '\n';
    }
}

} // namespace

void printComparison(const std::vector<SessionRow> &rows, const BatchStatistics &stats, const ComparisonOptions &options,
                     std::ostream &out)
{
    for (std::size_t g = 0; g < stats.designs.size(); ++g) {
        if (g)
            out << '\n';
        printSection(stats.designs[g], rows, stats, options, out);
    }
    out << "\nBatch: " << stats.sessions << " sessions, " << stats.designs.size() << " design"
        << (stats.designs.size() == 1 ? "" : "s") << ", " << stats.unreadable << " unreadable, " << stats.withoutFit
        << " without a fit";
    if (stats.designs.size() > 1)
        out << "; statistics are per design, never across designs";
    out << '\n';
    // Sessions judged by their own recorded rule may differ; then the table's rule column says which.
    std::string ruleName;
    for (const auto &row : rows) {
        if (!row.opened)
            continue;
        if (ruleName.empty())
            ruleName = row.figures.ruleName;
        else if (ruleName != row.figures.ruleName)
            ruleName = "each session's recorded rule";
    }
    out << "  Verdicts against each session's specification ("
        << (ruleName.empty() ? toString(options.figures.rule) : ruleName) << "):\n    " << verdictCountsText(stats) << '\n';
    out << "  Reviewer's decisions: accepted " << stats.accepted << ", rejected " << stats.rejected << ", retest "
        << stats.retest << ", unreviewed " << stats.notReviewed << ", changed after sign-off "
        << stats.changedAfterSignOff << '\n';
    out << "  Safety stops in " << stats.safetyStopped << " sessions; incomplete sessions " << stats.incomplete
        << "; lab-sheet limit hit in " << stats.limitHit << '\n';
    out << "  Fit: " << toString(options.method) << "; U: expanded uncertainties at 95 % coverage, k from each result's "
        << "own budget (GUM G.4)\n";
}

} // namespace sagline::cli
