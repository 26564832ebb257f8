// Readings typed in by hand: for students and for meters with no interface. A value is
// validated against its role ("13,8 V" for a voltmeter; "145 mA" for an ammeter; a current
// typed where a voltage belongs is refused), either decimal separator, SI prefixes.
#pragma once

#include "MeterRole.h"

#include <QString>

namespace sagline {

struct ManualValue {
    bool ok = false;
    double value = 0.0; // SI units (V or A) when ok
    QString error;      // names the role and the rule, e.g. "secondary voltmeter: expected a voltage, ..."
};

// Readings are RMS magnitudes: negative values are refused, as are NaN and infinities. A bare
// number is taken in the role's SI unit.
ManualValue parseManualValue(MeterRole role, const QString &text);

} // namespace sagline
