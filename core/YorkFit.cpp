#include "YorkFit.h"

#include "LineFit.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace sagline {

namespace {

// The quantities of York 2004 steps 3-5 for a trial slope b.
struct YorkState {
    double sumW = 0.0;
    double meanX = 0.0; // X̄
    double meanY = 0.0; // Ȳ
    double numerator = 0.0;   // Σ W β V
    double denominator = 0.0; // Σ W β U
};

} // namespace

YorkFitResult yorkFit(std::span<const double> x, std::span<const double> y, std::span<const double> sx,
                      std::span<const double> sy, std::span<const double> correlation, const YorkOptions &options)
{
    YorkFitResult r;
    const std::size_t n = x.size();
    r.n = n;
    if (y.size() != n || sx.size() != n || sy.size() != n || (!correlation.empty() && correlation.size() != n)) {
        r.message = "x, y and their uncertainties differ in length";
        return r;
    }
    if (n < 2) {
        r.message = "a line needs at least 2 points, got " + std::to_string(n);
        return r;
    }
    LineFit start;
    for (std::size_t i = 0; i < n; ++i) {
        const double rho = correlation.empty() ? 0.0 : correlation[i];
        if (!std::isfinite(x[i]) || !std::isfinite(y[i]) || !std::isfinite(sx[i]) || !std::isfinite(sy[i])
            || !std::isfinite(rho)) {
            r.status = FitStatus::NonFiniteValue;
            r.message = "point " + std::to_string(i) + ": a value or an uncertainty is not finite";
            return r;
        }
        if (!(sx[i] > 0.0) || !(sy[i] > 0.0)) {
            r.status = FitStatus::InvalidUncertainty;
            r.message = "point " + std::to_string(i) + ": uncertainties must be above zero";
            return r;
        }
        if (!(std::fabs(rho) < 1.0)) {
            r.status = FitStatus::InvalidUncertainty;
            r.message = "point " + std::to_string(i) + ": the error correlation must be between -1 and 1";
            return r;
        }
        start.add(x[i], y[i]);
    }
    const LineFitResult ols = start.result();
    if (!ols.ok()) {
        r.status = ols.status;
        r.message = ols.message;
        return r;
    }

    std::vector<double> weightX(n), weightY(n), alpha(n), rho(n), weight(n), beta(n);
    for (std::size_t i = 0; i < n; ++i) {
        weightX[i] = 1.0 / (sx[i] * sx[i]);
        weightY[i] = 1.0 / (sy[i] * sy[i]);
        alpha[i] = std::sqrt(weightX[i] * weightY[i]);
        rho[i] = correlation.empty() ? 0.0 : correlation[i];
    }
    // Steps 3-5 of York 2004 for slope b; fills weight and beta.
    const auto evaluate = [&](double b) {
        YorkState s;
        for (std::size_t i = 0; i < n; ++i) {
            weight[i] = weightX[i] * weightY[i] / (weightX[i] + b * b * weightY[i] - 2.0 * b * rho[i] * alpha[i]);
            s.sumW += weight[i];
            s.meanX += weight[i] * x[i];
            s.meanY += weight[i] * y[i];
        }
        s.meanX /= s.sumW;
        s.meanY /= s.sumW;
        for (std::size_t i = 0; i < n; ++i) {
            const double u = x[i] - s.meanX;
            const double v = y[i] - s.meanY;
            beta[i] = weight[i] * (u / weightY[i] + b * v / weightX[i] - (b * u + v) * rho[i] / alpha[i]);
            s.numerator += weight[i] * beta[i] * v;
            s.denominator += weight[i] * beta[i] * u;
        }
        return s;
    };

    double b = ols.slope;
    bool converged = false;
    YorkState state;
    for (int iteration = 1; iteration <= options.maxIterations; ++iteration) {
        state = evaluate(b);
        if (!(state.denominator != 0.0) || !std::isfinite(state.numerator / state.denominator))
            break;
        const double next = state.numerator / state.denominator;
        const double change = std::fabs(next - b);
        b = next;
        r.iterations = iteration;
        if (change <= std::max(options.tolerance, 8.0 * std::numeric_limits<double>::epsilon()) * std::fabs(b)
            || change == 0.0) {
            converged = true;
            break;
        }
    }
    if (!converged) {
        r.status = FitStatus::NotConverged;
        r.message = "the York iteration did not converge in " + std::to_string(options.maxIterations)
                    + " iterations; check the uncertainties";
        return r;
    }
    // Steps 7-10 with the converged slope.
    state = evaluate(b);
    const double a = state.meanY - b * state.meanX;
    double meanAdjusted = 0.0; // x̄ of the adjusted points x_i = X̄ + β_i
    for (std::size_t i = 0; i < n; ++i)
        meanAdjusted += weight[i] * (state.meanX + beta[i]);
    meanAdjusted /= state.sumW;
    double sumWu2 = 0.0;
    double chi2 = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        const double u = state.meanX + beta[i] - meanAdjusted;
        sumWu2 += weight[i] * u * u;
        const double e = y[i] - b * x[i] - a;
        chi2 += weight[i] * e * e;
    }
    if (!(sumWu2 > 0.0)) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "the adjusted x values have no spread: the slope cannot be fitted";
        return r;
    }
    r.status = FitStatus::Ok;
    r.slope = b;
    r.intercept = a;
    const double varB = 1.0 / sumWu2;
    r.slopeSe = std::sqrt(varB);
    r.interceptSe = std::sqrt(1.0 / state.sumW + meanAdjusted * meanAdjusted * varB);
    r.covariance = -meanAdjusted * varB;
    r.chiSquared = chi2;
    r.weightedMeanX = state.meanX;
    r.weights = weight;
    if (n >= 3) {
        r.mswd = chi2 / static_cast<double>(n - 2);
        const double birge = std::sqrt(*r.mswd);
        r.slopeSeScaled = r.slopeSe * birge;
        r.interceptSeScaled = r.interceptSe * birge;
    }
    return r;
}

} // namespace sagline
