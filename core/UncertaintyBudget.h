// An uncertainty budget (JCGM 100:2008, the GUM): the components of a result's standard
// uncertainty, each with its evaluation type, distribution, standard uncertainty, sensitivity
// coefficient and contribution, combined by the law of propagation for independent inputs
// (GUM 5.1.2), with the effective degrees of freedom by Welch–Satterthwaite (GUM G.4.1) and the
// coverage factor k = t_p(ν_eff) for a 95 % coverage probability (GUM G.3, Table G.2).
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace sagline {

enum class EvaluationType { A, B };
std::string toString(EvaluationType type); // "A", "B"

// The shape of a component's distribution, for the coverage interval (CombinedDistribution.h):
// a scaled Student t with the component's degrees of freedom when they are finite, a normal,
// or a rectangle of half-width sqrt(3)·u.
enum class DistributionShape { Normal, Rectangular };

struct BudgetComponent {
    std::string source;                  // what it is, e.g. "ammeter gain (±0.5 % of reading)"
    EvaluationType type = EvaluationType::B;
    std::string distribution;            // "normal", "rectangular", as shown
    DistributionShape shape = DistributionShape::Normal; // normal with finite ν: a scaled t
    double standardUncertainty = 0.0;    // u(x_i), in inputUnit
    std::string inputUnit;               // unit of x_i: "V", "A", "%", "°C"
    double sensitivity = 0.0;            // c_i = ∂y/∂x_i, result's unit per inputUnit
    double contribution = 0.0;           // |c_i|·u(x_i), result's unit
    std::optional<double> degreesOfFreedom; // ν_i; absent: infinite (a Type B limit taken as exact)
};

// The 95 % coverage probability used for every expanded uncertainty Sagline prints.
inline constexpr double coverageProbability = 0.95;

// A result with its uncertainty. Without a usable scatter (a two-point fit) the uncertainty is
// absent and the budget empty.
struct UncertainValue {
    double value = 0.0;
    std::optional<double> standardUncertainty;  // u_c, same unit as value
    std::optional<double> expandedUncertainty;  // U = k·u_c
    std::optional<double> effectiveDof;         // ν_eff; +infinity when every component has ν = ∞
    std::optional<double> coverageFactor;       // k = U/u_c (t_{0.975}(ν_eff) unless rectangles dominate)
    std::vector<BudgetComponent> budget;        // independent components, largest contribution first
};

// Combines the components into value's u_c, ν_eff (Welch–Satterthwaite) and U, the half-width of
// the 95 % coverage interval of the components' combined distribution (CombinedDistribution.h),
// with k = U/u_c. An empty list gives u_c = 0, ν_eff = ∞.
UncertainValue combineBudget(double value, std::vector<BudgetComponent> components);

// Welch–Satterthwaite: ν_eff = u_c⁴ / Σ (c_i u_i)⁴/ν_i (GUM G.4.1, eq. G.2b); +infinity when no
// component has finite ν.
double effectiveDegreesOfFreedom(double combinedU, const std::vector<BudgetComponent> &components);

// k for coverage probability p at ν degrees of freedom: Student t (non-integer ν interpolates
// Table G.2, GUM G.4.1 note), the normal quantile when ν is infinite.
double coverageFactorFor(double dof, double probability = coverageProbability);

// "U (k = 2.08, 95 %)": how every output names an expanded uncertainty.
std::string expandedUncertaintyLabel(const UncertainValue &value);
// "k = 2.08" with 3 significant digits; "k = 1.96" for ν_eff infinite.
std::string coverageFactorText(double k);
// "6.0" or "∞" for a degrees-of-freedom value.
std::string degreesOfFreedomText(std::optional<double> dof);

} // namespace sagline
