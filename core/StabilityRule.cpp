#include "StabilityRule.h"

#include <algorithm>
#include <cmath>

namespace sagline {

StabilityTracker::StabilityTracker(const StabilityRule &rule) : m_rule(rule)
{
    m_rule.count = std::max(1, m_rule.count);
}

void StabilityTracker::start(double timeS)
{
    m_last.clear();
    m_startS = timeS;
    m_total = 0;
}

void StabilityTracker::add(double voltageV, double currentA)
{
    m_last.push_back({voltageV, currentA});
    while (static_cast<int>(m_last.size()) > m_rule.count)
        m_last.pop_front();
    ++m_total;
}

bool StabilityTracker::isStable() const
{
    if (static_cast<int>(m_last.size()) < m_rule.count)
        return false;
    auto agrees = [this](auto member, double floor) {
        double low = m_last.front().*member;
        double high = low;
        double sum = 0.0;
        for (const Pair &p : m_last) {
            low = std::min(low, p.*member);
            high = std::max(high, p.*member);
            sum += p.*member;
        }
        const double mean = sum / static_cast<double>(m_last.size());
        return high - low <= std::max(m_rule.relativeTolerance * std::fabs(mean), floor);
    };
    return agrees(&Pair::voltageV, m_rule.voltageFloorV) && agrees(&Pair::currentA, m_rule.currentFloorA);
}

bool StabilityTracker::isTimedOut(double timeS) const
{
    return timeS - m_startS >= m_rule.maxTimeS;
}

} // namespace sagline
