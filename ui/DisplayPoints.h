// The recorded points as the charts draw them: kept sorted by current so thinning (LTTB needs
// x in order) costs one pass per refresh, not a sort. A display cache only; the session store
// and the fit hold the data of record.
#pragma once

#include "Downsample.h"

#include <QList>
#include <QPointF>

#include <cstdint>
#include <functional>
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
    // `id` is the caller's key for the point (the reading's row), used by setExcluded.
    void insert(std::int64_t id, double currentA, double voltageV, bool excluded);
    bool setExcluded(std::int64_t id, bool excluded); // false when the id is unknown
    void clear();
    std::size_t size() const { return m_points.size(); }

    // Included or excluded points in current order, mapped through `y` (identity: V).
    std::vector<PlotPoint> collect(bool excluded, const std::function<double(double, double)> &y = {}) const;
    // The included points (I, V) in current order, without a copy: a refresh thins them
    // straight from here.
    std::span<const PlotPoint> included() const { return m_included; }
    double maxCurrent() const;
    double minVoltage() const { return m_minVoltage; } // +inf when empty
    double maxVoltage() const { return m_maxVoltage; } // -inf when empty

private:
    struct Entry {
        double current;
        double voltage;
        std::int64_t id;
        bool excluded;
    };
    void rebuildIncluded();

    std::vector<Entry> m_points;
    std::vector<PlotPoint> m_included; // the included entries' (I, V), same order
    // Kept as points arrive: a refresh must not walk 100 000 points to size an axis.
    double m_minVoltage = std::numeric_limits<double>::infinity();
    double m_maxVoltage = -std::numeric_limits<double>::infinity();
};

} // namespace sagline
