#include "DisplayPoints.h"

#include <algorithm>
#include <limits>

namespace sagline {

std::size_t drawnPointBudget(double plotWidthPx)
{
    constexpr double fewest = 300.0;
    constexpr double most = 4000.0;
    return static_cast<std::size_t>(std::clamp(plotWidthPx, fewest, most));
}

void DisplayPoints::insert(std::int64_t id, double currentA, double voltageV, bool excluded)
{
    // upper_bound keeps points of equal current in arrival order.
    const auto at = std::upper_bound(m_points.begin(), m_points.end(), currentA,
                                     [](double c, const Entry &e) { return c < e.current; });
    m_points.insert(at, Entry{currentA, voltageV, id, excluded});
    if (!excluded) {
        const auto atIncluded = std::upper_bound(m_included.begin(), m_included.end(), currentA,
                                                 [](double c, const PlotPoint &p) { return c < p.x; });
        m_included.insert(atIncluded, PlotPoint{currentA, voltageV});
    }
    m_minVoltage = std::min(m_minVoltage, voltageV);
    m_maxVoltage = std::max(m_maxVoltage, voltageV);
}

bool DisplayPoints::setExcluded(std::int64_t id, bool excluded)
{
    for (auto &entry : m_points) {
        if (entry.id != id)
            continue;
        if (entry.excluded != excluded) {
            entry.excluded = excluded;
            rebuildIncluded(); // rare (a person excluding a point): O(n) is fine
        }
        return true;
    }
    return false;
}

void DisplayPoints::clear()
{
    m_points.clear();
    m_included.clear();
    m_minVoltage = std::numeric_limits<double>::infinity();
    m_maxVoltage = -std::numeric_limits<double>::infinity();
}

void DisplayPoints::rebuildIncluded()
{
    m_included.clear();
    for (const auto &entry : m_points) {
        if (!entry.excluded)
            m_included.push_back({entry.current, entry.voltage});
    }
}

std::vector<PlotPoint> DisplayPoints::collect(bool excluded, const std::function<double(double, double)> &y) const
{
    std::vector<PlotPoint> out;
    out.reserve(excluded ? m_points.size() - m_included.size() : m_included.size());
    for (const auto &entry : m_points) {
        if (entry.excluded == excluded)
            out.push_back({entry.current, y ? y(entry.current, entry.voltage) : entry.voltage});
    }
    return out;
}

double DisplayPoints::maxCurrent() const { return m_points.empty() ? 0.0 : m_points.back().current; }

QList<QPointF> toQtPoints(std::span<const PlotPoint> points)
{
    QList<QPointF> out;
    out.reserve(static_cast<qsizetype>(points.size()));
    for (const auto &p : points)
        out.append(QPointF(p.x, p.y));
    return out;
}

} // namespace sagline
