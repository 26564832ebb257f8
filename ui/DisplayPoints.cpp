#include "DisplayPoints.h"

#include <algorithm>
#include <cmath>

namespace sagline {

std::size_t drawnPointBudget(double plotWidthPx)
{
    constexpr double fewest = 300.0;
    constexpr double most = 4000.0;
    return static_cast<std::size_t>(std::clamp(plotWidthPx, fewest, most));
}

void DisplayPoints::add(std::int64_t id, double currentA, double voltageV, bool excluded)
{
    if (!std::isfinite(currentA) || !std::isfinite(voltageV))
        return;
    m_arrivals.push_back(Entry{currentA, voltageV, id, excluded});
    if (!excluded)
        include(currentA, voltageV);
}

void DisplayPoints::include(double currentA, double voltageV)
{
    m_maxCurrent = std::max(m_maxCurrent, currentA);
    m_minVoltage = std::min(m_minVoltage, voltageV);
    m_maxVoltage = std::max(m_maxVoltage, voltageV);
}

void DisplayPoints::recomputeExtremes()
{
    m_maxCurrent = -std::numeric_limits<double>::infinity();
    m_minVoltage = std::numeric_limits<double>::infinity();
    m_maxVoltage = -std::numeric_limits<double>::infinity();
    for (const Entry &entry : m_sorted) {
        if (!entry.excluded)
            include(entry.current, entry.voltage);
    }
}

bool DisplayPoints::setExcluded(std::int64_t id, bool excluded)
{
    settle();
    for (auto &entry : m_sorted) {
        if (entry.id != id)
            continue;
        if (entry.excluded != excluded) {
            entry.excluded = excluded;
            split(); // rare (a person excluding a point): O(n) is fine
            recomputeExtremes();
        }
        return true;
    }
    return false;
}

void DisplayPoints::clear()
{
    m_sorted.clear();
    m_arrivals.clear();
    m_included.clear();
    m_excluded.clear();
    m_maxCurrent = -std::numeric_limits<double>::infinity();
    m_minVoltage = std::numeric_limits<double>::infinity();
    m_maxVoltage = -std::numeric_limits<double>::infinity();
}

std::span<const PlotPoint> DisplayPoints::included() const
{
    settle();
    return m_included;
}

std::span<const PlotPoint> DisplayPoints::excluded() const
{
    settle();
    return m_excluded;
}

void DisplayPoints::settle() const
{
    if (m_arrivals.empty())
        return;
    const auto byCurrent = [](const Entry &a, const Entry &b) { return a.current < b.current; };
    std::stable_sort(m_arrivals.begin(), m_arrivals.end(), byCurrent);
    if (!m_sorted.empty() && m_arrivals.front().current >= m_sorted.back().current) {
        // A rising sweep: the new points go after the rest, and so do their display points.
        for (const Entry &entry : m_arrivals)
            (entry.excluded ? m_excluded : m_included).push_back({entry.current, entry.voltage});
        m_sorted.insert(m_sorted.end(), m_arrivals.begin(), m_arrivals.end());
        m_arrivals.clear();
        return;
    }
    const auto middle = static_cast<std::ptrdiff_t>(m_sorted.size());
    m_sorted.insert(m_sorted.end(), m_arrivals.begin(), m_arrivals.end());
    m_arrivals.clear();
    // Stable: of equal currents, the earlier arrivals (already sorted) stay first.
    std::inplace_merge(m_sorted.begin(), m_sorted.begin() + middle, m_sorted.end(), byCurrent);
    split();
}

void DisplayPoints::split() const
{
    m_included.clear();
    m_excluded.clear();
    for (const Entry &entry : m_sorted)
        (entry.excluded ? m_excluded : m_included).push_back({entry.current, entry.voltage});
}

QList<QPointF> toQtPoints(std::span<const PlotPoint> points)
{
    QList<QPointF> out;
    out.reserve(static_cast<qsizetype>(points.size()));
    for (const auto &p : points)
        out.append(QPointF(p.x, p.y));
    return out;
}

} // namespace sagline
