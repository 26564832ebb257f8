// A session whose readings carry the primary voltage, from a supply that sags under load: the
// window's R, V0, voltage at rated current and regulation are those of the fit on the readings
// referred to the rated primary voltage, exactly as core's session summary (what `sagline-cli
// fit` and the report print) gives them; the results say which basis was used, and R as measured
// (which holds the supply's own impedance) is shown beside it.
#include "UiTestSupport.h"

#include "PlanJson.h"
#include "Planner.h"
#include "ResultsPanel.h"
#include "SessionStore.h"
#include "SessionSummary.h"
#include "SetupJson.h"
#include "UncertaintyFormat.h"

#include <gtest/gtest.h>

#include <array>
#include <cmath>

using namespace sagline;
using namespace sagline::test;

namespace {

Setup demoSetup()
{
    const auto parsed = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    EXPECT_TRUE(parsed.setup.has_value());
    return *parsed.setup;
}

// Every planned step read once. The unit at the rated supply gives V = V0 - R·I (plus a little
// scatter); the supply falls 3 % from no load to full load, so every secondary reading (V and I:
// the load is a resistor) is that point scaled by V1/V1,rated. The readings as measured fit an R
// about 0.03·V0/I_rated larger.
QString writeSaggingSupplySession(const QString &path, const Setup &setup, bool primaryVoltmeter = true)
{
    const Plan plan = *makePlan(setup).plan;
    NewSession session;
    session.setupJson = setupToJson(setup);
    session.planJson = planToJson(plan);
    session.operatorName = "Referral test";
    session.unitSerial = "REF-1";
    session.softwareVersion = "test";
    session.createdBy = {"Referral test", ""};
    auto created = SessionStore::create(path.toStdString(), session);
    if (!created.ok())
        return QString::fromStdString(created.message);
    static constexpr std::array<double, 5> noise{0.004, -0.003, 0.002, -0.005, 0.001};
    const double ratedV1 = setup.nameplate.primaryVoltageV;
    const double top = plan.steps.back().currentA;
    for (std::size_t k = 0; k < plan.steps.size(); ++k) {
        const PlanStep &step = plan.steps[k];
        const double referredV = plan.noLoadVoltageV - plan.seriesResistanceOhm * step.currentA + noise[k % noise.size()];
        const double v1 = ratedV1 * (1.0 - 0.03 * step.currentA / top);
        Reading reading;
        reading.step = step.index;
        reading.currentA = step.currentA * v1 / ratedV1;
        reading.voltageV = referredV * v1 / ratedV1;
        if (primaryVoltmeter) {
            reading.primary.voltageV = v1;
            reading.primary.uVoltageV = 0.005 * v1 / std::sqrt(3.0);
        }
        reading.flags = flagManual;
        reading.rawText = "test";
        if (!created.value->appendReading(reading).ok())
            return QStringLiteral("reading not stored");
    }
    return {};
}

QString shown(const UncertainValue &value, const char *unit)
{
    return QString::fromStdString(formatWithUncertainty(value.value, value.expandedUncertainty.value_or(0.0), unit));
}

} // namespace

TEST(ReferredFitWindow, ShowsTheSameResultsAsTheSessionSummaryAndSaysWhichBasis)
{
    QTemporaryDir folder;
    const QString path = folder.filePath(QStringLiteral("referred.sagline"));
    ASSERT_EQ(writeSaggingSupplySession(path, demoSetup()), QString());

    // Core's results for the session, as `sagline-cli fit` prints them (referred by default).
    const auto referred = loadSessionSummary(path.toStdString());
    ASSERT_TRUE(referred.ok()) << referred.message;
    ASSERT_EQ(referred.value.supply.fitVoltages, FitVoltages::Referred);
    ASSERT_TRUE(referred.value.analysis);
    const AnalysisResult &a = *referred.value.analysis;
    ReviewOptions rawOptions;
    rawOptions.fitVoltages = FitVoltages::Raw;
    const auto raw = loadSessionSummary(path.toStdString(), rawOptions);
    ASSERT_TRUE(raw.ok() && raw.value.analysis);
    const AnalysisResult &r = *raw.value.analysis;
    // The two bases differ by more than the shown digits: a window showing the raw fit fails below.
    ASSERT_NE(shown(a.seriesResistanceOhm, "Ω"), shown(r.seriesResistanceOhm, "Ω"));

    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    ASSERT_TRUE(window->openSessionFile(path)) << window->lastMessage().toStdString();
    window->flushCharts();
    const ResultsPanel *results = window->results();
    EXPECT_EQ(results->value(QStringLiteral("series_resistance")), shown(a.seriesResistanceOhm, "Ω"));
    EXPECT_EQ(results->value(QStringLiteral("no_load_voltage")), shown(a.noLoadVoltageV, "V"));
    EXPECT_EQ(results->value(QStringLiteral("full_load_voltage")), shown(a.fullLoadVoltageV, "V"));
    EXPECT_EQ(results->value(QStringLiteral("regulation")), shown(a.regulationPercent, "%"));
    EXPECT_EQ(results->value(QStringLiteral("fit_basis")), QStringLiteral("referred"));
    EXPECT_TRUE(results->note(QStringLiteral("fit_basis")).startsWith(QStringLiteral("Referred to rated primary voltage")))
        << results->note(QStringLiteral("fit_basis")).toStdString();
    // The raw R stays available, and is the raw fit's.
    EXPECT_EQ(results->value(QStringLiteral("series_resistance_as_measured")), shown(r.seriesResistanceOhm, "Ω"));
}

TEST(ReferredFitWindow, WithoutAPrimaryVoltmeterTheReadingsAsMeasuredAreFitted)
{
    // The same sagging supply, unmeasured: nothing to refer, the window shows the fit as measured
    // (core's summary says the supply is assumed at its rating) and adds no basis rows.
    QTemporaryDir folder;
    const QString path = folder.filePath(QStringLiteral("unmeasured.sagline"));
    ASSERT_EQ(writeSaggingSupplySession(path, demoSetup(), false), QString());
    const auto summary = loadSessionSummary(path.toStdString());
    ASSERT_TRUE(summary.ok() && summary.value.analysis);
    ASSERT_EQ(summary.value.supply.fitVoltages, FitVoltages::Raw);
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    ASSERT_TRUE(window->openSessionFile(path)) << window->lastMessage().toStdString();
    window->flushCharts();
    EXPECT_EQ(window->results()->value(QStringLiteral("series_resistance")),
              shown(summary.value.analysis->seriesResistanceOhm, "Ω"));
    EXPECT_TRUE(window->results()->value(QStringLiteral("fit_basis")).isEmpty());
    EXPECT_TRUE(window->results()->value(QStringLiteral("series_resistance_as_measured")).isEmpty());
}
