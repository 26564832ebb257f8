// A whole typed-in sweep driven through the window as a student would: type the nameplate,
// accept the plan, type 8 readings (one refused), check results, chart and session file.
#include "UiTestSupport.h"

#include "CautionStrip.h"
#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "ReadingsTableModel.h"
#include "ResultsPanel.h"
#include "SessionStore.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QFile>
#include <QPushButton>
#include <QTableView>

#include <cmath>

using namespace sagline;
using namespace sagline::test;

namespace {

// The invented transformer the readings come from (demo data, not a measurement).
constexpr double trueNoLoadV = 19.65;
constexpr double trueResistanceOhm = 0.52;
constexpr double noiseV[] = {0.006, -0.004, 0.003, -0.007, 0.005, -0.002, 0.004, -0.005};

} // namespace

TEST(TypedSweep, NameplateToResultsByKeyboardAndMouse)
{
    QTemporaryDir folder;
    ASSERT_TRUE(folder.isValid());
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    SetupForm *form = window->setupForm();

    // Enter the nameplate and bench as typed, units and all.
    typeInto(form->quantityField("nameplate.rated_power_va"), "60 VA");
    typeInto(form->quantityField("nameplate.primary_voltage_v"), "230 V");
    typeInto(form->quantityField("nameplate.frequency_hz"), "50");
    typeInto(form->quantityField("nameplate.secondary_voltage_v"), "18 V");
    typeInto(form->quantityField("nameplate.secondary_no_load_voltage_v"), "19,6 V");
    typeInto(form->quantityField("bench.steps"), "7");
    typeInto(form->quantityField("bench.rheostat.total_resistance_ohm"), "50 ohm"); // QTest types ASCII only; "Ω" is accepted too
    typeInto(form->quantityField("bench.rheostat.power_rating_w"), "600 W");
    typeInto(form->quantityField("bench.fuse.rating_a"), "500 mA");
    typeInto(form->quantityField("bench.dwell_s"), "1 s");
    SessionDetails details;
    details.operatorName = QStringLiteral("Test operator");
    details.unitSerial = QStringLiteral("UT-0042");
    details.ambientTemperature = QStringLiteral("22,5 °C");
    form->setSessionDetails(details);
    EXPECT_TRUE(form->shownErrors().isEmpty()) << form->shownErrors().join('\n').toStdString();

    // The plan: 8 steps (k = 0..7), the mains caution shown for a 230 V primary.
    const auto &plan = window->workspace()->plan();
    ASSERT_TRUE(plan.has_value());
    ASSERT_EQ(plan->steps.size(), 8u);
    EXPECT_TRUE(window->caution()->isCautionShown());
    EXPECT_EQ(window->planPanel()->table()->model()->rowCount(), 8);
    EXPECT_TRUE(window->planPanel()->summaryText().contains("NEC 450.3(B)"));

    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();
    EXPECT_TRUE(strip->recordButton()->isEnabled());
    EXPECT_TRUE(strip->instructionText().contains("Step 0")) << strip->instructionText().toStdString();

    // An invalid entry is refused with its rule under the field, and nothing is recorded.
    typeInto(strip->currentField(), "12 V");
    typeInto(strip->voltageField(), "19.6 V");
    QTest::mouseClick(strip->recordButton(), Qt::LeftButton);
    EXPECT_TRUE(window->workspace()->readings().empty());
    EXPECT_FALSE(strip->currentField()->error().isEmpty());
    EXPECT_TRUE(strip->currentField()->error().contains("ammeter")) << strip->currentField()->error().toStdString();
    EXPECT_TRUE(window->lastMessage().startsWith("Current I: ")) << window->lastMessage().toStdString(); // the label, not the key

    // Eight readings: typed, then Enter in the voltage field records (keyboard only).
    for (std::size_t k = 0; k < plan->steps.size(); ++k) {
        const double current = plan->steps[k].currentA;
        const double voltage = trueNoLoadV - trueResistanceOhm * current + noiseV[k];
        typeInto(strip->currentField(), QString::number(current * 1000.0, 'f', 1) + " mA");
        typeInto(strip->voltageField(), QString::number(voltage, 'f', 4).replace('.', ',') + " V");
        QTest::keyClick(strip->voltageField()->lineEdit(), Qt::Key_Return);
        ASSERT_EQ(window->workspace()->readings().size(), k + 1) << window->lastMessage().toStdString();
    }
    EXPECT_FALSE(window->workspace()->isRunning());
    window->flushCharts();

    // Results: R near the invented transformer's 0.52 Ω (noise is a few mV over 3.3 A).
    const QString shownR = window->results()->value("series_resistance");
    EXPECT_TRUE(shownR.endsWith("Ω")) << shownR.toStdString();
    EXPECT_NEAR(shownValue(shownR, Unit::Ohm), trueResistanceOhm, 0.01) << shownR.toStdString();
    EXPECT_NEAR(shownValue(window->results()->value("no_load_voltage"), Unit::Volt), trueNoLoadV, 0.01);
    // Regulation and a verdict by the decision rule are shown with the result.
    EXPECT_TRUE(window->results()->value("regulation").endsWith("%"));
    EXPECT_FALSE(window->results()->verdictText().isEmpty());
    // The chart holds the 8 points and a fitted line; the table the 8 readings.
    EXPECT_EQ(window->chart()->drawnIncludedCount(), 8);
    EXPECT_GE(window->chart()->drawnFitPointCount(), 2);
    EXPECT_EQ(window->readingsModel()->rowCount(), 8);

    // Report to PDF from the session (the store area's report writer).
    const QString pdf = folder.filePath("report.pdf");
    EXPECT_EQ(window->writeReport(pdf), QString());
    QFile written(pdf);
    ASSERT_TRUE(written.open(QIODevice::ReadOnly));
    EXPECT_TRUE(written.read(5).startsWith("%PDF-"));

    // The session file alone holds every reading.
    auto stored = SessionStore::openForReview(window->workspace()->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok()) << stored.message;
    EXPECT_EQ(stored.value->readings().value.size(), 8u);
}

TEST(TypedSweep, ExcludeAndRestoreKeepTheFitAndTheRecord)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->setupForm()->setSessionDetails({QStringLiteral("T"), QStringLiteral("S-1"), {}, {}});
    window->instrumentsPanel()->sourceBox()->setCurrentIndex(
        window->instrumentsPanel()->sourceBox()->findData(int(ReadingSource::TypedIn)));
    window->planPanel()->acceptButton()->click();
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    const char *typed[][2] = {{"0 A", "19.60 V"}, {"1 A", "19.10 V"}, {"2 A", "18.62 V"}, {"3 A", "17.00 V"}};
    for (const auto &reading : typed)
        ASSERT_TRUE(workspace->submitTyped(reading[0], reading[1], true).taken()); // round numbers, confirmed
    ASSERT_EQ(workspace->liveFit().count(), 4u);
    // Excluding needs a reason; the store refuses an empty one and the fit is unchanged.
    EXPECT_FALSE(workspace->exclude(3, QString()).isEmpty());
    EXPECT_EQ(workspace->liveFit().count(), 4u);
    ASSERT_TRUE(workspace->exclude(3, "lead slipped").isEmpty());
    EXPECT_EQ(workspace->liveFit().count(), 3u);
    window->flushCharts();
    EXPECT_EQ(window->chart()->drawnExcludedCount(), 1);
    EXPECT_EQ(window->chart()->drawnIncludedCount(), 3);
    ASSERT_TRUE(workspace->restore(3, "checked the lead").isEmpty());
    EXPECT_EQ(workspace->liveFit().count(), 4u);
    auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok());
    EXPECT_EQ(stored.value->exclusions().value.size(), 2u);
}
