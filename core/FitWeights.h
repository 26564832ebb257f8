// The weights a fit used, read point by point: an empty list means every weight is 1 (OLS
// stores none), read as 1.0, which is exactly what a stored 1.0 gives. (The hot loops of
// FitSummary and OutlierScreen take the same rule as a template parameter, `unit`.)
#pragma once

#include <cstddef>
#include <span>
#include <vector>

namespace sagline {

struct FitWeights {
    std::span<const double> values;
    FitWeights(std::span<const double> v) : values(v) {}
    FitWeights(const std::vector<double> &v) : values(v) {}
    double operator[](std::size_t i) const { return values.empty() ? 1.0 : values[i]; }
};

} // namespace sagline
