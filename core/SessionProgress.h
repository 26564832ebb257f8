// How far a session got: k of N planned steps recorded, and whether its sweep finished, is
// still running, was stopped (safety limit or operator) or was interrupted (the recording
// program ended without finishing: a crash, a power cut). A verdict is only final for a
// complete session; before that it is "provisional (k of N steps)", and a session that ended
// early is "incomplete" everywhere and never passes.
#pragma once

#include "Reading.h"
#include "SessionRecords.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

enum class Completeness {
    Complete,     // every planned step recorded, or the sweep recorded its finish
    InProgress,   // the sweep is running now (only the recording window knows this)
    Stopped,      // ended by a safety stop or by the operator before the last step
    Interrupted,  // ended without a finish or a stop: the recording program did not end the sweep
};

const char *toString(Completeness state); // "complete", "in progress", "stopped", "interrupted"

struct SessionProgress {
    Completeness state = Completeness::Complete;
    int plannedSteps = 0;         // N
    int recordedSteps = 0;        // k: planned steps with a reading that was not superseded
    bool tracksSteps = true;      // false: no reading carries a plan step (an import), judged as a whole
    std::optional<int> nextStep;  // the first planned step without a reading, where a resume starts
    std::string endReason;        // for Stopped: "safety stop at step 5 (output-va)", "stopped by the operator at step 4"

    bool isComplete() const { return state == Completeness::Complete; }
    // "provisional (3 of 9 steps)", "incomplete (4 of 9 steps; safety stop at step 5 (output-va))",
    // "incomplete (4 of 9 steps; interrupted)", "" when complete.
    std::string label() const;
    // The verdict as people should read it: the outcome when complete, else the label (an
    // incomplete or provisional session never reads "pass").
    std::string verdictText(const std::string &outcome) const;
};

// `plannedSteps`: the plan's step indices in order. `sweepRunning`: the caller is recording it
// now. Events decide how the sweep ended (the last of finished / stopped / safety stop /
// resumed); a file without events (older, or imported) is complete when every planned step has
// a reading, stopped when it has a safety stop, else interrupted.
SessionProgress sessionProgress(const std::vector<int> &plannedSteps, const std::vector<Reading> &readings,
                                const std::vector<SafetyStopRecord> &safetyStops,
                                const std::vector<SweepEventRecord> &events, bool sweepRunning);

} // namespace sagline
