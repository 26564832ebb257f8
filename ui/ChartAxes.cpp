#include "ChartAxes.h"

#include <QValueAxis>

#include <algorithm>
#include <cmath>

namespace sagline {

AxisSpan grownSpan(const AxisSpan &current, double lowNeeded, double highNeeded, double headroom)
{
    if (!std::isfinite(lowNeeded) || !std::isfinite(highNeeded))
        return current;
    if (current.contains(lowNeeded, highNeeded))
        return current;
    double width = highNeeded - lowNeeded;
    if (width <= 0.0)
        width = std::max(std::abs(highNeeded) * 0.05, 1e-3);
    const AxisSpan needed{lowNeeded - headroom * width, highNeeded + headroom * width};
    if (current.isEmpty())
        return needed;
    return {std::min(current.low, needed.low), std::max(current.high, needed.high)};
}

void applySpan(QValueAxis *axis, const AxisSpan &span, int ticks)
{
    axis->setTickCount(ticks);
    axis->setRange(span.low, span.high);
    axis->applyNiceNumbers();
    const double interval = (axis->max() - axis->min()) / std::max(1, axis->tickCount() - 1);
    int decimals = 2;
    if (interval > 0.0) {
        // Fewest decimals that show every tick exactly (0.25 needs two, 0.5 one, 5 none).
        decimals = std::clamp(static_cast<int>(std::ceil(-std::log10(interval) - 1e-9)), 0, 6);
        while (decimals < 6) {
            const double scaled = interval * std::pow(10.0, decimals);
            if (std::abs(scaled - std::round(scaled)) < 1e-6)
                break;
            ++decimals;
        }
    }
    axis->setLabelFormat(QStringLiteral("%.%1f").arg(decimals));
}

} // namespace sagline
