#include "FitOutput.h"

#include "NumberFormat.h"
#include "UncertaintyFormat.h"


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
            {"expanded_uncertainty", optionalNumber(v.expandedUncertainty)}};
}

// Pads to `width` characters, counting UTF-8 code points (setw counts bytes: "R²" is 3).
std::string padRight(const std::string &text, std::size_t width)
{
    std::size_t characters = 0;
    for (unsigned char c : text)
        characters += (c & 0xC0) != 0x80 ? 1 : 0;
    return characters >= width ? text + ' ' : text + std::string(width - characters, ' ');
}

std::string rowLabel(std::size_t row, const std::vector<int> &lineNumbers)
{
    if (row < lineNumbers.size())
        return "line " + std::to_string(lineNumbers[row]);
    return "row " + std::to_string(row);
}

// A short number for labels: "2", "2.5", "95" (no trailing zeros).
std::string shortNumber(double value)
{
    std::string text = formatSignificant(value, 3);
    if (text.find('.') != std::string::npos) {
        text.erase(text.find_last_not_of('0') + 1);
        if (text.back() == '.')
            text.pop_back();
    }
    return text;
}

std::string withU(const UncertainValue &v, const std::string &unit, double k)
{
    if (!v.expandedUncertainty)
        return formatQuantity(v.value, unit, 4) + " (no uncertainty: too few points)";
    return formatWithUncertainty(v.value, *v.expandedUncertainty, unit) + " (k = " + shortNumber(k) + ")";
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

} // namespace

std::vector<std::string> fitWarnings(const FitSummary &fit, const std::vector<int> &lineNumbers)
{
    std::vector<std::string> warnings;
    if (fit.curvatureP && *fit.curvatureP < 0.01)
        warnings.push_back("the V-I line bends (quadratic term p = " + formatSignificant(*fit.curvatureP, 2)
                           + "): core saturation or winding heating; the straight-line R is an average");
    for (std::size_t row : fit.outlierRows)
        warnings.push_back(rowLabel(row, lineNumbers) + " looks like an outlier (studentized residual "
                           + formatSignificant(*fit.points[row].studentized, 3) + "); check it, exclude it with a reason if it is wrong");
    if (fit.mswd && *fit.mswd > 3.0)
        warnings.push_back("the scatter is larger than the stated uncertainties (MSWD = " + formatSignificant(*fit.mswd, 3)
                           + "); uncertainties were enlarged by sqrt(MSWD)");
    if (fit.n < 4)
        warnings.push_back("fewer than 4 points: no curvature check");
    return warnings;
}

nlohmann::json fitReportJson(const FitReport &report)
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
    j["series_resistance_ci95_ohm"] = f.seriesResistanceCi
                                          ? nlohmann::json::array({f.seriesResistanceCi->low, f.seriesResistanceCi->high})
                                          : nlohmann::json(nullptr);
    j["outliers"] = f.outlierRows;
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
    nlohmann::json points = nlohmann::json::array();
    for (const PointFit &p : f.points) {
        nlohmann::json point = {{"row", p.row}, {"used", p.used}, {"residual_v", p.residualV},
                                {"studentized", optionalNumber(p.studentized)}, {"outlier", p.outlier}};
        if (p.row < report.lineNumbers.size())
            point["line"] = report.lineNumbers[p.row];
        points.push_back(point);
    }
    j["points"] = points;
    if (report.analysis) {
        const AnalysisResult &a = *report.analysis;
        nlohmann::json analysis = {{"coverage_factor", a.coverageFactor},
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
        j["analysis"] = analysis;
    }
    if (report.decision) {
        const ConformityDecision &d = *report.decision;
        j["verdict"] = {{"outcome", toString(d.outcome)}, {"rule", toString(d.rule)}, {"rule_name", d.ruleName},
                        {"regulation_limit_percent", d.upperLimit}, {"acceptance_limit_percent", d.acceptanceLimit},
                        {"explanation", d.explanation}};
    }
    if (report.analysis)
        j["settings_source"] = {{"rule", toString(report.ruleSource)},
                                {"regulation_limit", toString(report.regulationLimitSource)},
                                {"temperature_constant", toString(report.temperatureConstantSource)}};
    j["warnings"] = report.warnings;
    return j;
}

void printFitReport(const FitReport &report, std::ostream &out)
{
    const FitSummary &f = report.fit;
    const auto row = [&](const std::string &label, const std::string &text) {
        out << "  " << padRight(label, 24) << text << '\n';
    };
    std::size_t total = f.points.size();
    out << "Straight-line fit V = V0 - R·I of " << report.source << "\n"
        << "  " << methodTitle(f.method) << ", " << f.n << " of " << total << " readings used\n\n";
    const double k = 2.0;
    const auto rSe = f.analysisSlopeSe();
    const auto v0Se = f.analysisInterceptSe();
    const UncertainValue r{f.seriesResistanceOhm(), rSe, rSe ? std::optional<double>(k * *rSe) : std::nullopt};
    const UncertainValue v0{f.noLoadVoltageV(), v0Se, v0Se ? std::optional<double>(k * *v0Se) : std::nullopt};
    row("Series resistance R", withU(r, "Ω", k));
    if (f.seriesResistanceCi)
        row("", shortNumber(f.confidence * 100.0) + " % interval " + formatQuantity(f.seriesResistanceCi->low, "Ω")
                    + " to " + formatQuantity(f.seriesResistanceCi->high, "Ω") + " (Student t, "
                    + std::to_string(f.degreesOfFreedom) + " degrees of freedom)");
    row("No-load voltage V0", withU(v0, "V", k));
    if (f.mswd)
        row("MSWD", formatSignificant(*f.mswd, 3) + " (S/(n-2); near 1 when the stated uncertainties explain the scatter)");
    if (f.residualSdV)
        row("Residual SD", formatQuantity(*f.residualSdV, "V", 3));
    if (f.rSquared)
        row("R²", formatSignificant(*f.rSquared, 6));
    if (f.curvatureP)
        row("Curvature check", "p = " + formatSignificant(*f.curvatureP, 2) + " for a quadratic term"
                                   + (*f.curvatureP < 0.01 ? ": the line bends" : ": no sign of bending"));
    std::string outliers = "none";
    if (!f.outlierRows.empty()) {
        outliers.clear();
        for (std::size_t rowIndex : f.outlierRows)
            outliers += (outliers.empty() ? "" : ", ") + rowLabel(rowIndex, report.lineNumbers);
    }
    row("Outliers (|t| > 3)", outliers + " (flagged, never dropped)");

    if (report.analysis && report.analysis->ok()) {
        const AnalysisResult &a = *report.analysis;
        out << "\nAt rated secondary current (from the nameplate):\n";
        row("Full-load voltage", withU(a.fullLoadVoltageV, "V", a.coverageFactor));
        row("Regulation", withU(a.regulationPercent, "%", a.coverageFactor) + ", of the "
                              + (a.regulationBase == RegulationBase::FullLoad ? "full-load" : "no-load") + " voltage");
        row("Copper loss I²R", withU(a.copperLossW, "W", a.coverageFactor));
        if (a.primaryResistanceOhm)
            row("R referred to primary", withU(*a.primaryResistanceOhm, "Ω", a.coverageFactor) + " (a²·R)");
        if (a.referenceResistanceOhm)
            row("R at reference temp.", withU(*a.referenceResistanceOhm, "Ω", a.coverageFactor) + "; "
                                            + a.temperatureCorrection->convention);
    } else if (report.analysis) {
        out << "\nNo analysis at rated current: " << report.analysis->errors.front().message() << '\n';
    }
    if (report.decision) {
        const ConformityDecision &d = *report.decision;
        std::string outcome = d.outcome == ConformityOutcome::Pass   ? "PASS"
                              : d.outcome == ConformityOutcome::Fail ? "FAIL"
                                                                     : "CANNOT DECIDE";
        row("Verdict", outcome + " against a regulation limit of " + formatSignificant(d.upperLimit, 4) + " %");
        row("", d.explanation);
        row("", "Decision rule: " + d.ruleName);
    }
    if (report.analysis)
        row("Settings from", "rule: " + toString(report.ruleSource) + "; limit: " + toString(report.regulationLimitSource)
                                 + "; temperature constant: " + toString(report.temperatureConstantSource));
    if (!report.warnings.empty()) {
        out << "\nWarnings:\n";
        for (const auto &w : report.warnings)
            out << "  - " << w << '\n';
    }
}

} // namespace sagline::cli
