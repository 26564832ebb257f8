// The recorded points as the charts draw them, shared by the V–I and the residual chart:
// sorted by current (LTTB thinning needs x in order) and split into included and excluded
// arrays. Points arrive in any order and are only appended; the next read sorts what arrived
// since the last one (one stable sort of the new points, one merge with the sorted rest), so
// opening a session of n readings costs one O(n log n) sort whatever order they were recorded
// in, and a live point costs an O(n) merge per chart refresh, not per point. A display cache
// only; the session store and the fit hold the data of record.
#pragma once

#include "Downsample.h"

#include <QList>
#include <QPointF>

#include <cmath>
#include <cstdint>
#include <limits>
#include <span>
#include <vector>

namespace sagline {

// How many points a chart draws: about one per pixel column of its plot area (more cannot be
// told apart, and the markers overlap long before), never fewer than a readable minimum.
std::size_t drawnPointBudget(double plotWidthPx);
// The points as a chart series takes them.
QList<QPointF> toQtPoints(std::span<const PlotPoint> points);

class DisplayPoints {
public:
    // `id` is the caller's key for the point (the reading's row), used by setExcluded. A point
    // with a non-finite current or voltage cannot be drawn and is not kept.
    void add(std::int64_t id, double currentA, double voltageV, bool excluded);
    bool setExcluded(std::int64_t id, bool excluded); // false when the id is unknown
    void clear();
    std::size_t size() const { return m_sorted.size() + m_arrivals.size(); }

    // The included and the excluded points (I, V) in current order; points of equal current
    // in arrival order. Valid until the next change.
    std::span<const PlotPoint> included() const;
    std::span<const PlotPoint> excluded() const;
    // The extremes of the included points, which size the axes: an excluded or superseded point
    // (417 A typed for 417 mA) never does. Kept as points arrive: a refresh must not walk
    // 100 000 points to size an axis; an exclusion changed later recomputes them once.
    bool hasIncluded() const { return std::isfinite(m_maxCurrent); }
    double maxCurrent() const { return hasIncluded() ? m_maxCurrent : 0.0; }
    double minVoltage() const { return m_minVoltage; } // +inf when none is included
    double maxVoltage() const { return m_maxVoltage; } // -inf when none is included

private:
    struct Entry {
        double current;
        double voltage;
        std::int64_t id;
        bool excluded;
    };
    void settle() const; // sorts the arrivals into place and rebuilds the split arrays
    void include(double currentA, double voltageV); // into the extremes
    void recomputeExtremes();
    void split() const;

    // Sorting on read is a cache update, not a change of what the points are: hence mutable.
    mutable std::vector<Entry> m_sorted;   // by current, stable
    mutable std::vector<Entry> m_arrivals; // since the last read, in arrival order
    mutable std::vector<PlotPoint> m_included;
    mutable std::vector<PlotPoint> m_excluded;
    double m_maxCurrent = -std::numeric_limits<double>::infinity();
    double m_minVoltage = std::numeric_limits<double>::infinity();
    double m_maxVoltage = -std::numeric_limits<double>::infinity();
};

} // namespace sagline
