#include "ConformityDecision.h"

#include "NumberFormat.h"
#include "UncertaintyFormat.h"

#include <cmath>

namespace sagline {

std::string toString(DecisionRule rule)
{
    return rule == DecisionRule::SimpleAcceptance ? "simple" : "guarded";
}

std::optional<DecisionRule> decisionRuleFromString(std::string_view text)
{
    if (text == "simple")
        return DecisionRule::SimpleAcceptance;
    if (text == "guarded")
        return DecisionRule::GuardedAcceptance;
    return std::nullopt;
}

std::string toString(ConformityOutcome outcome)
{
    switch (outcome) {
    case ConformityOutcome::Pass: return "pass";
    case ConformityOutcome::Fail: return "fail";
    case ConformityOutcome::CannotDecide: return "cannot-decide";
    }
    return "cannot-decide";
}

ConformityDecision decideAgainstUpperLimit(double measured, double expandedUncertainty, double upperLimit,
                                           DecisionRule rule)
{
    ConformityDecision d;
    d.rule = rule;
    d.measured = measured;
    d.expandedUncertainty = expandedUncertainty;
    d.upperLimit = upperLimit;
    if (!std::isfinite(measured) || !std::isfinite(upperLimit) || !std::isfinite(expandedUncertainty)
        || expandedUncertainty < 0.0) {
        d.error = "the result, its expanded uncertainty (>= 0) and the limit must be finite numbers";
        return d;
    }
    d.ok = true;
    const std::string value = formatSignificant(measured, 4);
    const std::string limit = formatSignificant(upperLimit, 4);
    if (rule == DecisionRule::SimpleAcceptance) {
        // ILAC-G8:09/2019 §4.2.1: acceptance limit = tolerance limit; up to 50 % risk of a
        // false accept at the limit (shared risk).
        d.guardBand = 0.0;
        d.acceptanceLimit = upperLimit;
        d.ruleName = "ILAC-G8:09/2019 simple acceptance (guard band w = 0)";
        d.outcome = measured <= upperLimit ? ConformityOutcome::Pass : ConformityOutcome::Fail;
        d.explanation = value + (d.outcome == ConformityOutcome::Pass ? " is within " : " exceeds ")
                        + "the limit " + limit + "; simple acceptance ignores the uncertainty (shared risk).";
        return d;
    }
    // ILAC-G8:09/2019 §4.2.2 (binary with guard band) and §4.2.3 (non-binary): w = U gives at
    // most about 2.5 % false-accept risk for a normal distribution. Between TL - U and TL + U the
    // uncertainty interval straddles the limit: neither pass nor fail can be stated.
    d.guardBand = expandedUncertainty;
    d.acceptanceLimit = upperLimit - expandedUncertainty;
    d.ruleName = "ILAC-G8:09/2019 guarded acceptance (guard band w = U, k = 2)";
    const std::string withU = formatWithUncertainty(measured, expandedUncertainty, "");
    if (measured <= d.acceptanceLimit) {
        d.outcome = ConformityOutcome::Pass;
        d.explanation = withU + " lies wholly within the limit " + limit + ".";
    } else if (measured - expandedUncertainty > upperLimit) {
        d.outcome = ConformityOutcome::Fail;
        d.explanation = withU + " lies wholly beyond the limit " + limit + ".";
    } else {
        d.outcome = ConformityOutcome::CannotDecide;
        d.explanation = withU + " straddles the limit " + limit
                        + (measured <= upperLimit ? " (conditional pass: within the limit by less than U)."
                                                  : " (conditional fail: beyond the limit by less than U).");
    }
    return d;
}

ConformityDecision decideAgainstUpperLimit(double measured, std::optional<double> expandedUncertainty,
                                           double upperLimit, DecisionRule rule)
{
    if (expandedUncertainty || rule == DecisionRule::SimpleAcceptance)
        return decideAgainstUpperLimit(measured, expandedUncertainty.value_or(0.0), upperLimit, rule);
    ConformityDecision d = decideAgainstUpperLimit(measured, 0.0, upperLimit, rule);
    if (!d.ok)
        return d;
    d.outcome = ConformityOutcome::CannotDecide;
    d.explanation = formatSignificant(measured, 4) + " has no uncertainty (too few points), so the guard band "
                    "cannot be applied; record more points.";
    return d;
}

} // namespace sagline
