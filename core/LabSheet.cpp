#include "LabSheet.h"

#include "JsonReader.h"
#include "NumberFormat.h"
#include "OutputText.h"
#include "SetupJson.h"
#include "TextFile.h"
#include "Units.h"

#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdint>
#include <cstdio>

namespace sagline {

using nlohmann::json;

namespace {

// Highest load fraction a sheet may allow: the setup parser's own ceiling for top_fraction.
constexpr double maxSheetLoadFraction = 1.5;
constexpr std::size_t maxTitleLength = 200;
constexpr std::size_t maxInstructionsLength = 20000;

bool isMissing(const json &object, const char *key)
{
    return !object.contains(key) || object.at(key).is_null();
}

std::optional<bool> readBool(const json &object, const std::string &path, const char *key, FieldErrors &errors)
{
    if (isMissing(object, key)) {
        errors.push_back({path + "." + key, "is required (true or false)"});
        return std::nullopt;
    }
    if (!object.at(key).is_boolean()) {
        errors.push_back({path + "." + key, "must be true or false, got " + shortJson(object.at(key))});
        return std::nullopt;
    }
    return object.at(key).get<bool>();
}

// A number, a string with a unit, or (for fractions) a percentage string.
std::optional<double> readQuantity(const json &object, const std::string &path, const char *key, Unit unit,
                                   FieldErrors &errors)
{
    const std::string field = path + "." + key;
    if (isMissing(object, key)) {
        errors.push_back({field, "is required"});
        return std::nullopt;
    }
    const json &value = object.at(key);
    if (value.is_number()) {
        const double number = value.get<double>();
        if (!std::isfinite(number)) {
            errors.push_back({field, "must be a finite number"});
            return std::nullopt;
        }
        return number;
    }
    if (value.is_string()) {
        std::string text = value.get<std::string>();
        const bool percent = unit == Unit::None && text.find('%') != std::string::npos;
        const auto parsed = parseQuantity(text, percent ? Unit::Percent : unit);
        if (!parsed.ok) {
            errors.push_back({field, parsed.error});
            return std::nullopt;
        }
        return percent ? parsed.value / 100.0 : parsed.value;
    }
    errors.push_back({field, "must be a number or a string with a unit, got " + shortJson(value)});
    return std::nullopt;
}

std::optional<std::string> readText(const json &object, const char *key, std::size_t maxLength, bool required,
                                    FieldErrors &errors)
{
    if (isMissing(object, key)) {
        if (required)
            errors.push_back({key, "is required (a non-empty string)"});
        return std::nullopt;
    }
    const json &value = object.at(key);
    if (!value.is_string()) {
        errors.push_back({key, "must be a string, got " + shortJson(value)});
        return std::nullopt;
    }
    std::string text = value.get<std::string>();
    if (required && text.find_first_not_of(" \t\r\n") == std::string::npos) {
        errors.push_back({key, "must not be empty"});
        return std::nullopt;
    }
    if (text.size() > maxLength) {
        errors.push_back({key, "is too long: at most " + std::to_string(maxLength) + " bytes, got "
                                   + std::to_string(text.size())});
        return std::nullopt;
    }
    return text;
}

void readFuse(const json &locks, LabSheetLocks &out, FieldErrors &errors)
{
    const std::string path = "locks.required_fuse";
    if (isMissing(locks, "required_fuse") || !locks.at("required_fuse").is_object()) {
        errors.push_back({path, "is required: an object {\"rating_a\": ..., \"type\": \"time-lag\" or \"quick-acting\"}"});
        return;
    }
    const json &fuse = locks.at("required_fuse");
    for (const auto &item : fuse.items()) {
        if (item.key() != "rating_a" && item.key() != "type")
            errors.push_back({path + "." + printableKey(item.key()), "is not a fuse field; the fields are rating_a and type"});
    }
    if (auto rating = readQuantity(fuse, path, "rating_a", Unit::Ampere, errors)) {
        // The same range as a setup's bench.fuse: the sheet's fuse becomes the setup's.
        if (!(*rating >= minFuseRatingA) || *rating > maxFuseRatingA)
            errors.push_back({path + ".rating_a", "must be at least " + formatQuantity(minFuseRatingA, "A") + " and at most "
                                                      + formatQuantity(maxFuseRatingA, "A") + ", got " + formatQuantity(*rating, "A")});
        else
            out.requiredFuse.ratingA = *rating;
    }
    if (isMissing(fuse, "type") || !fuse.at("type").is_string()) {
        errors.push_back({path + ".type", "is required: \"time-lag\" or \"quick-acting\""});
    } else {
        const std::string type = fuse.at("type").get<std::string>();
        if (type == "time-lag")
            out.requiredFuse.type = FuseType::TimeLag;
        else if (type == "quick-acting")
            out.requiredFuse.type = FuseType::QuickActing;
        else
            errors.push_back({path + ".type", "must be \"time-lag\" or \"quick-acting\", got \"" + type + "\""});
    }
}

// {"scheme": "pbkdf2-hmac-sha256", "iterations": N, "salt": hex, "hash": hex}, as written by
// `sagline-cli labsheet new --supervisor-pin`; never the PIN itself.
void readSupervisorPin(const json &value, LabSheetLocks &out, FieldErrors &errors)
{
    const std::string path = "locks.supervisor_pin";
    if (!value.is_object()) {
        errors.push_back({path, "must be an object with scheme, iterations, salt and hash (written by "
                                "sagline-cli labsheet new --supervisor-pin; never the PIN itself)"});
        return;
    }
    SupervisorPinLock lock;
    const std::size_t before = errors.size();
    for (const auto &item : value.items()) {
        if (item.key() != "scheme" && item.key() != "iterations" && item.key() != "salt" && item.key() != "hash")
            errors.push_back({path + "." + printableKey(item.key()), "is not a PIN field; the fields are scheme, iterations, salt and hash"});
    }
    if (isMissing(value, "scheme") || value.at("scheme") != supervisorPinScheme)
        errors.push_back({path + ".scheme", std::string("must be \"") + supervisorPinScheme + "\""});
    if (isMissing(value, "iterations") || !value.at("iterations").is_number_integer()
        || value.at("iterations").get<long long>() < 1000 || value.at("iterations").get<long long>() > 10000000)
        errors.push_back({path + ".iterations", "must be a whole number from 1000 to 10000000"});
    else
        lock.iterations = static_cast<std::uint32_t>(value.at("iterations").get<long long>());
    const auto hexField = [&](const char *key, std::size_t minBytes, std::size_t maxBytes, std::string &target) {
        const std::string field = path + "." + key;
        if (isMissing(value, key) || !value.at(key).is_string()) {
            errors.push_back({field, "is required: hexadecimal text"});
            return;
        }
        const std::string text = value.at(key).get<std::string>();
        const auto bytes = fromHex(text);
        if (!bytes || bytes->size() < minBytes || bytes->size() > maxBytes) {
            errors.push_back({field, "must be " + std::to_string(minBytes * 2) + " to " + std::to_string(maxBytes * 2)
                                         + " hexadecimal digits"});
            return;
        }
        target = text;
    };
    hexField("salt", 8, 64, lock.saltHex);
    hexField("hash", 32, 32, lock.hashHex);
    if (errors.size() == before)
        out.supervisorPin = lock;
}

void readLocks(const json &document, LabSheetLocks &out, FieldErrors &errors)
{
    if (isMissing(document, "locks") || !document.at("locks").is_object()) {
        errors.push_back({"locks", "is required and must be an object with plan_fixed, max_load_fraction, "
                                   "required_fuse and typed_in_only"});
        return;
    }
    const json &locks = document.at("locks");
    for (const auto &item : locks.items()) {
        const std::string &key = item.key();
        if (key != "plan_fixed" && key != "max_load_fraction" && key != "required_fuse" && key != "typed_in_only"
            && key != "supervisor_pin")
            errors.push_back({"locks." + printableKey(key), "is not a lock; the locks are plan_fixed, max_load_fraction, "
                                              "required_fuse, typed_in_only and supervisor_pin"});
    }
    if (auto fixed = readBool(locks, "locks", "plan_fixed", errors))
        out.planFixed = *fixed;
    if (auto typed = readBool(locks, "locks", "typed_in_only", errors))
        out.typedInOnly = *typed;
    if (auto fraction = readQuantity(locks, "locks", "max_load_fraction", Unit::None, errors)) {
        if (*fraction <= 0.0 || *fraction > maxSheetLoadFraction)
            errors.push_back({"locks.max_load_fraction", "must be above 0 and at most " + formatSignificant(maxSheetLoadFraction, 3)
                                                             + " (of rated secondary current), got "
                                                             + formatSignificant(*fraction, 4)});
        else
            out.maxLoadFraction = *fraction;
    }
    readFuse(locks, out, errors);
    if (!isMissing(locks, "supervisor_pin"))
        readSupervisorPin(locks.at("supervisor_pin"), out, errors);
}

// The setup must not plan beyond the sheet, and its fuse must be the required one.
void checkSetupAgainstLocks(LabSheet &sheet, FieldErrors &errors)
{
    Bench &bench = sheet.setup.bench;
    if (bench.topFraction > sheet.locks.maxLoadFraction + 1e-12)
        errors.push_back({"setup.bench.top_fraction", "must be at most locks.max_load_fraction ("
                                                          + formatSignificant(sheet.locks.maxLoadFraction, 4) + "), got "
                                                          + formatSignificant(bench.topFraction, 4)
                                                          + ": the plan would go beyond the sheet's limit"});
    if (!bench.fuse) {
        bench.fuse = sheet.locks.requiredFuse;
    } else if (std::fabs(bench.fuse->ratingA - sheet.locks.requiredFuse.ratingA) > 1e-9 * sheet.locks.requiredFuse.ratingA
               || bench.fuse->type != sheet.locks.requiredFuse.type) {
        errors.push_back({"setup.bench.fuse", "must be the required fuse (" + formatQuantity(sheet.locks.requiredFuse.ratingA, "A")
                                                  + " " + toString(sheet.locks.requiredFuse.type) + "), got "
                                                  + formatQuantity(bench.fuse->ratingA, "A") + " " + toString(bench.fuse->type)});
    }
    const PlanResult plan = makePlan(sheet.setup);
    for (const auto &error : plan.errors)
        errors.push_back({"setup." + error.field, error.rule});
}

} // namespace

LabSheetParse parseLabSheetJson(std::string_view text)
{
    LabSheetParse out;
    JsonRead read = readJson(text);
    if (!read.ok()) {
        out.errors.push_back({"lab sheet", read.error});
        return out;
    }
    const json document = std::move(*read.document);
    if (!document.is_object()) {
        out.errors.push_back({"lab sheet", "must be a JSON object with format, version, title, setup, locks, instructions"});
        return out;
    }
    for (const auto &item : document.items()) {
        const std::string &key = item.key();
        if (key != "format" && key != "version" && key != "title" && key != "setup" && key != "locks"
            && key != "instructions")
            out.errors.push_back({printableKey(key), "is not a lab-sheet field; the fields are format, version, title, setup, locks, "
                                       "instructions"});
    }
    if (isMissing(document, "format") || document.at("format") != labSheetFormatName) {
        out.errors.push_back({"format", std::string("must be \"") + labSheetFormatName + "\" (this is not a lab sheet)"});
        return out; // nothing else is worth reporting for a file of another kind
    }
    if (isMissing(document, "version") || !document.at("version").is_number_integer())
        out.errors.push_back({"version", "is required (an integer)"});
    else if (document.at("version").get<long long>() > labSheetFormatVersion)
        out.errors.push_back({"version", "is " + std::to_string(document.at("version").get<long long>())
                                             + ", newer than this Sagline reads (" + std::to_string(labSheetFormatVersion)
                                             + "); update Sagline"});
    else if (document.at("version").get<long long>() < 1)
        out.errors.push_back({"version", "must be at least 1"});

    LabSheet sheet;
    if (auto title = readText(document, "title", maxTitleLength, true, out.errors))
        sheet.title = *title;
    if (auto instructions = readText(document, "instructions", maxInstructionsLength, false, out.errors))
        sheet.instructions = *instructions;
    readLocks(document, sheet.locks, out.errors);

    bool setupOk = false;
    if (isMissing(document, "setup") || !document.at("setup").is_object()) {
        out.errors.push_back({"setup", "is required: the setup file's object with nameplate and bench"});
    } else {
        const SetupParse setup = parseSetupJson(jsonText(document.at("setup")));
        for (const auto &error : setup.errors)
            out.errors.push_back({"setup." + error.field, error.rule});
        if (setup.setup) {
            sheet.setup = *setup.setup;
            setupOk = true;
        }
    }
    if (setupOk && out.errors.empty())
        checkSetupAgainstLocks(sheet, out.errors);
    if (out.errors.empty())
        out.sheet = sheet;
    return out;
}

LabSheetParse loadLabSheetFile(const std::string &path)
{
    const TextFileRead file = readTextFile(path, maxSetupFileBytes);
    if (!file.text) {
        LabSheetParse out;
        out.errors.push_back(unreadableFileError(path, file.error));
        return out;
    }
    const std::optional<FileText> &text = file.text;
    return parseLabSheetJson(*text);
}

std::string labSheetToJson(const LabSheet &sheet)
{
    json locks = {
        {"plan_fixed", sheet.locks.planFixed},
        {"max_load_fraction", sheet.locks.maxLoadFraction},
        {"required_fuse", {{"rating_a", sheet.locks.requiredFuse.ratingA}, {"type", toString(sheet.locks.requiredFuse.type)}}},
        {"typed_in_only", sheet.locks.typedInOnly},
    };
    if (const auto &pin = sheet.locks.supervisorPin)
        locks["supervisor_pin"] = {{"scheme", pin->scheme}, {"iterations", pin->iterations}, {"salt", pin->saltHex},
                                   {"hash", pin->hashHex}};
    const json document = {
        {"format", labSheetFormatName},
        {"version", labSheetFormatVersion},
        {"title", sheet.title},
        {"setup", json::parse(setupToJson(sheet.setup))},
        {"locks", locks},
        {"instructions", sheet.instructions},
    };
    return jsonText(document, 2);
}

std::string labSheetFingerprint(const LabSheet &sheet)
{
    // FNV-1a, 64 bit (Fowler, Noll, Vo; offset basis and prime of the published parameters).
    std::uint64_t hash = 0xcbf29ce484222325ull;
    for (unsigned char c : labSheetToJson(sheet)) {
        hash ^= c;
        hash *= 0x100000001b3ull;
    }
    char text[17];
    std::snprintf(text, sizeof text, "%016llx", static_cast<unsigned long long>(hash));
    return text;
}

double labSheetMaxCurrentA(const LabSheet &sheet)
{
    const Nameplate &plate = sheet.setup.nameplate;
    if (plate.secondaryVoltageV <= 0.0)
        return 0.0;
    return sheet.locks.maxLoadFraction * plate.ratedPowerVa / plate.secondaryVoltageV;
}

LimitCheck checkStepAgainstSheet(const LabSheet &sheet, const PlanStep &step)
{
    const double limit = labSheetMaxCurrentA(sheet);
    if (step.currentA <= limit * (1.0 + 1e-9))
        return {};
    return {false, "lab-sheet-max-load",
            "step " + std::to_string(step.index) + " asks for " + formatQuantity(step.currentA, "A")
                + ", above the lab sheet's limit of " + formatQuantity(limit, "A") + " ("
                + formatSignificant(sheet.locks.maxLoadFraction * 100.0, 3) + " % of rated current)"};
}

LimitCheck checkReadingAgainstSheet(const LabSheet &sheet, double currentA)
{
    const double limit = labSheetMaxCurrentA(sheet);
    const double refuseAbove = limit * (1.0 + labSheetReadingAllowance);
    if (std::isfinite(currentA) && currentA <= refuseAbove)
        return {};
    return {false, "lab-sheet-max-load",
            "a current of " + formatQuantity(currentA, "A") + " is above the lab sheet's limit of "
                + formatQuantity(limit, "A") + " (" + formatSignificant(sheet.locks.maxLoadFraction * 100.0, 3)
                + " % of rated current, " + formatSignificant(labSheetReadingAllowance * 100.0, 2)
                + " % allowance for setting the load by hand): reduce the load and ask your supervisor"};
}

LimitCheck checkFuseAgainstSheet(const LabSheet &sheet, const FuseSpec &fitted)
{
    const FuseSpec &required = sheet.locks.requiredFuse;
    if (std::fabs(fitted.ratingA - required.ratingA) <= 1e-9 * required.ratingA && fitted.type == required.type)
        return {};
    return {false, "lab-sheet-fuse",
            "the fitted fuse (" + formatQuantity(fitted.ratingA, "A") + " " + toString(fitted.type)
                + ") is not the one the lab sheet requires (" + formatQuantity(required.ratingA, "A") + " "
                + toString(required.type) + ")"};
}

} // namespace sagline
