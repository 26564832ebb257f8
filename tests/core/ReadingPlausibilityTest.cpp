// Readings from a file that no sweep of the nameplate could have taken (a slip of the decimal
// point or the unit) are named with their line and refused; the one that stopped a sweep just
// past its limit, and rows marked excluded, come in. The nameplate is invented (demo data).
#include "ReadingPlausibility.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

Setup demoSetup()
{
    Setup setup;
    setup.nameplate.ratedPowerVa = 50.0;
    setup.nameplate.primaryVoltageV = 230.0;
    setup.nameplate.secondaryVoltageV = 18.0;
    setup.nameplate.secondaryNoLoadVoltageV = 19.6;
    setup.bench.overloadFactor = 1.1; // hard limit 55 VA
    return setup;
}

Reading reading(double currentA, double voltageV, bool excluded = false)
{
    Reading r;
    r.currentA = currentA;
    r.voltageV = voltageV;
    r.excluded = excluded;
    return r;
}

} // namespace

TEST(ReadingPlausibility, ASlipOfTheDecimalPointIsNamedWithItsLine)
{
    // 417 typed for 0.417 A: 417 A x 19.4 V = 8090 VA against a 55 VA limit.
    const std::vector<Reading> readings{reading(0.0, 19.6), reading(417.0, 19.4), reading(0.8, 196.0)};
    const FieldErrors errors = implausibleReadings(readings, {2, 3, 4}, demoSetup());
    ASSERT_EQ(errors.size(), 2u);
    EXPECT_EQ(errors[0].field, "line 3, column current_a");
    EXPECT_NE(errors[0].rule.find("8.090 kVA"), std::string::npos) << errors[0].rule;
    EXPECT_NE(errors[0].rule.find("55.00 VA"), std::string::npos) << errors[0].rule;
    EXPECT_EQ(errors[1].field, "line 4, column voltage_v");
    EXPECT_NE(errors[1].rule.find("196.0 V"), std::string::npos) << errors[1].rule;
}

TEST(ReadingPlausibility, AReadingJustPastTheLimitAndExcludedRowsComeIn)
{
    // 3.2 A x 18 V = 57.6 VA: past the 55 VA limit (the reading that stopped a sweep), within 2x.
    const std::vector<Reading> readings{reading(3.2, 18.0), reading(417.0, 19.4, true), reading(0.0, 39.0)};
    EXPECT_TRUE(implausibleReadings(readings, {2, 3, 4}, demoSetup()).empty());
    // Just beyond twice the limit (110 VA) and twice the no-load voltage (39.2 V): refused.
    const std::vector<Reading> beyond{reading(6.2, 18.0), reading(0.0, 39.3)};
    EXPECT_EQ(implausibleReadings(beyond, {}, demoSetup()).size(), 2u);
    EXPECT_EQ(implausibleReadings(beyond, {}, demoSetup()).front().field, "reading 1, column current_a");
}

TEST(ReadingPlausibility, TheNoLoadVoltageFollowsFromTheRegulationWhenNotGiven)
{
    sagline::Setup setup = demoSetup();
    setup.nameplate.secondaryNoLoadVoltageV.reset();
    setup.nameplate.regulationPercent = 10.0; // 18 V x 1.10 = 19.8 V, twice is 39.6 V
    EXPECT_TRUE(implausibleReadings({reading(0.0, 39.5)}, {2}, setup).empty());
    EXPECT_EQ(implausibleReadings({reading(0.0, 39.7)}, {2}, setup).size(), 1u);
}
