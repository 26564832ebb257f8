// The window's CSV export is the session's: shortest round-trip digits ("19.6", not
// "19.600000000000001"), the exclusion reason and who excluded, and a file name whose
// extension says CSV (".pdf" refused, none given: ".csv" added).
#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QFile>
#include <QPushButton>
#include <QTableView>

using namespace sagline;
using namespace sagline::test;

TEST(CsvExportWindow, ShortestDigitsReasonsAndACheckedExtension)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    answerPrompts(*window, {QStringLiteral("lead came loose")});
    window->setupForm()->setSessionDetails({QStringLiteral("Export tester"), QStringLiteral("EX-1"), QStringLiteral("20 °C"), {}});
    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();
    // Step 0 (open circuit) and step 1 of the demo plan, typed as a meter shows them.
    typeInto(strip->currentField(), QStringLiteral("0 A"));
    typeInto(strip->voltageField(), QStringLiteral("19.6 V"));
    strip->recordAction()->trigger();
    ASSERT_TRUE(waitUntil([&] { return window->workspace()->readings().size() == 1; }, 5000)) << window->lastMessage().toStdString();
    typeInto(strip->currentField(), QStringLiteral("0.417 A"));
    typeInto(strip->voltageField(), QStringLiteral("19.4 V"));
    strip->recordAction()->trigger();
    ASSERT_TRUE(waitUntil([&] { return window->workspace()->readings().size() == 2; }, 5000)) << window->lastMessage().toStdString();

    window->readingsView()->selectRow(1);
    for (QAction *action : window->readingsView()->actions()) {
        if (action->text().contains(QStringLiteral("xclude")))
            action->trigger();
    }
    ASSERT_TRUE(window->workspace()->readings()[1].excluded) << window->lastMessage().toStdString();
    EXPECT_TRUE(window->shownMessage().startsWith(QStringLiteral("Reading 2 excluded: lead came loose")))
        << window->shownMessage().toStdString();

    // A PDF name is refused and nothing is written.
    const QString pdf = folder.filePath(QStringLiteral("readings.pdf"));
    const QString refused = window->exportCsvTo(pdf);
    EXPECT_TRUE(refused.contains(QStringLiteral("must end in .csv"))) << refused.toStdString();
    EXPECT_FALSE(QFile::exists(pdf));

    // No extension: ".csv" is added.
    EXPECT_EQ(window->exportCsvTo(folder.filePath(QStringLiteral("readings"))), QString());
    QFile file(folder.filePath(QStringLiteral("readings.csv")));
    ASSERT_TRUE(file.open(QIODevice::ReadOnly));
    const QString csv = QString::fromUtf8(file.readAll());
    const QStringList lines = csv.split(QStringLiteral("\r\n"), Qt::SkipEmptyParts);
    ASSERT_EQ(lines.size(), 3) << csv.toStdString();
    EXPECT_TRUE(lines[0].contains(QStringLiteral("exclusion_reason,excluded_by"))) << lines[0].toStdString();
    EXPECT_TRUE(lines[1].startsWith(QStringLiteral("0,19.6,"))) << lines[1].toStdString();
    EXPECT_TRUE(lines[2].startsWith(QStringLiteral("0.417,19.4,"))) << lines[2].toStdString();
    EXPECT_FALSE(csv.contains(QStringLiteral("00000000"))) << csv.toStdString();
    EXPECT_TRUE(lines[2].contains(QStringLiteral(",true,lead came loose,") + testPerson)) << lines[2].toStdString();
}
