#include "BudgetTable.h"

#include "NumberFormat.h"
#include "UncertaintyFormat.h"

#include <cmath>
#include <limits>

namespace sagline {

namespace {

std::string sensitivityUnit(const std::string &resultUnit, const std::string &inputUnit)
{
    if (inputUnit.empty() || inputUnit == resultUnit)
        return "";
    return " " + (resultUnit.empty() ? std::string("1") : resultUnit) + "/" + inputUnit;
}

} // namespace

std::string valueWithExpandedUncertainty(const UncertainValue &value, const std::string &unit)
{
    if (!value.expandedUncertainty)
        return formatQuantity(value.value, unit, 4) + " (no uncertainty: too few points)";
    return formatWithUncertainty(value.value, *value.expandedUncertainty, unit) + ", " + expandedUncertaintyLabel(value);
}

BudgetTable budgetTable(const std::string &key, const std::string &title, const UncertainValue &value,
                        const std::string &unit)
{
    BudgetTable table;
    table.key = key;
    table.title = title;
    if (!value.standardUncertainty) {
        table.summary = formatQuantity(value.value, unit, 4) + "; no uncertainty (too few points)";
        return table;
    }
    const std::string dof = degreesOfFreedomText(value.effectiveDof);
    table.summary = formatQuantity(value.value, unit, 5) + "; u = " + formatQuantity(*value.standardUncertainty, unit, 2)
                    + ", ν_eff " + (dof.front() == '>' ? dof : "= " + dof) + ", " + expandedUncertaintyLabel(value)
                    + " = " + formatQuantity(*value.expandedUncertainty, unit, 2);
    for (const BudgetComponent &c : value.budget) {
        BudgetTableRow row;
        row.source = c.source;
        row.type = toString(c.type);
        row.distribution = c.distribution;
        const std::string inputUnit = c.inputUnit.empty() ? unit : c.inputUnit;
        row.standardUncertainty = formatQuantity(c.standardUncertainty, inputUnit, 3);
        row.sensitivity = (c.sensitivity == 0.0 ? std::string("0") : formatSignificant(c.sensitivity, 4))
                          + sensitivityUnit(unit, c.inputUnit);
        row.contribution = formatQuantity(c.contribution, unit, 3);
        row.degreesOfFreedom = degreesOfFreedomText(c.degreesOfFreedom ? c.degreesOfFreedom
                                                                       : std::optional<double>(std::numeric_limits<double>::infinity()));
        table.rows.push_back(std::move(row));
    }
    return table;
}

std::vector<BudgetTable> budgetTables(const AnalysisResult &a)
{
    std::vector<BudgetTable> tables;
    const auto add = [&](const char *key, const std::string &title, const UncertainValue &value, const char *unit) {
        if (value.standardUncertainty)
            tables.push_back(budgetTable(key, title, value, unit));
    };
    add("series_resistance_ohm", "Series resistance R (secondary)", a.seriesResistanceOhm, "Ω");
    add("no_load_voltage_v", "No-load voltage V0", a.noLoadVoltageV, "V");
    add("full_load_voltage_v", "Voltage at rated current", a.fullLoadVoltageV, "V");
    add("regulation_percent", "Regulation (" + toString(a.regulationBase) + " base)", a.regulationPercent, "%");
    add("copper_loss_w", "Copper loss at rated current", a.copperLossW, "W");
    if (a.primaryResistanceOhm)
        add("series_resistance_primary_ohm", "R referred to the primary", *a.primaryResistanceOhm, "Ω");
    if (a.referenceTemperatureC) {
        const std::string at = " at " + formatSignificant(*a.referenceTemperatureC, 3) + " °C";
        if (a.referenceResistanceOhm)
            add("series_resistance_reference_ohm", "Series resistance R" + at, *a.referenceResistanceOhm, "Ω");
        if (a.referredFullLoadVoltageV)
            add("full_load_voltage_reference_v", "Voltage at rated current" + at, *a.referredFullLoadVoltageV, "V");
        if (a.referredRegulationPercent)
            add("regulation_reference_percent", "Regulation" + at, *a.referredRegulationPercent, "%");
        if (a.referredCopperLossW)
            add("copper_loss_reference_w", "Copper loss" + at, *a.referredCopperLossW, "W");
    }
    return tables;
}

std::vector<BudgetTable> budgetTables(const LineResults &results)
{
    std::vector<BudgetTable> tables;
    if (results.seriesResistanceOhm.standardUncertainty)
        tables.push_back(budgetTable("series_resistance_ohm", "Series resistance R (secondary)",
                                     results.seriesResistanceOhm, "Ω"));
    if (results.noLoadVoltageV.standardUncertainty)
        tables.push_back(budgetTable("no_load_voltage_v", "No-load voltage V0", results.noLoadVoltageV, "V"));
    return tables;
}

} // namespace sagline
