// Quadratic fit y = c0 + c1·x + c2·x² and the test of its curvature term, to warn that the V–I
// line bends (core saturation, winding heating). x is centred and scaled to [-1, 1] (t) and y
// centred, so the normal equations in 1, t, t² are well conditioned (raw power sums of x would
// not be); they are solved from sums in one pass, then refined once from the residuals of a second
// pass (one step of iterative refinement), which gives the digits a QR over the n rows gave
// (checked on NIST StRD Pontius) without an n × 3 matrix.
#pragma once

#include "FitStatus.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>

namespace sagline {

struct QuadraticFitResult {
    FitStatus status = FitStatus::TooFewPoints;
    std::string message;
    std::size_t n = 0;
    double c0 = 0.0, c1 = 0.0, c2 = 0.0;       // coefficients in the units of x and y
    std::optional<double> c0Se, c1Se, c2Se;    // standard errors from the scatter (n >= 4)
    std::optional<double> residualSd;          // sqrt(Σ w e² / (n - 3)) (n >= 4)
    std::optional<double> rSquared;            // 1 - SSR/SST, weighted; empty if all y equal
    // Two-sided p-value of c2 = 0 (Student t with n - 3 dof, the same as the partial F test
    // with 1 and n - 3 dof). Small p: the curvature is real. Independent of the weights' scale.
    std::optional<double> curvatureP;

    bool ok() const { return status == FitStatus::Ok; }
};

// weights may be empty (all 1) or the same size as x (w > 0, e.g. 1/u²). Needs 3 points with
// 3 distinct x for the coefficients, 4 for the scatter-based items.
QuadraticFitResult fitQuadratic(std::span<const double> x, std::span<const double> y,
                                std::span<const double> weights = {});

} // namespace sagline
