// Live straight-line fit y = intercept + slope·x (for Sagline: V = V0 - R·I with x = current in A,
// y = voltage in V), updated in O(1) per added or removed point.
//
// The state is the weighted means and centred co-moments (West 1979, the weighted form of
// Welford's update), never raw power sums, so a large common offset in x or y costs no digits.
// Removal runs the same update backwards, so a point can be excluded and restored; after many
// removals the co-moments can drift by a few ulps, which LineFitTest bounds. The residual sum
// of squares is carried by the recursive least-squares update (and downdate), which keeps its
// digits when R² is close to 1.
#pragma once

#include "FitStatus.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace sagline {

// A straight-line estimate with its uncertainty. Units for the Sagline use: x in A, y in V.
struct LineFitResult {
    FitStatus status = FitStatus::TooFewPoints;
    std::string message;                     // empty when ok; else names the problem
    std::size_t n = 0;                       // points in the fit
    int degreesOfFreedom = 0;                // n - 2
    double slope = 0.0;                      // b, V/A
    double intercept = 0.0;                  // a, V
    double meanX = 0.0;                      // weighted mean of x, A
    double meanY = 0.0;                      // weighted mean of y, V
    double sxx = 0.0;                        // Σ w (x - meanX)², A² (times weight units)
    // The items below need n >= 3 (a residual scatter) and are empty otherwise.
    std::optional<double> slopeSe;           // standard error of the slope, V/A
    std::optional<double> interceptSe;       // standard error of the intercept, V
    std::optional<double> covariance;        // cov(slope, intercept), V²/A
    std::optional<double> residualSd;        // s = sqrt(Σ w e² / (n-2)), V (for unit weights)
    std::optional<double> rSquared;          // 1 - SSR/SST; empty when all y are equal

    bool ok() const { return status == FitStatus::Ok; }
    double seriesResistanceOhm() const { return -slope; } // R = -b, Ω
    double noLoadVoltageV() const { return intercept; }    // V0 = a, V
};

// The line from centred sums a batch fit computed in two passes (means first): the same status
// and message as the live fit (all currents equal, squares that overflow) and the same slope,
// intercept and R² formulas. r.meanX and r.meanY are the caller's; false when there is no line.
bool lineFromCentredSums(LineFitResult &r, double sxx, double sxy, double syy, double weightSum, double maxAbsX);

// A two-sided interval.
struct Interval {
    double low = 0.0;
    double high = 0.0;
};

// The value predicted at x with its confidence interval (of the line) and prediction interval
// (of one new reading), at the given confidence level. Empty intervals when the fit has no
// scatter estimate (n < 3).
struct LinePrediction {
    double value = 0.0;                      // intercept + slope·x, V
    std::optional<double> standardError;     // of the line at x, V
    std::optional<Interval> confidence;      // where the line lies, V
    std::optional<Interval> prediction;      // where one new reading is expected, V
};

class LineFit {
public:
    // Adds (x, y) with weight w > 0 (1 for ordinary least squares, 1/u² for weighted).
    // Returns false and changes nothing if a value is not finite or w is not above zero.
    bool add(double x, double y, double weight = 1.0);
    // Removes a point previously added with the same values (O(1)); false if the fit is empty
    // or the values are invalid. The caller keeps the list of points; this class keeps sums only.
    bool remove(double x, double y, double weight = 1.0);
    void clear();

    std::size_t count() const { return m_count; }

    // Ordinary least squares statistics: standard errors from the residual scatter s²·(X'WX)⁻¹,
    // which is right for unit weights and for relative weights. O(1).
    LineFitResult result() const;
    // Weighted statistics with absolute weights w = 1/u²: standard errors from (X'WX)⁻¹ alone
    // (as gsl_fit_wlinear), needing only n >= 2; chiSquared() gives the goodness of fit.
    LineFitResult weightedResult() const;
    double chiSquared() const; // Σ w e², for absolute weights (0 when n < 3)

    // Confidence and prediction intervals at x (Student t, n - 2 dof), e.g. for the next step.
    // For the prediction interval of a new reading with weight w the scatter term is s²/w.
    LinePrediction predict(double x, double confidence = 0.95, double newWeight = 1.0) const;
    // predict() at every x of a grid (a chart's band): the same values, with the t quantile
    // found once rather than once per x (it is most of the cost of a single prediction).
    std::vector<LinePrediction> predictAll(std::span<const double> xs, double confidence = 0.95) const;

private:
    // predict() with the coverage factor t already known (none: fewer than 3 points).
    LinePrediction predictWithFactor(double x, const LineFitResult &r, std::optional<double> t, double newWeight) const;
    LineFitResult baseResult() const;
    double directSsr() const; // Syy - Sxy²/Sxx, for the start and for pivotal removals

    std::size_t m_count = 0;
    double m_weightSum = 0.0; // Σ w
    double m_meanX = 0.0;     // Σ w x / Σ w
    double m_meanY = 0.0;     // Σ w y / Σ w
    double m_sxx = 0.0;       // Σ w (x - meanX)²
    double m_syy = 0.0;       // Σ w (y - meanY)²
    double m_sxy = 0.0;       // Σ w (x - meanX)(y - meanY)
    double m_ssr = 0.0;       // Σ w e², residual sum of squares of the current line
    double m_maxAbsX = 0.0;   // for the degenerate-x test (never decreases; conservative)
};

// Batch ordinary least squares of y on x over arrays (x in A, y in V for Sagline), by three
// passes: the means, the centred co-moments, the residual sum of squares. The same statistics
// as LineFit::result(); the fastest accurate route for a large array (see bench/FitBenchmark).
// x and y must have the same length.
LineFitResult fitLine(std::span<const double> x, std::span<const double> y);

} // namespace sagline
