// The distribution of a result's error Σ cᵢXᵢ as its budget describes it: independent, centred
// components, each normal (a stated standard uncertainty), rectangular (a meter's limit, half-
// width sqrt(3)·u) or a scaled Student t (Type A from the scatter, ν = n - 2). Its 95 % coverage
// interval is the coverage interval Sagline prints, and its CDF gives the conformance
// probability (JCGM 106:2012 §7), so the interval and the probability come from one
// distribution.
//
// Why not only k = t95(ν_eff) (GUM G.4): Welch–Satterthwaite assumes every component near
// normal. When a rectangular limit dominates (a meter's gain in V0, typically) the combined
// distribution has light tails and t95(ν_eff) ≈ 1.96 over-covers by up to 19 % (a rectangular
// alone needs 1.65, GUM G.2.3 (from memory)); the Monte Carlo of JCGM 101:2008 shows it
// (tests/core/MonteCarloBudgetTest.cpp). With normal and t components only this distribution
// gives what W–S approximates. ν_eff is still computed and shown.
//
// Method: the normal and rectangular part on a grid of cell masses (rectangles by differences of
// the interpolated cumulative masses, O(cells) each), then the t part by its CDF, tabulated
// once per distribution; the coverage point by bisection. About 0.1 ms per result.
#pragma once

#include "UncertaintyBudget.h"

#include <vector>

namespace sagline {

class CombinedDistribution {
public:
    explicit CombinedDistribution(const std::vector<BudgetComponent> &components);

    // P(Σ cᵢXᵢ <= x).
    double cdf(double x) const;
    // The half-width h of the probabilistically symmetric interval [-h, h] holding probability p
    // (the distribution is symmetric), 0 < p < 1.
    double symmetricHalfWidth(double p) const;
    double standardDeviation() const { return m_sd; }

private:
    double gridCdf(double x) const;      // the normal and rectangular part alone

    double m_sd = 0.0;                   // sqrt(Σ contribution²)
    double m_normalSd = 0.0;             // the normal components together
    std::vector<double> m_rectangles;    // half-widths
    double m_tScale = 0.0;               // the t component's contribution (0: none)
    double m_tDof = 0.0;
    // Grid of the normal-and-rectangular part: cell masses, cells of width m_step from -m_half.
    std::vector<double> m_mass;
    std::vector<double> m_cumulative;    // m_cumulative[k] = mass of cells < k (size cells + 1)
    double m_half = 0.0;
    double m_step = 0.0;
    // The t CDF on a uniform table over [-m_tableEnd, m_tableEnd].
    std::vector<double> m_tTable;
    double m_tableEnd = 0.0;
};

} // namespace sagline
