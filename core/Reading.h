// One recorded point: a paired secondary current and voltage with its provenance.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>

namespace sagline {

// Flags are bits so a point can carry several; stored as an integer in the session file.
enum ReadingFlag : std::uint32_t {
    flagNone = 0,
    flagUnstable = 1u << 0,          // stability rule not met within its maximum time
    flagOverload = 1u << 1,          // a meter reported overload (SCPI 9.9E37); not fitted
    flagNotANumber = 1u << 2,        // a meter reported not-a-number (SCPI 9.91E37); not fitted
    flagOutsidePrediction = 1u << 3, // far outside the fit's prediction interval when recorded
    flagOutlier = 1u << 4,           // |studentized residual| above the threshold
    flagManual = 1u << 5,            // typed in by hand
    flagSimulated = 1u << 6,         // from the virtual bench
    flagConfirmed = 1u << 7,         // typed in outside what the step expects, and confirmed by the person
};

std::string flagsToString(std::uint32_t flags); // "unstable|outlier", "" when none

// What the primary-side meters read with a point, each value nullable (a bench may have none,
// a voltmeter only, or a power analyser reading all of them). Units SI: V, A, W, var; the power
// factor is |P|/S, 0..1. Each u* is the value's standard uncertainty (absent: not known).
struct PrimaryReading {
    std::optional<double> voltageV;          // V1, V RMS
    std::optional<double> uVoltageV;
    std::optional<double> currentA;          // I1, A RMS
    std::optional<double> uCurrentA;
    std::optional<double> powerW;            // P1, active power drawn, W
    std::optional<double> uPowerW;
    std::optional<double> powerFactor;       // P1/S1, 0..1
    std::optional<double> uPowerFactor;
    std::optional<double> reactivePowerVar;  // Q1, var (magnitude)
    std::optional<double> uReactivePowerVar;

    bool hasAny() const { return voltageV || currentA || powerW || powerFactor || reactivePowerVar; }
};

// What the fit reads of a reading comes first, 54 bytes together (one or two cache lines, not
// three of a reading's five), so fitting a million readings reads less memory. (Aligning the
// struct to a line was measured too: 8 % more memory, and slower once the fit prefetches.)
struct Reading {
    double currentA = 0.0;           // secondary current, A RMS
    double voltageV = 0.0;           // secondary voltage, V RMS
    std::optional<double> uCurrentA; // standard uncertainty of currentA, A
    std::optional<double> uVoltageV; // standard uncertainty of voltageV, V
    std::uint32_t flags = flagNone;
    bool excluded = false;           // left out of the fit: excluded, or superseded (reasons in the store)
    bool superseded = false;         // replaced by a retake of its step (then also `excluded`)
    int step = -1;                   // plan step index, -1 when not part of a plan
    std::int64_t id = 0;             // session-store row id; 0 before it is stored
    std::string timeUtc;             // ISO 8601, e.g. 2026-12-02T10:15:03.250Z
    std::string rawText;             // the instruments' own text for this point
    PrimaryReading primary;          // the primary side, when its meters were read
};
static_assert(offsetof(Reading, superseded) < 64, "the fitted fields lie within the first 64 bytes");

} // namespace sagline
