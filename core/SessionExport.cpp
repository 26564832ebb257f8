#include "SessionExport.h"

#include "AssessmentJson.h"

#include "CsvField.h"
#include "JsonReader.h"
#include "PrimarySideJson.h"
#include "WithheldVerdict.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <system_error>

namespace sagline {

namespace {

using json = nlohmann::ordered_json; // keys in the order written: session first

// The shortest text that reads back to the same double: std::to_chars without a precision
// gives the shortest round-trip form (C++17 [charconv.to.chars]), so 19.6 is written "19.6",
// not "19.600000000000001" as "%.17g" would.
std::string exact(double value)
{
    if (!std::isfinite(value))
        return {};
    char text[40];
    const auto [end, error] = std::to_chars(text, text + sizeof text, value);
    if (error != std::errc())
        return {};
    return std::string(text, end);
}

std::string exact(const std::optional<double> &value)
{
    return value ? exact(*value) : std::string();
}

json optionalNumber(const std::optional<double> &value)
{
    return value && std::isfinite(*value) ? json(*value) : json(nullptr);
}

json number(double value)
{
    return std::isfinite(value) ? json(value) : json(nullptr);
}

json fitToJson(const FitSummary &fit)
{
    json out;
    out["status"] = toString(fit.status);
    out["message"] = fit.message;
    out["n"] = fit.n;
    out["method"] = toString(fit.method);
    if (!fit.ok())
        return out;
    out["slope"] = number(fit.slope);
    out["intercept"] = number(fit.intercept);
    out["series_resistance_ohm"] = number(fit.seriesResistanceOhm());
    out["series_resistance_se_ohm"] = optionalNumber(fit.slopeSe);
    out["no_load_voltage_v"] = number(fit.noLoadVoltageV());
    out["no_load_voltage_se_v"] = optionalNumber(fit.interceptSe);
    out["r_squared"] = optionalNumber(fit.rSquared);
    out["residual_sd_v"] = optionalNumber(fit.residualSdV);
    out["series_resistance_ci95_ohm"] = nullptr; // filled by the caller from the budget or the fit
    out["outliers"] = fit.outlierRows;
    out["outlier_screening"] = outlierScreeningJson(fit.outlierScreening);
    out["curvature_p"] = optionalNumber(fit.curvatureP);
    if (fit.method != FitMethod::Ols) {
        out["series_resistance_se_scaled_ohm"] = optionalNumber(fit.slopeSeScaled);
        out["no_load_voltage_se_scaled_v"] = optionalNumber(fit.interceptSeScaled);
        out["mswd"] = optionalNumber(fit.mswd);
    }
    return out;
}

json uncertain(const UncertainValue &value)
{
    return json(uncertainValueJson(value));
}

json analysisToJson(const SessionSummary &summary)
{
    if (!summary.analysis)
        return {{"available", false}, {"reason", summary.analysisProblem}};
    const AnalysisResult &a = *summary.analysis;
    json out = {{"available", true},
                {"coverage_probability", coverageProbability},
                {"uncertainty_basis", a.uncertaintyBasis},
                {"meters_known", a.metersKnown},
                {"series_resistance_ohm", uncertain(a.seriesResistanceOhm)},
                {"no_load_voltage_v", uncertain(a.noLoadVoltageV)},
                {"full_load_voltage_v", uncertain(a.fullLoadVoltageV)},
                {"regulation_percent", uncertain(a.regulationPercent)},
                {"regulation_base", toString(a.regulationBase)},
                {"copper_loss_w", uncertain(a.copperLossW)}};
    out["primary_resistance_ohm"] = a.primaryResistanceOhm ? uncertain(*a.primaryResistanceOhm) : json(nullptr);
    out["reference_resistance_ohm"] = a.referenceResistanceOhm ? uncertain(*a.referenceResistanceOhm) : json(nullptr);
    nlohmann::json results = resultsJson(a);
    addPrimaryResultsJson(results, summary.primarySide);
    out["results"] = results;
    out["winding_temperature_c"] = optionalNumber(summary.latestTemperatureC(TemperatureKind::Winding));
    out["reference_temperature_c"] = optionalNumber(a.referenceTemperatureC);
    out["reference_temperature_defaulted"] = summary.referenceTemperatureDefaulted;
    out["settings_used"] = describeSettingsUsed(summary);
    out["temperature_convention"] = a.temperatureCorrection ? json(a.temperatureCorrection->convention) : json(nullptr);
    return out;
}

json verdictToJson(const SessionSummary &summary)
{
    if (!summary.verdict)
        return nullptr;
    return verdictJson(*summary.verdict);
}

// The primary-side columns, written only when some reading has a primary side (a session
// without primary meters keeps the plain format).
constexpr const char *primaryHeader = ",primary_voltage_v,u_primary_voltage_v,primary_current_a,u_primary_current_a,"
                                      "primary_power_w,u_primary_power_w,primary_power_factor,u_primary_power_factor,"
                                      "primary_reactive_power_var,u_primary_reactive_power_var";

bool anyPrimary(const std::vector<Reading> &readings)
{
    return std::any_of(readings.begin(), readings.end(), [](const Reading &r) { return r.primary.hasAny(); });
}

std::string primaryCells(const PrimaryReading &p)
{
    return ',' + exact(p.voltageV) + ',' + exact(p.uVoltageV) + ',' + exact(p.currentA) + ',' + exact(p.uCurrentA) + ',' +
           exact(p.powerW) + ',' + exact(p.uPowerW) + ',' + exact(p.powerFactor) + ',' + exact(p.uPowerFactor) + ',' +
           exact(p.reactivePowerVar) + ',' + exact(p.uReactivePowerVar);
}

} // namespace

std::optional<Interval> seriesResistanceInterval(const SessionSummary &summary)
{
    if (summary.analysis) {
        const UncertainValue &r = summary.analysis->seriesResistanceOhm;
        if (!r.expandedUncertainty)
            return std::nullopt;
        return Interval{r.value - *r.expandedUncertainty, r.value + *r.expandedUncertainty};
    }
    return summary.fit.seriesResistanceCi;
}

std::string readingsToCsv(const std::vector<Reading> &readings)
{
    const bool primary = anyPrimary(readings);
    std::string out = std::string("current_a,voltage_v,u_current_a,u_voltage_v,step,time_utc,flags,excluded") +
                      (primary ? primaryHeader : "") + "\r\n";
    for (const Reading &reading : readings) {
        out += exact(reading.currentA) + ',' + exact(reading.voltageV) + ',' + exact(reading.uCurrentA) + ',' +
               exact(reading.uVoltageV) + ',' + (reading.step >= 0 ? std::to_string(reading.step) : std::string()) + ',' +
               csvField(reading.timeUtc) + ',' + csvField(flagsToString(reading.flags)) + ',' +
               (reading.excluded ? "true" : "false") + (primary ? primaryCells(reading.primary) : std::string()) + "\r\n";
    }
    return out;
}

std::string sessionReadingsToCsv(const SessionSummary &summary)
{
    // The import columns first (import reads this back), then who did what, which import skips.
    const bool primary = anyPrimary(summary.readings);
    std::string out = std::string("current_a,voltage_v,u_current_a,u_voltage_v,step,time_utc,flags,excluded") +
                      (primary ? primaryHeader : "") +
                      ",exclusion_reason,excluded_by,superseded_reason,recorded_by,recorded_account\r\n";
    for (std::size_t i = 0; i < summary.readings.size(); ++i) {
        const Reading &reading = summary.readings[i];
        const ExclusionRecord *exclusion = summary.latestExclusion(reading.id);
        const bool excludedByRecord = exclusion && exclusion->excluded;
        const SupersessionRecord *retake = reading.superseded ? summary.supersessionOf(reading.id) : nullptr;
        const Actor actor = summary.recorders.of(i);
        out += exact(reading.currentA) + ',' + exact(reading.voltageV) + ',' + exact(reading.uCurrentA) + ',' +
               exact(reading.uVoltageV) + ',' + (reading.step >= 0 ? std::to_string(reading.step) : std::string()) + ',' +
               csvField(reading.timeUtc) + ',' + csvField(flagsToString(reading.flags)) + ',' +
               (reading.excluded ? "true" : "false") + (primary ? primaryCells(reading.primary) : std::string()) + ',' +
               csvField(excludedByRecord ? exclusion->reason : "") + ',' +
               csvField(excludedByRecord ? exclusion->author : "") + ',' + csvField(retake ? retake->reason : "") + ',' +
               csvField(actor.person) + ',' + csvField(actor.osAccount) + "\r\n";
    }
    return out;
}

std::string fitResultsToCsv(const SessionSummary &summary)
{
    const FitSummary &fit = summary.fit;
    std::string out = "quantity,value,standard_uncertainty,unit\r\n";
    auto row = [&out](const std::string &quantity, const std::string &value, const std::string &u, const std::string &unit) {
        out += csvField(quantity) + ',' + value + ',' + u + ',' + csvField(unit) + "\r\n";
    };
    row("fit_method", toString(fit.method), "", "");
    row("fit_status", toString(fit.status), "", "");
    row("points_used", std::to_string(fit.n), "", "");
    if (fit.ok()) {
        // With an analysis, R and V0 carry their full budgets' u and the interval is R ± U.
        const AnalysisResult *a = summary.analysis ? &*summary.analysis : nullptr;
        row("series_resistance", exact(fit.seriesResistanceOhm()),
            exact(a ? a->seriesResistanceOhm.standardUncertainty : fit.analysisSlopeSe()), "ohm");
        row("no_load_voltage", exact(fit.noLoadVoltageV()),
            exact(a ? a->noLoadVoltageV.standardUncertainty : fit.analysisInterceptSe()), "V");
        row("r_squared", exact(fit.rSquared), "", "");
        row("residual_sd", exact(fit.residualSdV), "", "V");
        row("curvature_p", exact(fit.curvatureP), "", "");
        if (const auto ci = seriesResistanceInterval(summary)) {
            row("series_resistance_ci95_low", exact(ci->low), "", "ohm");
            row("series_resistance_ci95_high", exact(ci->high), "", "ohm");
        }
        if (a) {
            auto add = [&](const std::string &name, const UncertainValue &v, const std::string &unit) {
                row(name, exact(v.value), exact(v.standardUncertainty), unit);
            };
            add("full_load_voltage", a->fullLoadVoltageV, "V");
            add("regulation_" + toString(a->regulationBase), a->regulationPercent, "%");
            add("copper_loss_at_rated_current", a->copperLossW, "W");
            if (a->primaryResistanceOhm)
                add("series_resistance_referred_to_primary", *a->primaryResistanceOhm, "ohm");
            if (a->referenceResistanceOhm)
                add("series_resistance_at_reference_temperature", *a->referenceResistanceOhm, "ohm");
            if (a->referredFullLoadVoltageV)
                add("full_load_voltage_at_reference_temperature", *a->referredFullLoadVoltageV, "V");
            if (a->referredRegulationPercent)
                add("regulation_" + toString(a->regulationBase) + "_at_reference_temperature",
                    *a->referredRegulationPercent, "%");
            if (a->referredCopperLossW)
                add("copper_loss_at_reference_temperature", *a->referredCopperLossW, "W");
        }
        row("fit_voltages", toString(summary.supply.fitVoltages), "", "");
        if (const auto &p = summary.primarySide) {
            auto addOptional = [&](const std::string &name, const std::optional<UncertainValue> &v, const std::string &unit) {
                if (v)
                    row(name, exact(v->value), exact(v->standardUncertainty), unit);
            };
            if (p->openCircuit) {
                addOptional("no_load_loss", p->openCircuit->noLoadLossW, "W");
                addOptional("no_load_current", p->openCircuit->noLoadCurrentA, "A");
                addOptional("no_load_power_factor", p->openCircuit->noLoadPowerFactor, "");
                addOptional("core_loss_resistance", p->openCircuit->coreLossResistanceOhm, "ohm");
                addOptional("magnetizing_reactance", p->openCircuit->magnetizingReactanceOhm, "ohm");
            }
            addOptional("efficiency_at_rated", p->efficiencyAtRatedPercent, "%");
            addOptional("max_efficiency", p->maxEfficiencyPercent, "%");
            addOptional("max_efficiency_current", p->maxEfficiencyCurrentA, "A");
            addOptional("series_reactance", p->seriesReactanceOhm, "ohm");
            addOptional("regulation_at_power_factor", p->regulationAtPowerFactorPercent, "%");
            for (const StepLosses &s : p->steps) {
                const std::string id = std::to_string(s.readingId);
                row("efficiency_reading_" + id, exact(s.efficiencyPercent.value), exact(s.efficiencyPercent.standardUncertainty), "%");
                if (s.remainderW)
                    row("loss_remainder_reading_" + id, exact(s.remainderW->value), exact(s.remainderW->standardUncertainty), "W");
            }
        }
        if (summary.verdict) // the outcome only for a complete session, else "incomplete (k of N steps; ...)"
            row("verdict_" + toString(summary.verdict->rule), csvField(summary.verdictText()), "", "");
        for (const PointFit &point : fit.points) {
            if (point.row >= summary.readings.size())
                continue;
            const std::string id = std::to_string(summary.readings[point.row].id);
            row("residual_reading_" + id, exact(point.residualV), "", "V");
            if (point.studentized)
                row("studentized_residual_reading_" + id, exact(*point.studentized), "", "");
        }
    }
    return out;
}

std::string sessionSummaryToJson(const SessionSummary &summary, int indent)
{
    json out;
    out["session"] = {{"file", summary.path},
                      {"created_utc", summary.info.createdUtc},
                      {"created_by", summary.info.createdBy.person},
                      {"created_account", summary.info.createdBy.osAccount},
                      {"operator", summary.info.operatorName},
                      {"unit_serial", summary.info.unitSerial},
                      {"software_version", summary.info.softwareVersion},
                      {"schema_version", summary.info.schemaVersion},
                      {"notice", summary.notice}};
    // Stored documents pass the one reader first: a hostile one is left out, not echoed; a sound
    // one is then read with its keys in the stored order.
    const auto stored = [](const std::string &text) {
        return readJson(text).ok() ? json::parse(text, nullptr, false) : json(nullptr);
    };
    out["setup"] = stored(summary.info.setupJson);
    out["plan"] = stored(summary.info.planJson);
    out["temperatures"] = json::array();
    for (const auto &t : summary.temperatures)
        out["temperatures"].push_back({{"time_utc", t.timeUtc}, {"kind", toString(t.kind)}, {"celsius", number(t.celsius)},
                                       {"source", t.source}, {"person", t.actor.person}, {"os_account", t.actor.osAccount}});
    out["instruments"] = json::array();
    for (const auto &i : summary.instruments)
        out["instruments"].push_back({{"time_utc", i.timeUtc}, {"role", i.role}, {"identity", i.identity}, {"accuracy", i.accuracy}});
    std::size_t superseded = 0;
    for (const Reading &reading : summary.readings)
        superseded += reading.superseded ? 1 : 0;
    out["readings"] = {{"total", summary.readings.size()}, {"excluded", summary.excludedCount() - superseded},
                       {"superseded", superseded}};
    out["progress"] = progressJson<json>(summary.progress);
    out["fit"] = fitToJson(summary.fit);
    if (summary.fit.ok()) {
        if (const auto ci = seriesResistanceInterval(summary))
            out["fit"]["series_resistance_ci95_ohm"] = json::array({number(ci->low), number(ci->high)});
    }
    out["analysis"] = analysisToJson(summary);
    out["primary_side"] = json(primarySideJson(summary.primarySide, summary.supply));
    out["verdict"] = verdictToJson(summary);
    if (out["verdict"].is_object()) {
        out["verdict"]["as_shown"] = summary.verdictText(); // "provisional (k of N steps)" until complete
        withholdVerdict(out["verdict"], summary.progress);
    }
    out["seal"] = {{"state", toString(summary.seal.state)}, {"summary", summary.seal.summary()}};
    out["exclusions"] = json::array();
    for (const auto &e : summary.exclusions)
        out["exclusions"].push_back({{"reading_id", e.readingId}, {"excluded", e.excluded}, {"reason", e.reason},
                                     {"author", e.author}, {"os_account", e.osAccount}, {"time_utc", e.timeUtc}});
    out["retakes"] = json::array();
    for (const auto &r : summary.supersessions)
        out["retakes"].push_back({{"reading_id", r.readingId}, {"replacement_id", r.replacementId}, {"reason", r.reason},
                                  {"person", r.actor.person}, {"os_account", r.actor.osAccount}, {"time_utc", r.timeUtc}});
    out["safety_stops"] = json::array();
    for (const auto &s : summary.safetyStops)
        out["safety_stops"].push_back({{"time_utc", s.timeUtc}, {"step", s.step}, {"rule", s.rule}, {"message", s.message},
                                       {"measured", optionalNumber(s.measured)}, {"limit", optionalNumber(s.limitValue)},
                                       {"person", s.actor.person}, {"os_account", s.actor.osAccount}});
    out["sweep_events"] = json::array();
    for (const auto &e : summary.sweepEvents)
        out["sweep_events"].push_back({{"time_utc", e.timeUtc}, {"kind", toString(e.kind)}, {"step", e.step},
                                       {"detail", e.detail}, {"person", e.actor.person}, {"os_account", e.actor.osAccount}});
    out["notes"] = json::array();
    for (const auto &n : summary.notes)
        out["notes"].push_back({{"time_utc", n.timeUtc}, {"author", n.author}, {"text", n.text},
                                {"person", n.actor.person}, {"os_account", n.actor.osAccount}});
    out["sign_offs"] = json::array();
    for (const auto &s : summary.signOffs)
        out["sign_offs"].push_back({{"time_utc", s.timeUtc}, {"reviewer", s.reviewer}, {"decision", toString(s.decision)},
                                    {"comment", s.comment}, {"os_account", s.osAccount}, {"sha256", s.digest}});
    out["reopens"] = json::array();
    for (const auto &r : summary.reopens)
        out["reopens"].push_back({{"time_utc", r.timeUtc}, {"sign_off_id", r.signOffId}, {"reason", r.reason},
                                  {"person", r.actor.person}, {"os_account", r.actor.osAccount}});
    // Text from the file may hold invalid UTF-8: replace it instead of throwing.
    return out.dump(indent, ' ', false, json::error_handler_t::replace);
}

} // namespace sagline
