// The results panel after a virtual-bench sweep of the demo setup: the results carry
// "U (k = …, 95 %)", the verdict is judged against the demo specification, and "Uncertainty
// budget…" opens every result's budget with the meters' gain and offset as rows (the virtual
// bench's own meters, recorded in the session's setup). Set SAGLINE_SHOTS_DIR to keep PNGs in its
// metrology/ folder: the window and the budget dialog over it at 1366×768 and 1600×1000.
#include "BudgetDialog.h"
#include "DemoSweep.h"
#include "ResultsPanel.h"
#include "ShotsAtWorkingSizes.h"
#include "UiTestSupport.h"

#include <QPainter>
#include <QPushButton>
#include <QTableWidget>
#include <QTemporaryDir>

#include <gtest/gtest.h>

#include <algorithm>

using namespace sagline;
using namespace sagline::test;

namespace {

void keepScreenshot(QWidget *widget, const QString &name)
{
    const QString folder = shotsFolder(QStringLiteral("metrology"));
    if (folder.isEmpty())
        return;
    widget->grab().save(folder + QLatin1Char('/') + name);
}

// The window with the budget dialog open over it, as a person at that screen size sees them:
// the dialog sized to fit inside the window and centred on it (the offscreen platform has no
// screen to photograph, so the two grabs are composed where the window manager would put them).
void keepScreenshotWithDialog(QWidget *window, QWidget *dialog, const QString &name)
{
    const QString folder = shotsFolder(QStringLiteral("metrology"));
    if (folder.isEmpty())
        return;
    QPixmap picture = window->grab();
    const QPixmap over = dialog->grab();
    QPainter painter(&picture);
    const QPoint at((picture.width() - over.width()) / 2, (picture.height() - over.height()) / 2);
    painter.fillRect(QRect(at + QPoint(4, 4), over.size()), QColor(0, 0, 0, 60)); // a shadow, so the edge shows
    painter.drawPixmap(at, over);
    painter.setPen(QColor(0x60, 0x60, 0x60));
    painter.drawRect(QRect(at, over.size()).adjusted(0, 0, -1, -1));
    painter.end();
    picture.save(folder + QLatin1Char('/') + name);
}

QStringList tableRows(QTableWidget *table)
{
    QStringList rows;
    for (int r = 0; r < table->rowCount(); ++r) {
        QStringList cells;
        for (int c = 0; c < table->columnCount(); ++c)
            cells << (table->item(r, c) ? table->item(r, c)->text() : QString());
        rows << cells.join(QLatin1Char('|'));
    }
    return rows;
}

} // namespace

TEST(BudgetDialog, TheDemoBudgetListsEachMetersGainAndOffset)
{
    QTemporaryDir folder;
    ASSERT_TRUE(folder.isValid());
    auto window = demoWindow(folder.path());
    window->resize(1366, 768);
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    const DemoResult demo = runVirtualBenchDemo(*window);
    ASSERT_TRUE(demo.ok) << demo.message.toStdString();

    ResultsPanel *results = window->results();
    EXPECT_TRUE(results->value(QStringLiteral("series_resistance")).contains(QStringLiteral(" ± ")));
    EXPECT_TRUE(results->value(QStringLiteral("uncertainty_basis")).contains(QStringLiteral("meters")))
        << results->value(QStringLiteral("uncertainty_basis")).toStdString();
    EXPECT_FALSE(results->verdictText().isEmpty());
    EXPECT_FALSE(results->verdictText().contains(QStringLiteral("NOT JUDGED"))) << results->verdictText().toStdString();
    ASSERT_TRUE(results->budgetButton()->isEnabled());
    keepScreenshot(window.get(), QStringLiteral("window-1366x768.png"));

    BudgetDialog dialog(results->budgets(), window.get());
    dialog.resize(std::min(1100, window->width() - 80), std::min(700, window->height() - 80));
    dialog.show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(&dialog));
    const QStringList rows = tableRows(dialog.table());
    const auto has = [&](const QString &text) {
        return std::any_of(rows.begin(), rows.end(), [&](const QString &row) { return row.contains(text); });
    };
    EXPECT_TRUE(has(QStringLiteral("Series resistance R (secondary)")));
    EXPECT_TRUE(has(QStringLiteral("U (k = ")));
    EXPECT_TRUE(has(QStringLiteral("voltmeter gain")));
    EXPECT_TRUE(has(QStringLiteral("ammeter offset")));
    EXPECT_TRUE(has(QStringLiteral("readings' scatter")) || has(QStringLiteral("readings' resolution")));
    // In the regulation's table the voltmeter gain is a row with sensitivity 0: it cancels.
    QString heading;
    bool cancels = false;
    for (const QString &row : rows) {
        const QStringList cells = row.split(QLatin1Char('|'));
        if (cells.mid(1).join(QString()).isEmpty()) { // a result's heading row
            heading = cells.front();
            continue;
        }
        if (heading.startsWith(QStringLiteral("Regulation (")) && cells.front().startsWith(QStringLiteral("voltmeter gain")))
            cancels = cells[4] == QStringLiteral("0") || cells[4].startsWith(QStringLiteral("0 "));
    }
    EXPECT_TRUE(cancels) << rows.join(QLatin1Char('\n')).toStdString();
    keepScreenshot(&dialog, QStringLiteral("budget-dialog.png"));
    keepScreenshotWithDialog(window.get(), &dialog, QStringLiteral("budget-in-window-1366x768.png"));
    window->resize(1600, 1000);
    dialog.resize(std::min(1300, window->width() - 80), std::min(860, window->height() - 80));
    runEventsUntil([] { return false; }, 200);
    keepScreenshot(window.get(), QStringLiteral("window-1600x1000.png"));
    keepScreenshotWithDialog(window.get(), &dialog, QStringLiteral("budget-in-window-1600x1000.png"));
}
