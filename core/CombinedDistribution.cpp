#include "CombinedDistribution.h"

#include "Distributions.h"

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

constexpr int gridCells = 401;       // odd: one cell centred on 0
constexpr int tableSize = 4097;
constexpr double gridReachSds = 8.0; // the normal part is cut at ±8 σ (mass lost < 1e-15)

double normalCdf(double z)
{
    return 0.5 * std::erfc(-z / std::sqrt(2.0));
}

} // namespace

CombinedDistribution::CombinedDistribution(const std::vector<BudgetComponent> &components)
{
    double normalVariance = 0.0, total = 0.0;
    const BudgetComponent *t = nullptr;
    for (const BudgetComponent &c : components) {
        if (!(c.contribution > 0.0) || !std::isfinite(c.contribution))
            continue;
        total += c.contribution * c.contribution;
        const bool finiteDof = c.degreesOfFreedom && std::isfinite(*c.degreesOfFreedom) && *c.degreesOfFreedom > 0.0;
        if (c.shape == DistributionShape::Rectangular)
            m_rectangles.push_back(c.contribution * std::sqrt(3.0));
        else if (finiteDof && (!t || c.contribution > t->contribution))
            t = &c;
    }
    for (const BudgetComponent &c : components) {
        // Every normal part, and any second t taken as normal (budgets carry one Type A).
        if (c.contribution > 0.0 && std::isfinite(c.contribution) && c.shape == DistributionShape::Normal && &c != t)
            normalVariance += c.contribution * c.contribution;
    }
    m_sd = std::sqrt(total);
    m_normalSd = std::sqrt(normalVariance);
    if (t) {
        m_tScale = t->contribution;
        m_tDof = *t->degreesOfFreedom;
    }
    const bool needGrid = !m_rectangles.empty() || (m_tScale > 0.0 && m_normalSd > 0.0);
    if (!needGrid)
        return;

    // The normal and rectangular part as cell masses.
    m_half = gridReachSds * m_normalSd;
    for (double a : m_rectangles)
        m_half += a;
    m_step = 2.0 * m_half / gridCells;
    m_mass.assign(gridCells, 0.0);
    const auto centre = [&](int k) { return -m_half + (k + 0.5) * m_step; };
    if (m_normalSd > 0.0) {
        for (int k = 0; k < gridCells; ++k)
            m_mass[k] = normalCdf((centre(k) + m_step / 2) / m_normalSd) - normalCdf((centre(k) - m_step / 2) / m_normalSd);
    } else {
        m_mass[gridCells / 2] = 1.0;
    }
    m_cumulative.assign(gridCells + 1, 0.0);
    const auto accumulate = [&] {
        for (int k = 0; k < gridCells; ++k)
            m_cumulative[k + 1] = m_cumulative[k] + m_mass[k];
    };
    accumulate();
    std::vector<double> next(gridCells);
    for (double a : m_rectangles) {
        // A rectangle of half-width a: the density at x is (C(x + a) - C(x - a))/(2a).
        for (int k = 0; k < gridCells; ++k)
            next[k] = (gridCdf(centre(k) + a) - gridCdf(centre(k) - a)) * m_step / (2.0 * a);
        double sum = 0.0;
        for (double m : next)
            sum += m;
        for (int k = 0; k < gridCells; ++k)
            m_mass[k] = next[k] / sum;
        accumulate();
    }
    if (m_tScale > 0.0) {
        // The t CDF over every argument cdf() can need on [-reach, reach].
        const double reach = m_half + m_tScale * studentTQuantile(0.9995, m_tDof);
        m_tableEnd = (reach + m_half) / m_tScale;
        m_tTable.resize(tableSize);
        for (int j = 0; j < tableSize; ++j)
            m_tTable[j] = studentTCdf(-m_tableEnd + 2.0 * m_tableEnd * j / (tableSize - 1), m_tDof);
    }
}

double CombinedDistribution::gridCdf(double x) const
{
    if (m_mass.empty()) // a normal alone (or nothing at all)
        return m_normalSd > 0.0 ? normalCdf(x / m_normalSd) : (x >= 0.0 ? 1.0 : 0.0);
    const double u = (x + m_half) / m_step;
    if (u <= 0.0)
        return 0.0;
    if (u >= gridCells)
        return 1.0;
    const int k = static_cast<int>(u);
    return m_cumulative[k] + (u - k) * m_mass[k];
}

double CombinedDistribution::cdf(double x) const
{
    if (!(m_tScale > 0.0))
        return gridCdf(x);
    if (m_mass.empty())
        return studentTCdf(x / m_tScale, m_tDof);
    const double last = tableSize - 1;
    double sum = 0.0;
    for (int k = 0; k < gridCells; ++k) {
        if (m_mass[k] == 0.0)
            continue;
        const double z = (x - (-m_half + (k + 0.5) * m_step)) / m_tScale;
        const double u = (z + m_tableEnd) / (2.0 * m_tableEnd) * last;
        double f;
        if (u <= 0.0 || u >= last) {
            f = studentTCdf(z, m_tDof);
        } else {
            const int j = static_cast<int>(u);
            f = m_tTable[j] + (u - j) * (m_tTable[j + 1] - m_tTable[j]);
        }
        sum += m_mass[k] * f;
    }
    return std::clamp(sum, 0.0, 1.0);
}

double CombinedDistribution::symmetricHalfWidth(double p) const
{
    const double target = (1.0 + p) / 2.0;
    if (!(m_sd > 0.0))
        return 0.0;
    if (m_mass.empty() && !(m_tScale > 0.0))
        return normalQuantile(target) * m_normalSd;
    if (m_mass.empty())
        return studentTQuantile(target, m_tDof) * m_tScale;
    double low = 0.0;
    double high = m_half + (m_tScale > 0.0 ? m_tScale * studentTQuantile(0.9995, m_tDof) : 0.0);
    for (int i = 0; i < 60 && high - low > 1e-9 * m_sd; ++i) {
        const double mid = (low + high) / 2.0;
        (cdf(mid) < target ? low : high) = mid;
    }
    return (low + high) / 2.0;
}

} // namespace sagline
