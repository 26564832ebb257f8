#include "UiFormat.h"

#include "NumberFormat.h"

#include <algorithm>
#include <cmath>

namespace sagline {

namespace {

int decimalsFor(double value, int significantDigits)
{
    if (value == 0.0)
        return std::max(0, significantDigits - 1);
    const int magnitude = static_cast<int>(std::floor(std::log10(std::abs(value))));
    return std::clamp(significantDigits - 1 - magnitude, 0, 9);
}

QString withUnit(const QString &number, Unit unit)
{
    const QString symbol = unitText(unit);
    if (symbol.isEmpty())
        return number;
    // U+202F narrow no-break space keeps number and unit on one line.
    return number + QChar(0x202F) + symbol;
}

} // namespace

QString unitText(Unit unit) { return QString::fromStdString(unitSymbol(unit)); }

QString formatNumber(double value, int significantDigits)
{
    if (!std::isfinite(value))
        return QStringLiteral("—");
    return QString::number(value, 'f', decimalsFor(value, significantDigits));
}

QString formatFixed(double value, int decimals, Unit unit)
{
    if (!std::isfinite(value))
        return QStringLiteral("—");
    return withUnit(QString::number(value, 'f', decimals), unit);
}

QString formatQuantity(double value, Unit unit, int significantDigits)
{
    if (!std::isfinite(value))
        return QStringLiteral("—");
    const QString symbol = unitText(unit);
    if (symbol.isEmpty())
        return formatNumber(value, significantDigits);
    // One style for every quantity the window shows: an SI prefix keeps the mantissa in
    // [1, 1000) ("480.0 mΩ", "260.9 mA"), as the results and the report print them.
    QString text = QString::fromStdString(sagline::formatQuantity(value, symbol.toStdString(), significantDigits));
    const qsizetype space = text.lastIndexOf(QLatin1Char(' '));
    if (space >= 0)
        text[space] = QChar(0x202F); // narrow no-break space keeps number and unit on one line
    return text;
}

} // namespace sagline
