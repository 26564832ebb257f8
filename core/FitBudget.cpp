#include "FitBudget.h"

#include "NumberFormat.h"
#include "OutlierScreen.h"

#include <algorithm>
#include <cmath>
#include <vector>

namespace sagline {

namespace {

// A rectangular limit of half-width a as a standard uncertainty (GUM 4.3.7).
double rectangular(double halfWidth)
{
    return halfWidth / std::sqrt(3.0);
}

BudgetComponent typeB(std::string source, std::string distribution, double u, std::string unit, double c)
{
    BudgetComponent component;
    component.source = std::move(source);
    component.type = EvaluationType::B;
    component.shape = distribution == "rectangular" ? DistributionShape::Rectangular : DistributionShape::Normal;
    component.distribution = std::move(distribution);
    component.standardUncertainty = u;
    component.inputUnit = std::move(unit);
    component.sensitivity = c;
    component.contribution = std::fabs(c) * u;
    return component;
}

const std::string commonLineMark = ", common to every reading)";

} // namespace

std::string commonGainLineSource(const std::string &meter, double gainPercentOfReading)
{
    return meter + " gain (±" + formatSignificant(gainPercentOfReading, 3) + " % of reading" + commonLineMark;
}

bool isCommonGainLine(const BudgetComponent &component)
{
    const std::string &s = component.source;
    return s.size() >= commonLineMark.size() && s.compare(s.size() - commonLineMark.size(), commonLineMark.size(), commonLineMark) == 0;
}

std::vector<BudgetComponent> mergeCommonGainLines(std::vector<BudgetComponent> components)
{
    std::vector<BudgetComponent> out;
    out.reserve(components.size());
    for (BudgetComponent &c : components) {
        auto same = std::find_if(out.begin(), out.end(), [&](const BudgetComponent &o) {
            return isCommonGainLine(c) && o.source == c.source;
        });
        if (same == out.end()) {
            out.push_back(std::move(c));
            continue;
        }
        same->sensitivity += c.sensitivity;
        same->contribution = std::fabs(same->sensitivity) * same->standardUncertainty;
    }
    return out;
}

FitBudget::FitBudget(const FitSummary &fit, const AnalysisInput &input)
    : m_fit(fit), m_input(input), m_v0(fit.intercept), m_r(-fit.slope)
{
    m_weighted = fit.method != FitMethod::Ols;
    if (input.meters)
        m_floorV = resolutionScatterV(input.meters->voltmeter.resolution, input.meters->ammeter.resolution, fit.slope);
    if (m_weighted) {
        // Absolute covariance of the weighted fit (enlarged by sqrt(MSWD) when above 1).
        const auto sa = fit.analysisInterceptSe();
        const auto sb = fit.analysisSlopeSe();
        const auto cov = fit.analysisCovariance();
        if (sa && sb && cov && fit.n >= 3) {
            m_maa = *sa * *sa;
            m_mbb = *sb * *sb;
            m_mab = *cov;
            m_hasRandom = true;
        }
        return;
    }
    if (!fit.residualSdV || fit.n < 3)
        return;
    m_scatterV = *fit.residualSdV;
    if (fit.sxx > 0.0 && fit.sumWeights > 0.0) {
        m_maa = 1.0 / fit.sumWeights + fit.meanCurrentA * fit.meanCurrentA / fit.sxx;
        m_mbb = 1.0 / fit.sxx;
        m_mab = -fit.meanCurrentA / fit.sxx;
        m_hasRandom = true;
    } else if (m_scatterV > 0.0 && fit.slopeSe && fit.interceptSe && fit.covariance) {
        const double s2 = m_scatterV * m_scatterV;
        m_maa = *fit.interceptSe * *fit.interceptSe / s2;
        m_mbb = *fit.slopeSe * *fit.slopeSe / s2;
        m_mab = *fit.covariance / s2;
        m_hasRandom = true;
    }
}

std::optional<BudgetComponent> FitBudget::randomComponent(const ResultGradient &g) const
{
    // Gradient with respect to (intercept a = V0, slope b = -R).
    const double ga = g.dV0;
    const double gb = -g.dR;
    const double spread = std::sqrt(std::max(0.0, ga * ga * m_maa + gb * gb * m_mbb + 2.0 * ga * gb * m_mab));
    const double dof = static_cast<double>(m_fit.n) - 2.0;
    BudgetComponent c;
    if (m_weighted) {
        const double mswd = m_fit.mswd.value_or(1.0);
        c.source = "readings' random error: their stated uncertainties through the "
                   + std::string(m_fit.method == FitMethod::York ? "York" : "weighted") + " fit";
        c.type = EvaluationType::B;
        c.distribution = "normal";
        if (mswd > 1.0) {
            c.source += ", × sqrt(MSWD) = " + formatSignificant(std::sqrt(mswd), 3) + " (the scatter exceeds them)";
            c.type = EvaluationType::A;
            c.degreesOfFreedom = dof;
        }
        c.standardUncertainty = spread;
        c.inputUnit = "";
        c.sensitivity = 1.0;
        c.contribution = spread;
        return c;
    }
    if (m_scatterV >= m_floorV) {
        c.source = "readings' scatter about the line (residual SD, " + std::to_string(m_fit.n - 2) + " degrees of freedom)";
        c.type = EvaluationType::A;
        c.distribution = "normal";
        c.standardUncertainty = m_scatterV;
        c.degreesOfFreedom = dof;
    } else {
        c.source = "readings' resolution (the scatter, " + formatQuantity(m_scatterV, "V", 2)
                   + ", is below what rounding to the last digit gives)";
        c.type = EvaluationType::B;
        // Each reading's rounding is rectangular; their sum through the fit is close to normal.
        c.distribution = "rectangular per reading, normal through the fit";
        c.shape = DistributionShape::Normal;
        c.standardUncertainty = m_floorV;
    }
    c.inputUnit = "V";
    c.sensitivity = spread;
    c.contribution = spread * c.standardUncertainty;
    return c;
}

UncertainValue FitBudget::evaluate(double value, const ResultGradient &g) const
{
    if (!m_hasRandom) {
        UncertainValue bare;
        bare.value = value;
        return bare;
    }
    std::vector<BudgetComponent> components;
    if (auto random = randomComponent(g))
        components.push_back(*random);
    if (m_input.meters) {
        const MeterSpec &vm = m_input.meters->voltmeter;
        const MeterSpec &am = m_input.meters->ammeter;
        const auto add = [&](bool present, BudgetComponent component) {
            if (present)
                components.push_back(std::move(component));
        };
        // Gains in % of reading: sensitivities per %. A result of R/V0 alone (regulation) has
        // V0·f_V0 + R·f_R = 0 exactly; keep rounding from showing as a tiny non-zero.
        const double scaleTerms = std::fabs(m_v0 * g.dV0) + std::fabs(m_r * g.dR);
        const double voltGain = m_v0 * g.dV0 + m_r * g.dR;
        add(vm.gainPercentOfReading > 0.0,
            typeB("voltmeter gain (±" + formatSignificant(vm.gainPercentOfReading, 3) + " % of reading)", "rectangular",
                  rectangular(vm.gainPercentOfReading), "%",
                  std::fabs(voltGain) <= 1e-12 * scaleTerms ? 0.0 : -voltGain / 100.0));
        add(vm.offset > 0.0, typeB("voltmeter offset (±" + formatQuantity(vm.offset, "V", 3) + ")", "rectangular",
                                   rectangular(vm.offset), "V", -g.dV0));
        add(am.gainPercentOfReading > 0.0,
            typeB("ammeter gain (±" + formatSignificant(am.gainPercentOfReading, 3) + " % of reading)", "rectangular",
                  rectangular(am.gainPercentOfReading), "%", m_r * g.dR / 100.0));
        add(am.offset > 0.0, typeB("ammeter offset (±" + formatQuantity(am.offset, "A", 3) + ")", "rectangular",
                                   rectangular(am.offset), "A", -m_r * g.dV0));
    }
    if (m_input.referralGainUPercent && *m_input.referralGainUPercent > 0.0) {
        // With the setup's primary voltmeter the line is that meter's common gain line, so that a
        // result also using V1 directly (efficiency, P0 referred to rated) merges the two.
        const auto &primary = m_input.meters ? m_input.meters->primaryVoltmeter : std::nullopt;
        components.push_back(typeB(primary ? commonGainLineSource("primary voltmeter", primary->gainPercentOfReading)
                                           : "primary voltmeter gain, through the referral to the rated supply (u = "
                                                 + formatSignificant(*m_input.referralGainUPercent, 3) + " % of reading)",
                                   "rectangular", *m_input.referralGainUPercent, "%", -m_v0 * g.dV0 / 100.0));
    }
    if (g.dT != 0.0)
        components.push_back(typeB("winding temperature (u = " + formatSignificant(m_input.uWindingTemperatureC, 3) + " °C"
                                       + (m_input.windingTemperatureUncertaintyDefaulted ? ", default" : "") + ")",
                                   "normal", m_input.uWindingTemperatureC, "°C", g.dT));
    return combineBudget(value, std::move(components));
}

std::string FitBudget::basis() const
{
    if (!m_hasRandom)
        return "no uncertainty: the fit has too few points to estimate the readings' random error";
    const std::string random = m_weighted ? "the readings' stated uncertainties" : "the readings' scatter";
    if (!m_input.meters)
        return "the meters' specifications were not recorded: the uncertainty is from " + random
               + (m_input.referralGainUPercent
                      ? std::string(" and the primary voltmeter's gain through the referral (the secondary meters' "
                                    "systematic errors not included)")
                      : std::string(" only (systematic meter errors not included)"));
    return random + " and the meters' specifications (gain and offset common to every reading"
           + (m_input.referralGainUPercent ? std::string(", the primary voltmeter's gain through the referral)") : std::string(")"));
}

} // namespace sagline
