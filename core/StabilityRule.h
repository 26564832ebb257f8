// The stability rule of a sweep step: a point is stable once k consecutive readings agree
// within a tolerance (both V and I); if that has not happened by the maximum time, the
// step's point is recorded as unstable. Pure C++; times are passed in by the caller.
#pragma once

#include <deque>

namespace sagline {

struct StabilityRule {
    int count = 3;                    // k consecutive readings
    double relativeTolerance = 0.002; // spread (max - min) allowed, as a fraction of the mean
    double voltageFloorV = 0.005;     // ... but never tighter than this (meter resolution), V
    double currentFloorA = 0.0005;    // ... and this, A
    double maxTimeS = 30.0;           // give up and mark the point unstable after this, s
};

class StabilityTracker {
public:
    explicit StabilityTracker(const StabilityRule &rule);

    void start(double timeS);            // a new step; forgets earlier readings
    void add(double voltageV, double currentA);
    bool isStable() const;               // the last k readings agree
    bool isTimedOut(double timeS) const; // the maximum time since start() has passed
    int readingCount() const { return m_total; }
    const StabilityRule &rule() const { return m_rule; }

private:
    struct Pair {
        double voltageV;
        double currentA;
    };
    StabilityRule m_rule;
    std::deque<Pair> m_last;
    double m_startS = 0.0;
    int m_total = 0;
};

} // namespace sagline
