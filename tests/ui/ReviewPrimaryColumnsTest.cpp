// The review table's efficiency-at-rated and no-load-loss columns: for a session with primary
// readings they hold the numbers the session's own summary (what `fit`, the report and `compare`
// print) gives, with U and k; for a session without, a dash and a tooltip that says why. The
// review PDF's summary table has the same two columns (read back with Debian's pdftotext).
#include "../core/ReviewTestSupport.h"

#include "ReviewTableModel.h"
#include "ReviewWindow.h"
#include "SessionSummary.h"
#include "UncertaintyFormat.h"

#include <QDir>
#include <QHeaderView>
#include <QProcess>
#include <QSignalSpy>
#include <QTableView>
#include <QTest>

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

namespace {

// The demo unit (ReviewTestSupport.h) with a mains-side analyser, a scenario of our own: at
// 230 V a no-load loss of 2.5 W and 9 var, the copper loss R·I2², the leakage X = 0.3 Ω; P1 =
// P2 + P0 + R·I2², Q1 = Q0 + X·I2², read with the stated u of a 0.5 % meter.
std::string makePrimarySession(const std::string &path, const DemoUnit &unit)
{
    NewSession session;
    session.setupJson = demoSetupJson(unit.ratedPowerVa, unit.design);
    session.operatorName = unit.operatorName;
    session.unitSerial = unit.serial;
    session.windingTemperatureC = unit.windingC;
    session.softwareVersion = "test";
    auto created = SessionStore::create(path, session);
    EXPECT_TRUE(created.ok()) << created.message;
    if (!created.ok())
        return path;
    for (Reading reading : demoReadings(unit)) {
        const double i = reading.currentA;
        reading.primary.voltageV = 230.0;
        reading.primary.uVoltageV = 0.5 / 100.0 * 230.0 / std::sqrt(3.0);
        reading.primary.powerW = reading.voltageV * i + 2.5 + unit.resistanceOhm * i * i;
        reading.primary.uPowerW = 0.5 / 100.0 * *reading.primary.powerW / std::sqrt(3.0) + 0.005;
        reading.primary.reactivePowerVar = 9.0 + 0.3 * i * i;
        reading.primary.uReactivePowerVar = 0.01 * *reading.primary.reactivePowerVar / std::sqrt(3.0) + 0.005;
        EXPECT_TRUE(created.value->appendReading(reading).ok());
    }
    return path;
}

QString shown(const UncertainValue &value, const char *unit)
{
    return QString::fromStdString(formatWithCoverage(value.value, value.expandedUncertainty, value.coverageFactor, unit));
}

} // namespace

TEST(ReviewPrimaryColumns, EfficiencyAndNoLoadLossAsTheSessionSummaryGivesThem)
{
    TempFolder folder;
    DemoUnit withPrimary;
    withPrimary.serial = "PRI-1";
    const std::string primaryPath = makePrimarySession(folder.file("with-primary.sagline"), withPrimary);
    DemoUnit without;
    without.serial = "SEC-1";
    makeDemoSession(folder.file("secondary-only.sagline"), without);

    const auto summary = loadSessionSummary(primaryPath);
    ASSERT_TRUE(summary.ok()) << summary.message;
    ASSERT_TRUE(summary.value.primarySide);
    ASSERT_TRUE(summary.value.primarySide->efficiencyAtRatedPercent);
    ASSERT_TRUE(summary.value.primarySide->openCircuit && summary.value.primarySide->openCircuit->noLoadLossW);
    const UncertainValue &efficiency = *summary.value.primarySide->efficiencyAtRatedPercent;
    const UncertainValue &noLoadLoss = *summary.value.primarySide->openCircuit->noLoadLossW;
    ASSERT_TRUE(efficiency.expandedUncertainty && noLoadLoss.expandedUncertainty);
    // P0 = 2.5 W as read at the rated 230 V (the scenario's own).
    EXPECT_NEAR(noLoadLoss.value, 2.5, 1e-9);

    auto window = std::make_unique<ReviewWindow>();
    QSignalSpy finished(window.get(), &ReviewWindow::scanFinished);
    window->addInputs({QString::fromStdString(folder.file("with-primary.sagline")),
                       QString::fromStdString(folder.file("secondary-only.sagline"))});
    ASSERT_TRUE(finished.wait(30000));
    const ReviewTableModel *model = window->model();
    ASSERT_EQ(model->rowCount(), 2);
    EXPECT_EQ(model->headerData(ReviewTableModel::EfficiencyAtRated, Qt::Horizontal).toString(), "η at rated ± U");
    EXPECT_EQ(model->headerData(ReviewTableModel::NoLoadLoss, Qt::Horizontal).toString(), "No-load loss ± U");
    int checked = 0;
    for (int row = 0; row < model->rowCount(); ++row) {
        const std::string serial = model->sessionRow(row).unitSerial;
        const QModelIndex eta = model->index(row, ReviewTableModel::EfficiencyAtRated);
        const QModelIndex p0 = model->index(row, ReviewTableModel::NoLoadLoss);
        if (serial == "PRI-1") {
            EXPECT_EQ(eta.data().toString(), shown(efficiency, "%"));
            EXPECT_EQ(p0.data().toString(), shown(noLoadLoss, "W"));
            EXPECT_DOUBLE_EQ(eta.data(ReviewTableModel::SortRole).toDouble(), efficiency.value);
            EXPECT_DOUBLE_EQ(p0.data(ReviewTableModel::SortRole).toDouble(), noLoadLoss.value);
            ++checked;
        } else {
            ASSERT_EQ(serial, "SEC-1");
            EXPECT_EQ(eta.data().toString(), "—");
            EXPECT_EQ(p0.data().toString(), "—");
            EXPECT_FALSE(eta.data(ReviewTableModel::SortRole).isValid()) << "blank cells sort last";
            EXPECT_TRUE(eta.data(Qt::ToolTipRole).toString().contains("No primary-side readings"));
            EXPECT_TRUE(p0.data(Qt::ToolTipRole).toString().contains("No primary-side readings"));
            ++checked;
        }
    }
    EXPECT_EQ(checked, 2);

    // The review PDF's summary page: the same columns, with their units, in the same words.
    const QString pdf = QString::fromStdString(folder.file("review.pdf"));
    ASSERT_EQ(window->exportPdf(pdf), QString());
    QProcess pdftotext;
    pdftotext.start(QStringLiteral("pdftotext"), {QStringLiteral("-layout"), pdf, QStringLiteral("-")});
    ASSERT_TRUE(pdftotext.waitForFinished(30000));
    const QString pdfText = QString::fromUtf8(pdftotext.readAllStandardOutput());
    const QString summaryPage = pdfText.section(QLatin1Char('\f'), 0, 0);
    // One line per unit in the primary side's table: its serial, then both cells whole.
    QString primaryLine, secondaryLine;
    for (const QString &line : summaryPage.split(QLatin1Char('\n'))) {
        if (line.contains(QStringLiteral("η at rated ± U"))) {
            EXPECT_TRUE(line.contains(QStringLiteral("No-load loss ± U"))) << line.toStdString();
        }
        if (line.contains(QStringLiteral("PRI-1")) && line.contains(QStringLiteral(" W ± ")))
            primaryLine = line;
        if (line.contains(QStringLiteral("SEC-1")) && line.count(QStringLiteral("—")) == 2)
            secondaryLine = line;
    }
    EXPECT_TRUE(summaryPage.contains(QStringLiteral("η at rated ± U"))) << summaryPage.toStdString();
    EXPECT_TRUE(primaryLine.contains(shown(efficiency, "%"))) << primaryLine.toStdString() << "\n" << summaryPage.toStdString();
    EXPECT_TRUE(primaryLine.contains(shown(noLoadLoss, "W"))) << primaryLine.toStdString();
    EXPECT_FALSE(secondaryLine.isEmpty()) << "the unit without primary readings has two dashes\n" << summaryPage.toStdString();

    // SAGLINE_SCREENSHOT_DIR: the table scrolled to the new columns, at 1366x768.
    const QString shots = qEnvironmentVariable("SAGLINE_SCREENSHOT_DIR");
    if (!shots.isEmpty()) {
        window->resize(1366, 768);
        window->show();
        ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
        window->table()->scrollTo(window->table()->model()->index(0, ReviewTableModel::NoLoadLoss));
        QDir().mkpath(shots);
        EXPECT_TRUE(window->grab().save(shots + QStringLiteral("/review-efficiency-columns-1366x768.png")));
    }
}
