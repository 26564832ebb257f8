#include "CurvatureCheck.h"

#include "Distributions.h"
#include "FitWeights.h"

#include <Eigen/Dense>

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

// Σ w, Σ w t, ..., Σ w t⁴ (the Gram matrix of 1, t, t²) and Σ w t^k u for the centred y.
struct QuadraticSums {
    Eigen::Matrix3d gram = Eigen::Matrix3d::Zero();
    Eigen::Vector3d moment = Eigen::Vector3d::Zero();
    double sst = 0.0; // Σ w u², the total sum of squares about the weighted mean of y
};

} // namespace

QuadraticFitResult fitQuadratic(std::span<const double> x, std::span<const double> y, std::span<const double> weights)
{
    QuadraticFitResult r;
    const std::size_t n = x.size();
    r.n = n;
    if (y.size() != n || (!weights.empty() && weights.size() != n)) {
        r.status = FitStatus::TooFewPoints;
        r.message = "x, y and weights differ in length";
        return r;
    }
    if (n < 3) {
        r.message = "a quadratic needs at least 3 points, got " + std::to_string(n);
        return r;
    }
    const FitWeights weightAt(weights);
    // Pass 1: checks, the mean and range of x, the weighted mean of y, whether 3 x differ.
    double sumX = 0.0, minX = x[0], maxX = x[0], weightSum = 0.0, sumWY = 0.0, maxAbsY = 0.0;
    double firstX = x[0], secondX = x[0];
    int distinct = 1;
    for (std::size_t i = 0; i < n; ++i) {
        const double w = weightAt[i];
        if (!std::isfinite(x[i]) || !std::isfinite(y[i]) || !std::isfinite(w)) {
            r.status = FitStatus::NonFiniteValue;
            r.message = "point " + std::to_string(i) + " is not finite";
            return r;
        }
        if (!(w > 0.0)) {
            r.status = FitStatus::InvalidUncertainty;
            r.message = "point " + std::to_string(i) + " has a weight that is not above zero";
            return r;
        }
        sumX += x[i];
        minX = std::min(minX, x[i]);
        maxX = std::max(maxX, x[i]);
        weightSum += w;
        sumWY += w * y[i];
        maxAbsY = std::max(maxAbsY, std::fabs(y[i]));
        if (distinct < 3 && x[i] != firstX && x[i] != secondX) {
            if (distinct == 1)
                secondX = x[i];
            ++distinct;
        }
    }
    // Centre on the mean and scale to [-1, 1]: the columns 1, t, t² are then of similar size.
    const double mean = sumX / static_cast<double>(n);
    const double scale = std::max(std::fabs(minX - mean), std::fabs(maxX - mean));
    const double maxAbs = std::max(std::fabs(mean), scale);
    if (!(scale > 1e-10 * maxAbs)) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "all x values are equal";
        return r;
    }
    const double meanY = sumWY / weightSum;
    const double perScale = 1.0 / scale;
    // Pass 2: the normal equations of u = y - ȳ in 1, t, t².
    QuadraticSums sums;
    {
        double s[5] = {0.0, 0.0, 0.0, 0.0, 0.0}, m[3] = {0.0, 0.0, 0.0}, sst = 0.0;
        for (std::size_t i = 0; i < n; ++i) {
            const double w = weightAt[i];
            const double t = (x[i] - mean) * perScale;
            const double u = y[i] - meanY;
            const double wt = w * t, wt2 = wt * t;
            s[0] += w;
            s[1] += wt;
            s[2] += wt2;
            s[3] += wt2 * t;
            s[4] += wt2 * t * t;
            m[0] += w * u;
            m[1] += wt * u;
            m[2] += wt2 * u;
            sst += w * u * u;
        }
        sums.gram << s[0], s[1], s[2], s[1], s[2], s[3], s[2], s[3], s[4];
        sums.moment << m[0], m[1], m[2];
        sums.sst = sst;
    }
    const Eigen::LDLT<Eigen::Matrix3d> gram(sums.gram);
    const Eigen::Vector3d pivots = gram.vectorD();
    // Three distinct x give a positive definite Gram matrix; a pivot at rounding level of the
    // largest means the t² column is (numerically) a combination of the others.
    if (distinct < 3 || gram.info() != Eigen::Success || !(pivots.minCoeff() > 1e-13 * pivots.maxCoeff())) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "fewer than 3 distinct x values: no curvature can be fitted";
        return r;
    }
    Eigen::Vector3d d = gram.solve(sums.moment);
    // Pass 3: residuals of that solution; their moments give one refinement step, and the
    // residual sum of squares of the refined solution is ssr - δ·(Aᵀr).
    double ssr = 0.0;
    Eigen::Vector3d residualMoment;
    {
        double e[3] = {0.0, 0.0, 0.0};
        for (std::size_t i = 0; i < n; ++i) {
            const double w = weightAt[i];
            const double t = (x[i] - mean) * perScale;
            const double res = (y[i] - meanY) - (d(0) + (d(1) + d(2) * t) * t);
            const double wr = w * res;
            e[0] += wr;
            e[1] += wr * t;
            e[2] += wr * t * t;
            ssr += wr * res;
        }
        residualMoment << e[0], e[1], e[2];
    }
    const Eigen::Vector3d step = gram.solve(residualMoment);
    d += step;
    ssr = std::max(0.0, ssr - step.dot(residualMoment));
    d(0) += meanY;
    // Back to the units of x: t = (x - m)/s.
    const double m = mean;
    const double s = scale;
    Eigen::Matrix3d jacobian;
    jacobian << 1.0, -m / s, m * m / (s * s),
                0.0, 1.0 / s, -2.0 * m / (s * s),
                0.0, 0.0, 1.0 / (s * s);
    const Eigen::Vector3d c = jacobian * d;
    r.status = FitStatus::Ok;
    r.c0 = c(0);
    r.c1 = c(1);
    r.c2 = c(2);

    if (sums.sst > 0.0)
        r.rSquared = std::clamp(1.0 - ssr / sums.sst, 0.0, 1.0);
    if (n < 4)
        return r;
    const double dof = static_cast<double>(n) - 3.0;
    const double s2 = ssr / dof;
    r.residualSd = std::sqrt(s2);
    const Eigen::Matrix3d covD = gram.solve(Eigen::Matrix3d::Identity()) * s2;
    const Eigen::Matrix3d covC = jacobian * covD * jacobian.transpose();
    r.c0Se = std::sqrt(std::max(0.0, covC(0, 0)));
    r.c1Se = std::sqrt(std::max(0.0, covC(1, 1)));
    r.c2Se = std::sqrt(std::max(0.0, covC(2, 2)));
    const double roundingLevel = 1e-12 * maxAbsY;
    if (std::sqrt(ssr / weightSum) <= roundingLevel) {
        // Exact data: the t ratio would be rounding noise over rounding noise. The curvature is
        // real exactly when the t² term moves the curve by more than rounding.
        r.curvatureP = std::fabs(d(2)) > roundingLevel ? 0.0 : 1.0;
        return r;
    }
    const double d2Se = std::sqrt(covD(2, 2));
    const double t = std::fabs(d(2)) / d2Se;
    r.curvatureP = std::clamp(2.0 * studentTCdf(-t, dof), 0.0, 1.0);
    return r;
}

} // namespace sagline
