// From a fit to a verdict: limits from the specification (each judged), the nameplate only when
// chosen and then labelled, not judged without a limit, judged at the reference temperature
// when one is set.
#include "ConformityAssessment.h"
#include "FitSummary.h"
#include "SetupJson.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

// A sweep of our own on the line V = 26.4 - 1.1·I with a little scatter (24 V, 50 VA: rated
// current 2.0833 A, regulation 100·1.1·2.0833/(26.4 - 2.2917) = 9.506 %).
FitSummary sweepFit()
{
    const double wiggle[] = {0.004, -0.003, 0.002, -0.004, 0.003, -0.002, 0.001, -0.001};
    std::vector<Reading> readings(8);
    for (std::size_t k = 0; k < readings.size(); ++k) {
        readings[k].currentA = 0.3 * static_cast<double>(k);
        readings[k].voltageV = 26.4 - 1.1 * readings[k].currentA + wiggle[k];
    }
    return fitReadings(readings, FitMethod::Ols);
}

sagline::Setup setupWith(const std::string &sections)
{
    const SetupParse parsed = parseSetupJson(
        R"json({"nameplate":{"rated_power_va":50,"primary_voltage_v":230,"secondary_voltage_v":24,)json"
        R"json("secondary_no_load_voltage_v":26.4})json"
        + sections + "}");
    EXPECT_TRUE(parsed.setup) << (parsed.errors.empty() ? "" : parsed.errors.front().message());
    return parsed.setup.value_or(sagline::Setup{});
}

} // namespace

TEST(ConformityAssessment, NoLimitIsNotJudgedButTheNameplateIsShownBeside)
{
    const Assessment a = assessFit(sweepFit(), setupWith(""), {});
    ASSERT_TRUE(a.analysis.ok());
    EXPECT_EQ(a.verdict.outcome, ConformityOutcome::NotJudged);
    EXPECT_TRUE(a.verdict.limits.empty());
    EXPECT_EQ(a.verdict.limitsSource, "no limit stated");
    ASSERT_TRUE(a.verdict.nameplateRegulationPercent);
    EXPECT_NEAR(*a.verdict.nameplateRegulationPercent, 10.0, 1e-9);
    EXPECT_NEAR(*a.verdict.regulationMinusNameplatePercent, a.analysis.regulationPercent.value - 10.0, 1e-12);
    EXPECT_NE(a.verdict.explanation.find("not judged"), std::string::npos) << a.verdict.explanation;
    EXPECT_NE(a.verdict.explanation.find("nameplate"), std::string::npos) << a.verdict.explanation;
    EXPECT_FALSE(a.analysis.metersKnown);
    EXPECT_NE(a.analysis.uncertaintyBasis.find("not recorded"), std::string::npos) << a.analysis.uncertaintyBasis;
}

TEST(ConformityAssessment, TheNameplateIsALimitOnlyWhenChosenAndSaysSo)
{
    AssessmentOptions options;
    options.regulationLimit = {RegulationLimitChoice::Kind::Nameplate, 0.0};
    const Assessment a = assessFit(sweepFit(), setupWith(""), options);
    ASSERT_EQ(a.verdict.limits.size(), 1u);
    EXPECT_NEAR(*a.verdict.limits.front().limits.max, 10.0, 1e-9);
    EXPECT_NE(a.verdict.limitsSource.find("nameplate's own regulation"), std::string::npos) << a.verdict.limitsSource;
    EXPECT_EQ(a.verdict.outcome, ConformityOutcome::Pass);
    // A stated limit wins over the specification's and is labelled as given.
    options.regulationLimit = {RegulationLimitChoice::Kind::Stated, 9.0};
    const Assessment stated = assessFit(sweepFit(), setupWith(R"(,"specification":{"regulation_max_percent":12})"), options);
    ASSERT_EQ(stated.verdict.limits.size(), 1u);
    EXPECT_DOUBLE_EQ(*stated.verdict.limits.front().limits.max, 9.0);
    EXPECT_EQ(stated.verdict.outcome, ConformityOutcome::Fail);
    EXPECT_NE(stated.verdict.limitsSource.find("given for this judgement"), std::string::npos);
}

TEST(ConformityAssessment, EveryLimitOfTheSpecificationIsJudgedTheWorstDecides)
{
    const std::string spec = R"(,"specification":{"regulation_max_percent":12,"full_load_voltage_v":{"min":24.0},)"
                             R"("no_load_voltage_v":{"min":26.0,"max":26.8},"series_resistance_max_ohm":1.2,)"
                             R"("source":"drawing D-1"})";
    const Assessment a = assessFit(sweepFit(), setupWith(spec), {});
    ASSERT_EQ(a.verdict.limits.size(), 4u);
    // Full-load voltage 26.4 - 2.2917 = 24.108 V against a 24.0 V minimum: well inside, pass.
    for (const ConformityDecision &d : a.verdict.limits)
        EXPECT_EQ(d.outcome, ConformityOutcome::Pass) << d.quantity << ": " << d.explanation;
    EXPECT_EQ(a.verdict.outcome, ConformityOutcome::Pass);
    EXPECT_NE(a.verdict.limitsSource.find("drawing D-1"), std::string::npos);
    ASSERT_TRUE(a.verdict.conformanceProbability);
    double lowest = 1.0;
    for (const ConformityDecision &d : a.verdict.limits)
        lowest = std::min(lowest, *d.conformanceProbability);
    EXPECT_DOUBLE_EQ(*a.verdict.conformanceProbability, lowest);

    // A tighter R limit: beyond it by more than U, so the whole verdict fails.
    const Assessment tight = assessFit(
        sweepFit(), setupWith(R"(,"specification":{"regulation_max_percent":12,"series_resistance_max_ohm":1.0})"), {});
    EXPECT_EQ(tight.verdict.outcome, ConformityOutcome::Fail);
}

TEST(ConformityAssessment, JudgedAtTheReferenceTemperatureWhenSet)
{
    // Measured cold (20 °C): regulation 9.506 % passes a 10.5 % limit; referred to 75 °C
    // (copper, IEEE C57.12.90: R × 1.216110, FACTS.md §3) it is 100·1.3377·2.0833/(26.4 - 2.787)
    // = 11.80 % (the wiggle moves the fit a little), and fails.
    const sagline::Setup setup = setupWith(R"(,"specification":{"regulation_max_percent":10.5})");
    AssessmentOptions options;
    const Assessment cold = assessFit(sweepFit(), setup, options);
    EXPECT_EQ(cold.verdict.outcome, ConformityOutcome::Pass);
    EXPECT_FALSE(cold.verdict.atReferenceTemperature);
    options.windingTemperatureC = 20.0;
    options.referenceTemperatureC = 75.0;
    const Assessment hot = assessFit(sweepFit(), setup, options);
    ASSERT_TRUE(hot.analysis.referredRegulationPercent);
    EXPECT_NEAR(hot.analysis.referredRegulationPercent->value, 11.80, 0.05);
    EXPECT_TRUE(hot.verdict.atReferenceTemperature);
    EXPECT_EQ(hot.verdict.outcome, ConformityOutcome::Fail);
    EXPECT_NE(hot.verdict.limits.front().quantity.find("at 75"), std::string::npos);
    // The winding temperature's uncertainty enters the referred results only.
    bool temperature = false;
    for (const BudgetComponent &c : hot.analysis.referredRegulationPercent->budget)
        temperature = temperature || c.source.rfind("winding temperature", 0) == 0;
    EXPECT_TRUE(temperature);
    for (const BudgetComponent &c : hot.analysis.regulationPercent.budget)
        EXPECT_NE(c.source.rfind("winding temperature", 0), 0u);
    // A reference temperature that is only a default is shown, not judged at.
    options.judgeAtReferenceTemperature = false;
    EXPECT_EQ(assessFit(sweepFit(), setup, options).verdict.outcome, ConformityOutcome::Pass);
}
