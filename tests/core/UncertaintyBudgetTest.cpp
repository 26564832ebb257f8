// Combining a budget: Welch–Satterthwaite, and the coverage interval of the components'
// combined distribution against closed forms (normal, Student t, rectangular, triangular).
#include "CombinedDistribution.h"
#include "Distributions.h"
#include "UncertaintyBudget.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

using namespace sagline;

namespace {

BudgetComponent component(double contribution, DistributionShape shape, std::optional<double> dof = std::nullopt)
{
    BudgetComponent c;
    c.source = "test";
    c.standardUncertainty = contribution;
    c.sensitivity = 1.0;
    c.contribution = contribution;
    c.shape = shape;
    c.degreesOfFreedom = dof;
    c.type = dof ? EvaluationType::A : EvaluationType::B;
    return c;
}

} // namespace

TEST(UncertaintyBudget, WelchSatterthwaiteByHand)
{
    // ν_eff = u_c⁴ / Σ u_i⁴/ν_i (GUM G.4.1, eq. G.2b). Worked by hand: u1 = 3 (ν = 4),
    // u2 = 4 (ν = ∞): u_c = 5, ν_eff = 625/(81/4) = 30.864.
    const std::vector<BudgetComponent> parts = {component(3.0, DistributionShape::Normal, 4.0),
                                                component(4.0, DistributionShape::Normal)};
    EXPECT_NEAR(effectiveDegreesOfFreedom(5.0, parts), 625.0 / 20.25, 1e-12);
    EXPECT_TRUE(std::isinf(effectiveDegreesOfFreedom(4.0, {component(4.0, DistributionShape::Normal)})));
    // k = t_0.975(ν) (GUM G.3, Table G.2: ν = 8 → 2.31, ν = ∞ → 1.96); scipy.stats.t.ppf gives 2.306004.
    EXPECT_NEAR(coverageFactorFor(8.0), 2.306004, 1e-6);
    EXPECT_NEAR(coverageFactorFor(std::numeric_limits<double>::infinity()), 1.959964, 1e-6);
}

TEST(UncertaintyBudget, CoverageIntervalOfSingleShapes)
{
    // Normal: U = 1.96 u. Student t with ν = 4 scaled by u: t_0.975(4) u = 2.776445 u (scipy).
    EXPECT_NEAR(*combineBudget(0.0, {component(2.0, DistributionShape::Normal)}).coverageFactor, 1.959964, 1e-6);
    EXPECT_NEAR(*combineBudget(0.0, {component(2.0, DistributionShape::Normal, 4.0)}).coverageFactor, 2.776445, 1e-5);
    // Rectangular alone: 95 % of a rectangle of half-width a is 0.95 a = 0.95·sqrt(3) u = 1.645448 u
    // (GUM 4.3.7 for u = a/sqrt(3)).
    const UncertainValue rectangle = combineBudget(0.0, {component(1.0, DistributionShape::Rectangular)});
    EXPECT_NEAR(*rectangle.coverageFactor, 0.95 * std::sqrt(3.0), 2e-3);
    // Two equal rectangles make a triangle on [-2a, 2a] (GUM 4.3.9): P(|x| > h) = (2a - h)²/(4a²)
    // = 5 % at h = 2a(1 - sqrt(0.05)); u = a·sqrt(2/3), so k = 2(1 - sqrt(0.05))/sqrt(2/3) = 1.901753.
    const UncertainValue triangle = combineBudget(
        0.0, {component(1.0, DistributionShape::Rectangular), component(1.0, DistributionShape::Rectangular)});
    EXPECT_NEAR(*triangle.coverageFactor, 2.0 * (1.0 - std::sqrt(0.05)) / std::sqrt(2.0 / 3.0), 2e-3);
    EXPECT_NEAR(*triangle.standardUncertainty, std::sqrt(2.0), 1e-12);
    EXPECT_TRUE(std::isinf(*triangle.effectiveDof));
}

TEST(UncertaintyBudget, NormalPlusRectangleMatchesTheClosedForm)
{
    // N(0, σ²) + U(-a, a): P(X <= x) = (1/2a)[ψ((x+a)/σ) - ψ((x-a)/σ)]·σ with ψ(z) = zΦ(z) + φ(z).
    const double sigma = 1.0, a = 2.0;
    const auto phi = [](double z) { return std::exp(-z * z / 2) / std::sqrt(2 * M_PI); };
    const auto Phi = [](double z) { return 0.5 * std::erfc(-z / std::sqrt(2.0)); };
    const auto psi = [&](double z) { return z * Phi(z) + phi(z); };
    const auto cdf = [&](double x) { return sigma / (2 * a) * (psi((x + a) / sigma) - psi((x - a) / sigma)); };
    const CombinedDistribution d(
        {component(sigma, DistributionShape::Normal), component(a / std::sqrt(3.0), DistributionShape::Rectangular)});
    for (double x : {-3.0, -1.0, 0.0, 0.5, 2.0, 3.5})
        EXPECT_NEAR(d.cdf(x), cdf(x), 1e-3) << x;
    double h = 0.0; // solve cdf(h) = 0.975 by bisection on the closed form
    for (double lo = 0.0, hi = 10.0; hi - lo > 1e-12;) {
        h = (lo + hi) / 2;
        (cdf(h) < 0.975 ? lo : hi) = h;
    }
    EXPECT_NEAR(d.symmetricHalfWidth(0.95), h, 2e-3 * h);
}

TEST(UncertaintyBudget, TypeADominatedIsCloseToTheWelchSatterthwaiteFactor)
{
    // A Type A with ν = 6 and a small normal Type B. The 97.5 % point of t₆ + N(0, 0.3²) by
    // quadrature (scipy.integrate.quad of t.pdf·norm.cdf, brentq) is 2.510945, k = 2.405049;
    // Welch–Satterthwaite's t95(ν_eff = 8.53) = 2.356004 approximates it within about 2 %.
    const std::vector<BudgetComponent> parts = {component(1.0, DistributionShape::Normal, 6.0),
                                                component(0.3, DistributionShape::Normal)};
    const UncertainValue v = combineBudget(0.0, parts);
    EXPECT_NEAR(*v.coverageFactor, 2.405049, 2e-3);
    EXPECT_NEAR(coverageFactorFor(*v.effectiveDof), 2.356004, 1e-5);
    EXPECT_EQ(v.budget.front().contribution, 1.0); // largest first
    EXPECT_EQ(expandedUncertaintyLabel(v).rfind("U (k = ", 0), 0u) << expandedUncertaintyLabel(v);
    EXPECT_NE(expandedUncertaintyLabel(v).find(", 95 %)"), std::string::npos) << expandedUncertaintyLabel(v);
}
