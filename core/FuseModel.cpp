#include "FuseModel.h"

#include <array>
#include <cmath>
#include <limits>
#include <utility>

namespace sagline {

namespace {

using CurvePoint = std::pair<double, double>; // (multiple of In, seconds)

// Nominal points: the geometric mean of each IEC 60127-2 gate where it has two bounds, a
// value well inside it where it has only a maximum. Gates from FACTS.md §1:
// quick-acting (sheet 2, >= 125 mA, verified): 2.1 In <= 30 min; 2.75 In 50 ms..2 s;
//   4 In 10..300 ms; 10 In <= 20 ms.
// time-lag (sheet 3, from memory): 2.1 In <= 2 min; 2.75 In 200 ms..10 s; 4 In 40 ms..3 s;
//   10 In 10..300 ms.
// The point at 1.6 In (one hour) only shapes the curve between 1.5 and 2.1 In (simulation choice).
constexpr std::array<CurvePoint, 5> quickActing{{{1.6, 3600.0}, {2.1, 60.0}, {2.75, 0.316}, {4.0, 0.0548}, {10.0, 0.010}}};
constexpr std::array<CurvePoint, 5> timeLag{{{1.6, 3600.0}, {2.1, 30.0}, {2.75, 1.41}, {4.0, 0.346}, {10.0, 0.0548}}};

double logInterpolate(const CurvePoint &a, const CurvePoint &b, double m)
{
    const double slope = std::log(b.second / a.second) / std::log(b.first / a.first);
    return a.second * std::exp(slope * std::log(m / a.first));
}

} // namespace

double nominalFuseOpeningTimeS(FuseType type, double multiple)
{
    if (!(multiple > 1.5))
        return std::numeric_limits<double>::infinity();
    const auto &curve = type == FuseType::TimeLag ? timeLag : quickActing;
    if (multiple <= curve.front().first) {
        // 1.5 .. 1.6 In: from "never" down to one hour.
        const double x = (multiple - 1.5) / (curve.front().first - 1.5);
        return curve.front().second / x;
    }
    for (std::size_t i = 1; i < curve.size(); ++i) {
        if (multiple <= curve[i].first)
            return logInterpolate(curve[i - 1], curve[i], multiple);
    }
    return logInterpolate(curve[curve.size() - 2], curve.back(), multiple); // extrapolate above 10 In
}

FuseModel::FuseModel(double ratingA, FuseType type) : m_ratingA(ratingA), m_type(type) {}

void FuseModel::advance(double seconds, double currentA)
{
    if (m_open || !(seconds > 0.0) || !(m_ratingA > 0.0))
        return;
    const double t = nominalFuseOpeningTimeS(m_type, std::fabs(currentA) / m_ratingA);
    if (std::isinf(t)) {
        m_heat *= std::exp(-seconds / coolingTimeConstantS);
        return;
    }
    m_heat += seconds / t;
    if (m_heat >= 1.0) {
        m_heat = 1.0;
        m_open = true;
    }
}

void FuseModel::replace()
{
    m_heat = 0.0;
    m_open = false;
}

} // namespace sagline
