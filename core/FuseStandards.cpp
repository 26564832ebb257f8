#include "FuseStandards.h"

#include <array>
#include <cmath>

namespace sagline {

namespace {

// IEC 60127 rated-current steps per decade: the R10 preferred numbers with 3.15 and 6.3
// (not 3.2 and 6.4). Source: IEC 60127 standard-sheet rating list (FACTS.md §1).
constexpr std::array<double, 10> r10Steps{1.0, 1.25, 1.6, 2.0, 2.5, 3.15, 4.0, 5.0, 6.3, 8.0};

} // namespace

double nextStandardFuseRating(double minimumA)
{
    if (!(minimumA > 0.0) || !std::isfinite(minimumA))
        return 0.0;
    double decade = std::pow(10.0, std::floor(std::log10(minimumA)));
    for (int pass = 0; pass < 3; ++pass) {
        for (double step : r10Steps) {
            // The 10 mA decade writes 31.5 mA as 32 mA on the IEC 60127 sheets (FACTS.md §1).
            const double rating = (step == 3.15 && decade < 0.05) ? 3.2 * decade : step * decade;
            // Relative tolerance so 0.5 * 2.0 lands on 1 A and not on 1.25 A.
            if (rating >= minimumA * (1.0 - 1e-9))
                return rating;
        }
        decade *= 10.0;
    }
    return 0.0; // unreachable for finite positive input
}

bool isStandardFuseRating(double ratingA)
{
    if (!(ratingA > 0.0) || !std::isfinite(ratingA))
        return false;
    const double next = nextStandardFuseRating(ratingA * (1.0 - 1e-3));
    return std::fabs(next - ratingA) <= 1e-3 * ratingA;
}

FuseGates fuseGates(FuseType type)
{
    switch (type) {
    case FuseType::QuickActing:
        // IEC 60127-2 standard sheet 2 (F, low breaking): 1.5 In >= 60 min, 2.1 In <= 30 min.
        return {1.5, 60.0, 2.1, 30.0 * 60.0,
                "IEC 60127-2 sheet 2 (quick-acting F): 1.5 In holds >= 60 min, 2.1 In opens <= 30 min"};
    case FuseType::TimeLag:
        // IEC 60127-2 standard sheet 3 (T, low breaking): 1.5 In >= 60 min, 2.1 In <= 2 min.
        // The 2 min figure is from memory (FACTS.md §1): check the sheet before relying on it.
        return {1.5, 60.0, 2.1, 2.0 * 60.0,
                "IEC 60127-2 sheet 3 (time-lag T): 1.5 In holds >= 60 min, 2.1 In opens <= 2 min (from memory)"};
    }
    return fuseGates(FuseType::TimeLag);
}

double necPrimaryOnlyMultiplier(double ratedPrimaryCurrentA)
{
    // NEC Table 450.3(B), "primary only" row (FACTS.md §2).
    if (ratedPrimaryCurrentA < 2.0)
        return 3.00;
    if (ratedPrimaryCurrentA < 9.0)
        return 1.67;
    return 1.25;
}

double necPrimaryOnlyMaximumA(double ratedPrimaryCurrentA)
{
    return necPrimaryOnlyMultiplier(ratedPrimaryCurrentA) * ratedPrimaryCurrentA;
}

double defaultFuseFactor(Construction construction)
{
    // Common practice (FACTS.md §10): 1.5-2 x I1 for laminated (EI) cores, 2-3 x I1 for toroids
    // because of their high inrush. We take 1.6 for laminated and the middle of the toroid
    // range, 2.5, which stays under the NEC 300 % primary-only ceiling once rounded to R10
    // for most small units; the planner warns when the rounded rating exceeds that ceiling.
    switch (construction) {
    case Construction::Laminated: return 1.6;
    case Construction::Toroidal: return 2.5;
    case Construction::Other: return 2.0;
    }
    return 2.0;
}

double defaultMagnetizingFraction(Construction construction)
{
    // Common practice, from memory (FACTS.md §10): no-load current of small EI units about
    // 5-20 % of rated primary current, toroids about 1-5 %. We take the upper-middle of each
    // range so the primary-current estimate errs high.
    switch (construction) {
    case Construction::Laminated: return 0.15;
    case Construction::Toroidal: return 0.05;
    case Construction::Other: return 0.15;
    }
    return 0.15;
}

} // namespace sagline
