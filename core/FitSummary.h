// The one batch fit of a session's readings that the UI, the report and the CLI all show:
// V = V0 - R·I by ordinary least squares, weighted least squares (per-point u(V)) or York (2004)
// with uncertainties in both I and V; residuals, externally studentized residuals and outlier
// flags; the quadratic (curvature) check. Nobody recomputes a fit in their own layer.
#pragma once

#include "FitStatus.h"
#include "LineFit.h"
#include "OutlierScreen.h"
#include "PointFits.h"
#include "Reading.h"
#include "Setup.h"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace sagline {

enum class FitMethod {
    Ols,  // ordinary least squares of V on I; standard errors from the residual scatter
    Wls,  // weighted least squares, w = 1/u(V)²; standard errors from the weights (absolute)
    York, // York et al. (2004), Am. J. Phys. 72(3) 367: errors in I and V; intrinsic standard errors
};

std::string toString(FitMethod method);                           // "ols", "wls", "york"
std::optional<FitMethod> fitMethodFromString(std::string_view text); // inverse of toString

struct FitOptions {
    OutlierScreenOptions outlierScreen; // Bonferroni family level and the fewest points screened
    double voltageResolutionV = 0.0; // one count of the voltmeter, V (floors the scatter); 0 = unknown
    double currentResolutionA = 0.0; // one count of the ammeter, A; 0 = unknown
    double confidence = 0.95;       // level of the interval of R and of predictions
    int yorkMaxIterations = 200;    // York: iterations before NotConverged
    double yorkTolerance = 1e-14;   // York: stop when |Δb/b| is below this
};

struct FitSummary {
    FitStatus status = FitStatus::TooFewPoints;
    std::string message;                 // empty when ok; else says what is wrong, naming the row
    FitMethod method = FitMethod::Ols;
    std::size_t n = 0;                   // points used
    int degreesOfFreedom = 0;            // n - 2

    double slope = 0.0;                  // b, V/A (negative for a loaded transformer)
    double intercept = 0.0;              // a, V
    // Standard errors and covariance of the fit (OLS: from the scatter, needs n >= 3;
    // WLS and York: intrinsic, from the given uncertainties only, as York 2004 and gsl_fit_wlinear).
    std::optional<double> slopeSe;       // V/A  (also the standard error of R)
    std::optional<double> interceptSe;   // V    (the standard error of V0)
    std::optional<double> covariance;    // cov(slope, intercept), V²/A
    // WLS and York only, n >= 3: S = Σ weighted squared residuals, MSWD = S/(n-2), and the
    // standard errors multiplied by sqrt(MSWD) (Birge ratio).
    std::optional<double> chiSquared;    // S, dimensionless
    std::optional<double> mswd;          // S/(n-2)
    std::optional<double> slopeSeScaled; // V/A
    std::optional<double> interceptSeScaled; // V

    std::optional<double> residualSdV;   // sqrt(Σ e²/(n-2)) of the plain residuals, V, n >= 3
    std::optional<double> rSquared;      // 1 - SSR/SST (weighted for WLS and York)
    double confidence = 0.95;            // level of seriesResistanceCi
    std::optional<Interval> seriesResistanceCi; // interval of R, Ω (see analysisSlopeSe)
    int iterations = 0;                  // York iterations used (0 for OLS and WLS)

    // The fit's geometry, for propagating a per-reading random error (core/UncertaintyBudget):
    // cov(intercept, slope) = s²·[[1/W + x̄²/Sxx, -x̄/Sxx], [-x̄/Sxx, 1/Sxx]] with unit weights.
    double meanCurrentA = 0.0;           // weighted mean of I, A
    double sxx = 0.0;                    // Σ w (I - meanCurrentA)², A² (times weight units)
    double sumWeights = 0.0;             // Σ w (n for OLS)
    // Every used reading states its random uncertainty u_voltage_v (the normalized-residual
    // screen and the WLS/York weights use it); false: the scatter is the only random estimate.
    bool statedRandomUncertainty = false;
    double scatterFloorV = 0.0;          // resolution floor of the scatter (OutlierScreen.h), V

    PointFits points;                    // one per input row, in input order
    OutlierScreening outlierScreening;   // the rule, its critical value, or why not screened
    std::vector<std::size_t> outlierRows; // rows flagged as outliers, ascending
    std::optional<double> curvatureP;    // p-value of the quadratic term (n >= 4, 3+ distinct I)
    std::optional<double> curvatureCoefficient; // c of V = a + b I + c I², V/A²

    bool ok() const { return status == FitStatus::Ok; }
    double seriesResistanceOhm() const { return -slope; } // R, Ω
    double noLoadVoltageV() const { return intercept; }    // V0, V
    // The standard uncertainties the analysis propagates: OLS as fitted; WLS and York the
    // intrinsic ones, enlarged by sqrt(MSWD) when MSWD > 1 (the scatter exceeds the stated
    // uncertainties), never reduced (common practice). Empty when there is none.
    std::optional<double> analysisSlopeSe() const;
    std::optional<double> analysisInterceptSe() const;
    std::optional<double> analysisCovariance() const;
};

// The fit options a setup implies: the meters' resolutions floor the scatter.
FitOptions fitOptionsFor(const std::optional<MeterSpecs> &meters);

// What the fit reads of each reading, as columns: 33 bytes a reading instead of a Reading's 296
// (a million-row CSV for `fit` needs no times, raw texts or ids).
struct ReadingColumns {
    enum State : std::uint8_t {
        fitted = 1,                // not excluded, not flagged overload or not-a-number
        hasCurrentUncertainty = 2, // uCurrentA holds the stated u(I)
        hasVoltageUncertainty = 4, // uVoltageV holds the stated u(V)
    };
    std::vector<double> currentA, voltageV, uCurrentA, uVoltageV; // A, V; u is 0 when not stated
    std::vector<std::uint8_t> state;                               // State bits

    std::size_t size() const { return currentA.size(); }
    void reserve(std::size_t n);
    // scale: the factor V1,rated/V1 that refers the reading to the rated supply (core/SupplyReferral)
    // on its current, voltage and their u; 1 keeps them as read.
    void append(const Reading &reading, double scale = 1.0);
    void clear();
};

// Fits the readings that are not excluded and not flagged overload or not-a-number.
// WLS needs u_voltage_v on every used reading; York needs u_current_a and u_voltage_v.
// Degenerate input gives a status and a message, never NaN and never a throw.
FitSummary fitReadings(const std::vector<Reading> &readings, FitMethod method, const FitOptions &options = {});
// The same fit of readings held as columns (row numbers are column indices): the same numbers.
FitSummary fitReadings(const ReadingColumns &columns, FitMethod method, const FitOptions &options = {});

// The live (O(1), ordinary least squares) fit as a FitSummary: line, standard errors,
// covariance, residual SD and R², without per-point results, so analyseFit can run on every
// point as it arrives.
FitSummary summaryOfLiveFit(const LineFit &live);

// The fitted voltage at a current, with the interval where the line lies and where one new
// reading is expected (Student t, n - 2 dof, at summary.confidence). uNewReadingV is the
// standard uncertainty of that reading; absent, the residual SD is used (OLS practice).
LinePrediction predictVoltage(const FitSummary &summary, double currentA,
                              std::optional<double> uNewReadingV = std::nullopt);

} // namespace sagline
