#include "SweepInstructions.h"

#include <cmath>

namespace sagline {

namespace {

// Three significant digits without an exponent: "11.9", "145", "1250".
QString sig3(double value)
{
    if (std::fabs(value) >= 1000.0)
        return QString::number(value, 'f', 0);
    return QString::number(value, 'g', 3);
}

QString formatCurrent(double amps)
{
    if (std::fabs(amps) < 1.0)
        return sig3(amps * 1000.0) + QStringLiteral(" mA");
    return sig3(amps) + QStringLiteral(" A");
}

QString formatResistance(double ohms)
{
    if (ohms >= 1000.0)
        return sig3(ohms / 1000.0) + QStringLiteral(" kΩ");
    return sig3(ohms) + QStringLiteral(" Ω");
}

QString expectation(const PlanStep &step)
{
    return QStringLiteral("expect about %1 V and %2").arg(sig3(step.predictedVoltageV), formatCurrent(step.currentA));
}

} // namespace

QString stepInstruction(const PlanStep &step)
{
    if (!step.loadResistanceOhm)
        return QStringLiteral("disconnect the load (open circuit); ") + expectation(step);
    return QStringLiteral("set the load to about %1; %2").arg(formatResistance(*step.loadResistanceOhm), expectation(step));
}

QString recheckInstruction(const PlanStep &step, const QString &why, bool programmableLoad)
{
    if (programmableLoad) {
        if (!step.loadResistanceOhm)
            return QStringLiteral("%1: opening the load again for step %2; %3").arg(why).arg(step.index).arg(expectation(step));
        return QStringLiteral("%1: setting the load again to about %2 for step %3; %4")
            .arg(why, formatResistance(*step.loadResistanceOhm))
            .arg(step.index)
            .arg(expectation(step));
    }
    if (!step.loadResistanceOhm)
        return QStringLiteral("%1: check the load is still disconnected (open circuit) for step %2, then confirm; %3")
            .arg(why)
            .arg(step.index)
            .arg(expectation(step));
    return QStringLiteral("%1: check the load is still at about %2 for step %3, then confirm; %4")
        .arg(why, formatResistance(*step.loadResistanceOhm))
        .arg(step.index)
        .arg(expectation(step));
}

} // namespace sagline
