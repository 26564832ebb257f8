// Shared pieces of the Monte Carlo checks of the uncertainty budgets (JCGM 101:2008, GUM
// Supplement 1): the number of draws, the sampled standard deviation and 95 % probabilistically
// symmetric half-width of a result, and the comparison with the analytic budget (JCGM 100:2008).
#pragma once

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdlib>
#include <string>
#include <vector>

namespace sagline::montecarlo {

// 200 000 draws, or SAGLINE_MC_DRAWS when set to at least 1000 (the asan-ubsan preset runs fewer).
inline std::size_t draws()
{
    if (const char *text = std::getenv("SAGLINE_MC_DRAWS")) {
        const long value = std::strtol(text, nullptr, 10);
        if (value >= 1000)
            return static_cast<std::size_t>(value);
    }
    return 200000;
}

struct Sampled {
    double u = 0.0;         // standard deviation of the draws
    double halfWidth = 0.0; // half the distance between the 2.5 % and 97.5 % quantiles
};

inline double quantile(std::vector<double> &values, double p)
{
    const auto k = static_cast<std::size_t>(p * static_cast<double>(values.size() - 1));
    std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(k), values.end());
    return values[k];
}

inline Sampled summarize(std::vector<double> &values)
{
    double mean = 0.0;
    for (double v : values)
        mean += v / static_cast<double>(values.size());
    double squares = 0.0;
    for (double v : values)
        squares += (v - mean) * (v - mean);
    Sampled out;
    out.u = std::sqrt(squares / static_cast<double>(values.size() - 1));
    out.halfWidth = (quantile(values, 0.975) - quantile(values, 0.025)) / 2.0;
    return out;
}

// The least-squares line V = V0 - R·I through one draw's readings, as the budgets' fit.
struct DrawnLine {
    double r = 0.0;
    double v0 = 0.0;
};

inline DrawnLine fitDrawnLine(const std::vector<double> &i, const std::vector<double> &v)
{
    const auto n = static_cast<double>(i.size());
    double meanI = 0.0, meanV = 0.0;
    for (std::size_t k = 0; k < i.size(); ++k) {
        meanI += i[k] / n;
        meanV += v[k] / n;
    }
    double sxx = 0.0, sxy = 0.0;
    for (std::size_t k = 0; k < i.size(); ++k) {
        sxx += (i[k] - meanI) * (i[k] - meanI);
        sxy += (i[k] - meanI) * (v[k] - meanV);
    }
    const double r = -sxy / sxx;
    return {r, meanV + r * meanI};
}

inline void expectWithin(double analytic, double sampled, double tolerance, const std::string &what)
{
    EXPECT_NEAR(analytic / sampled, 1.0, tolerance) << what << ": analytic " << analytic << ", sampled " << sampled;
}

} // namespace sagline::montecarlo
