#include "ComparisonExport.h"

#include "OutputText.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

namespace sagline {

using nlohmann::json;

namespace {

std::string number(const std::optional<double> &value)
{
    // value_or, not *value: GCC 12 warns "maybe uninitialized" on optionals built by ternaries.
    const double v = value.value_or(std::numeric_limits<double>::quiet_NaN());
    if (!std::isfinite(v))
        return {};
    char text[40];
    std::snprintf(text, sizeof text, "%.10g", v);
    return text;
}

json jsonNumber(const std::optional<double> &value)
{
    const double v = value.value_or(std::numeric_limits<double>::quiet_NaN());
    if (!std::isfinite(v))
        return nullptr;
    return v;
}

std::optional<double> fitted(const SessionRow &row, double value)
{
    return row.opened && row.figures.ok ? std::optional<double>(value) : std::nullopt;
}

bool isFar(const BatchStatistics &stats, std::size_t index)
{
    return std::find(stats.farFromBatch.begin(), stats.farFromBatch.end(), index) != stats.farFromBatch.end();
}

std::string designLabel(const SessionRow &row)
{
    return row.design.empty() ? std::string(unknownDesignLabel) : row.design;
}

// "yes", "yes (screening only)" when the row's design has fewer than 10 units, or "no".
std::string farText(const BatchStatistics &stats, std::size_t index)
{
    if (!isFar(stats, index))
        return "no";
    const DesignStatistics *group = stats.designOfRow(index);
    return group && !group->screeningOnly ? "yes" : "yes (screening only)";
}

json rowIndices(const std::vector<std::size_t> &indices)
{
    json list = json::array();
    for (std::size_t i : indices)
        list.push_back(i);
    return list;
}

json designJson(const DesignStatistics &d, const std::vector<SessionRow> &rows)
{
    const IndividualsChart &c = d.chart;
    json points = json::array();
    for (std::size_t k = 0; k < d.chartRows.size(); ++k) {
        const SessionRow &row = rows[d.chartRows[k]];
        const bool outside = std::find(c.outside.begin(), c.outside.end(), k) != c.outside.end();
        points.push_back({{"session", d.chartRows[k]}, {"started_utc", row.createdUtc},
                          {"unit_serial", row.unitSerial}, {"outside_limits", outside}});
    }
    return {
        {"design", d.design}, {"sessions", rowIndices(d.rows)}, {"resistance_count", d.resistanceCount},
        {"incomplete_left_out", d.incompleteLeftOut},
        {"mean_ohm", jsonNumber(d.meanOhm)}, {"sd_ohm", jsonNumber(d.sdOhm)}, {"min_ohm", jsonNumber(d.minOhm)},
        {"max_ohm", jsonNumber(d.maxOhm)}, {"median_ohm", jsonNumber(d.medianOhm)}, {"mad_ohm", jsonNumber(d.madOhm)},
        {"far_from_batch_rule", d.ruleNote}, {"far_from_batch_screening_only", d.screeningOnly},
        {"control_chart",
         {{"kind", "individuals (moving range of 2, d2 = 1.128)"}, {"n", c.n},
          {"centre_ohm", jsonNumber(c.centre)}, {"average_moving_range_ohm", jsonNumber(c.averageMovingRange)},
          {"sigma_ohm", jsonNumber(c.sigma)}, {"upper_limit_ohm", jsonNumber(c.upper)},
          {"lower_limit_ohm", jsonNumber(c.lower)}, {"preliminary", c.preliminary}, {"note", c.note},
          {"points_in_time_order", points}}},
    };
}

std::string labSheetName(const SessionRow &row)
{
    return row.supervision.labSheet ? row.supervision.labSheet->title : std::string();
}

std::string latestReviewer(const SessionRow &row)
{
    return row.signOffs.empty() ? std::string() : row.signOffs.back().reviewer;
}

std::optional<double> valueOf(const std::optional<UncertainValue> &v)
{
    return v ? std::optional<double>(v->value) : std::nullopt;
}

std::optional<double> expandedOf(const std::optional<UncertainValue> &v)
{
    return v ? v->expandedUncertainty : std::nullopt;
}

} // namespace

std::vector<std::string> comparisonCsvColumns()
{
    return {"file", "design", "unit_serial", "started_utc", "operator", "instruments", "readings", "points_used",
            "series_resistance_ohm", "series_resistance_u_ohm", "series_resistance_k", "winding_temperature_c",
            "reference_temperature_c", "temperature_constant_c", "series_resistance_ref_ohm",
            "series_resistance_ref_u_ohm", "series_resistance_ref_k", "no_load_voltage_v", "no_load_voltage_u_v",
            "no_load_voltage_k", "rated_current_a", "regulation_percent", "regulation_u_percent", "regulation_k",
            "regulation_limit_percent", "efficiency_at_rated_percent", "efficiency_at_rated_u_percent",
            "no_load_loss_w", "no_load_loss_u_w", "verdict", "conformance_probability", "decision_rule", "limits_source",
            "safety_stops", "review_decision", "reviewer",
            "lab_sheet", "supervisor", "limit_hits", "robust_z", "far_from_batch", "problem"};
}

std::string comparisonCsv(const std::vector<SessionRow> &rows, const BatchStatistics &stats)
{
    std::ostringstream out;
    const auto columns = comparisonCsvColumns();
    for (std::size_t i = 0; i < columns.size(); ++i)
        out << (i ? "," : "") << columns[i];
    out << '\n';
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const SessionRow &row = rows[i];
        const SessionFigures &f = row.figures;
        std::optional<double> z;
        if (i < stats.robustZ.size())
            z = stats.robustZ[i];
        const std::vector<std::string> fields = {
            row.path, row.opened ? designLabel(row) : std::string(), row.unitSerial, row.createdUtc, row.operatorName,
            row.instruments,
            row.opened ? std::to_string(row.readingCount) : std::string(),
            row.opened ? std::to_string(row.pointsUsed) : std::string(),
            number(fitted(row, f.resistanceOhm)), number(f.resistanceUOhm), number(f.resistanceK),
            number(f.windingTemperatureC), number(fitted(row, f.referenceTemperatureC)),
            number(fitted(row, f.temperatureConstantC)), number(f.resistanceRefOhm), number(f.resistanceRefUOhm),
            number(f.resistanceRefK), number(fitted(row, f.noLoadVoltageV)), number(f.noLoadVoltageUV),
            number(f.noLoadVoltageK), number(fitted(row, f.ratedCurrentA)), number(f.regulationPercent),
            number(f.regulationUPercent), number(f.regulationK), number(f.regulationLimitPercent),
            number(valueOf(row.efficiencyAtRated())), number(expandedOf(row.efficiencyAtRated())),
            number(valueOf(row.noLoadLoss())), number(expandedOf(row.noLoadLoss())),
            row.opened ? row.verdictShown() : std::string(), number(f.conformanceProbability),
            row.opened ? toString(f.rule) : std::string(), row.opened ? f.limitsSource : std::string(),
            row.opened ? std::to_string(row.safetyStops.size()) : std::string(),
            row.opened ? row.reviewState() : std::string(), latestReviewer(row), labSheetName(row),
            row.supervision.supervisor ? row.supervision.supervisor->supervisor : std::string(),
            row.opened ? std::to_string(row.supervision.limitHits.size()) : std::string(), number(z),
            row.opened ? farText(stats, i) : std::string(),
            row.opened ? (f.ok ? std::string() : f.message) : row.problem,
        };
        for (std::size_t k = 0; k < fields.size(); ++k)
            out << (k ? "," : "") << csvField(fields[k]);
        out << '\n';
    }
    return out.str();
}

std::string comparisonJson(const std::vector<SessionRow> &rows, const BatchStatistics &stats,
                           const ComparisonOptions &options)
{
    json sessions = json::array();
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const SessionRow &row = rows[i];
        if (!row.opened) {
            sessions.push_back({{"file", row.path}, {"opened", false}, {"problem", row.problem}});
            continue;
        }
        const SessionFigures &f = row.figures;
        json signOffs = json::array();
        for (const auto &s : row.signOffs)
            signOffs.push_back({{"time_utc", s.timeUtc}, {"reviewer", s.reviewer}, {"decision", toString(s.decision)},
                                {"comment", s.comment}});
        json stops = json::array();
        for (const auto &s : row.safetyStops)
            stops.push_back({{"time_utc", s.timeUtc}, {"step", s.step}, {"rule", s.rule}, {"message", s.message},
                             {"measured", jsonNumber(s.measured)}, {"limit", jsonNumber(s.limitValue)}});
        json session = {
            {"file", row.path}, {"opened", true}, {"notice", row.notice}, {"design", designLabel(row)},
            {"unit_serial", row.unitSerial}, {"started_utc", row.createdUtc}, {"operator", row.operatorName}, {"instruments", row.instruments},
            {"readings", row.readingCount}, {"points_used", row.pointsUsed}, {"fit_ok", f.ok},
            {"fit_message", f.message},
            {"series_resistance_ohm", jsonNumber(fitted(row, f.resistanceOhm))},
            {"series_resistance_u_ohm", jsonNumber(f.resistanceUOhm)},
            {"series_resistance_k", jsonNumber(f.resistanceK)},
            {"winding_temperature_c", jsonNumber(f.windingTemperatureC)},
            {"series_resistance_ref_ohm", jsonNumber(f.resistanceRefOhm)},
            {"series_resistance_ref_u_ohm", jsonNumber(f.resistanceRefUOhm)},
            {"series_resistance_ref_k", jsonNumber(f.resistanceRefK)},
            {"no_load_voltage_v", jsonNumber(fitted(row, f.noLoadVoltageV))},
            {"no_load_voltage_u_v", jsonNumber(f.noLoadVoltageUV)},
            {"no_load_voltage_k", jsonNumber(f.noLoadVoltageK)},
            {"rated_current_a", jsonNumber(fitted(row, f.ratedCurrentA))},
            {"regulation_percent", jsonNumber(f.regulationPercent)},
            {"regulation_u_percent", jsonNumber(f.regulationUPercent)},
            {"regulation_k", jsonNumber(f.regulationK)},
            {"regulation_limit_percent", jsonNumber(f.regulationLimitPercent)},
            {"efficiency_at_rated_percent", jsonNumber(valueOf(row.efficiencyAtRated()))},
            {"efficiency_at_rated_u_percent", jsonNumber(expandedOf(row.efficiencyAtRated()))},
            {"no_load_loss_w", jsonNumber(valueOf(row.noLoadLoss()))},
            {"no_load_loss_u_w", jsonNumber(expandedOf(row.noLoadLoss()))},
            {"fit_voltages", toString(row.supply.fitVoltages)},
            {"verdict", row.verdictShown()}, {"conformance_probability", jsonNumber(f.conformanceProbability)},
            {"decision_rule", toString(f.rule)}, {"decision_rule_text", f.ruleName},
            {"limits_source", f.limitsSource}, {"meters_known", f.metersKnown},
            {"completeness", toString(row.progress.state)},
            {"steps_recorded", row.progress.recordedSteps}, {"steps_planned", row.progress.plannedSteps},
            {"seal", toString(row.seal.state)}, {"seal_summary", row.seal.summary()},
            {"settings_from_record", row.settingsFromRecord},
            {"safety_stops", stops}, {"review_decision", row.reviewState()}, {"sign_offs", signOffs},
            {"lab_sheet", row.supervision.labSheet ? json(row.supervision.labSheet->title) : json(nullptr)},
            {"lab_sheet_fingerprint",
             row.supervision.labSheet ? json(row.supervision.labSheet->fingerprint) : json(nullptr)},
            {"supervisor", row.supervision.supervisor ? json(row.supervision.supervisor->supervisor) : json(nullptr)},
            {"supervisor_pin_checked", row.supervision.supervisor ? json(row.supervision.supervisor->pinChecked) : json(nullptr)},
            {"student", row.supervision.labSheet ? json(row.supervision.labSheet->student) : json(nullptr)},
            {"limit_hits", row.supervision.limitHits.size()},
            {"robust_z", i < stats.robustZ.size() ? jsonNumber(stats.robustZ[i]) : json(nullptr)},
            {"far_from_batch", isFar(stats, i)},
        };
        sessions.push_back(session);
    }
    json designsJson = json::array();
    for (const DesignStatistics &d : stats.designs)
        designsJson.push_back(designJson(d, rows));
    const json batch = {
        {"sessions", stats.sessions}, {"unreadable", stats.unreadable}, {"without_fit", stats.withoutFit},
        {"resistance_basis", stats.atReferenceTemperature ? "reference temperature" : "as measured"},
        {"resistance_count", stats.resistanceCount},
        {"mean_ohm", jsonNumber(stats.meanOhm)}, {"sd_ohm", jsonNumber(stats.sdOhm)},
        {"min_ohm", jsonNumber(stats.minOhm)}, {"max_ohm", jsonNumber(stats.maxOhm)},
        {"median_ohm", jsonNumber(stats.medianOhm)}, {"mad_ohm", jsonNumber(stats.madOhm)},
        {"verdicts", {{"pass", stats.pass}, {"fail", stats.fail}, {"conditional-pass", stats.conditionalPass},
                      {"conditional-fail", stats.conditionalFail}, {"not-judged", stats.notJudged},
                      {"n/a", stats.noVerdict}, {"incomplete", stats.incomplete}}},
        {"review", {{"accepted", stats.accepted}, {"rejected", stats.rejected}, {"retest", stats.retest},
                    {"not_reviewed", stats.notReviewed}, {"changed_after_sign_off", stats.changedAfterSignOff}}},
        {"safety_stopped", stats.safetyStopped}, {"limit_hit", stats.limitHit},
        {"designs", designsJson},
        {"far_from_batch_rule", stats.ruleNote}, {"far_from_batch_screening_only", stats.screeningOnly},
        {"method", toString(options.method)},
        {"reference_temperature_c", options.figures.referenceTemperatureC},
        {"copper_temperature_constant", toString(options.figures.copperConstant)},
        {"coverage_probability", coverageProbability},
    };
    return jsonText(json{{"sessions", sessions}, {"batch", batch}}, 2);
}

} // namespace sagline
