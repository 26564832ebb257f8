#include "NoteText.h"

#include <nlohmann/json.hpp>

namespace sagline {

namespace {

constexpr const char *programPrefix = "sagline/";

// "regulation_limit_percent" -> "regulation limit percent"
std::string words(std::string key)
{
    for (char &c : key)
        c = c == '_' ? ' ' : c;
    return key;
}

std::string flatten(const nlohmann::json &value)
{
    if (value.is_null())
        return "none";
    if (value.is_string())
        return value.get<std::string>();
    if (value.is_boolean())
        return value.get<bool>() ? "yes" : "no";
    if (value.is_number())
        return value.dump();
    std::string text;
    if (value.is_array()) {
        for (const auto &item : value)
            text += (text.empty() ? "" : ", ") + flatten(item);
        return text;
    }
    for (const auto &item : value.items())
        text += (text.empty() ? "" : "; ") + words(item.key()) + ": " + flatten(item.value());
    return text;
}

} // namespace

bool isProgramNote(const NoteRecord &note)
{
    return note.author.rfind(programPrefix, 0) == 0;
}

std::string noteAuthorName(const NoteRecord &note)
{
    if (!isProgramNote(note))
        return note.author;
    return words(note.author.substr(std::char_traits<char>::length(programPrefix))) + " (recorded by Sagline)";
}

std::string readableNoteText(const NoteRecord &note)
{
    if (!isProgramNote(note))
        return note.text;
    const nlohmann::json parsed = nlohmann::json::parse(note.text, nullptr, false);
    if (parsed.is_discarded() || !parsed.is_object())
        return note.text;
    return flatten(parsed);
}

} // namespace sagline
