// The one rule for a verdict of a session that is not complete (core/WithheldVerdict).
#include "WithheldVerdict.h"

#include <gtest/gtest.h>

namespace sagline {
namespace {

nlohmann::json judged()
{
    return {{"outcome", "pass"},
            {"explanation", "Judged on 2 limits."},
            {"limits", {{{"outcome", "pass"}}, {{"outcome", "conditional-pass"}}}}};
}

TEST(WithheldVerdict, ACompleteSessionsVerdictIsLeftAsItIs)
{
    nlohmann::json verdict = judged();
    withholdVerdict(verdict, SessionProgress{});
    EXPECT_EQ(verdict, judged());
    EXPECT_EQ(withheldVerdictHeadline(SessionProgress{}), "");
}

TEST(WithheldVerdict, AStoppedSessionReadsIncompleteEverywhereWithThePartialOutcomesBeside)
{
    SessionProgress stopped;
    stopped.state = Completeness::Stopped;
    stopped.plannedSteps = 9;
    stopped.recordedSteps = 3;
    stopped.endReason = "safety stop at step 3 (output-va)";
    nlohmann::json verdict = judged();
    withholdVerdict(verdict, stopped);
    EXPECT_EQ(verdict["outcome"], "incomplete");
    EXPECT_EQ(verdict["outcome_on_partial_data"], "pass");
    EXPECT_EQ(verdict["limits"][1]["outcome"], "incomplete");
    EXPECT_EQ(verdict["limits"][1]["outcome_on_partial_data"], "conditional-pass");
    EXPECT_EQ(verdict["explanation"], "Incomplete (3 of 9 steps; safety stop at step 3 (output-va)): no verdict. "
                                      "On the partial data: judged on 2 limits.");
}

TEST(WithheldVerdict, ARunningSweepIsProvisionalNotYetJudged)
{
    SessionProgress running;
    running.state = Completeness::InProgress;
    running.plannedSteps = 5;
    running.recordedSteps = 2;
    nlohmann::ordered_json verdict = judged();
    withholdVerdict(verdict, running);
    EXPECT_EQ(verdict["outcome"], "provisional");
    EXPECT_EQ(withheldVerdictHeadline(running), "Provisional (2 of 5 steps): no verdict yet");
    EXPECT_EQ(progressJson<nlohmann::ordered_json>(running).begin().key(), "state"); // as written, not sorted
}

} // namespace
} // namespace sagline
