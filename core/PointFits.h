// What a batch fit says about each input row, held as columns: a million rows take 17 MB (25 MB
// when the outlier screen compared its own statistic) instead of 56 MB of one struct a row, and
// the fit writes its per-point arrays straight into them. Read a row as a PointFit.
#pragma once

#include "ResultColumn.h"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <iterator>
#include <optional>
#include <vector>

namespace sagline {

// What the fit says about one input row (readings[row]).
struct PointFit {
    std::size_t row = 0;                 // index into the readings passed to fitReadings
    double residualV = 0.0;              // V_i - (V0 - R·I_i), V (also for rows not used)
    std::optional<double> studentized;   // externally studentized residual (used rows, n >= 4)
    std::optional<double> screeningStatistic; // what the outlier screen compared (OutlierScreen.h)
    bool used = false;                   // false: excluded, or flagged overload / not-a-number
    bool outlier = false;                // |screeningStatistic| above the screen's critical value
};

// A statistic column holds NaN where a row has no statistic; rows are read back as nullopt.
inline std::optional<double> statisticOrNone(double value)
{
    return std::isnan(value) ? std::nullopt : std::optional<double>(value);
}

class PointFits {
public:
    enum State : std::uint8_t { used = 1, outlier = 2 };

    ResultColumn residualV;          // one per row, V
    ResultColumn studentized;        // one per row, NaN where there is none
    ResultColumn screening;          // one per row, NaN where none; empty: the same as studentized
    std::vector<std::uint8_t> state; // State bits, one per row

    std::size_t size() const { return residualV.size(); }
    bool empty() const { return residualV.empty(); }
    PointFit operator[](std::size_t row) const
    {
        const double compared = screening.empty() ? studentized[row] : screening[row];
        return {row, residualV[row], statisticOrNone(studentized[row]), statisticOrNone(compared),
                (state[row] & used) != 0, (state[row] & outlier) != 0};
    }
    // The row's result, nullopt past the end (a fit that failed has no rows).
    std::optional<PointFit> atRow(std::size_t row) const
    {
        return row < size() ? std::optional<PointFit>((*this)[row]) : std::nullopt;
    }

    // Rows in order, each read as a PointFit (by value).
    class const_iterator {
    public:
        using iterator_category = std::input_iterator_tag;
        using value_type = PointFit;
        using difference_type = std::ptrdiff_t;
        using pointer = void;
        using reference = PointFit;
        const_iterator(const PointFits *fits, std::size_t row) : m_fits(fits), m_row(row) {}
        PointFit operator*() const { return (*m_fits)[m_row]; }
        const_iterator &operator++() { ++m_row; return *this; }
        const_iterator operator++(int) { const_iterator before = *this; ++m_row; return before; }
        bool operator==(const const_iterator &other) const { return m_row == other.m_row; }
        bool operator!=(const const_iterator &other) const { return m_row != other.m_row; }

    private:
        const PointFits *m_fits;
        std::size_t m_row;
    };
    const_iterator begin() const { return {this, 0}; }
    const_iterator end() const { return {this, size()}; }
};

} // namespace sagline
