#include "FuseStandards.h"
#include "Planner.h"
#include "TransformerFormulas.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace sagline;

namespace {

// A scenario of our own: 50 VA, 230 V to 12 V, 13.2 V at no load, laminated core.
Setup exampleSetup()
{
    sagline::Setup setup;
    setup.nameplate.ratedPowerVa = 50.0;
    setup.nameplate.primaryVoltageV = 230.0;
    setup.nameplate.frequencyHz = 50.0;
    setup.nameplate.secondaryVoltageV = 12.0;
    setup.nameplate.secondaryNoLoadVoltageV = 13.2;
    setup.bench.steps = 10;
    setup.bench.rheostat = Rheostat{100.0, 50.0};
    return setup;
}

Plan planOf(const Setup &setup)
{
    const PlanResult result = makePlan(setup);
    EXPECT_TRUE(result.plan.has_value());
    for (const auto &e : result.errors)
        ADD_FAILURE() << e.message();
    return result.plan.value_or(Plan{});
}

} // namespace

// Regulation with the full-load voltage as base, the electric-machines textbook definition
// (FACTS.md §4): 240 V no-load, 230 V full-load -> 4.35 %; 12.6 V / 12.0 V -> 5.000 %.
TEST(TransformerFormulas, RegulationUsesTheFullLoadVoltageAsBase)
{
    EXPECT_NEAR(formulas::regulationPercent(240.0, 230.0), 4.3478, 1e-4);
    EXPECT_NEAR(formulas::regulationPercent(12.6, 12.0), 5.000, 1e-12);
    EXPECT_NEAR(formulas::noLoadVoltageFromRegulation(12.0, 5.0), 12.6, 1e-12);
}

// Rheostat rule (common practice; FACTS.md §9): only the engaged track dissipates, so
// I_max = sqrt(P/R_total): 100 ohm, 50 W -> 0.7071 A at any setting.
TEST(TransformerFormulas, RheostatSafeCurrentIsTheSameAtEverySetting)
{
    EXPECT_NEAR(formulas::rheostatSafeCurrent(50.0, 100.0), 0.70711, 1e-5);
    // At a 25 ohm setting the allowed power is 25/100 of 50 W = 12.5 W = 0.5 A^2 x 25 ohm... at 0.7071 A.
    const double i = formulas::rheostatSafeCurrent(50.0, 100.0);
    EXPECT_NEAR(i * i * 25.0, 50.0 * 25.0 / 100.0, 1e-9);
}

TEST(Planner, ComputesRatedCurrentsRatioResistanceAndRegulation)
{
    const Plan plan = planOf(exampleSetup());
    EXPECT_NEAR(plan.ratedSecondaryCurrentA, 50.0 / 12.0, 1e-12);
    EXPECT_NEAR(plan.ratedPrimaryCurrentA, 50.0 / 230.0, 1e-12);
    EXPECT_NEAR(plan.turnsRatio, 230.0 / 13.2, 1e-12);
    EXPECT_NEAR(plan.seriesResistanceOhm, (13.2 - 12.0) / (50.0 / 12.0), 1e-12);
    EXPECT_NEAR(plan.regulationPercent, 10.0, 1e-12);
    ASSERT_EQ(plan.steps.size(), 11u);
    EXPECT_EQ(plan.steps.front().index, 0);
    EXPECT_FALSE(plan.steps.front().loadResistanceOhm.has_value());
    EXPECT_NEAR(plan.steps.back().predictedVoltageV, 12.0, 1e-12);
    EXPECT_NEAR(plan.steps.back().outputVa, 50.0, 1e-9);
}

TEST(Planner, DerivesNoLoadVoltageFromRegulation)
{
    sagline::Setup setup = exampleSetup();
    setup.nameplate.secondaryNoLoadVoltageV.reset();
    setup.nameplate.regulationPercent = 10.0;
    const Plan plan = planOf(setup);
    EXPECT_NEAR(plan.noLoadVoltageV, 13.2, 1e-12);
    EXPECT_NEAR(plan.seriesResistanceOhm, 0.288, 1e-12);
}

TEST(Planner, PredictedVoltageFallsAndVaMarginShrinksWithCurrent)
{
    const Plan plan = planOf(exampleSetup());
    for (std::size_t k = 1; k < plan.steps.size(); ++k) {
        EXPECT_GT(plan.steps[k].currentA, plan.steps[k - 1].currentA);
        EXPECT_LT(plan.steps[k].predictedVoltageV, plan.steps[k - 1].predictedVoltageV);
        EXPECT_LT(plan.steps[k].vaMargin, plan.steps[k - 1].vaMargin);
        EXPECT_GT(plan.steps[k].copperLossW, plan.steps[k - 1].copperLossW);
        EXPECT_GT(plan.steps[k].primaryCurrentA, plan.steps[k - 1].primaryCurrentA);
    }
}

TEST(Planner, LoadResistanceTimesCurrentEqualsPredictedVoltage)
{
    const Plan plan = planOf(exampleSetup());
    for (const PlanStep &step : plan.steps) {
        if (step.index == 0)
            continue;
        ASSERT_TRUE(step.loadResistanceOhm);
        EXPECT_NEAR(*step.loadResistanceOhm * step.currentA, step.predictedVoltageV, 1e-12);
        EXPECT_NEAR(step.loadPowerW, step.predictedVoltageV * step.currentA, 1e-12);
        EXPECT_NEAR(step.outputVa + step.vaMargin, 50.0, 1e-12);
    }
}

TEST(Planner, PrimaryCurrentAddsMagnetizingCurrentInQuadrature)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.magnetizingFraction = 0.1;
    const Plan plan = planOf(setup);
    const double im = 0.1 * 50.0 / 230.0;
    EXPECT_NEAR(plan.steps.front().primaryCurrentA, im, 1e-12);
    const PlanStep &top = plan.steps.back();
    EXPECT_NEAR(top.primaryCurrentA, std::hypot(top.currentA / plan.turnsRatio, im), 1e-12);
}

TEST(Planner, RecommendsTheNextR10TimeLagFuseAndTheNecCeiling)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.fuseFactor = 1.6; // FACTS.md §10 check: 50 VA, 230 V, 1.6 x I1 -> T 400 mA
    const Plan plan = planOf(setup);
    EXPECT_DOUBLE_EQ(plan.recommendedFuse.ratingA, 0.4);
    EXPECT_EQ(plan.recommendedFuse.type, FuseType::TimeLag);
    EXPECT_NEAR(plan.maxPrimaryProtectionA, 3.0 * 50.0 / 230.0, 1e-12); // below 2 A: 300 %
}

TEST(Planner, DefaultFuseFactorDependsOnConstructionAndIsReported)
{
    sagline::Setup setup = exampleSetup();
    setup.nameplate.construction = Construction::Toroidal;
    const Plan plan = planOf(setup);
    EXPECT_DOUBLE_EQ(plan.recommendedFuse.factor, defaultFuseFactor(Construction::Toroidal));
    EXPECT_NE(std::find(plan.defaultsUsed.begin(), plan.defaultsUsed.end(), "bench.fuse_factor"), plan.defaultsUsed.end());
}

// Outlook against the IEC 60127-2 gates: holds below 1.5 In, may open from 1.5 In, opens
// from 2.1 In.
TEST(Planner, FuseOutlookFollowsTheGates)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.magnetizingFraction = 0.0;
    setup.bench.steps = 100;
    setup.bench.fuse = FuseSpec{0.1, FuseType::TimeLag}; // deliberately small: full load draws about 0.19 A
    const Plan plan = planOf(setup);
    bool sawEach[3] = {false, false, false};
    for (const PlanStep &step : plan.steps) {
        const double multiple = step.primaryCurrentA / 0.1;
        const FuseOutlook expected = multiple >= 2.1   ? FuseOutlook::Opens
                                     : multiple >= 1.5 ? FuseOutlook::MayOpen
                                                       : FuseOutlook::Holds;
        EXPECT_EQ(step.fuseOutlook, expected) << "step " << step.index << " at " << multiple << " x In";
        sawEach[static_cast<int>(step.fuseOutlook)] = true;
    }
    EXPECT_TRUE(sawEach[0] && sawEach[1]);
    EXPECT_FALSE(plan.warnings.empty());
}

TEST(Planner, FlagsStepsBeyondTheRheostat)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.rheostat = Rheostat{20.0, 10.0}; // safe current sqrt(10/20) = 0.707 A; step 1 needs 31 ohm
    const Plan plan = planOf(setup);
    ASSERT_TRUE(plan.rheostatSafeCurrentA);
    EXPECT_NEAR(*plan.rheostatSafeCurrentA, std::sqrt(0.5), 1e-12);
    EXPECT_TRUE(plan.steps[0].rheostatOk);
    EXPECT_FALSE(plan.steps[1].rheostatOk); // setting above the 20 ohm track
    EXPECT_FALSE(plan.steps.back().rheostatOk); // current above the safe current
    EXPECT_FALSE(plan.warnings.empty());
}

TEST(Planner, RefusesATopStepAboveRatedVaUnlessOverloadAllowed)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.topFraction = 1.05;
    setup.bench.overloadFactor = 1.0;
    PlanResult refused = makePlan(setup);
    ASSERT_FALSE(refused.plan);
    ASSERT_FALSE(refused.errors.empty());
    EXPECT_EQ(refused.errors[0].field, "bench.top_fraction");
    EXPECT_NE(refused.errors[0].rule.find("allow_overload"), std::string::npos);

    setup.bench.overloadFactor = 1.1;
    EXPECT_TRUE(makePlan(setup).plan);

    setup.bench.overloadFactor = 1.0;
    setup.bench.allowOverload = true;
    EXPECT_TRUE(makePlan(setup).plan);
}

TEST(Planner, TopFractionAbove1Point1NeedsAllowOverload)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.topFraction = 1.2;
    setup.bench.overloadFactor = 1.5;
    const PlanResult refused = makePlan(setup);
    ASSERT_FALSE(refused.plan);
    EXPECT_EQ(refused.errors.back().field, "bench.top_fraction");
    setup.bench.allowOverload = true;
    EXPECT_TRUE(makePlan(setup).plan);
}

TEST(Planner, RefusesInvalidSetupsBuiltInCodeWithoutNaN)
{
    sagline::Setup setup = exampleSetup();
    setup.nameplate.ratedPowerVa = 0.0;
    setup.nameplate.secondaryNoLoadVoltageV = 11.0;
    PlanResult result = makePlan(setup);
    EXPECT_FALSE(result.plan);
    ASSERT_FALSE(result.errors.empty());
    EXPECT_EQ(result.errors[0].field, "nameplate.rated_power_va");

    setup = exampleSetup();
    setup.nameplate.secondaryNoLoadVoltageV = 11.0;
    result = makePlan(setup);
    ASSERT_FALSE(result.plan);
    EXPECT_EQ(result.errors[0].field, "nameplate.secondary_no_load_voltage_v");

    setup = exampleSetup();
    setup.nameplate.primaryVoltageV = std::nan("");
    result = makePlan(setup);
    ASSERT_FALSE(result.plan);
    EXPECT_EQ(result.errors[0].field, "nameplate.primary_voltage_v");
}

TEST(Planner, TotalTimeCountsEveryPointsDwell)
{
    sagline::Setup setup = exampleSetup();
    setup.bench.dwellS = 12.0;
    EXPECT_DOUBLE_EQ(planOf(setup).totalTimeS, 11 * 12.0);
}

// The default hard stop sits above a top step at rated load (DESIGN.md: overload_factor 1.1),
// so meter scatter at full load does not trip it.
TEST(Planner, DefaultHardStopLeavesRoomAboveRatedLoad)
{
    const Plan plan = planOf(exampleSetup());
    EXPECT_DOUBLE_EQ(sagline::Setup{}.bench.overloadFactor, 1.1);
    EXPECT_NEAR(plan.overloadLimitVa, 55.0, 1e-9);
    EXPECT_LT(plan.steps.back().outputVa * 1.05, plan.overloadLimitVa);
}
