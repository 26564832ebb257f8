#include "ManualEntry.h"

#include "Units.h"

namespace sagline {

ManualValue parseManualValue(MeterRole role, const QString &text)
{
    ManualValue result;
    const QString trimmed = text.trimmed();
    if (trimmed.isEmpty()) {
        result.error = QStringLiteral("%1: a reading is required (e.g. %2)")
                           .arg(roleName(role), roleUnit(role) == Unit::Volt ? QStringLiteral("\"13,8 V\"")
                                                                              : QStringLiteral("\"145 mA\""));
        return result;
    }
    const QuantityParse parsed = parseQuantity(trimmed.toStdString(), roleUnit(role));
    if (!parsed.ok) {
        const QString rule = QString::fromStdString(parsed.error);
        result.error = rule.startsWith(QLatin1Char('\''))
                           ? QStringLiteral("%1: %2").arg(roleName(role), rule)
                           : QStringLiteral("%1: '%2' %3").arg(roleName(role), trimmed, rule);
        return result;
    }
    if (parsed.value < 0.0) {
        result.error = QStringLiteral("%1: '%2' is negative; an RMS reading is zero or more").arg(roleName(role), trimmed);
        return result;
    }
    result.ok = true;
    result.value = parsed.value;
    return result;
}

} // namespace sagline
