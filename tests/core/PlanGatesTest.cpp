// Plausibility gates on the nameplate and the unsafe-step gate (core/PlanGates).
#include "PlanGates.h"
#include "Planner.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

// A scenario of our own: 60 VA, 230 V to 18 V at full load, 19.6 V no-load.
sagline::Setup sixtyVa()
{
    sagline::Setup setup;
    setup.nameplate.ratedPowerVa = 60.0;
    setup.nameplate.primaryVoltageV = 230.0;
    setup.nameplate.secondaryVoltageV = 18.0;
    setup.nameplate.secondaryNoLoadVoltageV = 19.6;
    setup.bench.steps = 12;
    return setup;
}

bool names(const FieldErrors &errors, const std::string &field, const std::string &words)
{
    for (const FieldError &error : errors)
        if (error.field == field && error.rule.find(words) != std::string::npos)
            return true;
    return false;
}

} // namespace

TEST(PlanGates, SecondaryTypedInMillivoltsIsRefusedNamingTheField)
{
    sagline::Setup setup = sixtyVa();
    setup.nameplate.secondaryVoltageV = 0.018; // "18 mV" typed for 18 V
    const PlanResult result = makePlan(setup);
    ASSERT_FALSE(result.plan);
    std::string all;
    for (const FieldError &error : result.errors)
        all += error.message() + "\n";
    EXPECT_TRUE(names(result.errors, "nameplate.secondary_voltage_v", "typed in mV?")) << all;
    EXPECT_TRUE(names(result.errors, "nameplate.secondary_voltage_v", "18 V would fit")) << all;
    // The regulation it implies and the current the bench would need are named too.
    EXPECT_TRUE(names(result.errors, "nameplate.secondary_voltage_v", "IEC 61558-1"));
    EXPECT_TRUE(names(result.errors, "nameplate.rated_power_va", "3333 A"));
}

TEST(PlanGates, RegulationAboveTheBoundIsRefused)
{
    sagline::Setup setup = sixtyVa();
    setup.nameplate.secondaryVoltageV = 9.0;
    setup.nameplate.secondaryNoLoadVoltageV = 19.6; // 118 %: no VA class allows it
    const PlanResult result = makePlan(setup);
    ASSERT_FALSE(result.plan);
    EXPECT_TRUE(names(result.errors, "nameplate.secondary_voltage_v", "118 %"));
    setup.nameplate.secondaryVoltageV = 10.0; // 96 %: a tiny short-circuit-proof unit could
    EXPECT_TRUE(makePlan(setup).plan);
}

TEST(PlanGates, StepUpBeyondTenTimesIsRefused)
{
    sagline::Setup setup = sixtyVa();
    setup.nameplate.primaryVoltageV = 23.0;
    setup.nameplate.secondaryVoltageV = 240.0;
    setup.nameplate.secondaryNoLoadVoltageV = 250.0;
    const PlanResult result = makePlan(setup);
    ASSERT_FALSE(result.plan);
    EXPECT_TRUE(names(result.errors, "nameplate.secondary_voltage_v", "times the primary"));
}

TEST(PlanGates, PlausibleNameplatePassesUntouched)
{
    EXPECT_TRUE(nameplatePlausibilityErrors(sixtyVa().nameplate, 19.6).empty());
    EXPECT_TRUE(makePlan(sixtyVa()).plan);
}

TEST(PlanGates, RheostatAndFuseLimitsNameTheUnsafeSteps)
{
    sagline::Setup setup = sixtyVa();
    // Safe current sqrt(25 W / 25 Ω) = 1 A of a 3.33 A rated secondary: steps 4 to 12 too much.
    setup.bench.rheostat = Rheostat{25.0, 25.0};
    const PlanResult result = makePlan(setup);
    ASSERT_TRUE(result.plan);
    const auto unsafe = unsafeSteps(*result.plan);
    ASSERT_FALSE(unsafe.empty());
    EXPECT_EQ(unsafe.front().index, 1); // 0.28 A into about 70 Ω: beyond the 25 Ω track
    EXPECT_EQ(unsafe.back().index, 12);
    const std::string text = describeUnsafeSteps(unsafe);
    EXPECT_NE(text.find("steps 4 to 12: current above the rheostat's safe 1.00 A"), std::string::npos) << text;
    EXPECT_NE(text.find("setting above the rheostat's track"), std::string::npos) << text;

    const Plan safe = truncatedToSafe(*result.plan);
    EXPECT_TRUE(unsafeSteps(safe).empty());
    ASSERT_FALSE(safe.steps.empty());
    EXPECT_EQ(safe.steps.front().index, 0);
    for (const PlanStep &step : safe.steps)
        EXPECT_LE(step.currentA, 1.0);
    EXPECT_NE(safe.warnings.back().find("cut to the safe steps"), std::string::npos);
}

TEST(PlanGates, FuseThatOpensMakesAStepUnsafe)
{
    sagline::Setup setup = sixtyVa();
    setup.bench.fuse = FuseSpec{0.125, FuseType::QuickActing}; // rated primary current is 0.26 A
    const PlanResult result = makePlan(setup);
    ASSERT_TRUE(result.plan);
    const auto unsafe = unsafeSteps(*result.plan);
    ASSERT_FALSE(unsafe.empty());
    EXPECT_NE(describeUnsafeSteps(unsafe).find("the primary fuse (125 mA quick-acting) opens"), std::string::npos)
        << describeUnsafeSteps(unsafe);
}

TEST(PlanGates, SafePlanHasNoUnsafeSteps)
{
    sagline::Setup setup = sixtyVa();
    setup.bench.rheostat = Rheostat{200.0, 4000.0}; // safe current 4.47 A
    const PlanResult result = makePlan(setup);
    ASSERT_TRUE(result.plan);
    EXPECT_TRUE(unsafeSteps(*result.plan).empty()) << describeUnsafeSteps(unsafeSteps(*result.plan));
}
