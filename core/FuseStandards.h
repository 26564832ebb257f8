// Fuse and protection tables from the standards: IEC 60127 ratings and time/current gates,
// NEC 450.3(B) primary-only ceiling, and the common-practice planning defaults.
#pragma once

#include "Setup.h"

#include <string>

namespace sagline {

// Smallest IEC 60127 standard rated current (R10 series 1, 1.25, 1.6, 2, 2.5, 3.15, 4, 5, 6.3, 8
// per decade) at or above `minimumA`. Precondition: minimumA > 0 and finite.
double nextStandardFuseRating(double minimumA);
// True when `ratingA` is one of the R10 standard ratings (to 0.1 %).
bool isStandardFuseRating(double ratingA);

// IEC 60127-2 time/current gates, as multiples of the rated current In, for a cold fuse-link.
struct FuseGates {
    double mustHoldMultiple;      // carries this for at least mustHoldMinutes (1.5 In)
    double mustHoldMinutes;
    double mustOpenMultiple;      // opens at this (2.1 In) within mustOpenMaxSeconds
    double mustOpenMaxSeconds;
    std::string source;           // where the figures come from, with its confidence tag
};
FuseGates fuseGates(FuseType type);

// NEC (NFPA 70) Table 450.3(B), primary-only protection, transformers 1000 V and less: the
// largest primary overcurrent device as a fraction of rated primary current (3.00 below 2 A,
// 1.67 from 2 A to below 9 A, 1.25 at 9 A and above; Note 1's round-up is not applied).
double necPrimaryOnlyMultiplier(double ratedPrimaryCurrentA);
double necPrimaryOnlyMaximumA(double ratedPrimaryCurrentA);

// Planning defaults (common practice, FACTS.md §10): fuse factor over rated primary current
// and the magnetizing current as a fraction of rated primary current, by construction.
double defaultFuseFactor(Construction construction);
double defaultMagnetizingFraction(Construction construction);

} // namespace sagline
