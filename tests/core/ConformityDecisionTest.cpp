// Decision rules of ILAC-G8:09/2019 §4.2 by their names, and the conformance probability of
// JCGM 106:2012 §7, on the check values of FACTS.md §7 and closed forms.
#include "ConformityAssessment.h"
#include "ConformityDecision.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

using namespace sagline;

namespace {

// A result with a normal distribution of standard uncertainty u (ν = ∞, k = 1.96).
UncertainValue normalResult(double value, double u)
{
    BudgetComponent c;
    c.source = "test";
    c.distribution = "normal";
    c.standardUncertainty = u;
    c.sensitivity = 1.0;
    c.contribution = u;
    return combineBudget(value, {c});
}

// A result with a given U (the FACTS check value states U, not u).
UncertainValue withExpanded(double value, double expanded)
{
    return normalResult(value, expanded / 1.959963984540054);
}

const ToleranceRange upperLimit8{std::nullopt, 8.0};

} // namespace

TEST(ConformityDecision, IlacG8CheckValueUnderEachRule)
{
    // FACTS.md §7 (computed from ILAC-G8:09/2019 §4.2): TL = 8.0 %, U = 0.6 %, result 7.7 %:
    // simple acceptance (§4.2.1) passes; the binary guarded rule (§4.2.2, AL = TL - U = 7.4 %)
    // fails; the non-binary rule (§4.2.3) gives a conditional pass.
    const UncertainValue r = withExpanded(7.7, 0.6);
    const ConformityDecision simple = decideConformity("regulation", "%", r, upperLimit8, DecisionRule::Simple);
    ASSERT_TRUE(simple.ok) << simple.error;
    EXPECT_EQ(simple.outcome, ConformityOutcome::Pass);
    EXPECT_NE(simple.ruleName.find("§4.2.1"), std::string::npos);
    const ConformityDecision guarded = decideConformity("regulation", "%", r, upperLimit8, DecisionRule::Guarded);
    EXPECT_EQ(guarded.outcome, ConformityOutcome::Fail);
    EXPECT_NEAR(*guarded.acceptance.max, 7.4, 1e-9);
    EXPECT_NE(guarded.ruleName.find("§4.2.2"), std::string::npos);
    const ConformityDecision nonBinary = decideConformity("regulation", "%", r, upperLimit8, DecisionRule::NonBinary);
    EXPECT_EQ(nonBinary.outcome, ConformityOutcome::ConditionalPass);
    EXPECT_NE(nonBinary.ruleName.find("§4.2.3"), std::string::npos);

    // The other zones of the non-binary rule: pass below TL - U, conditional fail up to TL + U.
    EXPECT_EQ(decideConformity("r", "%", withExpanded(7.3, 0.6), upperLimit8, DecisionRule::NonBinary).outcome,
              ConformityOutcome::Pass);
    EXPECT_EQ(decideConformity("r", "%", withExpanded(8.5, 0.6), upperLimit8, DecisionRule::NonBinary).outcome,
              ConformityOutcome::ConditionalFail);
    EXPECT_EQ(decideConformity("r", "%", withExpanded(8.7, 0.6), upperLimit8, DecisionRule::NonBinary).outcome,
              ConformityOutcome::Fail);
    EXPECT_EQ(decideConformity("r", "%", withExpanded(7.3, 0.6), upperLimit8, DecisionRule::Guarded).outcome,
              ConformityOutcome::Pass);
    EXPECT_EQ(decideConformity("r", "%", withExpanded(8.1, 0.6), upperLimit8, DecisionRule::Simple).outcome,
              ConformityOutcome::Fail);
}

TEST(ConformityDecision, TwoSidedLimitsAndNoUncertainty)
{
    const ToleranceRange band{17.5, 18.5};
    EXPECT_EQ(decideConformity("V", "V", withExpanded(18.0, 0.1), band, DecisionRule::NonBinary).outcome,
              ConformityOutcome::Pass);
    EXPECT_EQ(decideConformity("V", "V", withExpanded(17.55, 0.1), band, DecisionRule::NonBinary).outcome,
              ConformityOutcome::ConditionalPass);
    EXPECT_EQ(decideConformity("V", "V", withExpanded(17.45, 0.1), band, DecisionRule::NonBinary).outcome,
              ConformityOutcome::ConditionalFail);
    const ConformityDecision low = decideConformity("V", "V", withExpanded(17.55, 0.1), band, DecisionRule::Guarded);
    EXPECT_EQ(low.outcome, ConformityOutcome::Fail);
    EXPECT_NEAR(*low.acceptance.min, 17.6, 1e-9);
    EXPECT_NEAR(*low.acceptance.max, 18.4, 1e-9);
    // A two-point fit has no U: the guard band cannot be applied, simple acceptance decides on
    // the value (ILAC-G8 §4.2.1).
    UncertainValue bare;
    bare.value = 5.0;
    EXPECT_EQ(decideConformity("r", "%", bare, upperLimit8, DecisionRule::NonBinary).outcome, ConformityOutcome::NotJudged);
    EXPECT_EQ(decideConformity("r", "%", bare, upperLimit8, DecisionRule::Guarded).outcome, ConformityOutcome::NotJudged);
    EXPECT_EQ(decideConformity("r", "%", bare, upperLimit8, DecisionRule::Simple).outcome, ConformityOutcome::Pass);
    EXPECT_FALSE(decideConformity("r", "%", bare, upperLimit8, DecisionRule::Simple).conformanceProbability);
    EXPECT_FALSE(decideConformity("r", "%", withExpanded(NAN, 0.1), upperLimit8, DecisionRule::Simple).ok);
    EXPECT_FALSE(decideConformity("r", "%", withExpanded(1.0, 0.1), ToleranceRange{}, DecisionRule::Simple).ok);
}

TEST(ConformityDecision, ConformanceProbabilityOfNormalAndT)
{
    // JCGM 106:2012 §7: p_c = Φ((TL - y)/u) for a normal PDF; at the limit 0.5; one u below it
    // Φ(1) = 0.841345; at TL - 1.645 u it is 0.95 (scipy.stats.norm.cdf).
    EXPECT_NEAR(conformanceProbability(8.0, 0.2, std::numeric_limits<double>::infinity(), upperLimit8), 0.5, 1e-12);
    EXPECT_NEAR(conformanceProbability(7.8, 0.2, std::numeric_limits<double>::infinity(), upperLimit8), 0.841345, 1e-6);
    EXPECT_NEAR(*decideConformity("r", "%", normalResult(7.8, 0.2), upperLimit8, DecisionRule::Simple)
                     .conformanceProbability,
                0.841345, 1e-3);
    // A t PDF with ν = 5 (JCGM 106 uses the scaled and shifted t for a Type A result): one u
    // below the limit, P(T5 <= 1) = 0.818391 (scipy.stats.t.cdf(1, 5)).
    EXPECT_NEAR(conformanceProbability(7.8, 0.2, 5.0, upperLimit8), 0.818391, 1e-6);
    // Two-sided: Φ(1) - Φ(-3) = 0.839995 (scipy).
    EXPECT_NEAR(conformanceProbability(17.7, 0.2, std::numeric_limits<double>::infinity(), ToleranceRange{17.1, 17.9}),
                0.841345 - 0.001350, 1e-5);
    EXPECT_EQ(conformanceProbabilityText(0.9999), "> 99.9 %");
    EXPECT_EQ(conformanceProbabilityText(0.891), "89.1 %");
}

TEST(ConformityDecision, RuleNamesAndOutcomes)
{
    EXPECT_EQ(decisionRuleFromString("non-binary"), DecisionRule::NonBinary);
    EXPECT_EQ(decisionRuleFromString("guarded"), DecisionRule::Guarded);
    EXPECT_EQ(decisionRuleFromString("simple"), DecisionRule::Simple);
    EXPECT_FALSE(decisionRuleFromString("lenient"));
    EXPECT_EQ(toString(ConformityOutcome::ConditionalFail), "conditional-fail");
    EXPECT_EQ(toString(ConformityOutcome::NotJudged), "not-judged");
    EXPECT_EQ(worseOutcome(ConformityOutcome::ConditionalPass, ConformityOutcome::Pass), ConformityOutcome::ConditionalPass);
    EXPECT_EQ(worseOutcome(ConformityOutcome::ConditionalFail, ConformityOutcome::Fail), ConformityOutcome::Fail);
    EXPECT_EQ(worseOutcome(ConformityOutcome::NotJudged, ConformityOutcome::Pass), ConformityOutcome::Pass);
    EXPECT_EQ(regulationLimitFromText("nameplate")->kind, RegulationLimitChoice::Kind::Nameplate);
    EXPECT_DOUBLE_EQ(regulationLimitFromText("7.5 %")->percent, 7.5);
    EXPECT_DOUBLE_EQ(regulationLimitFromText("12")->percent, 12.0);
    EXPECT_FALSE(regulationLimitFromText("0"));
    EXPECT_FALSE(regulationLimitFromText("plate"));
}
