#include "UncertaintyBudget.h"

#include "CombinedDistribution.h"
#include "Distributions.h"
#include "NumberFormat.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

namespace sagline {

std::string toString(EvaluationType type)
{
    return type == EvaluationType::A ? "A" : "B";
}

double effectiveDegreesOfFreedom(double combinedU, const std::vector<BudgetComponent> &components)
{
    double denominator = 0.0;
    for (const BudgetComponent &c : components)
        if (c.degreesOfFreedom && *c.degreesOfFreedom > 0.0)
            denominator += std::pow(c.contribution, 4) / *c.degreesOfFreedom;
    if (!(denominator > 0.0))
        return std::numeric_limits<double>::infinity();
    return std::pow(combinedU, 4) / denominator;
}

double coverageFactorFor(double dof, double probability)
{
    const double tail = (1.0 + probability) / 2.0;
    if (!std::isfinite(dof) || dof > 1e7)
        return normalQuantile(tail);
    return studentTQuantile(tail, std::max(dof, 1.0));
}

UncertainValue combineBudget(double value, std::vector<BudgetComponent> components)
{
    UncertainValue result;
    result.value = value;
    double sum = 0.0;
    for (const BudgetComponent &c : components)
        sum += c.contribution * c.contribution;
    const double u = std::sqrt(sum);
    const double dof = effectiveDegreesOfFreedom(u, components);
    // The interval of the components' own distributions; t95(ν_eff) when u is 0 (no spread).
    const double k = u > 0.0 ? CombinedDistribution(components).symmetricHalfWidth(coverageProbability) / u
                             : coverageFactorFor(dof);
    std::stable_sort(components.begin(), components.end(),
                     [](const BudgetComponent &a, const BudgetComponent &b) { return a.contribution > b.contribution; });
    result.standardUncertainty = u;
    result.effectiveDof = dof;
    result.coverageFactor = k;
    result.expandedUncertainty = k * u;
    result.budget = std::move(components);
    return result;
}

std::string coverageFactorText(double k)
{
    return "k = " + formatSignificant(k, 3);
}

std::string degreesOfFreedomText(std::optional<double> dof)
{
    if (!dof)
        return "n/a";
    if (!std::isfinite(*dof))
        return "∞";
    if (*dof >= 1e4)
        return "> 10⁴";
    char text[32];
    std::snprintf(text, sizeof text, *dof >= 100.0 || *dof == std::floor(*dof) ? "%.0f" : "%.1f", *dof);
    return text;
}

std::string expandedUncertaintyLabel(const UncertainValue &value)
{
    if (!value.coverageFactor)
        return "U";
    return "U (" + coverageFactorText(*value.coverageFactor) + ", "
           + formatSignificant(coverageProbability * 100.0, 2) + " %)";
}

} // namespace sagline
