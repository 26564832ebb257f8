// Straight line with uncertainties in both x and y: York, Evensen, López Martínez and De Basabe
// Delgado (2004), "Unified equations for the slope, intercept, and standard errors of the best
// straight line", Am. J. Phys. 72(3), 367-375. The iteration of its section III, started from
// ordinary least squares; standard errors by its closed form (intrinsic, from the stated
// uncertainties only) and, separately, scaled by sqrt(MSWD).
#pragma once

#include "FitStatus.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace sagline {

struct YorkOptions {
    int maxIterations = 200;  // NotConverged after this many
    double tolerance = 1e-14; // stop when |Δb| <= tolerance·|b| (or at rounding level)
};

struct YorkFitResult {
    FitStatus status = FitStatus::TooFewPoints;
    std::string message;
    std::size_t n = 0;
    int iterations = 0;
    double slope = 0.0;                  // b (V/A for Sagline)
    double intercept = 0.0;              // a (V)
    double slopeSe = 0.0;                // σ_b, York 2004 eq. (13), intrinsic (unscaled)
    double interceptSe = 0.0;            // σ_a, intrinsic
    double covariance = 0.0;             // cov(a, b) = -x̄ σ_b², intrinsic
    double chiSquared = 0.0;             // S = Σ W_i (Y_i - b X_i - a)², expected value n - 2
    std::optional<double> mswd;          // S/(n - 2), n >= 3
    std::optional<double> slopeSeScaled; // σ_b·sqrt(MSWD), n >= 3
    std::optional<double> interceptSeScaled; // σ_a·sqrt(MSWD), n >= 3
    double weightedMeanX = 0.0;          // X̄ = Σ W X / Σ W at the solution
    std::vector<double> weights;         // W_i at the solution (used for residual diagnostics)

    bool ok() const { return status == FitStatus::Ok; }
};

// x, y with standard uncertainties sx, sy (all > 0) and, optionally, the correlation r_i of the
// errors of x_i and y_i (|r| < 1; empty means 0).
YorkFitResult yorkFit(std::span<const double> x, std::span<const double> y, std::span<const double> sx,
                      std::span<const double> sy, std::span<const double> correlation = {},
                      const YorkOptions &options = {});

} // namespace sagline
