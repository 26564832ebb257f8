// Outlier screening of a straight-line fit's residuals that does not cry wolf: the chance of
// flagging any point of a clean sweep is held at a stated family level (5 %) by a Bonferroni
// critical value, whatever the number of points.
//
// - Per-reading random uncertainty known (every point states its σ_i): the normalized residual
//   e_i / sqrt(Var e_i), with Var e_i from the hat matrix of the fit actually made
//   (σ_i²(1 - h_i) for weights 1/σ_i²), against z(1 - α/(2n)).
// - Otherwise: the externally studentized residual (n - 3 degrees of freedom) against the
//   Bonferroni t(1 - α/(2n), n - 3); its scatter is floored by the readings' resolution
//   (δ/sqrt(12), GUM F.2.2.1), so readings rounded to the last digit cannot give a near-zero
//   scatter and an enormous statistic.
// - Fewer than 6 points: not screened ("too few points to screen").
// Sources: Bonferroni-bounded outlier tests on externally studentized residuals, Cook and
// Weisberg, "Residuals and Influence in Regression" (1982), §2.2 (from memory); the studentized
// residual's t(n - p - 1) distribution, Belsley, Kuh and Welsch (1980) (from memory).
// Flags are information: nothing is excluded by them.
#pragma once

#include "ResultColumn.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace sagline {

struct OutlierScreenOptions {
    double familyAlpha = 0.05;         // chance of one or more flags on a clean sweep
    std::size_t minimumPoints = 6;     // below this: not screened
};

// Where the rule comes from, as every output names it beside the flag.
inline constexpr const char *outlierScreenSource =
    "Bonferroni-bounded test of externally studentized residuals, Cook and Weisberg, Residuals and "
    "Influence in Regression (1982) §2.2; t(n - p - 1) distribution of the studentized residual, Belsley, "
    "Kuh and Welsch, Regression Diagnostics (1980) (both from memory)";

struct OutlierScreening {
    bool screened = false;
    std::string rule;                   // the statistic, the critical value's origin
    std::string source = outlierScreenSource; // the published rule it follows
    std::optional<double> criticalValue; // |statistic| above this is flagged
    std::string reason;                 // why not screened, "" when screened
};

// Inputs are the used points only, in the same order: x (A), residuals e_i (V), the weights the
// fit used (empty: every weight 1, as for OLS), and knownSigmaV (σ_i of each residual in V, empty when unknown).
// slope is the fitted slope (V/A); scatterFloorV the smallest credible scatter from the
// resolution (0 when unknown). statistics receives one value per point (NaN where the
// statistic does not exist: read it with statisticOrNone, PointFits.h); flagged receives the
// indices of the flagged points, ascending.
OutlierScreening screenResiduals(std::span<const double> x, std::span<const double> residuals,
                                 std::span<const double> weights, std::span<const double> knownSigmaV,
                                 double scatterFloorV, const OutlierScreenOptions &options,
                                 ResultColumn &statistics, std::vector<std::size_t> &flagged,
                                 std::span<const double> firstPass = {});
// firstPass (knownSigmaV empty, one per point): the externally studentized residuals the caller computed with the
// same weights and floor, read as the first pass instead of computing them again. statistics then
// stays empty unless a point is flagged and the rest screened again (the values are firstPass's).

// Sums of the fitted line that the statistics need, when the caller has them already: the same
// numbers, in the same order of addition, as computed here (Σw, Σw·x/Σw, Σw(x - x̄)², Σw·e²).
struct ResidualSums {
    double sumW = 0.0;
    double meanX = 0.0;
    double sxx = 0.0;
    double ssr = 0.0;
};

// The externally studentized residuals alone (n >= 4; NaN where the point fixes the line or
// no scatter is left):
// sqrt(w_i) e_i / (s_(i) sqrt(1 - h_i)), s_(i) the scatter without point i, floored by floor.
void externallyStudentizedResiduals(std::span<const double> x, std::span<const double> residuals,
                                    std::span<const double> weights, double floor,
                                    ResultColumn &statistics);
void externallyStudentizedResiduals(std::span<const double> x, std::span<const double> residuals,
                                    std::span<const double> weights, double floor, const ResidualSums &sums,
                                    ResultColumn &statistics);

// The smallest scatter of V about the line that rounding alone gives: voltmeter and ammeter
// resolution δ as rectangular errors (δ/sqrt(12), GUM F.2.2.1), the current's through the
// slope. Zero when neither is known.
double resolutionScatterV(double voltageResolutionV, double currentResolutionA, double slopeVPerA);

} // namespace sagline
