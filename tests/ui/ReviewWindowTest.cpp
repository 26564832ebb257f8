// The review workspace, offscreen: a folder scanned in the background, the table sorted and
// filtered, statistics and the far-from-batch flag, the overlay legend, a sign-off, CSV and
// PDF export, and a screenshot of the window for a person to look at.
#include "../core/ReviewTestSupport.h"

#include "ReviewDetailView.h"
#include "ReviewFilterModel.h"
#include "ReviewOverlayChart.h"
#include "ReviewTableModel.h"
#include "ReviewTrendChart.h"
#include "ReviewWindow.h"
#include "ShotsAtWorkingSizes.h"
#include "UncertaintyBudget.h"

#include <QDir>
#include <QRegularExpression>
#include <QFile>
#include <QSignalSpy>
#include <QTabWidget>
#include <QTableView>
#include <QTest>

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

namespace {

void makeFolder(const TempFolder &folder)
{
    std::filesystem::create_directories(folder.file("lab/week2"));
    const double resistances[] = {1.150, 1.152, 1.148, 1.151, 1.30};
    for (int i = 0; i < 5; ++i) {
        DemoUnit unit;
        unit.serial = "DEMO-000" + std::to_string(i + 1);
        unit.resistanceOhm = resistances[i];
        unit.operatorName = i % 2 ? "B. Second" : "A. Tester";
        makeDemoSession(folder.file(std::string(i < 3 ? "lab/" : "lab/week2/") + "unit" + std::to_string(i + 1) + ".sagline"), unit);
    }
    writeBytes(folder.file("lab/damaged.sagline"), "SQLite format 3\0garbage");
}

std::unique_ptr<ReviewWindow> scannedWindow(const TempFolder &folder)
{
    auto window = std::make_unique<ReviewWindow>();
    QSignalSpy finished(window.get(), &ReviewWindow::scanFinished);
    window->addInputs({QString::fromStdString(folder.file("lab"))});
    EXPECT_TRUE(window->isScanning());
    EXPECT_TRUE(finished.wait(30000)) << "scan did not finish";
    return window;
}

int proxyRowOf(ReviewWindow &window, const QString &serial)
{
    for (int r = 0; r < window.filter()->rowCount(); ++r)
        if (window.filter()->index(r, ReviewTableModel::Unit).data().toString() == serial)
            return r;
    return -1;
}

} // namespace

TEST(ReviewWindow, ScansAFolderAndListsTheBadFile)
{
    TempFolder folder;
    makeFolder(folder);
    auto window = scannedWindow(folder);
    EXPECT_EQ(window->model()->rowCount(), 6);
    EXPECT_NE(window->problemsText().indexOf(QStringLiteral("damaged.sagline")), -1) << window->problemsText().toStdString();
    EXPECT_NE(window->summaryText().indexOf(QStringLiteral("DEMO-0005")), -1) << "far from the batch";
    EXPECT_NE(window->summaryText().indexOf(QStringLiteral("Iglewicz")), -1);
    // Every number has its unit, and its U the k of its own budget (not a blanket k = 2).
    const QString r = window->filter()->index(proxyRowOf(*window, "DEMO-0001"), ReviewTableModel::Resistance).data().toString();
    EXPECT_TRUE(r.contains(QRegularExpression(QStringLiteral("Ω ± [0-9.]+ m?Ω \\(k = [0-9.]+\\)$")))) << r.toStdString();
    const SessionFigures &figures = window->model()->sessionRow(window->filter()->mapToSource(
        window->filter()->index(proxyRowOf(*window, "DEMO-0001"), 0)).row()).figures;
    ASSERT_TRUE(figures.resistanceK.has_value());
    EXPECT_TRUE(r.endsWith(QString::fromStdString("(" + coverageFactorText(*figures.resistanceK) + ")"))) << r.toStdString();
    const QString tip = window->model()->headerData(ReviewTableModel::Resistance, Qt::Horizontal, Qt::ToolTipRole).toString();
    EXPECT_EQ(tip.indexOf(QStringLiteral("k = 2)")), -1) << tip.toStdString();
    EXPECT_NE(tip.indexOf(QStringLiteral("t95(ν_eff)")), -1) << tip.toStdString();
}

TEST(ReviewWindow, SortsNumericallyAndFilters)
{
    TempFolder folder;
    makeFolder(folder);
    auto window = scannedWindow(folder);
    window->table()->sortByColumn(ReviewTableModel::Resistance, Qt::DescendingOrder);
    EXPECT_EQ(window->filter()->index(0, ReviewTableModel::Unit).data().toString(), "DEMO-0005");
    window->table()->sortByColumn(ReviewTableModel::Resistance, Qt::AscendingOrder);
    EXPECT_EQ(window->filter()->index(0, ReviewTableModel::Unit).data().toString(), "DEMO-0003");
    // The unreadable row has no R: last whichever way.
    EXPECT_EQ(window->filter()->index(5, ReviewTableModel::File).data().toString(), "damaged.sagline");

    window->filter()->setVerdict(QStringLiteral("unreadable"));
    EXPECT_EQ(window->filter()->rowCount(), 1);
    window->filter()->setVerdict({});
    window->filter()->setText(QStringLiteral("b. second"));
    EXPECT_EQ(window->filter()->rowCount(), 2);
    window->filter()->setText({});
    window->filter()->setDateRange(QDate(2000, 1, 1), QDate(2001, 1, 1));
    EXPECT_EQ(window->filter()->rowCount(), 0);
    window->filter()->setDateRange({}, {});
    EXPECT_EQ(window->filter()->rowCount(), 6);
    window->setColumnVisible(ReviewTableModel::Instruments, true);
    EXPECT_FALSE(window->table()->isColumnHidden(ReviewTableModel::Instruments));
}

TEST(ReviewWindow, OverlaySignOffExportAndScreenshot)
{
    TempFolder folder;
    makeFolder(folder);
    auto window = scannedWindow(folder);
    window->table()->sortByColumn(ReviewTableModel::Unit, Qt::AscendingOrder);
    window->table()->selectRow(0);
    QTest::keyClick(window->table(), Qt::Key_Down, Qt::ShiftModifier);
    QTest::keyClick(window->table(), Qt::Key_Down, Qt::ShiftModifier);
    EXPECT_EQ(window->overlay()->legendEntries(), QStringList({"DEMO-0001", "DEMO-0002", "DEMO-0003"}));
    EXPECT_EQ(window->overlay()->seriesCount(), 6); // readings and fitted line per session
    EXPECT_NE(window->summaryText().indexOf(QStringLiteral("Selection: 3")), -1) << window->summaryText().toStdString();

    const int row = window->filter()->mapToSource(window->filter()->index(proxyRowOf(*window, "DEMO-0002"), 0)).row();
    EXPECT_EQ(window->signOff(row, {"Lab Lead", ReviewDecision::Accepted, "consistent with the batch"}, true), QString());
    EXPECT_EQ(window->model()->sessionRow(row).reviewState(), "accepted");
    EXPECT_NE(window->detail()->historyText().indexOf(QStringLiteral("Lab Lead")), -1);
    EXPECT_FALSE(window->signOff(row, {"", ReviewDecision::Accepted, ""}, true).isEmpty()) << "a reviewer is required";

    const QString csv = QString::fromStdString(folder.file("review.csv"));
    EXPECT_EQ(window->exportCsv(csv), QString());
    QFile csvFile(csv);
    ASSERT_TRUE(csvFile.open(QIODevice::ReadOnly));
    EXPECT_EQ(csvFile.readAll().count('\n'), 4); // header + the 3 selected sessions
    const QString pdf = QString::fromStdString(folder.file("review.pdf"));
    EXPECT_EQ(window->exportPdf(pdf), QString());
    QFile pdfFile(pdf);
    ASSERT_TRUE(pdfFile.open(QIODevice::ReadOnly));
    EXPECT_TRUE(pdfFile.read(5).startsWith("%PDF-"));

    window->table()->clicked(window->filter()->index(proxyRowOf(*window, "DEMO-0002"), 0));
    // With the session detail shown, the window still fits a 1366 x 768 screen.
    ASSERT_EQ(window->tabs()->currentWidget(), window->detail());
    window->resize(1366, 768);
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    QTest::qWait(50);
    EXPECT_EQ(window->size(), QSize(1366, 768));
    EXPECT_LE(window->minimumSizeHint().height(), 768);
    EXPECT_TRUE(saveAtWorkingSizes(*window, shotsFolder(QStringLiteral("review")),
                                   {{window.get(), QStringLiteral("review-window")},
                                    {window->detail(), QStringLiteral("review-detail")}}));
}

TEST(ReviewWindow, GroupsThreeDesignsAndDrawsEachDesignsTrend)
{
    // A lab's folder: 20, 60 and 100 VA units of one family (scenario of our own), R tenfold apart.
    TempFolder folder;
    std::filesystem::create_directories(folder.file("lab"));
    const struct {
        double va;
        double r;
    } units[] = {{20, 6.10}, {60, 0.631}, {100, 0.301}, {20, 6.05}, {60, 0.628}, {100, 0.299}, {20, 6.12},
                 {60, 0.634}, {100, 0.303}, {60, 0.630}, {60, 0.629}, {60, 0.702}};
    int i = 0;
    for (const auto &spec : units) {
        DemoUnit unit;
        unit.serial = "LAB-" + std::to_string(++i);
        unit.resistanceOhm = spec.r;
        unit.ratedPowerVa = spec.va;
        unit.scatterV = 0.0005;
        makeDemoSession(folder.file("lab/unit" + std::to_string(i) + ".sagline"), unit);
    }
    auto window = std::make_unique<ReviewWindow>();
    QSignalSpy finished(window.get(), &ReviewWindow::scanFinished);
    window->addInputs({QString::fromStdString(folder.file("lab"))});
    ASSERT_TRUE(finished.wait(30000));
    ASSERT_EQ(window->model()->rowCount(), 12);
    const BatchStatistics &stats = window->model()->statistics();
    ASSERT_EQ(stats.designs.size(), 3u);
    // Within its design the 0.702 Ω unit is far (median 0.6305 Ω, MAD 0.002 Ω: z = 0.6745 × 0.0715 / 0.002 ≈ 24) and above the
    // 60 VA control limit; across designs nothing else is flagged.
    ASSERT_EQ(stats.farFromBatch.size(), 1u);
    EXPECT_EQ(window->model()->sessionRow(static_cast<int>(stats.farFromBatch[0])).unitSerial, "LAB-12");
    const QString summary = window->summaryText();
    EXPECT_NE(summary.indexOf(QStringLiteral("never across designs")), -1) << summary.toStdString();
    EXPECT_NE(summary.indexOf(QStringLiteral("20 VA 230/24 V 50 Hz toroidal copper")), -1);
    // The design column groups the table, smallest rating first (numbers in names by value).
    EXPECT_TRUE(window->filter()->index(0, ReviewTableModel::Design).data().toString().startsWith(QStringLiteral("20 VA")));
    EXPECT_TRUE(window->filter()->index(3, ReviewTableModel::Design).data().toString().startsWith(QStringLiteral("60 VA")));
    EXPECT_TRUE(window->filter()->index(11, ReviewTableModel::Design).data().toString().startsWith(QStringLiteral("100 VA")));
    // The verdict reads as the window and the reports spell it.
    EXPECT_EQ(window->filter()->index(0, ReviewTableModel::Design).data().toString(),
              window->filter()->index(1, ReviewTableModel::Design).data().toString());
    EXPECT_EQ(window->model()->headerData(ReviewTableModel::Review, Qt::Horizontal).toString(), "Reviewer's decision");
    EXPECT_EQ(window->filter()->index(0, ReviewTableModel::Verdict).data().toString(), "NOT JUDGED");
    EXPECT_NE(window->filter()->index(0, ReviewTableModel::Date).data().toString().indexOf(QLatin1Char(':')), -1)
        << "the start time, not only the date";

    ReviewTrendChart *trend = window->trend();
    ASSERT_EQ(trend->designCount(), 3);
    int sixty = -1;
    for (int d = 0; d < trend->designCount(); ++d) {
        trend->showDesign(d);
        if (trend->shownDesign().startsWith(QStringLiteral("60 VA")))
            sixty = d;
    }
    ASSERT_GE(sixty, 0);
    trend->showDesign(sixty);
    EXPECT_EQ(trend->pointCount(), 6);
    EXPECT_TRUE(trend->hasLimits());
    EXPECT_EQ(trend->outsideCount(), 1) << trend->noteText().toStdString();
    EXPECT_NE(trend->noteText().indexOf(QStringLiteral("LAB-12")), -1) << trend->noteText().toStdString();

    // For people to look at (SAGLINE_SHOTS_DIR): the table grouped by design with the summary,
    // then the trend tab with the 60 VA design's control chart.
    const QString shots = shotsFolder(QStringLiteral("review"));
    window->tabs()->setCurrentIndex(0);
    // The 60 VA design's six units selected: their readings and lines in the overlay.
    window->table()->clearSelection();
    for (int r = 0; r < window->filter()->rowCount(); ++r)
        if (window->filter()->index(r, ReviewTableModel::Design).data().toString().startsWith(QStringLiteral("60 VA")))
            window->table()->selectionModel()->select(window->filter()->index(r, 0),
                                                      QItemSelectionModel::Select | QItemSelectionModel::Rows);
    EXPECT_EQ(window->overlay()->legendEntries().size(), 6);
    window->table()->scrollTo(window->filter()->index(3, 0), QAbstractItemView::PositionAtTop);
    EXPECT_TRUE(saveAtWorkingSizes(*window, shots, {{window.get(), QStringLiteral("review-grouped-by-design")}}));
    window->tabs()->setCurrentWidget(trend);
    EXPECT_TRUE(saveAtWorkingSizes(*window, shots, {{window.get(), QStringLiteral("review-trend-chart")}}));
}
