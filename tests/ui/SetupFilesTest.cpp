// Setups as files from the window (the CLI's setup format), recent setups, nameplate presets,
// and messages that speak the form's labels rather than the file's keys.
#include "UiTestSupport.h"

#include "SetupJson.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QFile>
#include <QMenu>
#include <QMenuBar>

using namespace sagline;
using namespace sagline::test;

namespace {

void writeText(const QString &path, const QByteArray &text)
{
    QFile file(path);
    ASSERT_TRUE(file.open(QIODevice::WriteOnly));
    file.write(text);
}

} // namespace

TEST(SetupFiles, SavedSetupReadsBackInCoreAndOpensInTheForm)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    const QString formBefore = window->setupForm()->setupJson();

    // The extension says JSON: another one is refused, none gets ".json".
    EXPECT_TRUE(window->saveSetupFile(folder.filePath(QStringLiteral("setup.pdf"))).contains(QStringLiteral("must end in .json")));
    EXPECT_EQ(window->saveSetupFile(folder.filePath(QStringLiteral("unit-60va"))), QString());
    const QString saved = folder.filePath(QStringLiteral("unit-60va.json"));
    // Core (the CLI's reader) takes the file as it is and finds the demo nameplate.
    const SetupParse parsed = loadSetupFile(saved.toStdString());
    ASSERT_TRUE(parsed.setup.has_value()) << parsed.errors.front().message();
    EXPECT_DOUBLE_EQ(parsed.setup->nameplate.ratedPowerVa, 60.0);
    EXPECT_DOUBLE_EQ(parsed.setup->bench.dwellS, 5.0);

    // Another window opens it into its form; it is the first of the recent setups.
    auto other = demoWindow(folder.path());
    other->setupForm()->clearSetup();
    EXPECT_EQ(other->openSetupFile(saved), QString());
    EXPECT_EQ(other->recentSetups().value(0), QFileInfo(saved).absoluteFilePath());
    EXPECT_TRUE(other->workspace()->plan().has_value());
    EXPECT_EQ(other->workspace()->plan()->steps.size(), window->workspace()->plan()->steps.size());
    QMenu *recent = nullptr;
    for (QMenu *menu : other->menuBar()->findChildren<QMenu *>()) {
        if (menu->title() == QStringLiteral("Recent set&ups"))
            recent = menu;
    }
    ASSERT_NE(recent, nullptr);
    emit recent->aboutToShow();
    ASSERT_EQ(recent->actions().size(), 1);
    EXPECT_EQ(recent->actions().front()->text(), QStringLiteral("unit-60va.json"));
    EXPECT_EQ(window->setupForm()->setupJson(), formBefore); // saving changed nothing on the form
}

TEST(SetupFiles, ABadSetupNamesTheFieldsByTheirLabels)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    const QString bad = folder.filePath(QStringLiteral("bad.json"));
    writeText(bad, R"({"nameplate": {"rated_power_va": -5, "primary_voltage_v": 230, "secondary_voltage_v": 18,
                      "secondary_no_load_voltage_v": 19.6}, "bench": {"fuse_factor": 0}})");
    const QString message = window->openSetupFile(bad);
    EXPECT_TRUE(message.contains(QStringLiteral("Rated power: "))) << message.toStdString();
    EXPECT_FALSE(message.contains(QStringLiteral("nameplate.rated_power_va"))) << message.toStdString();
    EXPECT_FALSE(message.contains(QStringLiteral("bench.fuse_factor"))) << message.toStdString();
    EXPECT_TRUE(window->recentSetups().isEmpty());
    // The form kept what it had.
    EXPECT_EQ(window->setupForm()->quantityField(QStringLiteral("nameplate.rated_power_va"))->text(), QStringLiteral("60 VA"));
}

TEST(SetupFiles, NameplatePresetsComeBackIntoABlankForm)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    EXPECT_FALSE(window->saveNameplatePreset(QStringLiteral("  ")).isEmpty());
    EXPECT_EQ(window->saveNameplatePreset(QStringLiteral("PT-60 demo")), QString());
    EXPECT_TRUE(window->nameplatePresets().contains(QStringLiteral("PT-60 demo")));
    window->setupForm()->clearSetup();
    EXPECT_TRUE(window->setupForm()->quantityField(QStringLiteral("nameplate.rated_power_va"))->isBlank());
    ASSERT_TRUE(window->applyNameplatePreset(QStringLiteral("PT-60 demo")));
    EXPECT_EQ(window->setupForm()->quantityField(QStringLiteral("nameplate.rated_power_va"))->text(), QStringLiteral("60 VA"));
    EXPECT_EQ(window->setupForm()->quantityField(QStringLiteral("nameplate.secondary_no_load_voltage_v"))->text(),
              QStringLiteral("19.6 V"));
    EXPECT_FALSE(window->applyNameplatePreset(QStringLiteral("no such preset")));
}
