#include "SetupJson.h"

#include "JsonReader.h"
#include "OutputText.h"
#include "TextFile.h"
#include "Units.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <array>
#include <cmath>
#include <set>
#include <sstream>
#include <tuple>

namespace sagline {

using nlohmann::json;

namespace {

// Reads typed fields out of one JSON object ("nameplate", "bench", ...), collecting every
// error instead of stopping at the first, so the user can fix the whole file in one pass.
class SectionReader {
public:
    SectionReader(const json &object, std::string path, SetupParse &out)
        : m_object(object), m_path(std::move(path)), m_out(out)
    {
    }

    std::string field(const std::string &key) const { return m_path + "." + key; }

    bool isMissing(const std::string &key) const
    {
        return !m_object.contains(key) || m_object.at(key).is_null();
    }

    void error(const std::string &key, const std::string &rule) { m_out.errors.push_back({field(key), rule}); }

    void usedDefault(const std::string &key) { m_out.defaultsUsed.push_back(field(key)); }

    // A number in SI units, or a string with a unit. Returns nothing when missing or invalid
    // (invalid also records an error).
    std::optional<double> quantity(const std::string &key, Unit unit)
    {
        if (isMissing(key))
            return std::nullopt;
        const json &value = m_object.at(key);
        if (value.is_number()) {
            const double number = value.get<double>();
            if (!std::isfinite(number)) {
                error(key, "must be a finite number");
                return std::nullopt;
            }
            return number;
        }
        if (value.is_string()) {
            const auto parsed = parseQuantity(value.get<std::string>(), unit);
            if (!parsed.ok) {
                error(key, parsed.error);
                return std::nullopt;
            }
            return parsed.value;
        }
        error(key, "must be a number or a string with a unit (such as \"12 " + unitSymbol(unit) + "\"), got "
                       + shortJson(value));
        return std::nullopt;
    }

    // A fraction: a plain number (0.8) or a percentage string ("80 %").
    std::optional<double> fraction(const std::string &key)
    {
        if (!isMissing(key) && m_object.at(key).is_string()) {
            const std::string text = m_object.at(key).get<std::string>();
            if (text.find('%') != std::string::npos) {
                const auto parsed = parseQuantity(text, Unit::Percent);
                if (!parsed.ok) {
                    error(key, parsed.error);
                    return std::nullopt;
                }
                return parsed.value / 100.0;
            }
        }
        return quantity(key, Unit::None);
    }

    double required(const std::string &key, Unit unit)
    {
        if (isMissing(key)) {
            error(key, "is required (" + unitQuantityName(unit) + " in " + unitSymbol(unit) + ")");
            return 0.0;
        }
        return quantity(key, unit).value_or(0.0);
    }

    bool hasError(const std::string &key) const
    {
        const std::string name = field(key);
        return std::any_of(m_out.errors.begin(), m_out.errors.end(), [&](const FieldError &e) { return e.field == name; });
    }

    // Checks lower < value (or <=) and value <= upper; records the rule when broken. A field
    // already refused (wrong unit, not a number) is not judged again on the stand-in 0.
    bool inRange(const std::string &key, double value, double lower, bool lowerInclusive, double upper,
                 const std::string &unitText, const std::string &why = {})
    {
        if (hasError(key))
            return false;
        const bool aboveLower = lowerInclusive ? value >= lower : value > lower;
        if (aboveLower && value <= upper)
            return true;
        std::ostringstream rule;
        rule << "must be " << (lowerInclusive ? "at least " : "above ") << lower << unitText << " and at most " << upper
             << unitText << ", got " << value << unitText;
        if (!why.empty())
            rule << " (" << why << ")";
        error(key, rule.str());
        return false;
    }

    std::optional<std::string> text(const std::string &key)
    {
        if (isMissing(key))
            return std::nullopt;
        const json &value = m_object.at(key);
        if (!value.is_string()) {
            error(key, "must be a string, got " + shortJson(value));
            return std::nullopt;
        }
        return value.get<std::string>();
    }

    std::optional<bool> boolean(const std::string &key)
    {
        if (isMissing(key))
            return std::nullopt;
        const json &value = m_object.at(key);
        if (!value.is_boolean()) {
            error(key, "must be true or false, got " + shortJson(value));
            return std::nullopt;
        }
        return value.get<bool>();
    }

    void rejectUnknownKeys(const std::set<std::string> &known)
    {
        for (const auto &item : m_object.items()) {
            if (known.count(item.key()))
                continue;
            std::string list;
            for (const auto &name : known)
                list += (list.empty() ? "" : ", ") + name;
            error(printableKey(item.key()), "is not a setup field (a typo?); known fields here: " + list);
        }
    }

private:
    const json &m_object;
    std::string m_path;
    SetupParse &m_out;
};

template <typename Enum, std::size_t N>
std::optional<Enum> enumFromText(SectionReader &reader, const std::string &key,
                                 const std::array<std::pair<const char *, Enum>, N> &choices)
{
    const auto text = reader.text(key);
    if (!text)
        return std::nullopt;
    for (const auto &[name, value] : choices) {
        if (*text == name)
            return value;
    }
    std::string allowed;
    for (const auto &[name, value] : choices)
        allowed += (allowed.empty() ? "" : ", ") + std::string(name);
    reader.error(key, "'" + *text + "' is not one of: " + allowed);
    return std::nullopt;
}

constexpr std::array<std::pair<const char *, Construction>, 3> constructionNames{{
    {"laminated", Construction::Laminated}, {"toroidal", Construction::Toroidal}, {"other", Construction::Other}}};
constexpr std::array<std::pair<const char *, WindingMaterial>, 3> materialNames{{
    {"copper", WindingMaterial::Copper}, {"aluminium", WindingMaterial::Aluminium},
    {"aluminum", WindingMaterial::Aluminium}}};
constexpr std::array<std::pair<const char *, FuseType>, 2> fuseTypeNames{{
    {"time-lag", FuseType::TimeLag}, {"quick-acting", FuseType::QuickActing}}};

// Scope limits of the tool (small single-phase mains transformers; NEC 450.3(B) covers 1000 V
// and less). Outside them the model and the protection tables do not apply.
constexpr double maxRatedPowerVa = 10000.0;
constexpr double maxVoltageV = 1000.0;
constexpr int maxSteps = 200;
constexpr double maxDwellS = 3600.0;
// Physical floors: below them a value cannot describe a mains transformer or a bench part (a
// rating of 1e-308 VA, a "rheostat" of 1 mΩ that is a short circuit); common practice, with
// the smallest catalogue parts (0.5 VA PCB transformers, 32 mA miniature fuses) well above.
constexpr double minRatedPowerVa = 0.1;
constexpr double minPrimaryVoltageV = 1.0;
constexpr double minSecondaryVoltageV = 1e-3; // lower ones are left to the planner's unit hint (PlanGates)
constexpr double minRheostatOhm = 0.1;
constexpr double minRheostatPowerW = 0.1;

void readNameplate(const json &object, SetupParse &out, Nameplate &plate)
{
    SectionReader r(object, "nameplate", out);
    r.rejectUnknownKeys({"rated_power_va", "primary_voltage_v", "frequency_hz", "secondary_voltage_v",
                         "secondary_no_load_voltage_v", "regulation_percent", "construction", "winding_material"});
    plate.ratedPowerVa = r.required("rated_power_va", Unit::VoltAmpere);
    if (!r.isMissing("rated_power_va"))
        r.inRange("rated_power_va", plate.ratedPowerVa, minRatedPowerVa, true, maxRatedPowerVa, " VA",
                  "Sagline covers small transformers up to 10 kVA");
    plate.primaryVoltageV = r.required("primary_voltage_v", Unit::Volt);
    if (!r.isMissing("primary_voltage_v"))
        r.inRange("primary_voltage_v", plate.primaryVoltageV, minPrimaryVoltageV, true, maxVoltageV, " V",
                  "NEC 450.3(B) and this tool cover 1000 V and less");
    if (r.isMissing("frequency_hz")) {
        r.usedDefault("frequency_hz");
        plate.frequencyHz = 50.0;
    } else if (auto f = r.quantity("frequency_hz", Unit::Hertz)) {
        plate.frequencyHz = *f;
        r.inRange("frequency_hz", *f, 0.0, false, 1000.0, " Hz");
    }
    plate.secondaryVoltageV = r.required("secondary_voltage_v", Unit::Volt);
    if (!r.isMissing("secondary_voltage_v"))
        r.inRange("secondary_voltage_v", plate.secondaryVoltageV, minSecondaryVoltageV, true, maxVoltageV, " V");

    plate.secondaryNoLoadVoltageV = r.quantity("secondary_no_load_voltage_v", Unit::Volt);
    if (plate.secondaryNoLoadVoltageV
        && !r.inRange("secondary_no_load_voltage_v", *plate.secondaryNoLoadVoltageV, minSecondaryVoltageV, true,
                      maxVoltageV, " V"))
        plate.secondaryNoLoadVoltageV.reset();
    plate.regulationPercent = r.quantity("regulation_percent", Unit::Percent);
    if (r.isMissing("secondary_no_load_voltage_v") && r.isMissing("regulation_percent")) {
        r.error("secondary_no_load_voltage_v",
                "give the secondary no-load voltage, or nameplate.regulation_percent instead (one is required)");
    }
    if (plate.secondaryNoLoadVoltageV && plate.secondaryVoltageV > 0.0
        && *plate.secondaryNoLoadVoltageV <= plate.secondaryVoltageV) {
        std::ostringstream rule;
        rule << "must be above nameplate.secondary_voltage_v (" << plate.secondaryVoltageV << " V), got "
             << *plate.secondaryNoLoadVoltageV << " V: the no-load voltage of a loaded transformer is the higher one";
        r.error("secondary_no_load_voltage_v", rule.str());
    }
    if (plate.regulationPercent)
        r.inRange("regulation_percent", *plate.regulationPercent, 0.0, false, 100.0, " %");
    if (plate.secondaryNoLoadVoltageV && plate.regulationPercent && plate.secondaryVoltageV > 0.0) {
        const double implied = plate.secondaryVoltageV * (1.0 + *plate.regulationPercent / 100.0);
        if (std::fabs(implied - *plate.secondaryNoLoadVoltageV) > 0.01 * *plate.secondaryNoLoadVoltageV) {
            std::ostringstream rule;
            rule << "disagrees with nameplate.secondary_no_load_voltage_v by more than 1 % (it implies " << implied
                 << " V); give only one of the two";
            r.error("regulation_percent", rule.str());
        }
    }
    if (r.isMissing("construction")) {
        r.usedDefault("construction");
    } else if (auto c = enumFromText(r, "construction", constructionNames)) {
        plate.construction = *c;
    }
    if (r.isMissing("winding_material")) {
        r.usedDefault("winding_material");
    } else if (auto m = enumFromText(r, "winding_material", materialNames)) {
        plate.windingMaterial = *m;
    }
}

void readRheostat(const json &object, SetupParse &out, Bench &bench)
{
    if (!object.is_object()) {
        out.errors.push_back({"bench.rheostat", "must be an object with total_resistance_ohm and power_rating_w"});
        return;
    }
    SectionReader r(object, "bench.rheostat", out);
    r.rejectUnknownKeys({"total_resistance_ohm", "power_rating_w"});
    Rheostat rheostat;
    rheostat.totalResistanceOhm = r.required("total_resistance_ohm", Unit::Ohm);
    if (!r.isMissing("total_resistance_ohm"))
        r.inRange("total_resistance_ohm", rheostat.totalResistanceOhm, minRheostatOhm, true, 1e6, " Ω");
    rheostat.powerRatingW = r.required("power_rating_w", Unit::Watt);
    if (!r.isMissing("power_rating_w"))
        r.inRange("power_rating_w", rheostat.powerRatingW, minRheostatPowerW, true, 1e5, " W");
    bench.rheostat = rheostat;
}

void readFuse(const json &object, SetupParse &out, Bench &bench)
{
    if (!object.is_object()) {
        out.errors.push_back({"bench.fuse", "must be an object with rating_a and type"});
        return;
    }
    SectionReader r(object, "bench.fuse", out);
    r.rejectUnknownKeys({"rating_a", "type"});
    FuseSpec fuse;
    fuse.ratingA = r.required("rating_a", Unit::Ampere);
    if (!r.isMissing("rating_a"))
        r.inRange("rating_a", fuse.ratingA, minFuseRatingA, true, maxFuseRatingA, " A");
    if (r.isMissing("type")) {
        r.usedDefault("type");
    } else if (auto t = enumFromText(r, "type", fuseTypeNames)) {
        fuse.type = *t;
    }
    bench.fuse = fuse;
}

void readBench(const json &object, SetupParse &out, Bench &bench)
{
    SectionReader r(object, "bench", out);
    r.rejectUnknownKeys({"steps", "top_fraction", "overload_factor", "allow_overload", "rheostat", "fuse",
                         "fuse_factor", "magnetizing_fraction", "dwell_s"});
    if (r.isMissing("steps")) {
        r.usedDefault("steps");
    } else if (auto steps = r.quantity("steps", Unit::None)) {
        if (*steps != std::floor(*steps)) {
            r.error("steps", "must be a whole number of load steps");
        } else if (r.inRange("steps", *steps, 1.0, true, maxSteps, "", "more steps than this only lengthen the time under load")) {
            bench.steps = static_cast<int>(*steps);
        }
    }
    if (r.isMissing("top_fraction")) {
        r.usedDefault("top_fraction");
    } else if (auto top = r.fraction("top_fraction")) {
        if (r.inRange("top_fraction", *top, 0.0, false, 1.5, "", "fraction of rated secondary current"))
            bench.topFraction = *top;
    }
    if (r.isMissing("overload_factor")) {
        r.usedDefault("overload_factor");
    } else if (auto factor = r.quantity("overload_factor", Unit::None)) {
        if (r.inRange("overload_factor", *factor, 0.0, false, 1.5, "", "multiple of rated VA allowed before the sweep stops"))
            bench.overloadFactor = *factor;
    }
    if (r.isMissing("allow_overload"))
        r.usedDefault("allow_overload");
    else if (auto allow = r.boolean("allow_overload"))
        bench.allowOverload = *allow;
    if (!r.isMissing("rheostat"))
        readRheostat(object.at("rheostat"), out, bench);
    if (!r.isMissing("fuse"))
        readFuse(object.at("fuse"), out, bench);
    // fuse_factor and magnetizing_fraction defaults depend on the construction: the planner
    // chooses and reports them.
    if (r.isMissing("fuse_factor")) {
    } else if (auto factor = r.quantity("fuse_factor", Unit::None)) {
        if (r.inRange("fuse_factor", *factor, 1.0, true, 5.0, "", "multiple of rated primary current"))
            bench.fuseFactor = *factor;
    }
    if (r.isMissing("magnetizing_fraction")) {
    } else if (auto fraction = r.fraction("magnetizing_fraction")) {
        if (r.inRange("magnetizing_fraction", *fraction, 0.0, true, 0.8, "", "fraction of rated primary current"))
            bench.magnetizingFraction = *fraction;
    }
    if (r.isMissing("dwell_s")) {
        r.usedDefault("dwell_s");
    } else if (auto dwell = r.quantity("dwell_s", Unit::Second)) {
        if (r.inRange("dwell_s", *dwell, 0.0, true, maxDwellS, " s"))
            bench.dwellS = *dwell;
    }
}

// One meter of the `meters` section: gain (% of reading), offset and resolution in the meter's
// unit; every item required (0 when the meter's specification has no such term).
void readMeter(const json &object, const std::string &name, Unit unit, SetupParse &out, MeterSpec &meter)
{
    const std::string path = "meters." + name;
    const std::string suffix = unit == Unit::Volt ? "_v" : unit == Unit::Watt ? "_w" : "_a";
    if (!object.is_object()) {
        out.errors.push_back({path, "must be an object with gain_percent_of_reading, offset" + suffix + " and resolution"
                                        + suffix});
        return;
    }
    SectionReader r(object, path, out);
    r.rejectUnknownKeys({"gain_percent_of_reading", "offset" + suffix, "resolution" + suffix});
    const double maxValue = unit == Unit::Volt ? maxVoltageV : unit == Unit::Watt ? maxRatedPowerVa : 100.0;
    meter.gainPercentOfReading = r.required("gain_percent_of_reading", Unit::Percent);
    if (!r.isMissing("gain_percent_of_reading"))
        r.inRange("gain_percent_of_reading", meter.gainPercentOfReading, 0.0, true, 10.0, " %",
                  "half-width of the meter's gain error; give 0 if its specification has none");
    meter.offset = r.required("offset" + suffix, unit);
    if (!r.isMissing("offset" + suffix))
        r.inRange("offset" + suffix, meter.offset, 0.0, true, maxValue, " " + unitSymbol(unit),
                  "half-width of the meter's offset (the counts term), in " + unitSymbol(unit));
    meter.resolution = r.required("resolution" + suffix, unit);
    if (!r.isMissing("resolution" + suffix))
        r.inRange("resolution" + suffix, meter.resolution, 0.0, true, maxValue, " " + unitSymbol(unit),
                  "one count of the last digit; give 0 if unknown");
}

void readMeters(const json &object, SetupParse &out, std::optional<MeterSpecs> &meters)
{
    if (!object.is_object()) {
        out.errors.push_back({"meters", "must be an object with voltmeter and ammeter"});
        return;
    }
    SectionReader r(object, "meters", out);
    r.rejectUnknownKeys({"voltmeter", "ammeter", "primary_voltmeter", "primary_ammeter", "power_meter",
                         "winding_temperature_u_c"});
    MeterSpecs specs;
    for (const auto &[key, unit, target] : {std::tuple{"voltmeter", Unit::Volt, &specs.voltmeter},
                                            std::tuple{"ammeter", Unit::Ampere, &specs.ammeter}}) {
        if (r.isMissing(key))
            r.error(key, "is required: the meters section describes both the secondary voltmeter and ammeter");
        else
            readMeter(object.at(key), key, unit, out, *target);
    }
    // The primary meters are optional: without one, its readings' own stated u is used.
    for (const auto &[key, unit, target] : {std::tuple{"primary_voltmeter", Unit::Volt, &specs.primaryVoltmeter},
                                            std::tuple{"primary_ammeter", Unit::Ampere, &specs.primaryAmmeter},
                                            std::tuple{"power_meter", Unit::Watt, &specs.powerMeter}}) {
        if (r.isMissing(key))
            continue;
        MeterSpec meter;
        readMeter(object.at(key), key, unit, out, meter);
        *target = meter;
    }
    if (auto u = r.quantity("winding_temperature_u_c", Unit::Celsius)) {
        if (r.inRange("winding_temperature_u_c", *u, 0.0, false, 50.0, " °C",
                      "standard uncertainty of the winding temperature"))
            specs.windingTemperatureUncertaintyC = *u;
    }
    meters = specs;
}

// {"min": ..., "max": ...}: at least one end, min below max.
std::optional<ToleranceRange> readRange(const json &object, const std::string &path, Unit unit, SetupParse &out)
{
    if (!object.is_object()) {
        out.errors.push_back({path, "must be an object with min and/or max (" + unitQuantityName(unit) + " in "
                                        + unitSymbol(unit) + ")"});
        return std::nullopt;
    }
    SectionReader r(object, path, out);
    r.rejectUnknownKeys({"min", "max"});
    ToleranceRange range;
    range.min = r.quantity("min", unit);
    range.max = r.quantity("max", unit);
    if (r.isMissing("min") && r.isMissing("max")) {
        out.errors.push_back({path, "needs min, max or both"});
        return std::nullopt;
    }
    if (range.min && range.max && !(*range.min < *range.max)) {
        std::ostringstream rule;
        rule << "must be below max (" << *range.max << " " << unitSymbol(unit) << "), got " << *range.min;
        r.error("min", rule.str());
        return std::nullopt;
    }
    if (range.min)
        r.inRange("min", *range.min, 0.0, true, maxVoltageV, " " + unitSymbol(unit));
    if (range.max)
        r.inRange("max", *range.max, 0.0, false, maxVoltageV, " " + unitSymbol(unit));
    if (r.hasError("min") || r.hasError("max"))
        return std::nullopt;
    return range;
}

void readSpecification(const json &object, SetupParse &out, std::optional<Specification> &specification)
{
    if (!object.is_object()) {
        out.errors.push_back({"specification", "must be an object of limits and their source"});
        return;
    }
    SectionReader r(object, "specification", out);
    r.rejectUnknownKeys({"regulation_max_percent", "full_load_voltage_v", "no_load_voltage_v",
                         "series_resistance_max_ohm", "source"});
    Specification spec;
    if (auto limit = r.quantity("regulation_max_percent", Unit::Percent)) {
        if (r.inRange("regulation_max_percent", *limit, 0.0, false, 100.0, " %", "full-load base"))
            spec.regulationMaxPercent = *limit;
    }
    if (!r.isMissing("full_load_voltage_v"))
        spec.fullLoadVoltageV = readRange(object.at("full_load_voltage_v"), r.field("full_load_voltage_v"), Unit::Volt, out);
    if (!r.isMissing("no_load_voltage_v"))
        spec.noLoadVoltageV = readRange(object.at("no_load_voltage_v"), r.field("no_load_voltage_v"), Unit::Volt, out);
    if (auto limit = r.quantity("series_resistance_max_ohm", Unit::Ohm)) {
        if (r.inRange("series_resistance_max_ohm", *limit, 0.0, false, 1e6, " Ω", "referred to the secondary"))
            spec.seriesResistanceMaxOhm = *limit;
    }
    spec.source = r.text("source").value_or("");
    specification = spec;
}

// "design": an optional name of up to 80 characters, printable text, not only spaces.
void readDesignName(const json &document, SetupParse &out, std::string &design)
{
    if (!document.contains("design") || document.at("design").is_null())
        return;
    const json &value = document.at("design");
    if (!value.is_string()) {
        out.errors.push_back({"design", "must be text naming the design, e.g. \"PT-60 rev B\""});
        return;
    }
    const std::string text = value.get<std::string>();
    const auto first = text.find_first_not_of(' ');
    if (first == std::string::npos) {
        out.errors.push_back({"design", "must not be empty; leave it out to group by the nameplate"});
        return;
    }
    const std::string trimmed = text.substr(first, text.find_last_not_of(' ') - first + 1);
    if (trimmed.size() > maxDesignNameBytes) {
        out.errors.push_back({"design", "must be at most " + std::to_string(maxDesignNameBytes) + " bytes, got "
                                            + std::to_string(trimmed.size())});
        return;
    }
    for (unsigned char c : trimmed) {
        if (c < 0x20 || c == 0x7f) {
            out.errors.push_back({"design", "must be one line of printable text (no control characters)"});
            return;
        }
    }
    design = trimmed;
}

} // namespace

SetupParse parseSetupJson(std::string_view text)
{
    SetupParse out;
    JsonRead read = readJson(text);
    if (!read.ok()) {
        out.errors.push_back({"setup", read.error + "; expected an object with \"nameplate\" and \"bench\""});
        return out;
    }
    const json document = std::move(*read.document);
    if (!document.is_object()) {
        out.errors.push_back({"setup", "must be a JSON object with \"nameplate\" and \"bench\""});
        return out;
    }
    Setup setup;
    for (const auto &item : document.items()) {
        if (item.key() != "nameplate" && item.key() != "bench" && item.key() != "meters"
            && item.key() != "specification" && item.key() != "design")
            out.errors.push_back({printableKey(item.key()),
                                  "is not a setup section; the sections are design, nameplate, bench, "
                                              "meters and specification"});
    }
    readDesignName(document, out, setup.design);
    if (!document.contains("nameplate") || !document.at("nameplate").is_object())
        out.errors.push_back({"nameplate", "is required and must be an object"});
    else
        readNameplate(document.at("nameplate"), out, setup.nameplate);
    if (!document.contains("bench") || document.at("bench").is_null()) {
        out.defaultsUsed.push_back("bench");
    } else if (!document.at("bench").is_object()) {
        out.errors.push_back({"bench", "must be an object"});
    } else {
        readBench(document.at("bench"), out, setup.bench);
    }
    if (document.contains("meters") && !document.at("meters").is_null())
        readMeters(document.at("meters"), out, setup.meters);
    if (document.contains("specification") && !document.at("specification").is_null())
        readSpecification(document.at("specification"), out, setup.specification);
    if (out.errors.empty())
        out.setup = setup;
    return out;
}

SetupParse loadSetupFile(const std::string &path)
{
    const TextFileRead file = readTextFile(path, maxSetupFileBytes);
    if (!file.text) {
        SetupParse out;
        out.errors.push_back(unreadableFileError(path, file.error));
        return out;
    }
    const std::optional<FileText> &text = file.text;
    SetupParse out = parseSetupJson(*text);
    for (auto &error : out.errors) {
        if (error.field == "setup")
            error.field = path;
    }
    return out;
}

std::string setupToJson(const Setup &setup)
{
    const Nameplate &p = setup.nameplate;
    const Bench &b = setup.bench;
    json nameplate = {
        {"rated_power_va", p.ratedPowerVa},
        {"primary_voltage_v", p.primaryVoltageV},
        {"frequency_hz", p.frequencyHz},
        {"secondary_voltage_v", p.secondaryVoltageV},
        {"secondary_no_load_voltage_v", p.secondaryNoLoadVoltageV ? json(*p.secondaryNoLoadVoltageV) : json(nullptr)},
        {"regulation_percent", p.regulationPercent ? json(*p.regulationPercent) : json(nullptr)},
        {"construction", toString(p.construction)},
        {"winding_material", toString(p.windingMaterial)},
    };
    json bench = {
        {"steps", b.steps},
        {"top_fraction", b.topFraction},
        {"overload_factor", b.overloadFactor},
        {"allow_overload", b.allowOverload},
        {"rheostat", b.rheostat ? json{{"total_resistance_ohm", b.rheostat->totalResistanceOhm},
                                       {"power_rating_w", b.rheostat->powerRatingW}}
                                : json(nullptr)},
        {"fuse", b.fuse ? json{{"rating_a", b.fuse->ratingA}, {"type", toString(b.fuse->type)}} : json(nullptr)},
        {"fuse_factor", b.fuseFactor ? json(*b.fuseFactor) : json(nullptr)},
        {"magnetizing_fraction", b.magnetizingFraction ? json(*b.magnetizingFraction) : json(nullptr)},
        {"dwell_s", b.dwellS},
    };
    json root{{"nameplate", nameplate}, {"bench", bench}};
    if (!setup.design.empty())
        root["design"] = setup.design;
    if (setup.meters) {
        const MeterSpecs &m = *setup.meters;
        const auto meter = [](const MeterSpec &spec, const std::string &suffix) {
            return json{{"gain_percent_of_reading", spec.gainPercentOfReading},
                        {"offset" + suffix, spec.offset},
                        {"resolution" + suffix, spec.resolution}};
        };
        root["meters"] = {
            {"voltmeter", meter(m.voltmeter, "_v")},
            {"ammeter", meter(m.ammeter, "_a")},
            {"winding_temperature_u_c",
             m.windingTemperatureUncertaintyC ? json(*m.windingTemperatureUncertaintyC) : json(nullptr)},
        };
        // Written only when given, so a setup without them reads back as it was.
        if (m.primaryVoltmeter)
            root["meters"]["primary_voltmeter"] = meter(*m.primaryVoltmeter, "_v");
        if (m.primaryAmmeter)
            root["meters"]["primary_ammeter"] = meter(*m.primaryAmmeter, "_a");
        if (m.powerMeter)
            root["meters"]["power_meter"] = meter(*m.powerMeter, "_w");
    }
    if (setup.specification) {
        const Specification &s = *setup.specification;
        const auto range = [](const std::optional<ToleranceRange> &r) {
            if (!r)
                return json(nullptr);
            return json{{"min", r->min ? json(*r->min) : json(nullptr)}, {"max", r->max ? json(*r->max) : json(nullptr)}};
        };
        root["specification"] = {
            {"regulation_max_percent", s.regulationMaxPercent ? json(*s.regulationMaxPercent) : json(nullptr)},
            {"full_load_voltage_v", range(s.fullLoadVoltageV)},
            {"no_load_voltage_v", range(s.noLoadVoltageV)},
            {"series_resistance_max_ohm", s.seriesResistanceMaxOhm ? json(*s.seriesResistanceMaxOhm) : json(nullptr)},
            {"source", s.source},
        };
    }
    return jsonText(root, 2);
}

} // namespace sagline
