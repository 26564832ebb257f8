// The recorded points as the charts draw them: kept sorted by current so thinning (LTTB needs
// x in order) costs one pass per refresh, not a sort. A display cache only; the session store
// and the fit hold the data of record.
#pragma once

#include "Downsample.h"

#include <cstdint>
#include <functional>
#include <vector>

namespace sagline {

class DisplayPoints {
public:
    // `id` is the caller's key for the point (the reading's row), used by setExcluded.
    void insert(std::int64_t id, double currentA, double voltageV, bool excluded);
    bool setExcluded(std::int64_t id, bool excluded); // false when the id is unknown
    void clear();
    std::size_t size() const { return m_points.size(); }
    std::size_t includedCount() const { return m_includedCount; }

    // Included or excluded points in current order, mapped through `y` (identity: V).
    std::vector<PlotPoint> collect(bool excluded, const std::function<double(double, double)> &y = {}) const;
    double maxCurrent() const;
    double minVoltage() const;
    double maxVoltage() const;

private:
    struct Entry {
        double current;
        double voltage;
        std::int64_t id;
        bool excluded;
    };
    std::vector<Entry> m_points;
    std::size_t m_includedCount = 0;
};

} // namespace sagline
