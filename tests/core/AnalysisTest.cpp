// Meter uncertainty, temperature correction, regulation and copper loss, conformity decision
// and the "value ± U" format, on hand-worked examples with their sources named.
#include "MeterUncertainty.h"
#include "ResultAnalysis.h"
#include "TemperatureCorrection.h"
#include "UncertaintyFormat.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

namespace {

// A fit given by hand: V0 = 12.6 V, R = 0.3 Ω, u(V0) = 0.02 V, u(R) = 0.01 Ω, cov = -1.5e-4 V²/A,
// residual SD 0.05 V with n - 2 = 8 degrees of freedom (the covariance per unit s² follows).
FitSummary handFit()
{
    FitSummary fit;
    fit.status = FitStatus::Ok;
    fit.n = 10;
    fit.degreesOfFreedom = 8;
    fit.intercept = 12.6;
    fit.slope = -0.3;
    fit.interceptSe = 0.02;
    fit.slopeSe = 0.01;
    fit.covariance = -1.5e-4;
    fit.residualSdV = 0.05;
    return fit;
}

} // namespace

TEST(MeterUncertainty, RectangularLimitOfADmmSpecification)
{
    // FACTS.md §6 check value (computed): 12.34 V, ±(0.5 % + 2 counts), 0.01 V per count:
    // a = 0.0817 V, u = a/sqrt(3) = 0.047170 V (GUM, JCGM 100:2008, 4.3.7).
    const MeterUncertainty u = meterUncertainty({0.5, 2.0, 0.01}, 12.34);
    ASSERT_TRUE(u.ok) << u.error;
    EXPECT_NEAR(u.halfWidth, 0.0817, 1e-12);
    EXPECT_NEAR(u.standardUncertainty, 0.047170, 5e-7);
    EXPECT_NEAR(2.0 * u.standardUncertainty, 0.094339, 5e-7);
    // Eurachem/CITAC guide, Appendix E.1: a semi-range of 1.5 gives u = 0.87 (FACTS.md §6).
    EXPECT_NEAR(meterUncertainty({0.0, 1.0, 1.5}, 100.0).standardUncertainty, 0.87, 0.005);
    // A limit at 99 % of a normal distribution: u = a/2.576 (FACTS.md §6, common practice).
    EXPECT_NEAR(meterUncertainty({0.0, 1.0, 2.576, SpecCoverage::Normal99}, 5.0).standardUncertainty, 1.0, 1e-4);
    // Resolution alone: δ/sqrt(12) (GUM F.2.2.1, from memory); FACTS.md §6: 0.01 V -> 0.002887 V.
    EXPECT_NEAR(resolutionUncertainty(0.01), 0.002887, 5e-7);
}

TEST(MeterUncertainty, RejectsSpecificationsThatGiveNoUncertainty)
{
    EXPECT_FALSE(meterUncertainty({0.0, 0.0, 0.01}, 12.0).ok);
    EXPECT_FALSE(meterUncertainty({-0.5, 2.0, 0.01}, 12.0).ok);
    EXPECT_FALSE(meterUncertainty({0.5, 2.0, 0.01}, NAN).ok);
    std::vector<Reading> readings(2);
    readings[0].voltageV = 24.0;
    readings[0].currentA = 1.0;
    readings[1].voltageV = 23.0;
    readings[1].currentA = 2.0;
    readings[1].uVoltageV = 0.5;
    EXPECT_FALSE(applyMeterUncertainty(readings, {0.5, 3.0, 0.001}, {1.0, 3.0, 0.001}).has_value());
    EXPECT_NEAR(*readings[0].uVoltageV, (0.005 * 24.0 + 0.003) / std::sqrt(3.0), 1e-15);
    EXPECT_NEAR(*readings[0].uCurrentA, (0.01 * 1.0 + 0.003) / std::sqrt(3.0), 1e-15);
    EXPECT_EQ(*readings[1].uVoltageV, 0.5); // kept
    const auto error = applyMeterUncertainty(readings, {0.0, 0.0, 0.0}, {1.0, 3.0, 0.001}, false);
    ASSERT_TRUE(error.has_value());
    EXPECT_EQ(error->rfind("row 0", 0), 0u);
}

TEST(TemperatureCorrection, MatchesTheCheckFactors)
{
    // R_ref = R_m (T_k + T_ref)/(T_k + T_m); factors computed in FACTS.md §3 from that formula
    // (IEEE C57.12.90: T_k = 234.5 °C copper, 225 °C aluminium; IEC 60076-1: 235 °C copper).
    EXPECT_NEAR(correctToReference(1.0, 20.0, 75.0, TemperatureConstant::CopperIeee).factor, 1.216110, 5e-7);
    EXPECT_NEAR(correctToReference(1.0, 20.0, 75.0, TemperatureConstant::CopperIec).factor, 1.215686, 5e-7);
    EXPECT_NEAR(correctToReference(1.0, 20.0, 85.0, TemperatureConstant::CopperIeee).factor, 1.255403, 5e-7);
    EXPECT_NEAR(correctToReference(1.0, 20.0, 85.0, TemperatureConstant::CopperIec).factor, 1.254902, 5e-7);
    EXPECT_NEAR(correctToReference(1.0, 20.0, 75.0, TemperatureConstant::Aluminium).factor, 1.224490, 5e-7);
    const TemperatureCorrection c = correctToReference(0.48, 20.0, 75.0, TemperatureConstant::CopperIeee);
    ASSERT_TRUE(c.ok);
    EXPECT_NEAR(c.resistanceOhm, 0.48 * 1.216110, 1e-6);
    EXPECT_NE(c.convention.find("234.5"), std::string::npos);
    EXPECT_FALSE(correctToReference(1.0, -300.0, 75.0, TemperatureConstant::CopperIeee).ok);
    EXPECT_FALSE(correctToReference(NAN, 20.0, 75.0, TemperatureConstant::CopperIeee).ok);
    EXPECT_EQ(temperatureConstantFromString("copper-iec"), TemperatureConstant::CopperIec);
}

TEST(ResultAnalysis, RegulationCopperLossAndReferredResistance)
{
    // Regulation (V_NL - V_FL)/V_FL · 100 (textbook definition, FACTS.md §4): V_NL = 12.6 V,
    // V_FL = 12.0 V gives 5.000 % on the full-load base and 4.762 % on the no-load base
    // (FACTS.md §4 check value, computed). Here V_FL = 12.6 - 0.3 Ω · 2 A = 12.0 V.
    AnalysisInput input;
    input.ratedCurrentA = 2.0;
    input.turnsRatio = 230.0 / 12.6;
    input.windingTemperatureC = 25.0;
    input.uWindingTemperatureC = 0.5;
    input.referenceTemperatureC = 75.0;
    const AnalysisResult r = analyseFit(handFit(), input);
    ASSERT_TRUE(r.ok()) << r.errors.front().message();
    EXPECT_NEAR(r.fullLoadVoltageV.value, 12.0, 1e-12);
    EXPECT_NEAR(r.regulationPercent.value, 5.0, 1e-12);
    // GUM 5.2.2 with the gradient worked by hand: ∂reg/∂V0 = 100 b I/V_fl² = -0.416667,
    // ∂reg/∂b = -100 I V0/V_fl² = -17.5; u² = 0.41667²·0.02² + 17.5²·0.01² + 2(0.41667)(17.5)(-1.5e-4).
    EXPECT_NEAR(*r.regulationPercent.standardUncertainty, 0.168840, 1e-6);
    // Scatter only: ν_eff = n - 2 = 8, k = t_0.975(8) = 2.306004 (GUM Table G.2 gives 2.31).
    EXPECT_NEAR(*r.regulationPercent.effectiveDof, 8.0, 1e-12);
    EXPECT_NEAR(*r.regulationPercent.coverageFactor, 2.306004, 1e-6);
    EXPECT_NEAR(*r.regulationPercent.expandedUncertainty, 2.306004 * 0.168840, 2e-6);
    EXPECT_NEAR(*r.fullLoadVoltageV.standardUncertainty, std::sqrt(0.02 * 0.02 + 4 * 1e-4 - 4 * 1.5e-4), 1e-12);
    EXPECT_NEAR(r.copperLossW.value, 4.0 * 0.3, 1e-12);                 // I²R
    EXPECT_NEAR(*r.copperLossW.standardUncertainty, 4.0 * 0.01, 1e-12);
    EXPECT_NEAR(r.primaryResistanceOhm->value, 0.3 * (230.0 / 12.6) * (230.0 / 12.6), 1e-9); // a²R
    // R at 75 °C from 25 °C, copper T_k = 234.5 °C: factor 309.5/259.5 = 1.192678; u from u(R)
    // and u(T_m) = 0.5 °C: sqrt((f u_R)² + (R_ref/(T_k+T_m) u_T)²) = 0.0119467 Ω (worked by hand).
    EXPECT_NEAR(r.referenceResistanceOhm->value, 0.357803468, 1e-8);
    EXPECT_NEAR(*r.referenceResistanceOhm->standardUncertainty, 0.0119467, 1e-7);

    input.regulationBase = RegulationBase::NoLoad;
    const AnalysisResult noLoad = analyseFit(handFit(), input);
    EXPECT_NEAR(noLoad.regulationPercent.value, 4.761904761904762, 1e-12);
    EXPECT_NEAR(*noLoad.regulationPercent.standardUncertainty, 0.153143, 1e-6);
}

TEST(ResultAnalysis, UncertaintyAgreesWithFiniteDifferences)
{
    // Independent route: central differences of the regulation formula, propagated with the
    // same covariance, must equal the analytic gradient's result.
    const FitSummary fit = handFit();
    AnalysisInput input;
    input.ratedCurrentA = 2.0;
    const auto reg = [&](double a, double b) { return 100.0 * (a - (a + b * 2.0)) / (a + b * 2.0); };
    const double h = 1e-6;
    const double ga = (reg(12.6 + h, -0.3) - reg(12.6 - h, -0.3)) / (2 * h);
    const double gb = (reg(12.6, -0.3 + h) - reg(12.6, -0.3 - h)) / (2 * h);
    const double u = std::sqrt(ga * ga * 4e-4 + gb * gb * 1e-4 + 2 * ga * gb * -1.5e-4);
    EXPECT_NEAR(*analyseFit(fit, input).regulationPercent.standardUncertainty, u, 1e-7);
}

TEST(ResultAnalysis, RejectsBadInputByField)
{
    AnalysisInput input;
    input.ratedCurrentA = 0.0;
    const AnalysisResult r = analyseFit(handFit(), input);
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.errors.front().field, "rated_current_a");
    input.ratedCurrentA = 100.0; // the line reaches 0 V before this current
    EXPECT_EQ(analyseFit(handFit(), input).errors.front().field, "rated_current_a");
    input.ratedCurrentA = 1.0;
    FitSummary failed;
    EXPECT_EQ(analyseFit(failed, input).errors.front().field, "fit");
    FitSummary twoPoints = handFit();
    twoPoints.n = 2;
    twoPoints.slopeSe.reset();
    twoPoints.interceptSe.reset();
    twoPoints.covariance.reset();
    twoPoints.residualSdV.reset();
    const AnalysisResult noU = analyseFit(twoPoints, input);
    ASSERT_TRUE(noU.ok());
    EXPECT_FALSE(noU.regulationPercent.standardUncertainty.has_value());
}

TEST(UncertaintyFormat, RoundsToTwoDigitsOfTheUncertainty)
{
    // GUM (JCGM 100:2008) 7.2.6: at most two significant digits for the uncertainty.
    EXPECT_EQ(formatWithUncertainty(1.95234, 0.02312, "Ω"), "1.952 Ω ± 0.023 Ω");
    EXPECT_EQ(formatWithUncertainty(0.05234, 0.00231, "Ω"), "52.3 mΩ ± 2.3 mΩ");
    EXPECT_EQ(formatWithUncertainty(26.4123, 0.0125, "V"), "26.412 V ± 0.013 V");
    EXPECT_EQ(formatWithUncertainty(5.0, 0.34, "%"), "5.00 % ± 0.34 %");
    EXPECT_EQ(formatWithUncertainty(1234.6, 12.0, "W"), "1.235 kW ± 0.012 kW");
    EXPECT_EQ(formatWithUncertainty(1.5, 0.0, "Ω"), "1.500 Ω");
}
