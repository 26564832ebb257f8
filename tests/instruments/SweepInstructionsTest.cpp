// The operator's texts for a plan step: three significant digits, mA below 1 A, kΩ from 1 kΩ,
// and the wording of a step started over after a lost link or a pause.
#include "SweepInstructions.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

PlanStep stepOf(int index, double currentA, double voltageV, std::optional<double> ohms)
{
    PlanStep step;
    step.index = index;
    step.currentA = currentA;
    step.predictedVoltageV = voltageV;
    step.loadResistanceOhm = ohms;
    return step;
}

} // namespace

TEST(SweepInstructions, SaysWhatToSetAndWhatToExpectInPlainUnits)
{
    // 11.94 V / 9.55 mA = 1250 Ω: shown as kΩ; a current below 1 A in mA.
    EXPECT_EQ(stepInstruction(stepOf(1, 0.00955, 11.94, 1250.0)).toStdString(),
              "set the load to about 1.25 kΩ; expect about 11.9 V and 9.55 mA");
    EXPECT_EQ(stepInstruction(stepOf(6, 2.5, 18.4, 7.36)).toStdString(), "set the load to about 7.36 Ω; expect about 18.4 V and 2.5 A");
    EXPECT_EQ(stepInstruction(stepOf(0, 0.0, 19.6, std::nullopt)).toStdString(),
              "disconnect the load (open circuit); expect about 19.6 V and 0 mA");
}

TEST(SweepInstructions, AStepStartedOverAsksToCheckAHandSetLoadAndSaysAProgrammableOneIsSetAgain)
{
    const PlanStep step = stepOf(3, 1.25, 19.0, 15.2);
    EXPECT_EQ(recheckInstruction(step, QStringLiteral("resumed"), false).toStdString(),
              "resumed: check the load is still at about 15.2 Ω for step 3, then confirm; expect about 19 V and 1.25 A");
    EXPECT_EQ(recheckInstruction(step, QStringLiteral("link restored"), true).toStdString(),
              "link restored: setting the load again to about 15.2 Ω for step 3; expect about 19 V and 1.25 A");
    const PlanStep open = stepOf(0, 0.0, 19.6, std::nullopt);
    EXPECT_EQ(recheckInstruction(open, QStringLiteral("resumed"), false).toStdString(),
              "resumed: check the load is still disconnected (open circuit) for step 0, then confirm; expect about 19.6 V and 0 mA");
    EXPECT_EQ(recheckInstruction(open, QStringLiteral("resumed"), true).toStdString(),
              "resumed: opening the load again for step 0; expect about 19.6 V and 0 mA");
}
