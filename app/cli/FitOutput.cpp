#include "FitOutput.h"

#include "AssessmentJson.h"
#include "BudgetTable.h"
#include "JsonNumberText.h"
#include "OutputText.h"
#include "NumberFormat.h"
#include "PrimarySideJson.h"
#include "UncertaintyFormat.h"
#include "WithheldVerdict.h"

#include <algorithm>
#include <functional>

namespace sagline::cli {

namespace {

nlohmann::json optionalNumber(const std::optional<double> &value)
{
    return value ? nlohmann::json(*value) : nlohmann::json(nullptr);
}

nlohmann::json uncertainJson(const UncertainValue &v)
{
    return {{"value", v.value},
            {"standard_uncertainty", optionalNumber(v.standardUncertainty)},
            {"expanded_uncertainty", optionalNumber(v.expandedUncertainty)},
            {"coverage_factor", optionalNumber(v.coverageFactor)}};
}

// Pads to `width` characters, counting UTF-8 code points (setw counts bytes: "R²" is 3).
std::size_t displayWidth(const std::string &text)
{
    std::size_t characters = 0;
    for (unsigned char c : text)
        characters += (c & 0xC0) != 0x80 ? 1 : 0;
    return characters;
}

std::string padRight(const std::string &text, std::size_t width)
{
    const std::size_t characters = displayWidth(text);
    return characters >= width ? text + ' ' : text + std::string(width - characters, ' ');
}

std::string rowLabel(std::size_t row, const std::vector<int> &lineNumbers)
{
    if (row < lineNumbers.size())
        return "line " + std::to_string(lineNumbers[row]);
    // A session's readings are numbered from 1, as the window, the report and
    // `exclude --reading N` number them.
    return "reading " + std::to_string(row + 1);
}

std::string methodTitle(FitMethod method)
{
    switch (method) {
    case FitMethod::Ols: return "ordinary least squares";
    case FitMethod::Wls: return "weighted least squares, w = 1/u(V)²";
    case FitMethod::York: return "York (2004), uncertainties in I and V";
    }
    return "";
}

// R and V0 with their budgets: from the analysis, or from the fit and the meters alone.
LineResults lineResultsOf(const FitReport &report)
{
    if (report.analysis)
        return {report.analysis->seriesResistanceOhm, report.analysis->noLoadVoltageV, report.analysis->uncertaintyBasis};
    return lineResults(report.fit, report.meters);
}

std::optional<Interval> seriesResistanceInterval(const FitReport &report)
{
    const UncertainValue r = lineResultsOf(report).seriesResistanceOhm;
    if (!r.expandedUncertainty)
        return std::nullopt;
    return Interval{r.value - *r.expandedUncertainty, r.value + *r.expandedUncertainty};
}

void printBudgetTable(const BudgetTable &table, std::ostream &out)
{
    out << "\n" << table.title << ": " << table.summary << '\n';
    std::vector<std::vector<std::string>> lines;
    lines.push_back(std::vector<std::string>(std::begin(budgetColumnTitles), std::end(budgetColumnTitles)));
    for (const BudgetTableRow &row : table.rows)
        lines.push_back({row.source, row.type, row.distribution, row.standardUncertainty, row.sensitivity,
                         row.contribution, row.degreesOfFreedom});
    std::vector<std::size_t> widths(lines.front().size(), 0);
    for (const auto &line : lines)
        for (std::size_t c = 0; c < line.size(); ++c)
            widths[c] = std::max(widths[c], displayWidth(line[c]));
    for (const auto &line : lines) {
        std::string text = "  ";
        for (std::size_t c = 0; c < line.size(); ++c)
            text += padRight(line[c], c + 1 < line.size() ? widths[c] + 1 : 0);
        while (!text.empty() && text.back() == ' ')
            text.pop_back();
        out << text << '\n';
    }
}

void printAnalysis(const FitReport &report, const std::function<void(const std::string &, const std::string &)> &row,
                   std::ostream &out)
{
    const AnalysisResult &a = *report.analysis;
    out << "\nAt rated secondary current (from the nameplate):\n";
    row("Full-load voltage", valueWithExpandedUncertainty(a.fullLoadVoltageV, "V"));
    row("Regulation", valueWithExpandedUncertainty(a.regulationPercent, "%") + ", of the "
                          + toString(a.regulationBase) + " voltage");
    row("Copper loss I²R", valueWithExpandedUncertainty(a.copperLossW, "W"));
    if (a.primaryResistanceOhm)
        row("R referred to primary", valueWithExpandedUncertainty(*a.primaryResistanceOhm, "Ω") + " (a²·R)");
    if (a.referenceResistanceOhm && a.temperatureCorrection && a.referenceTemperatureC) {
        out << "\nAt the reference temperature " << formatSignificant(*a.referenceTemperatureC, 3) << " °C (R × "
            << formatSignificant(a.temperatureCorrection->factor, 5) << ", V0 unchanged; "
            << a.temperatureCorrection->convention << "):\n";
        row("Series resistance R", valueWithExpandedUncertainty(*a.referenceResistanceOhm, "Ω"));
        if (a.referredFullLoadVoltageV)
            row("Full-load voltage", valueWithExpandedUncertainty(*a.referredFullLoadVoltageV, "V"));
        if (a.referredRegulationPercent)
            row("Regulation", valueWithExpandedUncertainty(*a.referredRegulationPercent, "%"));
        if (a.referredCopperLossW)
            row("Copper loss I²R", valueWithExpandedUncertainty(*a.referredCopperLossW, "W"));
    }
}

void printPrimarySide(const FitReport &report, const std::function<void(const std::string &, const std::string &)> &row,
                      std::ostream &out)
{
    out << "\nPrimary side and supply:\n";
    row("Supply", report.supply->statement);
    if (!report.primarySide)
        return;
    const PrimarySideResult &p = *report.primarySide;
    const auto show = [&](const std::string &label, const std::optional<UncertainValue> &v, const std::string &unit,
                          const std::string &after = "") {
        if (v)
            row(label, valueWithExpandedUncertainty(*v, unit) + after);
    };
    if (p.openCircuit) {
        const OpenCircuitResult &oc = *p.openCircuit;
        show("No-load loss P0", oc.noLoadLossW, "W", " (at the rated primary voltage)");
        show("No-load current I0", oc.noLoadCurrentA, "A");
        show("I0 of rated primary", oc.noLoadCurrentPercent, "%");
        show("No-load power factor", oc.noLoadPowerFactor, "");
        show("Core-loss resistance", oc.coreLossResistanceOhm, "Ω", " (Rc = V1²/P0, primary side)");
        show("Magnetizing reactance", oc.magnetizingReactanceOhm, "Ω", " (Xm = V1²/Q0, primary side)");
    }
    show("Efficiency at rated", p.efficiencyAtRatedPercent, "%");
    show("Peak efficiency", p.maxEfficiencyPercent, "%");
    show("... at current", p.maxEfficiencyCurrentA, "A", " (copper loss = core loss, I = sqrt(P0/R))");
    show("Series reactance X", p.seriesReactanceOhm, "Ω",
         p.seriesReactanceResolved ? " (referred to the secondary)" : " (not resolved by the meters)");
    show("Regulation at pf " + formatSignificant(p.regulationPowerFactor, 2) + (p.leading ? " lead" : " lag"),
         p.regulationAtPowerFactorPercent, "%", " (ΔV ≈ I(R cos φ ± X sin φ))");
    if (!p.steps.empty()) {
        out << "  Losses per step (W; η in %, U at 95 %):\n";
        out << "    " << padRight("I2 (A)", 9) << padRight("P1", 9) << padRight("P2", 9) << padRight("core", 8)
            << padRight("copper", 8) << padRight("rest", 8) << "η\n";
        for (const StepLosses &s : p.steps) {
            out << "    " << padRight(formatSignificant(s.currentA, 4), 9) << padRight(formatSignificant(s.inputPowerW.value, 4), 9)
                << padRight(formatSignificant(s.outputPowerW.value, 4), 9) << padRight(formatSignificant(s.coreLossW.value, 3), 8)
                << padRight(s.copperLossW ? formatSignificant(s.copperLossW->value, 3) : "-", 8)
                << padRight(s.remainderW ? formatSignificant(s.remainderW->value, 2) : "-", 8)
                << valueWithExpandedUncertainty(s.efficiencyPercent, "") << '\n';
        }
    }
    for (const std::string &note : p.notes)
        row("Note", note);
}

void printVerdict(const SpecificationVerdict &v, const std::optional<SessionProgress> &progress,
                  const std::function<void(const std::string &, const std::string &)> &row)
{
    // With no limit nothing was judged, at any temperature (the window and the report say the same).
    const std::string where = v.limits.empty()           ? ""
                              : v.atReferenceTemperature ? " (judged at the reference temperature)"
                                                         : " (judged as measured)";
    // An incomplete session has no verdict (core/WithheldVerdict): what its partial data gave
    // follows, labelled, never on the Verdict line.
    const bool withheld = progress && !progress->isComplete();
    if (withheld) {
        row("Verdict", withheldVerdictHeadline(*progress));
        row("", "For information only, " + partialDataWords(*progress) + where + ": " + withLowerFirstLetter(v.explanation));
    } else {
        row("Verdict", outcomeWords(v.outcome) + where);
        row("", v.explanation);
    }
    for (const ConformityDecision &d : v.limits) {
        // No outcome word for a withheld verdict: each line says what the partial data show.
        std::string line = !d.ok ? d.error : withheld ? d.explanation : outcomeWords(d.outcome) + ": " + d.explanation;
        if (d.conformanceProbability)
            line += " Probability of conformity " + conformanceProbabilityText(*d.conformanceProbability) + ".";
        row("", line);
    }
    row("Decision rule", v.ruleName);
    row("Limits from", v.limitsSource);
}

// One entry of "points" as the tree holds it (keys in the tree's order: alphabetical).
nlohmann::json pointJson(const PointFit &p, const std::vector<int> &lineNumbers)
{
    nlohmann::json point = {{"row", p.row},
                            {"used", p.used},
                            {"residual_v", p.residualV},
                            {"studentized", optionalNumber(p.studentized)},
                            {"screening_statistic", optionalNumber(p.screeningStatistic)},
                            {"outlier", p.outlier}};
    if (p.row < lineNumbers.size())
        point["line"] = lineNumbers[p.row];
    return point;
}

nlohmann::json pointsJson(const FitReport &report)
{
    nlohmann::json points = nlohmann::json::array();
    for (const PointFit &p : report.fit.points)
        points.push_back(pointJson(p, report.lineNumbers));
    return points;
}

// The same entry as text, as dump(2) writes it one level down ("points" is a top-level key):
// members at 6 spaces, sorted by name like the tree's std::map.
void appendPointText(std::string &out, const PointFit &p, const std::vector<int> &lineNumbers)
{
    out += "    {\n";
    if (p.row < lineNumbers.size()) {
        out += "      \"line\": ";
        appendJsonInteger(out, lineNumbers[p.row]);
        out += ",\n";
    }
    out += "      \"outlier\": ";
    appendJsonBool(out, p.outlier);
    out += ",\n      \"residual_v\": ";
    appendJsonNumber(out, p.residualV);
    out += ",\n      \"row\": ";
    appendJsonUnsigned(out, p.row);
    out += ",\n      \"screening_statistic\": ";
    appendJsonNumber(out, p.screeningStatistic);
    out += ",\n      \"studentized\": ";
    appendJsonNumber(out, p.studentized);
    out += ",\n      \"used\": ";
    appendJsonBool(out, p.used);
    out += "\n    }";
}

} // namespace

std::vector<std::string> fitWarnings(const FitSummary &fit, const std::vector<int> &lineNumbers)
{
    std::vector<std::string> warnings;
    if (fit.curvatureP && *fit.curvatureP < 0.01)
        warnings.push_back("the V-I line bends (quadratic term p = " + formatSignificant(*fit.curvatureP, 2)
                           + "): core saturation or winding heating; the straight-line R is an average");
    for (std::size_t row : fit.outlierRows)
        warnings.push_back(rowLabel(row, lineNumbers) + " looks like an outlier (screening statistic "
                           + formatSignificant(*fit.points[row].screeningStatistic, 3) + " beyond "
                           + formatSignificant(*fit.outlierScreening.criticalValue, 3)
                           + "); check it, exclude it with a reason if it is wrong");
    if (fit.mswd && *fit.mswd > 3.0)
        warnings.push_back("the scatter is larger than the stated uncertainties (MSWD = " + formatSignificant(*fit.mswd, 3)
                           + "); uncertainties were enlarged by sqrt(MSWD)");
    if (fit.n < 4)
        warnings.push_back("fewer than 4 points: no curvature check");
    return warnings;
}

nlohmann::json fitReportJson(const FitReport &report, PointsInJson points)
{
    const FitSummary &f = report.fit;
    nlohmann::json j;
    j["source"] = report.source;
    j["status"] = toString(f.status);
    j["n"] = f.n;
    j["method"] = toString(f.method);
    j["slope"] = f.slope;
    j["intercept"] = f.intercept;
    j["series_resistance_ohm"] = f.seriesResistanceOhm();
    j["series_resistance_se_ohm"] = optionalNumber(f.slopeSe);
    j["no_load_voltage_v"] = f.noLoadVoltageV();
    j["no_load_voltage_se_v"] = optionalNumber(f.interceptSe);
    j["covariance_slope_intercept"] = optionalNumber(f.covariance);
    j["r_squared"] = optionalNumber(f.rSquared);
    j["residual_sd_v"] = optionalNumber(f.residualSdV);
    j["confidence"] = f.confidence;
    // One coverage everywhere: the 95 % interval of R is R ± U of its budget.
    const auto ci = seriesResistanceInterval(report);
    j["series_resistance_ci95_ohm"] = ci ? nlohmann::json::array({ci->low, ci->high}) : nlohmann::json(nullptr);
    j["outliers"] = f.outlierRows;
    j["outlier_screening"] = outlierScreeningJson(f.outlierScreening);
    j["curvature_p"] = optionalNumber(f.curvatureP);
    j["curvature_coefficient_v_per_a2"] = optionalNumber(f.curvatureCoefficient);
    if (f.method != FitMethod::Ols) {
        j["series_resistance_se_scaled_ohm"] = optionalNumber(f.slopeSeScaled);
        j["no_load_voltage_se_scaled_v"] = optionalNumber(f.interceptSeScaled);
        j["mswd"] = optionalNumber(f.mswd);
        j["chi_squared"] = optionalNumber(f.chiSquared);
    }
    if (f.method == FitMethod::York)
        j["iterations"] = f.iterations;
    if (points == PointsInJson::Tree)
        j["points"] = pointsJson(report);
    else if (points == PointsInJson::Placeholder)
        j["points"] = nlohmann::json::array(); // the place writeFitReportJson streams them into
    const LineResults line = lineResultsOf(report);
    j["uncertainty_basis"] = line.uncertaintyBasis;
    j["coverage_probability"] = coverageProbability;
    if (report.analysis) {
        const AnalysisResult &a = *report.analysis;
        nlohmann::json analysis = {{"coverage_probability", coverageProbability},
                                   {"full_load_voltage_v", uncertainJson(a.fullLoadVoltageV)},
                                   {"regulation_percent", uncertainJson(a.regulationPercent)},
                                   {"regulation_base", toString(a.regulationBase)},
                                   {"copper_loss_w", uncertainJson(a.copperLossW)}};
        analysis["series_resistance_primary_ohm"] =
            a.primaryResistanceOhm ? uncertainJson(*a.primaryResistanceOhm) : nlohmann::json(nullptr);
        analysis["series_resistance_reference_ohm"] =
            a.referenceResistanceOhm ? uncertainJson(*a.referenceResistanceOhm) : nlohmann::json(nullptr);
        if (a.temperatureCorrection)
            analysis["temperature_convention"] = a.temperatureCorrection->convention;
        analysis["reference_temperature_c"] = optionalNumber(a.referenceTemperatureC);
        j["analysis"] = analysis;
        j["results"] = resultsJson(a);
    } else {
        j["results"] = {{"series_resistance_ohm", uncertainValueJson(line.seriesResistanceOhm)},
                        {"no_load_voltage_v", uncertainValueJson(line.noLoadVoltageV)}};
    }
    addPrimaryResultsJson(j["results"], report.primarySide);
    if (report.supply)
        j["primary_side"] = primarySideJson(report.primarySide, *report.supply);
    if (report.progress)
        j["progress"] = progressJson<nlohmann::json>(*report.progress);
    if (report.verdict) {
        j["verdict"] = verdictJson(*report.verdict);
        if (report.progress)
            withholdVerdict(j["verdict"], *report.progress);
    }
    if (report.hasNameplate)
        j["settings_source"] = {{"rule", toString(report.ruleSource)},
                                {"regulation_limit", toString(report.regulationLimitSource)},
                                {"temperature_constant", toString(report.temperatureConstantSource)}};
    j["warnings"] = report.warnings;
    return j;
}

void printFitReport(const FitReport &report, std::ostream &out)
{
    const FitSummary &f = report.fit;
    const std::function<void(const std::string &, const std::string &)> row = [&](const std::string &label,
                                                                                  const std::string &text) {
        out << "  " << padRight(label, 24) << text << '\n';
    };
    const std::size_t total = f.points.size();
    const LineResults line = lineResultsOf(report);
    out << "Straight-line fit V = V0 - R·I of " << report.source << "\n"
        << "  " << methodTitle(f.method) << ", " << f.n << " of " << total << " readings used\n"
        << "  Uncertainties: " << line.uncertaintyBasis << "\n";
    if (report.progress && !report.progress->isComplete())
        out << "  Sweep: " << report.progress->label() << "\n";
    out << '\n';
    row("Series resistance R", valueWithExpandedUncertainty(line.seriesResistanceOhm, "Ω"));
    row("No-load voltage V0", valueWithExpandedUncertainty(line.noLoadVoltageV, "V"));
    if (f.mswd)
        row("MSWD", formatSignificant(*f.mswd, 3) + " (S/(n-2); near 1 when the stated uncertainties explain the scatter)");
    if (f.residualSdV)
        row("Residual SD", formatQuantity(*f.residualSdV, "V", 3));
    if (f.rSquared)
        row("R²", formatSignificant(*f.rSquared, 6));
    if (f.curvatureP)
        row("Curvature check", "p = " + formatSignificant(*f.curvatureP, 2) + " for a quadratic term"
                                   + (*f.curvatureP < 0.01 ? ": the line bends" : ": no sign of bending"));
    if (f.outlierScreening.screened) {
        std::string outliers = "none flagged";
        if (!f.outlierRows.empty()) {
            outliers.clear();
            for (std::size_t rowIndex : f.outlierRows)
                outliers += (outliers.empty() ? "flagged: " : ", ") + rowLabel(rowIndex, report.lineNumbers);
        }
        row("Outlier screen", outliers + " (shown, never applied)");
        row("", f.outlierScreening.rule + "; critical value " + formatSignificant(*f.outlierScreening.criticalValue, 4));
        row("", "source: " + f.outlierScreening.source);
    } else {
        row("Outlier screen", f.outlierScreening.reason);
    }

    if (report.analysis)
        printAnalysis(report, row, out);
    if (report.supply)
        printPrimarySide(report, row, out);
    if (report.verdict) {
        out << '\n';
        printVerdict(*report.verdict, report.progress, row);
    }
    if (!report.settingsUsed.empty())
        row("Judged with", report.settingsUsed);
    if (report.printBudget) {
        out << "\nUncertainty budgets (GUM, JCGM 100:2008): independent inputs, contributions |cᵢ|·u(xᵢ) add in "
               "quadrature;\nν_eff by Welch-Satterthwaite (G.4); U = half-width of the 95 % interval of the components' "
               "combined\ndistribution, k = U/u (= t95(ν_eff) unless a rectangular limit dominates).\n";
        const std::vector<BudgetTable> tables = report.analysis ? budgetTables(*report.analysis) : budgetTables(line);
        for (const BudgetTable &table : tables)
            printBudgetTable(table, out);
        if (tables.empty())
            out << "  none: the fit has too few points for an uncertainty\n";
    }
    if (!report.warnings.empty()) {
        out << "\nWarnings:\n";
        for (const auto &w : report.warnings)
            out << "  - " << w << '\n';
    }
}

} // namespace sagline::cli

namespace sagline::cli {

void writeFitReportJson(const FitReport &report, std::ostream &out)
{
    if (!report.pointsInJson) {
        out << jsonText(fitReportJson(report, PointsInJson::Omitted), 2) << '\n';
        return;
    }
    const std::string text = jsonText(fitReportJson(report, PointsInJson::Placeholder), 2);
    const std::string_view placeholder = "\n  \"points\": []";
    // A newline inside a string is escaped, so this text occurs once: where the key is.
    const std::size_t at = text.find(placeholder);
    const PointFits &points = report.fit.points;
    if (at == std::string::npos || points.empty()) {
        out << text << '\n';
        return;
    }
    const std::size_t arrayStart = at + placeholder.size() - 2; // at the "[]"
    out.write(text.data(), static_cast<std::streamsize>(arrayStart));
    std::string chunk = "[\n";
    constexpr std::size_t flushAt = 1 << 16;
    chunk.reserve(flushAt + 512);
    for (std::size_t i = 0; i < points.size(); ++i) {
        if (i > 0)
            chunk += ",\n";
        appendPointText(chunk, points[i], report.lineNumbers);
        if (chunk.size() >= flushAt) {
            out.write(chunk.data(), static_cast<std::streamsize>(chunk.size()));
            chunk.clear();
        }
    }
    chunk += "\n  ]";
    out.write(chunk.data(), static_cast<std::streamsize>(chunk.size()));
    out.write(text.data() + arrayStart + 2, static_cast<std::streamsize>(text.size() - arrayStart - 2));
    out << '\n';
}

} // namespace sagline::cli
