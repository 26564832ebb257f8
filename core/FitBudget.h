// The uncertainty budget of any result f(V0, R, T_m) computed from a line fit V = V0 - R·I:
// given f's partial derivatives, it lists each independent input with its sensitivity
// (JCGM 100:2008, 5.1.3) and combines them (core/UncertaintyBudget.h). The inputs:
//
// - the readings' random error (one component, propagated through the fit's own covariance, so
//   the correlation of V0 and R is inside it): OLS, Type A from the residual SD s with n - 2
//   degrees of freedom, sensitivity sqrt(gᵀ M g) with M the fit's covariance per unit s²; when
//   s is below the resolution's rounding floor the floor is used instead (Type B, rectangular,
//   GUM F.2.2.1). WLS/York: the stated per-reading uncertainties through the weighted fit,
//   × sqrt(MSWD) when above 1 (then Type A, n - 2 dof).
// - voltmeter gain γ_V and offset o_V, ammeter gain γ_I and offset o_I: systematic, common to all
//   readings of a meter (GUM 5.2), rectangular half-widths from the setup (u = a/sqrt(3), GUM
//   4.3.7), ν = ∞. A reading V' = (1 + γ_V)V + o_V and I' = (1 + γ_I)I + o_I turn the fitted
//   V0' = (1 + γ_V)V0 + o_V + R o_I and R' = (1 + γ_V)R/(1 + γ_I), so
//   ∂f/∂γ_V = -(V0 f_V0 + R f_R), ∂f/∂o_V = -f_V0, ∂f/∂γ_I = R f_R, ∂f/∂o_I = -R f_V0.
//   For regulation, a function of R/V0 only, ∂f/∂γ_V = 0: the voltmeter's gain cancels.
// - the primary voltmeter's gain γ_1 on a fit of readings referred to the rated supply
//   (SupplyReferral.h): V2 and I2 are both multiplied by V1,rated/((1 + γ_1)V1), so every referred
//   point moves along the ray through the origin: V0' = V0/(1 + γ_1), R' = R (the ratio of the
//   scaled V and I), and ∂f/∂γ_1 = -V0 f_V0. It does not cancel in regulation (V0 moves, R·I_rated
//   does not) and is zero for R; rectangular (the meter's accuracy rule), ν = ∞.
// - the winding temperature T_m (results referred to a reference temperature): ∂f/∂T_m.
#pragma once

#include "FitSummary.h"
#include "ResultAnalysis.h"
#include "UncertaintyBudget.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

// Partial derivatives of a result f with respect to V0 (per V), R (per Ω) and T_m (per °C).
struct ResultGradient {
    double dV0 = 0.0;
    double dR = 0.0;
    double dT = 0.0;
};

// A meter's gain error is common to every reading it takes (GUM 5.2), so in one result it is one
// budget line whatever number of readings the result uses: the line is named the same wherever
// it arises (here and in core/PrimarySideAnalysis), and lines of the same name are merged by
// adding their sensitivities (full correlation: u = |Σ c_k|·u(γ), not the root sum of squares).
// meter: "primary voltmeter", "primary ammeter", "power meter".
std::string commonGainLineSource(const std::string &meter, double gainPercentOfReading);
bool isCommonGainLine(const BudgetComponent &component);
// The list with every set of common gain lines of one source merged into the first of them.
std::vector<BudgetComponent> mergeCommonGainLines(std::vector<BudgetComponent> components);

class FitBudget {
public:
    // fit must be ok; R and V0 are taken from it.
    FitBudget(const FitSummary &fit, const AnalysisInput &input);

    // The fit gives a random estimate (OLS needs n >= 3; WLS/York their covariance).
    bool hasUncertainty() const { return m_hasRandom; }
    // The value with its budget (or without uncertainty when hasUncertainty() is false).
    UncertainValue evaluate(double value, const ResultGradient &gradient) const;
    // One sentence for outputs: what the uncertainties include.
    std::string basis() const;

private:
    std::optional<BudgetComponent> randomComponent(const ResultGradient &g) const;

    const FitSummary &m_fit;
    const AnalysisInput &m_input;
    double m_v0 = 0.0;
    double m_r = 0.0;
    bool m_hasRandom = false;
    bool m_weighted = false;      // WLS or York: the stated per-reading uncertainties
    double m_scatterV = 0.0;      // OLS residual SD, V
    double m_floorV = 0.0;        // resolution floor of the scatter, V
    double m_maa = 0.0, m_mbb = 0.0, m_mab = 0.0; // covariance of (V0, slope) per unit scatter², or absolute (weighted)
};

} // namespace sagline
