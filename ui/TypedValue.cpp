#include "TypedValue.h"

namespace sagline {

std::optional<double> typedQuantity(const QString &text, Unit unit, const QString &field, QString *error)
{
    if (text.trimmed().isEmpty())
        return std::nullopt;
    const auto parsed = parseQuantity(text.toStdString(), unit);
    if (parsed.ok)
        return parsed.value;
    if (error) {
        const QString rule = QString::fromStdString(parsed.error);
        *error = field.isEmpty() ? rule : field + QStringLiteral(": ") + rule;
    }
    return std::nullopt;
}

std::optional<RegulationLimitChoice> typedRegulationLimit(const QString &text, const QString &field, QString *error)
{
    if (text.trimmed().compare(QLatin1String("nameplate"), Qt::CaseInsensitive) == 0)
        return RegulationLimitChoice{RegulationLimitChoice::Kind::Nameplate, 0.0};
    const auto percent = typedQuantity(text, Unit::Percent, field, error);
    if (!percent)
        return std::nullopt;
    return RegulationLimitChoice{RegulationLimitChoice::Kind::Stated, *percent};
}

} // namespace sagline
