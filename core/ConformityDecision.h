// A statement of conformity of one measured result against its tolerance limits, by a decision
// rule of ILAC-G8:09/2019 "Guidelines on Decision Rules and Statements of Conformity" §4.2,
// with the conformance probability of JCGM 106:2012 §7 (the probability that the true value
// lies within the limits, from the result's distribution centred on its value: the combined
// distribution of its budget's components, which is a normal or a scaled and shifted t when
// those are all normal or one Type A dominates). IEC Guide
// 115:2021 is the electrotechnical sector's reading of the same ideas (from memory); Sagline
// follows ILAC-G8 and JCGM 106 directly.
#pragma once

#include "Setup.h"
#include "UncertaintyBudget.h"

#include <optional>
#include <string>
#include <string_view>

namespace sagline {

enum class DecisionRule {
    Simple,    // ILAC-G8 §4.2.1, binary, w = 0: pass inside the tolerance limits, else fail
    Guarded,   // ILAC-G8 §4.2.2, binary with guard band w = U: pass inside TL - U, else fail
    NonBinary, // ILAC-G8 §4.2.3, w = U: pass, conditional pass, conditional fail, fail
};

enum class ConformityOutcome { Pass, Fail, ConditionalPass, ConditionalFail, NotJudged };

std::string toString(DecisionRule rule);                 // "simple", "guarded", "non-binary"
std::optional<DecisionRule> decisionRuleFromString(std::string_view text);
std::string describe(DecisionRule rule);                 // "ILAC-G8:09/2019 §4.2.2 binary ..."
inline constexpr const char *noAnalysisWords = "NO ANALYSIS"; // a session without a fit or setup to judge
std::string toString(ConformityOutcome outcome);         // "pass", "conditional-pass", ..., "not-judged"
// The one spelling people read, in the window, the review, the CLI tables and the reports; the
// tokens of toString are for files read by programs (CSV, JSON).
std::string outcomeWords(ConformityOutcome outcome);     // "PASS", "CONDITIONAL PASS", ..., "NOT JUDGED"
// The worse of two outcomes: fail > conditional-fail > conditional-pass > pass > not-judged.
ConformityOutcome worseOutcome(ConformityOutcome a, ConformityOutcome b);

struct ConformityDecision {
    bool ok = false;
    std::string error;                          // the rule broken by the inputs when !ok
    std::string quantity;                       // "regulation", "no-load voltage", ...
    std::string unit;                           // the limits' unit, e.g. "%", "V", "Ω"
    ConformityOutcome outcome = ConformityOutcome::NotJudged;
    DecisionRule rule = DecisionRule::NonBinary;
    double measured = 0.0;
    std::optional<double> expandedUncertainty;  // U of the result (95 %)
    ToleranceRange limits;                      // the tolerance limits TL
    double guardBand = 0.0;                     // w: 0 for simple, U otherwise
    ToleranceRange acceptance;                  // the acceptance limits AL = TL ∓ w
    std::optional<double> conformanceProbability; // P(TL_min <= Y <= TL_max), 0..1 (JCGM 106:2012 §7)
    std::string ruleName;                       // describe(rule)
    std::string explanation;                    // one sentence for reports
};

// P(min <= Y <= max) for Y = value + u·T_ν (T_ν Student t; normal when ν is infinite); u = 0
// gives 1 inside the limits and 0 outside.
double conformanceProbability(double value, double standardUncertainty, double effectiveDof,
                              const ToleranceRange &limits);
// The same with the result's own combined distribution (its budget's components,
// CombinedDistribution.h): the distribution its coverage interval comes from.
double conformanceProbability(const UncertainValue &result, const ToleranceRange &limits);
// "89.2 %", "> 99.9 %", "< 0.1 %".
std::string conformanceProbabilityText(double probability);

// Judges `result` (value, u, ν_eff and U from its budget) against limits (at least one end).
// Without an uncertainty (a two-point fit) the guarded and non-binary rules cannot apply their
// guard band: not-judged, said so; the simple rule decides on the value alone.
ConformityDecision decideConformity(const std::string &quantity, const std::string &unit, const UncertainValue &result,
                                    const ToleranceRange &limits, DecisionRule rule);

} // namespace sagline
