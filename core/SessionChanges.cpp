#include "SessionChanges.h"

#include <cmath>
#include <cstdio>

namespace sagline {

namespace {

using Result = StoreResult<std::int64_t>;

bool isBlank(const std::string &text)
{
    return text.find_first_not_of(" \t\r\n") == std::string::npos;
}

std::string trimmed(const std::string &text)
{
    const auto first = text.find_first_not_of(" \t\r\n");
    if (first == std::string::npos)
        return {};
    return text.substr(first, text.find_last_not_of(" \t\r\n") - first + 1);
}

std::optional<StoreStatus> commonRefusal(const SessionStore &store, const std::string &reason, const char *what)
{
    if (const std::string error = personError(store.actor().person); !error.empty())
        return StoreStatus::failure(StoreCode::InvalidArgument, error);
    if (isBlank(reason))
        return StoreStatus::failure(StoreCode::InvalidArgument, std::string("reason: say why the reading is ") + what);
    return std::nullopt;
}

StoreResult<Reading> readingNumber(const SessionStore &store, long long number)
{
    auto readings = store.readings();
    if (!readings.ok())
        return StoreResult<Reading>::failure(readings.status());
    const auto count = static_cast<long long>(readings.value.size());
    if (number < 1 || number > count)
        return StoreResult<Reading>::failure(StoreCode::NotFound, "reading: " + std::to_string(number)
                                                                      + " is not a reading of this session (it has "
                                                                      + std::to_string(count) + ", numbered from 1)");
    return readings.value[static_cast<std::size_t>(number - 1)];
}

} // namespace

std::string personError(const std::string &person)
{
    if (isBlank(person))
        return "by: the name of the person making the change is required";
    if (person.size() > 200)
        return "by: at most 200 characters";
    return {};
}

Result excludeReadingAs(SessionStore &store, const Reading &reading, long long number, const std::string &reason)
{
    if (const auto refusal = commonRefusal(store, reason, "excluded"))
        return Result::failure(*refusal);
    const std::string name = "reading " + std::to_string(number);
    if (reading.superseded)
        return Result::failure(StoreCode::InvalidArgument, name + ": superseded by a retake of its step, so it is out of the fit already");
    if (reading.excluded)
        return Result::failure(StoreCode::InvalidArgument, name + ": already excluded");
    return store.excludeReading(reading.id, trimmed(reason), trimmed(store.actor().person));
}

Result restoreReadingAs(SessionStore &store, const Reading &reading, long long number, const std::string &reason)
{
    if (const auto refusal = commonRefusal(store, reason, "restored"))
        return Result::failure(*refusal);
    const std::string name = "reading " + std::to_string(number);
    if (reading.superseded)
        return Result::failure(StoreCode::InvalidArgument,
                               name + ": superseded by a retake of its step; the retake is the step's reading");
    if (!reading.excluded)
        return Result::failure(StoreCode::InvalidArgument, name + ": not excluded, nothing to restore");
    return store.restoreReading(reading.id, trimmed(reason), trimmed(store.actor().person));
}

Result excludeReadingNumber(SessionStore &store, long long number, const std::string &reason)
{
    const auto reading = readingNumber(store, number);
    if (!reading.ok())
        return Result::failure(reading.status());
    return excludeReadingAs(store, reading.value, number, reason);
}

Result restoreReadingNumber(SessionStore &store, long long number, const std::string &reason)
{
    const auto reading = readingNumber(store, number);
    if (!reading.ok())
        return Result::failure(reading.status());
    return restoreReadingAs(store, reading.value, number, reason);
}

TemperatureRange plausibleTemperatureRange(TemperatureKind kind)
{
    return kind == TemperatureKind::Winding ? TemperatureRange{-60.0, 400.0} : TemperatureRange{-60.0, 80.0};
}

Result recordPersonTemperature(SessionStore &store, TemperatureKind kind, double celsius, const std::string &source)
{
    if (const std::string error = personError(store.actor().person); !error.empty())
        return Result::failure(StoreCode::InvalidArgument, error);
    const TemperatureRange range = plausibleTemperatureRange(kind);
    if (!std::isfinite(celsius) || celsius < range.lowC || celsius > range.highC) {
        char text[96];
        std::snprintf(text, sizeof text, " temperature: must be from %g to %g °C", range.lowC, range.highC);
        return Result::failure(StoreCode::InvalidArgument, toString(kind) + std::string(text));
    }
    if (isBlank(source))
        return Result::failure(StoreCode::InvalidArgument, "source: say how the temperature was measured");
    return store.recordTemperature(kind, celsius, trimmed(source));
}

Result addPersonNote(SessionStore &store, const std::string &text)
{
    if (const std::string error = personError(store.actor().person); !error.empty())
        return Result::failure(StoreCode::InvalidArgument, error);
    if (isBlank(text))
        return Result::failure(StoreCode::InvalidArgument, "text: the note is empty");
    return store.addNote(trimmed(store.actor().person), trimmed(text));
}

} // namespace sagline
