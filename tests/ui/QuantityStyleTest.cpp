// One unit style per quantity: the window prints every quantity with an SI prefix that keeps
// the mantissa in [1, 1000), as the results and the report do, so "0.4800 Ω" never stands
// beside "483.9 mΩ". The plan's figures and its step table follow the same rule.
#include "UiTestSupport.h"

#include "PlanPanel.h"
#include "UiFormat.h"

#include <gtest/gtest.h>

#include <QAbstractItemModel>
#include <QRegularExpression>
#include <QTableView>

using namespace sagline;
using namespace sagline::test;

TEST(QuantityStyle, QuantitiesTakeAnSiPrefix)
{
    const QChar gap(0x202F);
    EXPECT_EQ(formatQuantity(0.48, Unit::Ohm), QStringLiteral("480.0") + gap + QStringLiteral("mΩ"));
    EXPECT_EQ(formatQuantity(0.2609, Unit::Ampere), QStringLiteral("260.9") + gap + QStringLiteral("mA"));
    EXPECT_EQ(formatQuantity(46.56, Unit::Ohm), QStringLiteral("46.56") + gap + QStringLiteral("Ω"));
    EXPECT_EQ(formatQuantity(0.99996, Unit::Ampere), QStringLiteral("1.000") + gap + QStringLiteral("A")); // rounded first
    EXPECT_EQ(formatQuantity(8.89, Unit::Percent, 3), QStringLiteral("8.89") + gap + QStringLiteral("%"));
    EXPECT_EQ(formatQuantity(std::nan(""), Unit::Volt), QStringLiteral("—"));
}

TEST(QuantityStyle, ThePlanShowsNoQuantityBelowOneWithoutAPrefix)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    // "0.4800 Ω", "0.2609 A": a leading "0." before a unit without a prefix is the old style.
    static const QRegularExpression unprefixed(QStringLiteral("\\b0\\.\\d+\\x{202F}(Ω|A|V|W|VA)\\b"));
    const QString summary = window->planPanel()->summaryText();
    ASSERT_FALSE(summary.isEmpty());
    EXPECT_FALSE(unprefixed.match(summary).hasMatch()) << summary.toStdString();
    EXPECT_TRUE(summary.contains(QStringLiteral("mΩ"))) << summary.toStdString();
    const QAbstractItemModel *model = window->planPanel()->table()->model();
    ASSERT_GT(model->rowCount(), 1);
    for (int row = 0; row < model->rowCount(); ++row)
        for (int column = 0; column < model->columnCount(); ++column) {
            const QString cell = model->index(row, column).data().toString();
            EXPECT_FALSE(unprefixed.match(cell).hasMatch()) << "row " << row << ", column " << column << ": " << cell.toStdString();
        }
}
