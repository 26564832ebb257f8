// The second look at a typed-in reading (core/TypedReadingCheck).
#include "TypedReadingCheck.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

// Step 3 of an invented 60 VA, 18 V sweep: about 0.417 A (i.e. 417 mA) and 19.4 V.
TypedExpectation stepThree()
{
    TypedExpectation expected;
    expected.step = 3;
    expected.currentA = 0.417;
    expected.ratedCurrentA = 3.33;
    expected.predictedVoltageV = 19.4;
    return expected;
}

} // namespace

TEST(TypedReadingCheck, CurrentTypedInAmperesForMilliamperesIsQuestioned)
{
    const TypedCheck check = checkTypedReading(stepThree(), 417.0, 19.4);
    ASSERT_TRUE(check.needsConfirmation);
    EXPECT_EQ(check.field, "reading.current_a");
    EXPECT_NE(check.message.find("417.0 mA step 3 expects"), std::string::npos) << check.message;
    EXPECT_NE(check.message.find("typed A for mA?"), std::string::npos) << check.message;
}

TEST(TypedReadingCheck, VoltageWithASlippedDecimalPointIsQuestioned)
{
    TypedExpectation expected = stepThree();
    expected.predictedVoltageV = 19.6;
    const TypedCheck check = checkTypedReading(expected, 0.42, 196.0);
    ASSERT_TRUE(check.needsConfirmation);
    EXPECT_EQ(check.field, "reading.voltage_v");
    EXPECT_NE(check.message.find("19.60 V step 3 expects"), std::string::npos) << check.message;
    EXPECT_NE(check.message.find("slipped decimal point"), std::string::npos) << check.message;
}

TEST(TypedReadingCheck, ValueOutsideThePredictionIntervalIsQuestioned)
{
    TypedExpectation expected = stepThree();
    expected.voltageInterval = std::pair{19.30, 19.42};
    EXPECT_FALSE(checkTypedReading(expected, 0.42, 19.36).needsConfirmation);
    const TypedCheck check = checkTypedReading(expected, 0.42, 19.10);
    ASSERT_TRUE(check.needsConfirmation);
    EXPECT_NE(check.message.find("outside the 19.30 V to 19.42 V"), std::string::npos) << check.message;
}

TEST(TypedReadingCheck, PlausibleReadingsPassWithoutAQuestion)
{
    EXPECT_FALSE(checkTypedReading(stepThree(), 0.41, 19.35).needsConfirmation);
    EXPECT_FALSE(checkTypedReading(stepThree(), 0.55, 19.0).needsConfirmation); // a hand-set load is rough
    TypedExpectation openCircuit = stepThree();
    openCircuit.step = 0;
    openCircuit.currentA = 0.0;
    EXPECT_FALSE(checkTypedReading(openCircuit, 0.0, 19.6).needsConfirmation);
    EXPECT_TRUE(checkTypedReading(openCircuit, 1.2, 19.6).needsConfirmation);
}
