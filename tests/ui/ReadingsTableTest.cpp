// The readings table beside the results: the reading the batch fit calls an outlier is marked
// in its row (symbol and word, not colour alone), and only that one.
#include "UiTestSupport.h"

#include "ReadingsTableModel.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

using namespace sagline;
using namespace sagline::test;

namespace {

// Invented readings (demo data): V = 19.6 V − 0.5 Ω · I with a few mV of scatter, and one
// reading 0.2 V low, far outside it.
constexpr double scatterV[] = {0.003, -0.002, 0.004, -0.003, 0.001, -0.004, 0.002, -0.001, 0.003};
constexpr std::size_t misreadRow = 5;

} // namespace

TEST(ReadingsTable, TheOutlierRowIsMarkedAndNoOther)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    for (std::size_t i = 0; i < std::size(scatterV); ++i) {
        Reading r;
        r.id = static_cast<std::int64_t>(i + 1);
        r.step = static_cast<int>(i);
        r.currentA = 0.4 * static_cast<double>(i);
        r.voltageV = 19.6 - 0.5 * r.currentA + scatterV[i] - (i == misreadRow ? 0.2 : 0.0);
        r.timeUtc = "2026-12-02T04:00:00.000Z";
        window->workspace()->acceptRecorded(r);
    }
    window->flushCharts();

    const ReadingsTableModel *model = window->readingsModel();
    ASSERT_EQ(model->rowCount(), static_cast<int>(std::size(scatterV)));
    for (int row = 0; row < model->rowCount(); ++row) {
        const QString flags = model->data(model->index(row, ReadingsTableModel::Flags)).toString();
        // The flag's tooltip names the rule and its source; an unflagged row has none.
        const QString tip = model->data(model->index(row, ReadingsTableModel::Flags), Qt::ToolTipRole).toString();
        if (row == static_cast<int>(misreadRow)) {
            EXPECT_TRUE(flags.contains(QStringLiteral("▲ outlier"))) << flags.toStdString();
            EXPECT_TRUE(tip.contains(QStringLiteral("Bonferroni"))) << tip.toStdString();
            EXPECT_TRUE(tip.contains(QStringLiteral("Cook and Weisberg"))) << tip.toStdString();
            EXPECT_TRUE(tip.contains(QStringLiteral("critical value"))) << tip.toStdString();
        } else {
            EXPECT_FALSE(flags.contains(QStringLiteral("outlier"))) << "row " << row << ": " << flags.toStdString();
            EXPECT_TRUE(tip.isEmpty()) << "row " << row << ": " << tip.toStdString();
        }
    }
}
