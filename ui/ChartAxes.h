// Axis ranges that keep the data readable as it grows: they widen (with headroom, on nice
// numbers) only when something falls outside, never on every point, because each domain
// change re-lays out every drawn point (QT-NOTES §1.4).
#pragma once

class QValueAxis;

namespace sagline {

struct AxisSpan {
    double low = 0.0;
    double high = 0.0; // high <= low: empty, nothing shown yet
    bool isEmpty() const { return !(high > low); }
    bool contains(double lowNeeded, double highNeeded) const
    {
        return !isEmpty() && lowNeeded >= low && highNeeded <= high;
    }
};

// The span to use so that [lowNeeded, highNeeded] fits into `current` grown with `headroom`
// (a fraction of the needed width on each side); `current` unchanged when it already fits.
AxisSpan grownSpan(const AxisSpan &current, double lowNeeded, double highNeeded, double headroom);
// Sets the axis to the span on nice tick values and a label format with just enough decimals.
void applySpan(QValueAxis *axis, const AxisSpan &span, int ticks = 6);
// Round ticks and label decimals for the range the axis shows now (after a zoom or pan).
void retickShownRange(QValueAxis *axis, int ticks = 6);

} // namespace sagline
