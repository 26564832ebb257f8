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

} // namespace

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
    if (isDegenerate(m_sxx, m_weightSum, m_maxAbsX)) {
        r.status = FitStatus::DegenerateCurrent;
        r.message = "all currents are equal: the slope (series resistance) cannot be fitted";
        return r;
    }
    r.status = FitStatus::Ok;
    r.slope = m_sxy / m_sxx;
    r.intercept = m_meanY - r.slope * m_meanX;
    if (m_syy > 0.0)
        r.rSquared = std::clamp(m_sxy / m_sxx * m_sxy / m_syy, 0.0, 1.0);
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
    LinePrediction p;
    const LineFitResult r = baseResult();
    if (!r.ok())
        return p;
    p.value = m_meanY + r.slope * (x - m_meanX);
    if (m_count < 3 || !std::isfinite(x) || !(newWeight > 0.0) || !(confidence > 0.0 && confidence < 1.0))
        return p;
    const double s2 = chiSquared() / r.degreesOfFreedom;
    const double dx = x - m_meanX;
    const double lineVariance = s2 * (1.0 / m_weightSum + dx * dx / m_sxx);
    const double t = studentTCoverageFactor(confidence, r.degreesOfFreedom);
    p.standardError = std::sqrt(lineVariance);
    const double halfLine = t * *p.standardError;
    const double halfNew = t * std::sqrt(lineVariance + s2 / newWeight);
    p.confidence = Interval{p.value - halfLine, p.value + halfLine};
    p.prediction = Interval{p.value - halfNew, p.value + halfNew};
    return p;
}

} // namespace sagline
