// Completeness of a session: k of N planned steps, and how the sweep ended.
#include "SessionProgress.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

std::vector<Reading> readingsAt(std::initializer_list<int> steps)
{
    std::vector<Reading> readings;
    for (int step : steps) {
        Reading reading;
        reading.step = step;
        readings.push_back(reading);
    }
    return readings;
}

SweepEventRecord event(SweepEventKind kind, const std::string &time, int step)
{
    SweepEventRecord record;
    record.kind = kind;
    record.timeUtc = time;
    record.step = step;
    return record;
}

const std::vector<int> nineSteps{0, 1, 2, 3, 4, 5, 6, 7, 8};

} // namespace

TEST(SessionProgress, RunningSweepIsProvisionalWithItsCount)
{
    const auto progress = sessionProgress(nineSteps, readingsAt({0, 1, 2, 3}), {}, {}, true);
    EXPECT_EQ(progress.state, Completeness::InProgress);
    EXPECT_EQ(progress.recordedSteps, 4);
    EXPECT_EQ(progress.plannedSteps, 9);
    EXPECT_EQ(progress.label(), "provisional (4 of 9 steps)");
    EXPECT_EQ(progress.verdictText("pass"), "provisional (4 of 9 steps)");
    EXPECT_EQ(progress.nextStep, 4);
}

TEST(SessionProgress, FinishedSweepIsCompleteAndKeepsItsOutcome)
{
    const auto progress = sessionProgress(nineSteps, readingsAt({0, 1, 2, 3, 4, 5, 6, 7, 8}), {},
                                          {event(SweepEventKind::Started, "2026-01-01T10:00:00.000Z", 0),
                                           event(SweepEventKind::Finished, "2026-01-01T10:09:00.000Z", 8)},
                                          false);
    EXPECT_TRUE(progress.isComplete());
    EXPECT_EQ(progress.verdictText("pass"), "pass");
    EXPECT_FALSE(progress.nextStep);
}

TEST(SessionProgress, SafetyStopIsIncompleteNamingTheStop)
{
    SafetyStopRecord stop;
    stop.timeUtc = "2026-01-01T10:05:00.000Z";
    stop.step = 5;
    stop.rule = "output-va";
    const auto progress = sessionProgress(nineSteps, readingsAt({0, 1, 2, 3, 4, 5}), {stop},
                                          {event(SweepEventKind::Started, "2026-01-01T10:00:00.000Z", 0)}, false);
    EXPECT_EQ(progress.state, Completeness::Stopped);
    EXPECT_EQ(progress.verdictText("pass"), "incomplete (6 of 9 steps; safety stop at step 5 (output-va))");
}

TEST(SessionProgress, EndWithoutFinishOrStopIsInterrupted)
{
    const auto progress = sessionProgress(nineSteps, readingsAt({0, 1, 2}), {},
                                          {event(SweepEventKind::Started, "2026-01-01T10:00:00.000Z", 0)}, false);
    EXPECT_EQ(progress.state, Completeness::Interrupted);
    EXPECT_NE(progress.label().find("incomplete (3 of 9 steps; interrupted"), std::string::npos) << progress.label();
    EXPECT_EQ(progress.nextStep, 3);
}

TEST(SessionProgress, ResumeAfterAStopThenFinishIsComplete)
{
    SafetyStopRecord stop;
    stop.timeUtc = "2026-01-01T10:05:00.000Z";
    stop.step = 5;
    stop.rule = "rheostat-current";
    const auto progress = sessionProgress(nineSteps, readingsAt({0, 1, 2, 3, 4, 5, 6, 7, 8}), {stop},
                                          {event(SweepEventKind::Resumed, "2026-01-01T11:00:00.000Z", 5),
                                           event(SweepEventKind::Finished, "2026-01-01T11:05:00.000Z", 8)},
                                          false);
    EXPECT_TRUE(progress.isComplete());
}

TEST(SessionProgress, SupersededAndOverloadReadingsDoNotCountTheirStep)
{
    auto readings = readingsAt({0, 1, 2});
    readings[1].superseded = true;
    readings[2].flags = flagOverload;
    const auto progress = sessionProgress({0, 1, 2}, readings, {}, {}, false);
    EXPECT_EQ(progress.recordedSteps, 1);
    EXPECT_EQ(progress.nextStep, 1);
    EXPECT_EQ(progress.state, Completeness::Interrupted);
}

TEST(SessionProgress, ImportWithoutStepsIsJudgedAsAWhole)
{
    const auto progress = sessionProgress(nineSteps, readingsAt({-1, -1, -1}), {}, {}, false);
    EXPECT_FALSE(progress.tracksSteps);
    EXPECT_TRUE(progress.isComplete());
}

TEST(SessionProgress, OlderFileWithEveryStepIsComplete)
{
    EXPECT_TRUE(sessionProgress({0, 1, 2}, readingsAt({0, 1, 2}), {}, {}, false).isComplete());
}

TEST(SessionProgress, StopAfterEveryPlannedStepLeavesTheSweepComplete)
{
    SafetyStopRecord stop;
    stop.timeUtc = "2026-01-01T10:09:00.000Z";
    stop.step = 9; // an extra step beyond the plan
    stop.rule = "output-va";
    EXPECT_TRUE(sessionProgress({0, 1, 2}, readingsAt({0, 1, 2}), {stop}, {}, false).isComplete());
}
