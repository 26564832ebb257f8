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

} // namespace sagline
