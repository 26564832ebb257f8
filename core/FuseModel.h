// A miniature cartridge fuse for the virtual bench: it opens by its time/current behaviour.
// The opening time at a constant current follows a nominal curve placed inside the
// IEC 60127-2 pre-arcing gates of its type; for a varying current the fuse accumulates
// "heat" as the sum of dt / t_open(I) (it opens at 1) and loses it again below 1.5 In.
// A simulation model, not a maker's datasheet.
#pragma once

#include "Setup.h"

namespace sagline {

// Nominal pre-arcing time at a constant current of `multiple` x In, s; infinity at or below
// 1.5 In (IEC 60127-2: the fuse must carry 1.5 In for at least an hour).
double nominalFuseOpeningTimeS(FuseType type, double multiple);

class FuseModel {
public:
    FuseModel(double ratingA, FuseType type);

    // Passes `currentA` (RMS) through the fuse for `seconds`.
    void advance(double seconds, double currentA);
    bool isOpen() const { return m_open; }
    double heat() const { return m_heat; } // 0 cold .. 1 opens
    double ratingA() const { return m_ratingA; }
    FuseType type() const { return m_type; }
    void replace(); // a fresh fuse

    // Below 1.5 In the stored heat decays with this time constant (simulation choice).
    static constexpr double coolingTimeConstantS = 5.0;

private:
    double m_ratingA;
    FuseType m_type;
    double m_heat = 0.0;
    bool m_open = false;
};

} // namespace sagline
