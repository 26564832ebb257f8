// The report's primary-side section: the supply statement, the open-circuit quantities, the
// efficiency results and the loss balance of every step, all from core's SessionSummary.
#include "ReportSections.h"

#include "ReportCanvas.h"
#include "ReportText.h"
#include "SessionSummary.h"

namespace sagline {

using namespace reporttext;

void drawPrimarySide(ReportCanvas &canvas, const SessionSummary &summary)
{
    if (!summary.setup)
        return;
    canvas.heading(QStringLiteral("Primary side, losses and efficiency"));
    canvas.paragraph(QStringLiteral("Supply: %1.").arg(q(summary.supply.statement)), 8.5);
    if (!summary.primarySide)
        return;
    const PrimarySideResult &p = *summary.primarySide;
    QList<QPair<QString, QString>> rows;
    const auto add = [&rows](const QString &label, const std::optional<UncertainValue> &v, const std::string &unit,
                             const QString &after = {}) {
        if (v)
            rows.append({label, withU(*v, unit) + after});
    };
    if (p.openCircuit) {
        const OpenCircuitResult &oc = *p.openCircuit;
        add(QStringLiteral("No-load loss P0 (at rated V1)"), oc.noLoadLossW, "W");
        add(QStringLiteral("No-load current I0"), oc.noLoadCurrentA, "A");
        add(QStringLiteral("I0, share of rated primary current"), oc.noLoadCurrentPercent, "%");
        add(QStringLiteral("No-load power factor"), oc.noLoadPowerFactor, "");
        add(QStringLiteral("Core-loss resistance Rc = V1²/P0"), oc.coreLossResistanceOhm, "Ω");
        add(QStringLiteral("Magnetizing reactance Xm = V1²/Q0"), oc.magnetizingReactanceOhm, "Ω");
    }
    add(QStringLiteral("Efficiency at rated load"), p.efficiencyAtRatedPercent, "%");
    add(QStringLiteral("Peak efficiency"), p.maxEfficiencyPercent, "%");
    add(QStringLiteral("… at secondary current √(P0/R)"), p.maxEfficiencyCurrentA, "A");
    add(QStringLiteral("Series reactance X (secondary)"), p.seriesReactanceOhm, "Ω",
        p.seriesReactanceResolved ? QString() : QStringLiteral(" — not resolved by the meters"));
    add(QStringLiteral("Regulation at pf %1 %2").arg(p.regulationPowerFactor).arg(p.leading ? QStringLiteral("leading") : QStringLiteral("lagging")),
        p.regulationAtPowerFactorPercent, "%", QStringLiteral(" (ΔV ≈ I(R cos φ ± X sin φ))"));
    if (!rows.isEmpty())
        canvas.keyValues(rows, 1);
    if (!p.steps.empty()) {
        QList<QStringList> table;
        for (const StepLosses &s : p.steps) {
            const auto value = [](const std::optional<UncertainValue> &v, int digits) {
                return v ? q(formatSignificant(v->value, digits)) : QStringLiteral("—");
            };
            table.append({QString::number(summary.readingNumber(s.readingId)), q(formatSignificant(s.currentA, 4)),
                          q(formatSignificant(s.inputPowerW.value, 4)), q(formatSignificant(s.outputPowerW.value, 4)),
                          q(formatSignificant(s.coreLossW.value, 3)), value(s.copperLossW, 3), value(s.remainderW, 2),
                          withU(s.efficiencyPercent, "%")});
        }
        const auto right = Qt::AlignRight;
        canvas.table({{QStringLiteral("Reading"), 0.08, right},
                      {QStringLiteral("I2 (A)"), 0.1, right},
                      {QStringLiteral("P1 (W)"), 0.1, right},
                      {QStringLiteral("P2 = V2·I2 (W)"), 0.12, right},
                      {QStringLiteral("Core (W)"), 0.1, right},
                      {QStringLiteral("Copper R·I2² (W)"), 0.12, right},
                      {QStringLiteral("Remainder (W)"), 0.1, right},
                      {QStringLiteral("Efficiency"), 0.28, right}},
                     table);
    }
    QString notes;
    for (const std::string &w : p.warnings)
        notes += QStringLiteral("Warning: %1. ").arg(q(w));
    for (const std::string &n : p.notes)
        notes += q(n) + QStringLiteral(". ");
    if (!notes.isEmpty())
        canvas.paragraph(notes.trimmed(), 8.0);
}

} // namespace sagline
