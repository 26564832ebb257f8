#include "SessionProgress.h"

#include <algorithm>
#include <set>

namespace sagline {

const char *toString(Completeness state)
{
    switch (state) {
    case Completeness::Complete: return "complete";
    case Completeness::InProgress: return "in progress";
    case Completeness::Stopped: return "stopped";
    case Completeness::Interrupted: return "interrupted";
    }
    return "complete";
}

std::string SessionProgress::label() const
{
    const std::string count = std::to_string(recordedSteps) + " of " + std::to_string(plannedSteps) + " steps";
    switch (state) {
    case Completeness::Complete: return {};
    case Completeness::InProgress: return "provisional (" + count + ")";
    case Completeness::Stopped: return "incomplete (" + count + "; " + endReason + ")";
    case Completeness::Interrupted:
        return "incomplete (" + count + "; interrupted: the sweep was neither finished nor stopped)";
    }
    return {};
}

std::string SessionProgress::verdictText(const std::string &outcome) const
{
    return isComplete() ? outcome : label();
}

SessionProgress sessionProgress(const std::vector<int> &plannedSteps, const std::vector<Reading> &readings,
                                const std::vector<SafetyStopRecord> &safetyStops,
                                const std::vector<SweepEventRecord> &events, bool sweepRunning)
{
    SessionProgress progress;
    progress.plannedSteps = static_cast<int>(plannedSteps.size());
    std::set<int> recorded;
    std::set<int> stopSteps;
    for (const SafetyStopRecord &stop : safetyStops)
        stopSteps.insert(stop.step);
    bool anyStep = false;
    for (const Reading &reading : readings) {
        if (reading.step >= 0)
            anyStep = true;
        // A meter overload or a not-a-number is no reading of the step, and neither is the
        // excluded reading that tripped a safety stop there.
        const bool hasValue = (reading.flags & (flagOverload | flagNotANumber)) == 0;
        const bool tripped = reading.excluded && stopSteps.count(reading.step);
        if (!reading.superseded && reading.step >= 0 && hasValue && !tripped)
            recorded.insert(reading.step);
    }
    progress.tracksSteps = anyStep || readings.empty();
    for (int step : plannedSteps) {
        if (recorded.count(step))
            ++progress.recordedSteps;
        else if (!progress.nextStep)
            progress.nextStep = step;
    }
    const bool everyStep = progress.recordedSteps == progress.plannedSteps;

    // The latest of: finished, stopped (operator), resumed (events) and safety stops (their own
    // records), by time; a safety stop and its stop event can share a millisecond, so a tie
    // goes to the stop.
    enum class End { None, Finished, OperatorStop, SafetyStop, Resumed };
    End last = End::None;
    std::string lastTime;
    int lastStep = -1;
    std::string lastRule;
    const auto consider = [&](End kind, const std::string &time, int step, const std::string &rule) {
        if (last == End::None || time > lastTime || (time == lastTime && kind == End::SafetyStop)) {
            last = kind;
            lastTime = time;
            lastStep = step;
            lastRule = rule;
        }
    };
    for (const SweepEventRecord &event : events) {
        if (event.kind == SweepEventKind::Finished)
            consider(End::Finished, event.timeUtc, event.step, {});
        else if (event.kind == SweepEventKind::Stopped)
            consider(End::OperatorStop, event.timeUtc, event.step, {});
        else if (event.kind == SweepEventKind::Resumed || event.kind == SweepEventKind::Started)
            consider(End::Resumed, event.timeUtc, event.step, {});
    }
    for (const SafetyStopRecord &stop : safetyStops)
        consider(End::SafetyStop, stop.timeUtc, stop.step, stop.rule);

    if (sweepRunning) {
        progress.state = Completeness::InProgress;
    } else if (last == End::Finished || (!progress.tracksSteps && last != End::SafetyStop && last != End::OperatorStop)) {
        progress.state = Completeness::Complete;
    } else if (last == End::SafetyStop) {
        // A stop after every planned step was recorded (an extra step beyond the plan) leaves
        // the planned sweep complete.
        progress.state = everyStep ? Completeness::Complete : Completeness::Stopped;
        progress.endReason = "safety stop at step " + std::to_string(lastStep) + " (" + lastRule + ")";
    } else if (last == End::OperatorStop) {
        progress.state = everyStep ? Completeness::Complete : Completeness::Stopped;
        progress.endReason = "stopped by the operator at step " + std::to_string(lastStep);
    } else {
        // No finish and no stop: complete only if every step is there anyway (a file from
        // before sweep events, an import by step, or a program that ended right after the
        // last reading).
        progress.state = everyStep ? Completeness::Complete : Completeness::Interrupted;
    }
    return progress;
}

} // namespace sagline
