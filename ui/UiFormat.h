// How numbers are shown: every value with its unit, a sensible number of significant digits,
// and an uncertainty rounded to two significant digits with the value to the same decimal
// place (GUM, JCGM 100:2008, 7.2.6). Display only; no physics here.
#pragma once

#include "Units.h"

#include <QString>

namespace sagline {

// "24.00 V", "0.1302 A", "1.95 Ω"; "—" for a non-finite value.
QString formatQuantity(double value, Unit unit, int significantDigits = 4);
// The number alone, same rules as formatQuantity.
QString formatNumber(double value, int significantDigits = 4);
// "1.952 ± 0.023 Ω": the uncertainty to two significant digits, the value to match.
QString formatWithUncertainty(double value, double uncertainty, Unit unit);
// A fixed count of decimals with the unit ("1.2500 A"), for aligned table columns.
QString formatFixed(double value, int decimals, Unit unit);
// The unit symbol as a QString ("Ω", "V", ...).
QString unitText(Unit unit);

} // namespace sagline
