// Shared helpers for the instruments tests: a Qt event loop under GoogleTest, waiting on a
// condition while events run, an in-memory PointSink, and the demo setup and plan.
#pragma once

#include "EventLoopWait.h"
#include "Planner.h"
#include "PointSink.h"
#include "SetupJson.h"

#include <QCoreApplication>

#include <gtest/gtest.h>

#include <functional>
#include <vector>

namespace sagline::test {

// Runs the event loop until `done()` or `timeoutMs` of wall time; returns done().
inline bool waitUntil(const std::function<bool()> &done, int timeoutMs = 5000)
{
    return runEventsUntil(done, timeoutMs);
}

class MemorySink final : public PointSink {
public:
    std::vector<Reading> readings;
    std::vector<SafetyTrip> stops;
    std::vector<std::int64_t> stopReadingIds;
    std::vector<InstrumentIdentityRecord> instruments;
    std::vector<std::pair<std::int64_t, QString>> exclusions;
    QStringList events;
    int failNextCommits = 0; // the next N commitReading calls fail like a full disk

    CommitResult commitReading(const Reading &reading) override
    {
        if (failNextCommits > 0) {
            --failNextCommits;
            return {false, 0, QStringLiteral("disk full (simulated)")};
        }
        readings.push_back(reading);
        readings.back().id = static_cast<std::int64_t>(readings.size());
        return {true, readings.back().id, {}};
    }
    CommitResult recordSafetyStop(const SafetyTrip &trip, std::int64_t readingId, int, const QString &) override
    {
        stops.push_back(trip);
        stopReadingIds.push_back(readingId);
        return {true, static_cast<std::int64_t>(stops.size()), {}};
    }
    CommitResult recordInstrument(const InstrumentIdentityRecord &instrument) override
    {
        instruments.push_back(instrument);
        return {true, static_cast<std::int64_t>(instruments.size()), {}};
    }
    CommitResult excludeReading(std::int64_t readingId, const QString &reason) override
    {
        exclusions.emplace_back(readingId, reason);
        return {true, static_cast<std::int64_t>(exclusions.size()), {}};
    }
    CommitResult recordEvent(const QString &, const QString &text) override
    {
        events << text;
        return {true, static_cast<std::int64_t>(events.size()), {}};
    }
};

// The demo scenario of resources/demo-setup.json (our own invention): 60 VA, 230 V to 18 V.
inline Setup demoSetup()
{
    const SetupParse parse = loadSetupFile(SAGLINE_SOURCE_DIR "/resources/demo-setup.json");
    EXPECT_TRUE(parse.setup.has_value());
    return *parse.setup;
}

inline Plan planFor(const Setup &setup)
{
    const PlanResult result = makePlan(setup);
    EXPECT_TRUE(result.plan.has_value());
    return *result.plan;
}

} // namespace sagline::test
