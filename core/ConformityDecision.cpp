#include "ConformityDecision.h"

#include "CombinedDistribution.h"
#include "Distributions.h"
#include "NumberFormat.h"
#include "UncertaintyFormat.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace sagline {

namespace {

constexpr double infinity = std::numeric_limits<double>::infinity();

double lowerOf(const ToleranceRange &r)
{
    return r.min.value_or(-infinity);
}

double upperOf(const ToleranceRange &r)
{
    return r.max.value_or(infinity);
}

bool inside(double value, double low, double high)
{
    return value >= low && value <= high;
}

// P(Y <= x) for Y = value + u·T_ν.
double distribution(double x, double value, double u, double dof)
{
    if (x == infinity)
        return 1.0;
    if (x == -infinity)
        return 0.0;
    if (!(u > 0.0))
        return x >= value ? 1.0 : 0.0;
    const double z = (x - value) / u;
    if (!std::isfinite(dof) || dof > 1e7)
        return 0.5 * std::erfc(-z / std::sqrt(2.0));
    return studentTCdf(z, dof);
}

// "the upper limit 12.00 %" or "the limits 17.50 V to 18.50 V" or "the upper limit 600.0 mΩ": the
// same SI prefix style as the measured value beside it ("423.6 mΩ ± 5.4 mΩ").
std::string limitText(const ToleranceRange &limits, const std::string &unit)
{
    const auto q = [&](double v) { return formatQuantity(v, unit, 4); };
    if (limits.min && limits.max)
        return "the limits " + q(*limits.min) + " to " + q(*limits.max);
    if (limits.max)
        return "the upper limit " + q(*limits.max);
    return "the lower limit " + q(*limits.min);
}

int severity(ConformityOutcome outcome)
{
    switch (outcome) {
    case ConformityOutcome::NotJudged: return 0;
    case ConformityOutcome::Pass: return 1;
    case ConformityOutcome::ConditionalPass: return 2;
    case ConformityOutcome::ConditionalFail: return 3;
    case ConformityOutcome::Fail: return 4;
    }
    return 0;
}

} // namespace

std::string toString(DecisionRule rule)
{
    switch (rule) {
    case DecisionRule::Simple: return "simple";
    case DecisionRule::Guarded: return "guarded";
    case DecisionRule::NonBinary: return "non-binary";
    }
    return "non-binary";
}

std::optional<DecisionRule> decisionRuleFromString(std::string_view text)
{
    for (DecisionRule rule : {DecisionRule::Simple, DecisionRule::Guarded, DecisionRule::NonBinary})
        if (text == toString(rule))
            return rule;
    return std::nullopt;
}

std::string describe(DecisionRule rule)
{
    switch (rule) {
    case DecisionRule::Simple:
        return "ILAC-G8:09/2019 §4.2.1 simple acceptance, binary, guard band w = 0 (shared risk)";
    case DecisionRule::Guarded:
        return "ILAC-G8:09/2019 §4.2.2 binary statement with guard band w = U (pass within the limit less U, "
               "else fail)";
    case DecisionRule::NonBinary:
        return "ILAC-G8:09/2019 §4.2.3 non-binary statement with guard band w = U (pass, conditional pass, "
               "conditional fail, fail)";
    }
    return "";
}

std::string toString(ConformityOutcome outcome)
{
    switch (outcome) {
    case ConformityOutcome::Pass: return "pass";
    case ConformityOutcome::Fail: return "fail";
    case ConformityOutcome::ConditionalPass: return "conditional-pass";
    case ConformityOutcome::ConditionalFail: return "conditional-fail";
    case ConformityOutcome::NotJudged: return "not-judged";
    }
    return "not-judged";
}

std::string outcomeWords(ConformityOutcome outcome)
{
    switch (outcome) {
    case ConformityOutcome::Pass: return "PASS";
    case ConformityOutcome::Fail: return "FAIL";
    case ConformityOutcome::ConditionalPass: return "CONDITIONAL PASS";
    case ConformityOutcome::ConditionalFail: return "CONDITIONAL FAIL";
    case ConformityOutcome::NotJudged: return "NOT JUDGED";
    }
    return "NOT JUDGED";
}

ConformityOutcome worseOutcome(ConformityOutcome a, ConformityOutcome b)
{
    return severity(a) >= severity(b) ? a : b;
}

double conformanceProbability(double value, double standardUncertainty, double effectiveDof,
                              const ToleranceRange &limits)
{
    const double p = distribution(upperOf(limits), value, standardUncertainty, effectiveDof)
                     - distribution(lowerOf(limits), value, standardUncertainty, effectiveDof);
    return std::clamp(p, 0.0, 1.0);
}

double conformanceProbability(const UncertainValue &result, const ToleranceRange &limits)
{
    if (result.budget.empty() || !result.standardUncertainty || !(*result.standardUncertainty > 0.0))
        return conformanceProbability(result.value, result.standardUncertainty.value_or(0.0),
                                      result.effectiveDof.value_or(infinity), limits);
    const CombinedDistribution distribution(result.budget);
    const auto at = [&](double limit, double otherwise) {
        return std::isfinite(limit) ? distribution.cdf(limit - result.value) : otherwise;
    };
    return std::clamp(at(upperOf(limits), 1.0) - at(lowerOf(limits), 0.0), 0.0, 1.0);
}

std::string conformanceProbabilityText(double probability)
{
    if (probability >= 0.9995)
        return "> 99.9 %";
    if (probability <= 0.0005)
        return "< 0.1 %";
    return formatSignificant(probability * 100.0, 3) + " %";
}

ConformityDecision decideConformity(const std::string &quantity, const std::string &unit, const UncertainValue &result,
                                    const ToleranceRange &limits, DecisionRule rule)
{
    ConformityDecision d;
    d.quantity = quantity;
    d.unit = unit;
    d.rule = rule;
    d.ruleName = describe(rule);
    d.measured = result.value;
    d.limits = limits;
    d.expandedUncertainty = result.expandedUncertainty;
    const bool badLimit = (limits.min && !std::isfinite(*limits.min)) || (limits.max && !std::isfinite(*limits.max))
                          || (!limits.min && !limits.max) || (limits.min && limits.max && *limits.min > *limits.max);
    if (!std::isfinite(result.value) || badLimit
        || (result.expandedUncertainty && !(std::isfinite(*result.expandedUncertainty) && *result.expandedUncertainty >= 0.0))) {
        d.error = quantity + ": the result, its expanded uncertainty (>= 0) and at least one finite limit are needed";
        return d;
    }
    d.ok = true;
    const double low = lowerOf(limits), high = upperOf(limits);
    const std::string value = formatQuantity(result.value, unit, 4);
    const std::string against = limitText(limits, unit);
    if (result.standardUncertainty)
        d.conformanceProbability = conformanceProbability(result, limits);
    const bool withinTolerance = inside(result.value, low, high);

    if (rule == DecisionRule::Simple) {
        d.acceptance = limits;
        d.outcome = withinTolerance ? ConformityOutcome::Pass : ConformityOutcome::Fail;
        d.explanation = quantity + " " + value + (withinTolerance ? " is within " : " is outside ") + against
                        + "; simple acceptance does not use the uncertainty (up to 50 % risk of a wrong decision "
                          "at the limit).";
        return d;
    }
    if (!result.expandedUncertainty) {
        d.outcome = ConformityOutcome::NotJudged;
        d.explanation = quantity + " " + value + " has no uncertainty (too few points), so the guard band of "
                        + toString(rule) + " acceptance cannot be applied; record more points.";
        return d;
    }
    const double w = *result.expandedUncertainty;
    d.guardBand = w;
    if (limits.min)
        d.acceptance.min = *limits.min + w;
    if (limits.max)
        d.acceptance.max = *limits.max - w;
    const bool accepted = inside(result.value, lowerOf(d.acceptance), upperOf(d.acceptance));
    const std::string withU = formatWithUncertainty(result.value, w, unit);
    if (rule == DecisionRule::Guarded) {
        d.outcome = accepted ? ConformityOutcome::Pass : ConformityOutcome::Fail;
        d.explanation = quantity + " " + withU + (accepted ? " lies within " : " does not lie within ") + against
                        + " less U (the acceptance limits)";
        d.explanation += accepted || !withinTolerance ? "." : ", though within the limits themselves.";
        return d;
    }
    if (accepted) {
        d.outcome = ConformityOutcome::Pass;
        d.explanation = quantity + " " + withU + " lies wholly within " + against + ".";
    } else if (withinTolerance) {
        d.outcome = ConformityOutcome::ConditionalPass;
        d.explanation = quantity + " " + withU + " is within " + against + " by less than U (conditional pass).";
    } else if (inside(result.value, low - w, high + w)) {
        d.outcome = ConformityOutcome::ConditionalFail;
        d.explanation = quantity + " " + withU + " is beyond " + against + " by less than U (conditional fail).";
    } else {
        d.outcome = ConformityOutcome::Fail;
        d.explanation = quantity + " " + withU + " lies wholly beyond " + against + ".";
    }
    return d;
}

} // namespace sagline
