#include "Distributions.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

namespace sagline {

namespace {

// Continued fraction for I_x(a, b) (A&S 26.5.8), evaluated with the modified Lentz method.
double betaContinuedFraction(double a, double b, double x)
{
    constexpr double tiny = 1e-300;
    constexpr double epsilon = 1e-16;
    const double qab = a + b;
    const double qap = a + 1.0;
    const double qam = a - 1.0;
    double c = 1.0;
    double d = 1.0 - qab * x / qap;
    if (std::fabs(d) < tiny)
        d = tiny;
    d = 1.0 / d;
    double h = d;
    // One Lentz step with partial numerator aa: updates d and c, returns the factor for h.
    const auto step = [&](double aa) {
        d = 1.0 + aa * d;
        if (std::fabs(d) < tiny)
            d = tiny;
        c = 1.0 + aa / c;
        if (std::fabs(c) < tiny)
            c = tiny;
        d = 1.0 / d;
        return d * c;
    };
    for (int m = 1; m <= 10000; ++m) {
        const double m2 = 2.0 * m;
        h *= step(m * (b - m) * x / ((qam + m2) * (a + m2))); // the even term, d_2m
        const double delta = step(-(a + m) * (qab + m) * x / ((a + m2) * (qap + m2))); // the odd term
        h *= delta;
        if (std::fabs(delta - 1.0) < epsilon)
            break;
    }
    return h;
}

// log of x^a (1-x)^b / (a B(a, b)) without overflow.
double logFront(double a, double b, double x)
{
    return std::lgamma(a + b) - std::lgamma(a) - std::lgamma(b) + a * std::log(x) + b * std::log1p(-x);
}

// P(T > t) for t >= 0.
double studentTUpperTail(double t, double dof)
{
    const double x = dof / (dof + t * t);
    return 0.5 * regularizedIncompleteBeta(0.5 * dof, 0.5, x);
}

double studentTDensity(double t, double dof)
{
    const double logNorm = std::lgamma(0.5 * (dof + 1.0)) - std::lgamma(0.5 * dof)
                           - 0.5 * std::log(dof * std::numbers::pi);
    return std::exp(logNorm - 0.5 * (dof + 1.0) * std::log1p(t * t / dof));
}

} // namespace

double regularizedIncompleteBeta(double a, double b, double x)
{
    if (!(a > 0.0) || !(b > 0.0) || !(x >= 0.0) || !(x <= 1.0))
        return 0.0;
    if (x == 0.0)
        return 0.0;
    if (x == 1.0)
        return 1.0;
    // The fraction converges fast for x < (a+1)/(a+b+2); use the symmetry I_x(a,b) = 1 - I_{1-x}(b,a).
    if (x < (a + 1.0) / (a + b + 2.0))
        return std::exp(logFront(a, b, x)) * betaContinuedFraction(a, b, x) / a;
    return 1.0 - std::exp(logFront(b, a, 1.0 - x)) * betaContinuedFraction(b, a, 1.0 - x) / b;
}

double studentTCdf(double t, double dof)
{
    if (!(dof > 0.0) || std::isnan(t))
        return 0.0;
    const double upper = studentTUpperTail(std::fabs(t), dof);
    return t >= 0.0 ? 1.0 - upper : upper;
}

double studentTQuantile(double p, double dof)
{
    if (!(dof > 0.0) || !(p > 0.0) || !(p < 1.0))
        return 0.0;
    if (p == 0.5)
        return 0.0;
    // Solve P(T > t) = q for t >= 0 on the upper tail, which keeps digits when p is near 1.
    const double q = p > 0.5 ? 1.0 - p : p;
    double low = 0.0;
    double high = 1.0;
    while (studentTUpperTail(high, dof) > q && high < 1e300)
        high *= 2.0;
    double t = std::clamp(normalQuantile(1.0 - q), low, high);
    for (int i = 0; i < 200; ++i) {
        const double f = studentTUpperTail(t, dof) - q; // decreasing in t
        if (f > 0.0)
            low = t;
        else
            high = t;
        const double slope = -studentTDensity(t, dof);
        double next = slope != 0.0 ? t - f / slope : 0.5 * (low + high);
        if (!(next > low && next < high))
            next = 0.5 * (low + high);
        if (std::fabs(next - t) <= 4.0 * std::numeric_limits<double>::epsilon() * std::max(1.0, t)) {
            t = next;
            break;
        }
        t = next;
    }
    return p > 0.5 ? t : -t;
}

double studentTCoverageFactor(double confidence, double dof)
{
    return studentTQuantile(0.5 + 0.5 * confidence, dof);
}

double fSurvival(double f, double d1, double d2)
{
    if (!(d1 > 0.0) || !(d2 > 0.0) || std::isnan(f))
        return 1.0;
    if (f <= 0.0)
        return 1.0;
    if (std::isinf(f))
        return 0.0;
    return regularizedIncompleteBeta(0.5 * d2, 0.5 * d1, d2 / (d2 + d1 * f));
}

double normalQuantile(double p)
{
    if (!(p > 0.0) || !(p < 1.0))
        return 0.0;
    if (p > 0.5)
        return -normalQuantile(1.0 - p); // 1 - p is exact here; keeps the upper tail's digits
    // P. J. Acklam's coefficients (public algorithm, relative error 1.15e-9 before refinement).
    static constexpr double a[] = {-3.969683028665376e+01, 2.209460984245205e+02, -2.759285104469687e+02,
                                   1.383577518672690e+02, -3.066479806614716e+01, 2.506628277459239e+00};
    static constexpr double b[] = {-5.447609879822406e+01, 1.615858368580409e+02, -1.556989798598866e+02,
                                   6.680131188771972e+01, -1.328068155288572e+01};
    static constexpr double c[] = {-7.784894002430293e-03, -3.223964580411365e-01, -2.400758277161838e+00,
                                   -2.549732539343734e+00, 4.374664141464968e+00, 2.938163982698783e+00};
    static constexpr double d[] = {7.784695709041462e-03, 3.224671290700398e-01, 2.445134137142996e+00,
                                   3.754408661907416e+00};
    constexpr double pLow = 0.02425;
    double x;
    if (p < pLow) {
        const double q = std::sqrt(-2.0 * std::log(p));
        x = (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5])
            / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1.0);
    } else if (p <= 1.0 - pLow) {
        const double q = p - 0.5;
        const double r = q * q;
        x = (((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q
            / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1.0);
    } else {
        const double q = std::sqrt(-2.0 * std::log1p(-p));
        x = -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5])
            / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1.0);
    }
    // One Halley step on Phi(x) - p.
    const double e = 0.5 * std::erfc(-x / std::numbers::sqrt2) - p;
    const double u = e * std::sqrt(2.0 * std::numbers::pi) * std::exp(0.5 * x * x);
    return x - u / (1.0 + 0.5 * x * u);
}

} // namespace sagline
