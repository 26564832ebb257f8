// Student t and F distributions for confidence intervals and tests, implemented here (no GSL in
// the product): the regularized incomplete beta function by its continued fraction (Lentz's
// method), as in Abramowitz & Stegun 26.5.8 and 26.7.1 / 26.6.2. tests/core check against GSL.
#pragma once

namespace sagline {

// I_x(a, b), the regularized incomplete beta function; a, b > 0, 0 <= x <= 1.
// Returns 0 or 1 at the ends; relative accuracy about 1e-14 in the range used here.
double regularizedIncompleteBeta(double a, double b, double x);

// P(T <= t) for Student's t with `dof` > 0 degrees of freedom (dof may be non-integer).
double studentTCdf(double t, double dof);

// The t with P(T <= t) = p, 0 < p < 1, dof > 0. Example: studentTQuantile(0.975, 10) = 2.228139.
double studentTQuantile(double p, double dof);

// The two-sided t factor for a confidence level (0.95 -> t_{0.975, dof}).
double studentTCoverageFactor(double confidence, double dof);

// P(F > f) (upper tail) for the F distribution with d1, d2 > 0 degrees of freedom; f >= 0.
double fSurvival(double f, double d1, double d2);

// The standard normal quantile, P(Z <= z) = p, 0 < p < 1 (Acklam's rational approximation
// refined by one Halley step, about 1e-15 relative).
double normalQuantile(double p);

} // namespace sagline
