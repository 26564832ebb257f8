// How plain numbers are shown: every value with its unit and a sensible number of significant
// digits. Values with an uncertainty use core's formatWithUncertainty (UncertaintyFormat.h).
// Display only; no physics here.
#pragma once

#include "Units.h"

#include <QString>

namespace sagline {

// "24.00 V", "0.1302 A", "1.95 Ω"; "—" for a non-finite value.
QString formatQuantity(double value, Unit unit, int significantDigits = 4);
// The number alone, same rules as formatQuantity.
QString formatNumber(double value, int significantDigits = 4);
// A fixed count of decimals with the unit ("1.2500 A"), for aligned table columns.
QString formatFixed(double value, int decimals, Unit unit);
// The unit symbol as a QString ("Ω", "V", ...).
QString unitText(Unit unit);

} // namespace sagline
