#include "Reading.h"

#include <array>
#include <utility>

namespace sagline {

std::string flagsToString(std::uint32_t flags)
{
    static constexpr std::array<std::pair<std::uint32_t, const char *>, 8> names{{
        {flagUnstable, "unstable"},
        {flagOverload, "overload"},
        {flagNotANumber, "not-a-number"},
        {flagOutsidePrediction, "outside-prediction"},
        {flagOutlier, "outlier"},
        {flagManual, "manual"},
        {flagSimulated, "simulated"},
        {flagConfirmed, "confirmed"},
    }};
    std::string text;
    for (const auto &[bit, name] : names) {
        if (flags & bit) {
            if (!text.empty())
                text += '|';
            text += name;
        }
    }
    return text;
}

} // namespace sagline
