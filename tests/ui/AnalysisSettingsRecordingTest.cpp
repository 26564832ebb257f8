// The window stores its verdict settings in the session (core/AnalysisSettingsRecord.h) when the
// sweep starts and again when they change, and shows a reopened session's stored settings.
#include "UiTestSupport.h"

#include "AnalysisSettingsRecord.h"
#include "InstrumentsPanel.h"
#include "PlanPanel.h"
#include "SessionStore.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QPushButton>

using namespace sagline;
using namespace sagline::test;

namespace {

std::vector<AnalysisSettings> storedRecords(const SessionStore &store)
{
    std::vector<AnalysisSettings> records;
    const auto notes = store.notes();
    EXPECT_TRUE(notes.ok()) << notes.message;
    for (const NoteRecord &note : notes.value) {
        if (note.author != analysisSettingsNoteAuthor)
            continue;
        const AnalysisSettingsParse parse = parseAnalysisSettings(note.text);
        EXPECT_TRUE(parse.settings) << note.text;
        if (parse.settings)
            records.push_back(*parse.settings);
    }
    return records;
}

QComboBox *combo(SetupForm *form, const char *name)
{
    for (QComboBox *box : form->findChildren<QComboBox *>())
        if (box->accessibleName() == QLatin1String(name))
            return box;
    return nullptr;
}

} // namespace

TEST(AnalysisSettingsRecording, StartingASweepAndChangingSettingsWriteRecords)
{
    QTemporaryDir folder;
    ASSERT_TRUE(folder.isValid());
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    SetupForm *form = window->setupForm();
    QComboBox *rule = combo(form, "verdict.decision_rule");
    ASSERT_NE(rule, nullptr);
    rule->setCurrentIndex(rule->findData(int(DecisionRule::Simple)));
    typeInto(form->quantityField("verdict.regulation_limit_percent"), "4,5 %");
    EXPECT_EQ(window->workspace()->store(), nullptr); // nothing to write into yet
    SessionDetails details;
    details.operatorName = QStringLiteral("Test operator");
    details.unitSerial = QStringLiteral("UT-0043");
    details.ambientTemperature = QStringLiteral("22 °C");
    form->setSessionDetails(details);

    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();
    SessionStore *store = window->workspace()->store();
    ASSERT_NE(store, nullptr);
    auto records = storedRecords(*store);
    ASSERT_EQ(records.size(), 1u);
    EXPECT_EQ(records[0].rule, DecisionRule::Simple);
    ASSERT_TRUE(records[0].regulationLimitPercent);
    EXPECT_DOUBLE_EQ(*records[0].regulationLimitPercent, 4.5);
    EXPECT_FALSE(records[0].referenceTemperatureC);
    EXPECT_FALSE(records[0].temperatureConstant);

    // A change while the session is open is stored once typing pauses.
    rule->setCurrentIndex(rule->findData(int(DecisionRule::Guarded)));
    ASSERT_TRUE(waitUntil([&] { return storedRecords(*store).size() == 2; }));
    records = storedRecords(*store);
    EXPECT_EQ(records.back().rule, DecisionRule::Guarded);
    EXPECT_DOUBLE_EQ(records.back().regulationLimitPercent.value_or(0.0), 4.5);

    // A value that does not parse is not stored; the message names the field by its label.
    typeInto(form->quantityField("verdict.regulation_limit_percent"), "lots");
    ASSERT_TRUE(waitUntil([&] { return window->lastMessage().startsWith("Regulation limit: "); }))
        << window->lastMessage().toStdString();
    EXPECT_EQ(storedRecords(*store).size(), 2u);

    // Reopened, the session shows the settings it was last judged with.
    const QString path = window->workspace()->sessionPath();
    window->workspace()->stop();
    auto reopened = demoWindow(folder.path());
    ASSERT_TRUE(reopened->openSessionFile(path)) << reopened->lastMessage().toStdString();
    const VerdictSettings shown = reopened->setupForm()->verdictSettings();
    EXPECT_EQ(shown.rule, DecisionRule::Guarded);
    EXPECT_EQ(shown.regulationLimit, QStringLiteral("4.5"));
}
