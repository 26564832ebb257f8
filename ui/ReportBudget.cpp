// The uncertainty budget section of the session report: one table per result, the same
// tables the window's budget dialog and `sagline-cli fit --budget` show (core/BudgetTable.h).
#include "ReportSections.h"

#include "BudgetTable.h"
#include "ReportCanvas.h"
#include "ReportText.h"
#include "SessionSummary.h"

namespace sagline {

using namespace reporttext;

void drawUncertaintyBudget(ReportCanvas &canvas, const SessionSummary &summary)
{
    if (!summary.analysis)
        return;
    const std::vector<BudgetTable> tables = budgetTables(*summary.analysis);
    if (tables.empty())
        return;
    canvas.heading(QStringLiteral("Uncertainty budget"));
    canvas.paragraph(QStringLiteral("GUM (JCGM 100:2008): independent inputs, contributions |cᵢ|·u(xᵢ) combined in "
                                    "quadrature. Type A: the readings' scatter about the line; Type B: each meter's gain "
                                    "and offset (systematic, common to all its readings, rectangular), the resolution "
                                    "floor and the winding temperature. ν_eff by Welch–Satterthwaite (G.4); U is the "
                                    "half-width of the 95 % interval of the components' combined distribution, "
                                    "k = U/u (t95(ν_eff) when no rectangular limit dominates). Uncertainties include: %1.")
                         .arg(q(summary.analysis->uncertaintyBasis)),
                     8.0);
    const auto right = Qt::AlignRight;
    const QList<ReportTableColumn> columns{{QStringLiteral("Source"), 0.40},
                                           {QStringLiteral("Type"), 0.05},
                                           {QStringLiteral("Distribution"), 0.11},
                                           {QStringLiteral("u(xᵢ)"), 0.11, right},
                                           {QStringLiteral("cᵢ"), 0.13, right},
                                           {QStringLiteral("Contribution"), 0.12, right},
                                           {QStringLiteral("ν"), 0.08, right}};
    for (const BudgetTable &table : tables) {
        const QString title = q(table.title) + QStringLiteral(": ") + q(table.summary);
        QList<QStringList> rows;
        for (const BudgetTableRow &row : table.rows)
            rows.append({q(row.source), q(row.type), q(row.distribution), q(row.standardUncertainty), q(row.sensitivity),
                         q(row.contribution), q(row.degreesOfFreedom)});
        // A result's budget is read as one piece: its title and table start a new page rather than split.
        canvas.ensureSpace(canvas.paragraphHeightPt(title, 8.5, true) + canvas.tableHeightPt(columns, rows));
        canvas.paragraph(title, 8.5, true);
        canvas.table(columns, rows);
    }
}

} // namespace sagline
