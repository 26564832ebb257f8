#include "CurvatureCheck.h"

#include "Distributions.h"

#include <Eigen/Dense>

#include <algorithm>
#include <cmath>

namespace sagline {

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
    for (std::size_t i = 0; i < n; ++i) {
        const double w = weights.empty() ? 1.0 : weights[i];
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
    }
    // Centre on the mean and scale to [-1, 1]: the columns 1, t, t² are then of similar size.
    double mean = 0.0;
    for (double v : x)
        mean += v;
    mean /= static_cast<double>(n);
    double scale = 0.0;
    for (double v : x)
        scale = std::max(scale, std::fabs(v - mean));
    const double maxAbs = std::max(std::fabs(mean), scale);
    if (!(scale > 1e-10 * maxAbs)) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "all x values are equal";
        return r;
    }
    const auto rows = static_cast<Eigen::Index>(n);
    Eigen::MatrixXd a(rows, 3);
    Eigen::VectorXd b(rows);
    Eigen::VectorXd sqrtW(rows);
    for (Eigen::Index i = 0; i < rows; ++i) {
        const auto k = static_cast<std::size_t>(i);
        const double t = (x[k] - mean) / scale;
        sqrtW(i) = std::sqrt(weights.empty() ? 1.0 : weights[k]);
        a(i, 0) = sqrtW(i);
        a(i, 1) = sqrtW(i) * t;
        a(i, 2) = sqrtW(i) * t * t;
        b(i) = sqrtW(i) * y[k];
    }
    const Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(a);
    if (qr.rank() < 3) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "fewer than 3 distinct x values: no curvature can be fitted";
        return r;
    }
    const Eigen::Vector3d d = qr.solve(b);
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

    const Eigen::VectorXd residual = b - a * d; // weighted residuals
    const double ssr = residual.squaredNorm();
    const double weightSum = sqrtW.squaredNorm();
    const double meanY = sqrtW.dot(b) / weightSum; // Σ w y / Σ w
    const double sst = (b - meanY * sqrtW).squaredNorm();
    if (sst > 0.0)
        r.rSquared = std::clamp(1.0 - ssr / sst, 0.0, 1.0);
    if (n < 4)
        return r;
    const double dof = static_cast<double>(n) - 3.0;
    const double s2 = ssr / dof;
    r.residualSd = std::sqrt(s2);
    // (AᵀA)⁻¹ = P R⁻¹ R⁻ᵀ Pᵀ from the pivoted QR.
    const Eigen::Matrix3d upper = qr.matrixR().topLeftCorner(3, 3).triangularView<Eigen::Upper>();
    const Eigen::Matrix3d upperInverse = upper.triangularView<Eigen::Upper>().solve(Eigen::Matrix3d::Identity());
    const Eigen::Matrix3d permutation = qr.colsPermutation();
    const Eigen::Matrix3d covD = permutation * (upperInverse * upperInverse.transpose()) * permutation.transpose() * s2;
    const Eigen::Matrix3d covC = jacobian * covD * jacobian.transpose();
    r.c0Se = std::sqrt(std::max(0.0, covC(0, 0)));
    r.c1Se = std::sqrt(std::max(0.0, covC(1, 1)));
    r.c2Se = std::sqrt(std::max(0.0, covC(2, 2)));
    double maxAbsY = 0.0;
    for (double v : y)
        maxAbsY = std::max(maxAbsY, std::fabs(v));
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
