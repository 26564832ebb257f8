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

namespace {

// The "nice" step (1, 2 or 5 × 10^k) at or above `raw`.
double niceStep(double raw)
{
    const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
    const double fraction = raw / magnitude;
    const double nice = fraction <= 1.0 ? 1.0 : fraction <= 2.0 ? 2.0 : fraction <= 5.0 ? 5.0 : 10.0;
    return nice * magnitude;
}

} // namespace

namespace {

// Ticks on round values every `step`, labelled with the fewest decimals that show each exactly.
void setTicks(QValueAxis *axis, double first, double step)
{
    // Interval and anchor while the ticks are fixed, then dynamic: each setter lays the ticks
    // out again, and the old interval over the new range can be millions of ticks.
    axis->setTickType(QValueAxis::TicksFixed);
    axis->setTickInterval(step);
    axis->setTickAnchor(first);
    axis->setTickType(QValueAxis::TicksDynamic);
    int decimals = std::clamp(static_cast<int>(std::ceil(-std::log10(step) - 1e-9)), 0, 6);
    while (decimals < 6) {
        // Fewest decimals that show every tick exactly (0.25 needs two, 0.5 one, 5 none).
        const double scaled = step * std::pow(10.0, decimals);
        if (std::abs(scaled - std::round(scaled)) < 1e-6)
            break;
        ++decimals;
    }
    axis->setLabelFormat(QStringLiteral("%.%1f").arg(decimals));
}

} // namespace

void applySpan(QValueAxis *axis, const AxisSpan &span, int ticks)
{
    double low = span.low;
    double high = span.high;
    if (!std::isfinite(low) || !std::isfinite(high))
        return; // nothing drawable: keep the axis as it is
    if (!(high > low))
        high = low + 1.0;
    const double step = niceStep((high - low) / std::max(1, ticks - 1));
    const double first = std::floor(low / step + 1e-9) * step;
    const double last = std::ceil(high / step - 1e-9) * step;
    // A little room beyond the outer ticks so markers on the edge (the open-circuit point at
    // I = 0) are drawn whole; ticks stay on round values anchored at the first one.
    const double pad = 0.015 * (last - first);
    // Qt Charts lays the ticks out again on every range change with the interval it has: a
    // range a million times the old interval (the residuals of the first two points are ~0, the
    // third's are millivolts) would make it loop over a million ticks and freeze the window.
    // Fixed ticks while the range changes, then the new interval.
    axis->setTickType(QValueAxis::TicksFixed);
    axis->setRange(first - pad, last + pad);
    setTicks(axis, first, step);
}

void retickShownRange(QValueAxis *axis, int ticks)
{
    const double low = axis->min();
    const double high = axis->max();
    if (!(high > low) || !std::isfinite(low) || !std::isfinite(high))
        return;
    const double step = niceStep((high - low) / std::max(1, ticks - 1));
    setTicks(axis, std::ceil(low / step - 1e-9) * step, step);
}

} // namespace sagline
