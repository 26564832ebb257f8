#include "PrimarySideLines.h"

#include "NumberFormat.h"
#include "UncertaintyFormat.h"

#include <QObject>

namespace sagline {

namespace {

QString withU(const UncertainValue &value, const char *unit)
{
    if (!value.expandedUncertainty)
        return QString::fromStdString(formatQuantity(value.value, unit));
    return QString::fromStdString(formatWithUncertainty(value.value, *value.expandedUncertainty, unit));
}

QString uNote(const UncertainValue &value)
{
    return value.expandedUncertainty ? QString::fromStdString(expandedUncertaintyLabel(value)) : QObject::tr("no U");
}

} // namespace

QList<ResultLine> primarySideLines(const SupplyAssessment &supply, const std::optional<PrimarySideResult> &result)
{
    QList<ResultLine> lines;
    if (!result)
        return lines;
    lines.append({QStringLiteral("supply"), QObject::tr("Supply"),
                  supply.driftPercent ? QObject::tr("%1 % drift").arg(QString::fromStdString(formatSignificant(*supply.driftPercent, 2)))
                                      : QObject::tr("not measured"),
                  QString::fromStdString(supply.statement), supply.drifted});
    const auto add = [&lines](const char *key, const QString &label, const std::optional<UncertainValue> &value,
                              const char *unit, const QString &note = {}, bool warning = false) {
        if (value)
            lines.append({QString::fromLatin1(key), label, withU(*value, unit), note.isEmpty() ? uNote(*value) : note, warning});
    };
    if (result->openCircuit) {
        const OpenCircuitResult &oc = *result->openCircuit;
        add("no_load_loss", QObject::tr("No-load loss P0"), oc.noLoadLossW, "W");
        add("no_load_current", QObject::tr("No-load current I0"), oc.noLoadCurrentA, "A",
            oc.noLoadCurrentPercent ? QObject::tr("%1 % of rated primary current")
                                          .arg(QString::fromStdString(formatSignificant(oc.noLoadCurrentPercent->value, 3)))
                                    : QString());
        add("no_load_power_factor", QObject::tr("No-load power factor"), oc.noLoadPowerFactor, "");
    }
    add("efficiency_at_rated", QObject::tr("Efficiency at rated load"), result->efficiencyAtRatedPercent, "%");
    if (result->maxEfficiencyPercent && result->maxEfficiencyCurrentA)
        lines.append({QStringLiteral("max_efficiency"), QObject::tr("Peak efficiency"), withU(*result->maxEfficiencyPercent, "%"),
                      QObject::tr("at %1 (copper loss = core loss)").arg(withU(*result->maxEfficiencyCurrentA, "A"))});
    add("series_reactance", QObject::tr("Series reactance X (secondary)"), result->seriesReactanceOhm, "Ω",
        result->seriesReactanceResolved ? QString() : QObject::tr("not resolved by the meters"),
        !result->seriesReactanceResolved);
    add("regulation_at_power_factor",
        QObject::tr("Regulation at pf %1 %2").arg(result->regulationPowerFactor).arg(result->leading ? QObject::tr("leading") : QObject::tr("lagging")),
        result->regulationAtPowerFactorPercent, "%", QObject::tr("ΔV ≈ I(R cos φ ± X sin φ)"));
    if (!result->warnings.empty())
        lines.append({QStringLiteral("primary_warning"), QObject::tr("Primary side"), QObject::tr("check"),
                      QString::fromStdString(result->warnings.front()), true});
    return lines;
}

} // namespace sagline
