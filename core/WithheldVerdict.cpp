#include "WithheldVerdict.h"

#include <cctype>
#include <utility>

namespace sagline {

namespace {

std::string withFirstLetter(std::string text, bool upper)
{
    if (!text.empty()) {
        const auto c = static_cast<unsigned char>(text.front());
        text.front() = static_cast<char>(upper ? std::toupper(c) : std::tolower(c));
    }
    return text;
}

} // namespace

std::string partialDataWords(const SessionProgress &progress)
{
    return progress.state == Completeness::InProgress ? "on the data so far" : "on the partial data";
}

std::string withLowerFirstLetter(std::string text) { return withFirstLetter(std::move(text), false); }

template <typename Json>
Json progressJson(const SessionProgress &progress)
{
    return {{"state", toString(progress.state)},
            {"recorded_steps", progress.recordedSteps},
            {"planned_steps", progress.plannedSteps},
            {"label", progress.label()}};
}

std::string withheldVerdictHeadline(const SessionProgress &progress)
{
    if (progress.isComplete())
        return {};
    const bool running = progress.state == Completeness::InProgress;
    return withFirstLetter(progress.label(), true) + (running ? ": no verdict yet" : ": no verdict");
}

template <typename Json>
void withholdVerdict(Json &verdict, const SessionProgress &progress)
{
    if (progress.isComplete() || !verdict.is_object())
        return;
    const bool running = progress.state == Completeness::InProgress;
    const std::string word = running ? "provisional" : "incomplete";
    const auto withhold = [&word](Json &object) {
        if (object.is_object() && object.contains("outcome")) {
            object["outcome_on_partial_data"] = object["outcome"];
            object["outcome"] = word;
        }
    };
    withhold(verdict);
    // The explanation spoke of the partial data as if it were the verdict ("Judged on 4 limits").
    if (verdict.contains("explanation") && verdict["explanation"].is_string())
        verdict["explanation"] = withheldVerdictHeadline(progress) + ". " + withFirstLetter(partialDataWords(progress), true)
                                 + ": " + withLowerFirstLetter(verdict["explanation"].template get<std::string>());
    if (verdict.contains("limits") && verdict["limits"].is_array())
        for (Json &limit : verdict["limits"])
            withhold(limit);
}

template nlohmann::json progressJson<nlohmann::json>(const SessionProgress &);
template nlohmann::ordered_json progressJson<nlohmann::ordered_json>(const SessionProgress &);
template void withholdVerdict<nlohmann::json>(nlohmann::json &, const SessionProgress &);
template void withholdVerdict<nlohmann::ordered_json>(nlohmann::ordered_json &, const SessionProgress &);

} // namespace sagline
