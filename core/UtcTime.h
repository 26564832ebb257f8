// Wall-clock time as ISO 8601 UTC text with milliseconds, the form every stored time uses.
#pragma once

#include <chrono>
#include <string>

namespace sagline {

// "2026-12-02T10:15:03.250Z"
std::string formatUtc(std::chrono::system_clock::time_point time);
std::string utcNow();

} // namespace sagline
