#include "LineFit.h"

#include "Distributions.h"

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

bool isDegenerate(double sxx, double weightSum, double maxAbsX)
{
    // The weighted spread of x must exceed rounding noise relative to the size of x.
    const double variance = sxx / weightSum;
    const double noise = 1e-10 * maxAbsX;
    return !(variance > noise * noise) || sxx <= 0.0;
}

// The line from the centred sums, shared by the live and the batch fit; false (with the
// status and message set) when all x are equal.
bool setLineFromMoments(LineFitResult &r, double sxx, double sxy, double syy, double weightSum, double maxAbsX)
{
    if (!std::isfinite(sxx) || !std::isfinite(sxy) || !std::isfinite(syy)) {
        // Readings so large that their squares overflow: not "all equal", but not physical.
        r.status = FitStatus::NonFiniteValue;
        r.message = "the readings are too large to fit (their squares overflow a double); they are not physical values";
        return false;
    }
    if (isDegenerate(sxx, weightSum, maxAbsX)) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "all currents are equal: the slope (series resistance) cannot be fitted";
        return false;
    }
    r.status = FitStatus::Ok;
    r.slope = sxy / sxx;
    r.intercept = r.meanY - r.slope * r.meanX;
    if (syy > 0.0)
        r.rSquared = std::clamp(sxy / sxx * sxy / syy, 0.0, 1.0);
    return true;
}

} // namespace

bool lineFromCentredSums(LineFitResult &r, double sxx, double sxy, double syy, double weightSum, double maxAbsX)
{
    return setLineFromMoments(r, sxx, sxy, syy, weightSum, maxAbsX);
}

bool LineFit::add(double x, double y, double weight)
{
    if (!std::isfinite(x) || !std::isfinite(y) || !std::isfinite(weight) || !(weight > 0.0))
        return false;
    const double newWeightSum = m_weightSum + weight;
    const double dx = x - m_meanX;
    const double dy = y - m_meanY;
    // Residual sum of squares by the recursive least-squares update: the new point's
    // prediction error under the old fit, deflated by its leverage. No cancellation, unlike
    // Syy - Sxy²/Sxx, which loses digits when R² is close to 1.
    const bool recursive = m_count >= 2 && !isDegenerate(m_sxx, m_weightSum, m_maxAbsX);
    double ssrIncrease = 0.0;
    if (recursive) {
        const double error = dy - m_sxy / m_sxx * dx;
        const double leverage = weight * (1.0 / m_weightSum + dx * dx / m_sxx);
        ssrIncrease = weight * error * error / (1.0 + leverage);
    }
    m_meanX += dx * weight / newWeightSum;
    m_meanY += dy * weight / newWeightSum;
    m_sxx += weight * dx * (x - m_meanX);
    m_syy += weight * dy * (y - m_meanY);
    m_sxy += weight * dx * (y - m_meanY);
    m_weightSum = newWeightSum;
    m_maxAbsX = std::max(m_maxAbsX, std::fabs(x));
    ++m_count;
    m_ssr = recursive ? m_ssr + ssrIncrease : directSsr();
    return true;
}

bool LineFit::remove(double x, double y, double weight)
{
    if (m_count == 0 || !std::isfinite(x) || !std::isfinite(y) || !std::isfinite(weight) || !(weight > 0.0))
        return false;
    if (m_count == 1) {
        clear();
        return true;
    }
    const double oldWeightSum = m_weightSum - weight;
    if (!(oldWeightSum > 0.0)) { // weights did not match what was added
        return false;
    }
    // The downdate of the residual sum of squares: the point's residual under the current fit,
    // inflated by 1/(1 - leverage). Falls back to the direct form when the point is pivotal.
    double ssrDecrease = -1.0;
    if (!isDegenerate(m_sxx, m_weightSum, m_maxAbsX)) {
        const double dx = x - m_meanX;
        const double residual = (y - m_meanY) - m_sxy / m_sxx * dx;
        const double leverage = weight * (1.0 / m_weightSum + dx * dx / m_sxx);
        if (leverage < 0.5 && m_count > 3)
            ssrDecrease = weight * residual * residual / (1.0 - leverage);
    }
    // Inverse of add(): the means before x was added, then the co-moment terms it contributed.
    const double oldMeanX = m_meanX - (x - m_meanX) * weight / oldWeightSum;
    const double oldMeanY = m_meanY - (y - m_meanY) * weight / oldWeightSum;
    m_sxx = std::max(0.0, m_sxx - weight * (x - oldMeanX) * (x - m_meanX));
    m_syy = std::max(0.0, m_syy - weight * (y - oldMeanY) * (y - m_meanY));
    m_sxy -= weight * (x - oldMeanX) * (y - m_meanY);
    m_meanX = oldMeanX;
    m_meanY = oldMeanY;
    m_weightSum = oldWeightSum;
    --m_count;
    m_ssr = ssrDecrease >= 0.0 ? std::max(0.0, m_ssr - ssrDecrease) : directSsr();
    return true;
}

void LineFit::clear()
{
    *this = LineFit();
}

LineFitResult LineFit::baseResult() const
{
    LineFitResult r;
    r.n = m_count;
    r.degreesOfFreedom = static_cast<int>(m_count) - 2;
    r.meanX = m_meanX;
    r.meanY = m_meanY;
    r.sxx = m_sxx;
    if (m_count < 2) {
        r.status = FitStatus::TooFewPoints;
        r.message = "a line needs at least 2 points, got " + std::to_string(m_count);
        r.degreesOfFreedom = 0;
        return r;
    }
    setLineFromMoments(r, m_sxx, m_sxy, m_syy, m_weightSum, m_maxAbsX);
    return r;
}

double LineFit::directSsr() const
{
    if (m_count < 3 || !(m_sxx > 0.0))
        return 0.0;
    return std::max(0.0, m_syy - m_sxy / m_sxx * m_sxy);
}

double LineFit::chiSquared() const
{
    if (m_count < 3 || isDegenerate(m_sxx, m_weightSum, m_maxAbsX))
        return 0.0;
    return m_ssr;
}

LineFitResult LineFit::result() const
{
    LineFitResult r = baseResult();
    if (!r.ok() || m_count < 3)
        return r;
    const double s2 = chiSquared() / r.degreesOfFreedom;
    r.residualSd = std::sqrt(s2);
    r.slopeSe = std::sqrt(s2 / m_sxx);
    r.interceptSe = std::sqrt(s2 * (1.0 / m_weightSum + m_meanX * m_meanX / m_sxx));
    r.covariance = -m_meanX * s2 / m_sxx;
    return r;
}

LineFitResult LineFit::weightedResult() const
{
    LineFitResult r = baseResult();
    if (!r.ok())
        return r;
    r.slopeSe = std::sqrt(1.0 / m_sxx);
    r.interceptSe = std::sqrt(1.0 / m_weightSum + m_meanX * m_meanX / m_sxx);
    r.covariance = -m_meanX / m_sxx;
    if (m_count >= 3)
        r.residualSd = std::sqrt(chiSquared() / r.degreesOfFreedom);
    return r;
}

LinePrediction LineFit::predict(double x, double confidence, double newWeight) const
{
    const LineFitResult r = baseResult();
    if (!r.ok())
        return {};
    std::optional<double> t;
    if (m_count >= 3 && confidence > 0.0 && confidence < 1.0)
        t = studentTCoverageFactor(confidence, r.degreesOfFreedom);
    return predictWithFactor(x, r, t, newWeight);
}

std::vector<LinePrediction> LineFit::predictAll(std::span<const double> xs, double confidence) const
{
    std::vector<LinePrediction> out(xs.size());
    const LineFitResult r = baseResult();
    if (!r.ok())
        return out;
    std::optional<double> t;
    if (m_count >= 3 && confidence > 0.0 && confidence < 1.0)
        t = studentTCoverageFactor(confidence, r.degreesOfFreedom);
    for (std::size_t i = 0; i < xs.size(); ++i)
        out[i] = predictWithFactor(xs[i], r, t, 1.0);
    return out;
}

LinePrediction LineFit::predictWithFactor(double x, const LineFitResult &r, std::optional<double> t,
                                          double newWeight) const
{
    LinePrediction p;
    p.value = m_meanY + r.slope * (x - m_meanX);
    if (!t || !std::isfinite(x) || !(newWeight > 0.0))
        return p;
    const double s2 = chiSquared() / r.degreesOfFreedom;
    const double dx = x - m_meanX;
    const double lineVariance = s2 * (1.0 / m_weightSum + dx * dx / m_sxx);
    p.standardError = std::sqrt(lineVariance);
    const double halfLine = *t * *p.standardError;
    const double halfNew = *t * std::sqrt(lineVariance + s2 / newWeight);
    p.confidence = Interval{p.value - halfLine, p.value + halfLine};
    p.prediction = Interval{p.value - halfNew, p.value + halfNew};
    return p;
}

namespace {

// Σ f(i) over [0, n) with four independent accumulators, so the compiler can keep several
// additions in flight (strict IEEE order is kept inside each accumulator).
template <typename Term>
double sum4(std::size_t n, Term term)
{
    double s0 = 0.0, s1 = 0.0, s2 = 0.0, s3 = 0.0;
    std::size_t i = 0;
    for (; i + 4 <= n; i += 4) {
        s0 += term(i);
        s1 += term(i + 1);
        s2 += term(i + 2);
        s3 += term(i + 3);
    }
    for (; i < n; ++i)
        s0 += term(i);
    return (s0 + s1) + (s2 + s3);
}

} // namespace

LineFitResult fitLine(std::span<const double> x, std::span<const double> y)
{
    LineFitResult r;
    const std::size_t n = x.size();
    r.n = n;
    if (y.size() != n) {
        r.message = "x and y differ in length";
        return r;
    }
    if (n < 2) {
        r.message = "a line needs at least 2 points, got " + std::to_string(n);
        return r;
    }
    const double count = static_cast<double>(n);
    const double meanX = sum4(n, [&](std::size_t i) { return x[i]; }) / count;
    const double meanY = sum4(n, [&](std::size_t i) { return y[i]; }) / count;
    // A NaN or an infinity anywhere makes a sum non-finite, so no separate pass is needed.
    if (!std::isfinite(meanX) || !std::isfinite(meanY)) {
        r.status = FitStatus::NonFiniteValue;
        r.message = "a value is not a finite number (or the values are too large to sum)";
        return r;
    }
    double sxx = 0.0, sxy = 0.0, syy = 0.0;
    {
        double a[4] = {}, b[4] = {}, c[4] = {};
        std::size_t i = 0;
        for (; i + 4 <= n; i += 4) {
            for (std::size_t k = 0; k < 4; ++k) {
                const double dx = x[i + k] - meanX;
                const double dy = y[i + k] - meanY;
                a[k] += dx * dx;
                b[k] += dx * dy;
                c[k] += dy * dy;
            }
        }
        for (; i < n; ++i) {
            const double dx = x[i] - meanX;
            const double dy = y[i] - meanY;
            a[0] += dx * dx;
            b[0] += dx * dy;
            c[0] += dy * dy;
        }
        sxx = (a[0] + a[1]) + (a[2] + a[3]);
        sxy = (b[0] + b[1]) + (b[2] + b[3]);
        syy = (c[0] + c[1]) + (c[2] + c[3]);
    }
    r.degreesOfFreedom = static_cast<int>(n) - 2;
    r.meanX = meanX;
    r.meanY = meanY;
    r.sxx = sxx;
    if (!std::isfinite(sxx) || !std::isfinite(syy)) {
        r.status = FitStatus::NonFiniteValue;
        r.message = "the values are too large to fit";
        return r;
    }
    if (!setLineFromMoments(r, sxx, sxy, syy, count, std::max(std::fabs(meanX), std::sqrt(sxx / count))))
        return r;
    if (n < 3)
        return r;
    // Residuals directly: no cancellation when R² is close to 1.
    const double slope = r.slope;
    const double ssr = sum4(n, [&](std::size_t i) {
        const double e = (y[i] - meanY) - slope * (x[i] - meanX);
        return e * e;
    });
    const double s2 = ssr / r.degreesOfFreedom;
    r.residualSd = std::sqrt(s2);
    r.slopeSe = std::sqrt(s2 / sxx);
    r.interceptSe = std::sqrt(s2 * (1.0 / count + meanX * meanX / sxx));
    r.covariance = -meanX * s2 / sxx;
    if (syy > 0.0)
        r.rSquared = std::clamp(1.0 - ssr / syy, 0.0, 1.0);
    return r;
}

} // namespace sagline
