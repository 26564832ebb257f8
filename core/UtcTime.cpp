#include "UtcTime.h"

#include <cstdio>
#include <ctime>

namespace sagline {

std::string formatUtc(std::chrono::system_clock::time_point time)
{
    using namespace std::chrono;
    const auto sinceEpoch = time.time_since_epoch();
    const auto whole = floor<seconds>(sinceEpoch);
    const auto millis = duration_cast<milliseconds>(sinceEpoch - whole).count();
    const std::time_t seconds = static_cast<std::time_t>(whole.count());
    std::tm parts{};
    gmtime_r(&seconds, &parts);
    char text[96]; // room for any int year the compiler can imagine
    std::snprintf(text, sizeof text, "%04d-%02d-%02dT%02d:%02d:%02d.%03dZ", parts.tm_year + 1900, parts.tm_mon + 1,
                  parts.tm_mday, parts.tm_hour, parts.tm_min, parts.tm_sec, static_cast<int>(millis));
    return text;
}

std::string utcNow()
{
    return formatUtc(std::chrono::system_clock::now());
}

} // namespace sagline
