#include "AnalysisSettingsRecord.h"

#include <nlohmann/json.hpp>

#include <cmath>

namespace sagline {

using nlohmann::json;

namespace {

// Limits a reader can act on: a regulation limit is a positive percentage, a reference
// temperature lies where the linear resistance law is used (the CLI's range).
constexpr double maxLimitPercent = 100.0;
constexpr double minReferenceC = -50.0;
constexpr double maxReferenceC = 250.0;

json optionalNumber(const std::optional<double> &value)
{
    return value ? json(*value) : json(nullptr);
}

// Reads an optional number key: absent or null is "not set"; anything else must be a finite
// number within [low, high] (low exclusive when lowExclusive).
std::optional<double> readNumber(const json &object, const char *key, double low, bool lowExclusive, double high,
                                 FieldErrors &errors)
{
    const auto found = object.find(key);
    if (found == object.end() || found->is_null())
        return std::nullopt;
    if (!found->is_number()) {
        errors.push_back({key, "must be a number or null, got " + found->dump()});
        return std::nullopt;
    }
    const double value = found->get<double>();
    const bool belowLow = lowExclusive ? !(value > low) : !(value >= low);
    if (!std::isfinite(value) || belowLow || value > high) {
        errors.push_back({key, std::string("must be ") + (lowExclusive ? "above " : "at least ") + json(low).dump()
                                   + " and at most " + json(high).dump() + ", got " + found->dump()});
        return std::nullopt;
    }
    return value;
}

} // namespace

std::string analysisSettingsNoteText(const AnalysisSettings &settings)
{
    json object = {{"analysis_settings", analysisSettingsVersion},
                   {"regulation_limit_percent", settings.regulationLimitNameplate
                                                    ? json("nameplate")
                                                    : optionalNumber(settings.regulationLimitPercent)},
                   {"rule", toString(settings.rule)},
                   {"reference_temperature_c", optionalNumber(settings.referenceTemperatureC)}};
    object["temperature_constant"] =
        settings.temperatureConstant ? json(toString(*settings.temperatureConstant)) : json(nullptr);
    return object.dump();
}

AnalysisSettingsParse parseAnalysisSettings(const std::string &text)
{
    AnalysisSettingsParse parse;
    const json object = json::parse(text, nullptr, false);
    if (object.is_discarded() || !object.is_object()) {
        parse.errors.push_back({"analysis_settings", "the note is not a JSON object"});
        return parse;
    }
    const auto version = object.find("analysis_settings");
    if (version == object.end() || !version->is_number_integer()) {
        parse.errors.push_back({"analysis_settings", "must be the record version, an integer"});
        return parse;
    }
    if (version->get<long long>() != analysisSettingsVersion) {
        parse.errors.push_back({"analysis_settings", "version " + version->dump() + " is not one this program reads ("
                                                         + std::to_string(analysisSettingsVersion) + ")"});
        return parse;
    }
    AnalysisSettings settings;
    if (const auto limit = object.find("regulation_limit_percent"); limit != object.end() && *limit == "nameplate")
        settings.regulationLimitNameplate = true;
    else
        settings.regulationLimitPercent =
            readNumber(object, "regulation_limit_percent", 0.0, true, maxLimitPercent, parse.errors);
    settings.referenceTemperatureC =
        readNumber(object, "reference_temperature_c", minReferenceC, false, maxReferenceC, parse.errors);
    const auto rule = object.find("rule");
    if (rule == object.end() || !rule->is_string() || !decisionRuleFromString(rule->get<std::string>()))
        parse.errors.push_back({"rule", "must be \"simple\", \"guarded\" or \"non-binary\", got "
                                            + (rule == object.end() ? std::string("nothing") : rule->dump())});
    else
        settings.rule = *decisionRuleFromString(rule->get<std::string>());
    const auto constant = object.find("temperature_constant");
    if (constant != object.end() && !constant->is_null()) {
        const auto parsed = constant->is_string() ? temperatureConstantFromString(constant->get<std::string>())
                                                  : std::nullopt;
        if (!parsed)
            parse.errors.push_back({"temperature_constant",
                                    "must be copper-ieee, copper-iec, aluminium or null, got " + constant->dump()});
        else
            settings.temperatureConstant = parsed;
    }
    if (parse.errors.empty())
        parse.settings = settings;
    return parse;
}

RecordedAnalysisSettings latestAnalysisSettings(const std::vector<NoteRecord> &notes)
{
    RecordedAnalysisSettings recorded;
    for (auto it = notes.rbegin(); it != notes.rend(); ++it) {
        if (it->author != analysisSettingsNoteAuthor)
            continue;
        AnalysisSettingsParse parse = parseAnalysisSettings(it->text);
        if (!parse.settings) {
            recorded.notices.push_back("analysis settings note " + std::to_string(it->id) + " (" + it->timeUtc
                                       + ") ignored: " + parse.errors.front().message());
            continue;
        }
        recorded.settings = parse.settings;
        recorded.recordedUtc = it->timeUtc;
        break;
    }
    return recorded;
}

std::string toString(SettingSource source)
{
    switch (source) {
    case SettingSource::SessionRecord:
        return "session record";
    case SettingSource::Option:
        return "option";
    case SettingSource::Default:
        break;
    }
    return "default";
}

} // namespace sagline
