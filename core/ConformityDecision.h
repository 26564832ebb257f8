// Pass or fail of a measured value against an upper tolerance limit (e.g. the nameplate's
// regulation) by a decision rule of ILAC-G8:09/2019 "Guidelines on Decision Rules and
// Statements of Conformity", section 4.2.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace sagline {

enum class DecisionRule {
    SimpleAcceptance,  // ILAC-G8 §4.2.1, binary, guard band w = 0: pass if value <= limit
    GuardedAcceptance, // ILAC-G8 §4.2.2/§4.2.3 with w = U (k = 2): pass if value <= limit - U,
                       // fail if value > limit + U, otherwise cannot decide
};

enum class ConformityOutcome { Pass, Fail, CannotDecide };

std::string toString(DecisionRule rule);          // "simple", "guarded"
std::optional<DecisionRule> decisionRuleFromString(std::string_view text);
std::string toString(ConformityOutcome outcome);   // "pass", "fail", "cannot-decide"

struct ConformityDecision {
    bool ok = false;
    std::string error;                 // the rule broken by the inputs when !ok
    ConformityOutcome outcome = ConformityOutcome::CannotDecide;
    DecisionRule rule = DecisionRule::SimpleAcceptance;
    double measured = 0.0;             // the result, in the limit's unit (e.g. %)
    double expandedUncertainty = 0.0;  // U of the result, same unit
    double upperLimit = 0.0;           // tolerance limit TL
    double guardBand = 0.0;            // w: 0 for simple acceptance, U for guarded
    double acceptanceLimit = 0.0;      // AL = TL - w
    std::string ruleName;              // e.g. "ILAC-G8:09/2019 guarded acceptance, w = U (k = 2)"
    std::string explanation;           // one sentence for reports
};

// measured and upperLimit finite; expandedUncertainty finite and >= 0.
ConformityDecision decideAgainstUpperLimit(double measured, double expandedUncertainty, double upperLimit,
                                           DecisionRule rule);
// As above, for a result whose uncertainty may be unknown (a fit of 2 points): without U,
// guarded acceptance cannot decide (it has no guard band to apply); simple acceptance decides
// on the value alone.
ConformityDecision decideAgainstUpperLimit(double measured, std::optional<double> expandedUncertainty,
                                           double upperLimit, DecisionRule rule);

} // namespace sagline
