#include "DisplayPoints.h"

#include <algorithm>
#include <limits>

namespace sagline {

void DisplayPoints::insert(std::int64_t id, double currentA, double voltageV, bool excluded)
{
    // upper_bound keeps points of equal current in arrival order.
    const auto at = std::upper_bound(m_points.begin(), m_points.end(), currentA,
                                     [](double c, const Entry &e) { return c < e.current; });
    m_points.insert(at, Entry{currentA, voltageV, id, excluded});
    if (!excluded)
        ++m_includedCount;
}

bool DisplayPoints::setExcluded(std::int64_t id, bool excluded)
{
    for (auto &entry : m_points) {
        if (entry.id != id)
            continue;
        if (entry.excluded != excluded) {
            entry.excluded = excluded;
            m_includedCount = excluded ? m_includedCount - 1 : m_includedCount + 1;
        }
        return true;
    }
    return false;
}

void DisplayPoints::clear()
{
    m_points.clear();
    m_includedCount = 0;
}

std::vector<PlotPoint> DisplayPoints::collect(bool excluded, const std::function<double(double, double)> &y) const
{
    std::vector<PlotPoint> out;
    out.reserve(excluded ? m_points.size() - m_includedCount : m_includedCount);
    for (const auto &entry : m_points) {
        if (entry.excluded == excluded)
            out.push_back({entry.current, y ? y(entry.current, entry.voltage) : entry.voltage});
    }
    return out;
}

double DisplayPoints::maxCurrent() const { return m_points.empty() ? 0.0 : m_points.back().current; }

double DisplayPoints::minVoltage() const
{
    double v = std::numeric_limits<double>::infinity();
    for (const auto &entry : m_points)
        v = std::min(v, entry.voltage);
    return v;
}

double DisplayPoints::maxVoltage() const
{
    double v = -std::numeric_limits<double>::infinity();
    for (const auto &entry : m_points)
        v = std::max(v, entry.voltage);
    return v;
}

} // namespace sagline
