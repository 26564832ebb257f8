// Inline validation in the setup form: the field and the rule, as core words them.
#include "UiTestSupport.h"

#include "PlanPanel.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QPushButton>

using namespace sagline;
using namespace sagline::test;

TEST(SetupForm, WrongUnitIsShownUnderItsFieldAndBlocksThePlan)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    ASSERT_TRUE(window->workspace()->plan().has_value());
    EXPECT_TRUE(window->planPanel()->acceptButton()->isEnabled());

    QuantityField *power = window->setupForm()->quantityField("nameplate.rated_power_va");
    typeInto(power, "60 A");
    EXPECT_FALSE(window->workspace()->plan().has_value());
    EXPECT_FALSE(power->error().isEmpty());
    EXPECT_FALSE(window->planPanel()->acceptButton()->isEnabled());
    // The message names the field (status line) and the rule (under the field).
    EXPECT_TRUE(window->lastMessage().startsWith("Rated power: ")) << window->lastMessage().toStdString(); // the label, not the key

    typeInto(power, "60 VA");
    EXPECT_TRUE(power->error().isEmpty());
    EXPECT_TRUE(window->workspace()->plan().has_value());
}

TEST(SetupForm, MissingNoLoadVoltageAndRegulationIsRefused)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    typeInto(window->setupForm()->quantityField("nameplate.secondary_no_load_voltage_v"), "");
    EXPECT_FALSE(window->workspace()->plan().has_value());
    EXPECT_FALSE(window->setupForm()->shownErrors().isEmpty());
}

TEST(SetupForm, AcceptWithoutOperatorNamesTheMissingField)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->setupForm()->setSessionDetails({});
    window->planPanel()->acceptButton()->click();
    EXPECT_FALSE(window->workspace()->isRunning());
    EXPECT_TRUE(window->lastMessage().contains("operator")) << window->lastMessage().toStdString();
}
