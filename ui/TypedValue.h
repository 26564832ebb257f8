// A number as typed into a form field ("500 mA", "19,6 V", "75 °C"), read by core's parser:
// the one place the window turns typed text into a value.
#pragma once

#include "Units.h"

#include <QString>

#include <optional>

namespace sagline {

// None when the text is blank. None and `error` set when it does not read: "field: rule", or
// the rule alone when no field is named. `error` is left as it is otherwise.
std::optional<double> typedQuantity(const QString &text, Unit unit, const QString &field = {},
                                    QString *error = nullptr);

} // namespace sagline
