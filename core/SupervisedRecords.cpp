#include "SupervisedRecords.h"

#include "JsonReader.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cctype>

namespace sagline {

using nlohmann::json;

bool SafetyChecklist::complete() const
{
    return !items.empty() && std::all_of(items.begin(), items.end(), [](const ChecklistItem &item) { return item.ticked; });
}

SafetyChecklist standardSafetyChecklist(const std::string &student)
{
    // The usual cautions for work on a mains-connected transformer (DESIGN.md, Safety).
    SafetyChecklist list;
    list.student = student;
    list.items = {
        {"fused-isolated-supply", "The primary is fed from a fused, isolated supply (isolating transformer or "
                                  "protected bench supply), and the lab sheet's fuse is fitted", false},
        {"meters-rated", "The meters and test leads are rated for the measurement category and voltage of the "
                         "circuit (IEC 61010 CAT marking)", false},
        {"leads-checked", "Leads, clips and plugs checked: no damaged insulation, shrouded connectors, "
                          "secondary wiring done with the supply off", false},
    };
    return list;
}

std::string supervisorConfirmationError(const SupervisorConfirmation &confirmation)
{
    const auto trimmed = [](const std::string &text) {
        const auto first = text.find_first_not_of(" \t");
        return first == std::string::npos ? std::string() : text.substr(first, text.find_last_not_of(" \t") - first + 1);
    };
    const std::string supervisor = trimmed(confirmation.supervisor);
    if (supervisor.empty())
        return "supervisor: the supervisor's own name is required";
    if (supervisor.size() > 120)
        return "supervisor: at most 120 characters";
    for (unsigned char c : supervisor)
        if (c < 0x20 || c == 0x7f)
            return "supervisor: one line of printable text";
    std::string a = supervisor, b = trimmed(confirmation.student);
    std::transform(a.begin(), a.end(), a.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    std::transform(b.begin(), b.end(), b.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    if (a == b)
        return "supervisor: the student cannot confirm their own set-up; the supervisor gives their name";
    return {};
}

std::string supervisorNoteText(const SupervisorConfirmation &confirmation)
{
    return json{{"supervisor_confirmed", confirmation.supervisor},
                {"student", confirmation.student},
                {"pin_checked", confirmation.pinChecked}}
        .dump(-1, ' ', false, json::error_handler_t::replace);
}

std::string supervisedSessionFileName(const std::string &student, const std::string &unitSerial,
                                      const std::string &utcStamp)
{
    const auto part = [](const std::string &text, const char *fallback) {
        std::string out;
        for (unsigned char c : text) {
            const bool keep = std::isalnum(c) || c == '-' || c == '_' || c == '.';
            if (keep)
                out.push_back(static_cast<char>(c));
            else if (!out.empty() && out.back() != '-')
                out.push_back('-');
        }
        while (!out.empty() && (out.back() == '-' || out.back() == '.'))
            out.pop_back();
        while (!out.empty() && (out.front() == '-' || out.front() == '.'))
            out.erase(out.begin());
        if (out.size() > 40)
            out.resize(40);
        return out.empty() ? std::string(fallback) : out;
    };
    return part(student, "student") + "_" + part(unitSerial, "unit") + "_" + utcStamp + "Z.sagline";
}

LabSheetStamp labSheetStamp(const LabSheet &sheet, const std::string &student)
{
    return {sheet.title, labSheetFingerprint(sheet), sheet.locks.maxLoadFraction, sheet.locks.requiredFuse, student};
}

std::string labSheetNoteText(const LabSheetStamp &stamp)
{
    return json{{"lab_sheet", stamp.title},
                {"fingerprint", stamp.fingerprint},
                {"max_load_fraction", stamp.maxLoadFraction},
                {"required_fuse", {{"rating_a", stamp.requiredFuse.ratingA}, {"type", toString(stamp.requiredFuse.type)}}},
                {"student", stamp.student}}
        .dump(-1, ' ', false, json::error_handler_t::replace);
}

std::string checklistNoteText(const SafetyChecklist &checklist)
{
    json items = json::array();
    for (const auto &item : checklist.items)
        items.push_back({{"item", item.key}, {"text", item.text}, {"ticked", item.ticked}});
    return json{{"safety_checklist", items}, {"student", checklist.student}, {"complete", checklist.complete()}}.dump(-1, ' ', false, json::error_handler_t::replace);
}

std::string limitHitNoteText(const LimitHit &hit)
{
    json object = {{"limit_hit", hit.rule}, {"message", hit.message}, {"step", hit.step}};
    object["current_a"] = hit.currentA ? json(*hit.currentA) : json(nullptr);
    return object.dump(-1, ' ', false, json::error_handler_t::replace);
}

namespace {

std::optional<json> parseObject(const std::string &text)
{
    JsonRead read = readJson(text);
    if (!read.ok() || !read.document->is_object())
        return std::nullopt;
    return std::move(read.document);
}

std::string stringOr(const json &object, const char *key)
{
    return object.contains(key) && object.at(key).is_string() ? object.at(key).get<std::string>() : std::string();
}

std::optional<LabSheetStamp> readStamp(const json &object)
{
    if (!object.contains("lab_sheet") || !object.at("lab_sheet").is_string())
        return std::nullopt;
    LabSheetStamp stamp;
    stamp.title = object.at("lab_sheet").get<std::string>();
    stamp.fingerprint = stringOr(object, "fingerprint");
    stamp.student = stringOr(object, "student");
    if (object.contains("max_load_fraction") && object.at("max_load_fraction").is_number())
        stamp.maxLoadFraction = object.at("max_load_fraction").get<double>();
    if (object.contains("required_fuse") && object.at("required_fuse").is_object()) {
        const json &fuse = object.at("required_fuse");
        if (fuse.contains("rating_a") && fuse.at("rating_a").is_number())
            stamp.requiredFuse.ratingA = fuse.at("rating_a").get<double>();
        stamp.requiredFuse.type = stringOr(fuse, "type") == "quick-acting" ? FuseType::QuickActing : FuseType::TimeLag;
    }
    return stamp;
}

std::optional<SafetyChecklist> readChecklist(const json &object)
{
    if (!object.contains("safety_checklist") || !object.at("safety_checklist").is_array())
        return std::nullopt;
    SafetyChecklist list;
    list.student = stringOr(object, "student");
    for (const json &item : object.at("safety_checklist")) {
        if (!item.is_object())
            return std::nullopt;
        list.items.push_back({stringOr(item, "item"), stringOr(item, "text"),
                              item.contains("ticked") && item.at("ticked").is_boolean() && item.at("ticked").get<bool>()});
    }
    return list;
}

std::optional<SupervisorConfirmation> readSupervisor(const json &object, const std::string &timeUtc)
{
    if (!object.contains("supervisor_confirmed") || !object.at("supervisor_confirmed").is_string())
        return std::nullopt;
    SupervisorConfirmation confirmation;
    confirmation.supervisor = object.at("supervisor_confirmed").get<std::string>();
    confirmation.student = stringOr(object, "student");
    confirmation.pinChecked = object.contains("pin_checked") && object.at("pin_checked").is_boolean()
                              && object.at("pin_checked").get<bool>();
    confirmation.timeUtc = timeUtc;
    return confirmation;
}

std::optional<LimitHit> readLimitHit(const json &object, const std::string &timeUtc)
{
    if (!object.contains("limit_hit") || !object.at("limit_hit").is_string())
        return std::nullopt;
    LimitHit hit;
    hit.timeUtc = timeUtc;
    hit.rule = object.at("limit_hit").get<std::string>();
    hit.message = stringOr(object, "message");
    if (object.contains("step") && object.at("step").is_number_integer())
        hit.step = object.at("step").get<int>();
    if (object.contains("current_a") && object.at("current_a").is_number())
        hit.currentA = object.at("current_a").get<double>();
    return hit;
}

} // namespace

SupervisionSummary summarizeSupervision(const std::vector<NoteRecord> &notes)
{
    SupervisionSummary summary;
    for (const NoteRecord &note : notes) {
        const bool sheetNote = note.author == labSheetNoteAuthor;
        const bool checklistNote = note.author == checklistNoteAuthor;
        const bool limitNote = note.author == limitHitNoteAuthor;
        const bool supervisorNote = note.author == supervisorNoteAuthor;
        if (!sheetNote && !checklistNote && !limitNote && !supervisorNote)
            continue;
        const auto object = parseObject(note.text);
        bool understood = false;
        if (object && sheetNote) {
            if (auto stamp = readStamp(*object)) {
                if (!summary.labSheet)
                    summary.labSheet = *stamp;
                understood = true;
            }
        } else if (object && checklistNote) {
            if (auto list = readChecklist(*object)) {
                summary.checklist = *list;
                understood = true;
            }
        } else if (object && supervisorNote) {
            if (auto confirmation = readSupervisor(*object, note.timeUtc)) {
                summary.supervisor = *confirmation;
                understood = true;
            }
        } else if (object && limitNote) {
            if (auto hit = readLimitHit(*object, note.timeUtc)) {
                summary.limitHits.push_back(*hit);
                understood = true;
            }
        }
        if (!understood)
            ++summary.unreadable;
    }
    return summary;
}

} // namespace sagline
