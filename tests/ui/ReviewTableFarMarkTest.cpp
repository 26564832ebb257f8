// The review table's far-from-batch mark says "screening only" by the row's own design: a
// design with ten units makes a batch statement even when another design in the folder has
// three (the mark used the folder-wide flag, true as soon as any design was small).
#include "ReviewTableModel.h"
#include "SessionComparison.h"

#include <gtest/gtest.h>

using namespace sagline;

namespace {

SessionRow unit(const std::string &design, double resistance)
{
    SessionRow row;
    row.opened = true;
    row.path = design + ".sagline";
    row.design = design;
    row.figures.ok = true;
    row.figures.resistanceOhm = resistance;
    row.figures.resistanceRefOhm = resistance * 1.2;
    return row;
}

QString zText(const ReviewTableModel &model, int row)
{
    return model.index(row, ReviewTableModel::RobustZ).data().toString();
}

} // namespace

TEST(ReviewTableFarMark, ScreeningOnlyFollowsTheRowsOwnDesign)
{
    // 60 VA: ten units, the last far (median 0.6305 Ω, MAD 0.001 Ω); 20 VA: three units, the
    // last far from the other two (median 6.10 Ω, MAD 0.02 Ω, z(6.50) = 0.6745 × 0.40 / 0.02 ≈ 13).
    std::vector<SessionRow> rows;
    for (double r : {0.630, 0.631, 0.629, 0.632, 0.630, 0.631, 0.629, 0.632, 0.631, 0.70})
        rows.push_back(unit("60 VA", r));
    for (double r : {6.10, 6.08, 6.50})
        rows.push_back(unit("20 VA", r));
    ReviewTableModel model;
    model.appendRows(rows);
    const BatchStatistics &stats = model.statistics();
    ASSERT_EQ(stats.designs.size(), 2u);
    ASSERT_EQ(stats.farFromBatch, (std::vector<std::size_t>{9, 12}));
    EXPECT_NE(zText(model, 9).indexOf(QStringLiteral("far from batch")), -1) << zText(model, 9).toStdString();
    EXPECT_EQ(zText(model, 9).indexOf(QStringLiteral("screening only")), -1)
        << "ten units of its design: " << zText(model, 9).toStdString();
    EXPECT_NE(zText(model, 12).indexOf(QStringLiteral("far from batch (screening only)")), -1)
        << "three units of its design: " << zText(model, 12).toStdString();
}
