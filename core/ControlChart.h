// The individuals control chart (X chart with moving ranges) a lab lead keeps per design: one
// value per unit in time order, centre line at the mean, limits at ±3σ where σ is estimated from
// the average moving range of successive values:
//     MR_i = |x_i - x_{i-1}|,  σ̂ = MR̄ / d2,  d2 = 1.128 for ranges of two,
//     UCL = x̄ + 3σ̂,  LCL = x̄ - 3σ̂
// (Montgomery, Introduction to Statistical Quality Control, the chapter on control charts for
// individual measurements). d2 for n = 2 is E|X1 - X2|/σ = 2/√π for normal data; the tables
// print it to three decimals as 1.128. The moving range, unlike the sample standard deviation,
// is not inflated by a slow drift, so a trend across the batch still shows against the limits.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace sagline {

// d2 for subgroups of two (the moving range of successive values), as tabulated.
inline constexpr double movingRangeD2 = 1.128;
// Fewer values than this give no limits at all: two moving ranges are the least for an estimate.
inline constexpr std::size_t controlChartMinimumValues = 3;
// Below this many values the limits are called preliminary: Montgomery advises 20 to 25 samples
// to set trial limits (from memory).
inline constexpr std::size_t controlChartSettledValues = 20;

struct IndividualsChart {
    std::size_t n = 0;                          // values given
    std::optional<double> centre;               // x̄
    std::optional<double> averageMovingRange;   // MR̄ over n - 1 ranges
    std::optional<double> sigma;                // MR̄ / d2
    std::optional<double> upper, lower;         // x̄ ± 3σ̂
    std::vector<std::size_t> outside;           // indices (into the values) beyond a limit
    bool preliminary = true;                    // fewer than controlChartSettledValues values
    std::string note;                           // how the limits were set, or why there are none
    bool hasLimits() const { return upper.has_value() && lower.has_value(); }
};

// The chart of `values` taken in the order given (time order). Non-finite values are a
// precondition violation of the caller; they are skipped and said in the note, never averaged.
IndividualsChart individualsChart(const std::vector<double> &valuesInTimeOrder);

} // namespace sagline
