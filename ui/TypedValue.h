// A number as typed into a form field ("500 mA", "19,6 V", "75 °C"), read by core's parser:
// the one place the window turns typed text into a value.
#pragma once

#include "ConformityAssessment.h"
#include "Units.h"

#include <QString>

#include <optional>

namespace sagline {

// None when the text is blank. None and `error` set when it does not read: "field: rule", or
// the rule alone when no field is named. `error` is left as it is otherwise.
std::optional<double> typedQuantity(const QString &text, Unit unit, const QString &field = {},
                                    QString *error = nullptr);

// The verdict's regulation limit as typed: blank = the setup's specification (nothing returned),
// "nameplate" = the nameplate's own regulation chosen explicitly, else a percentage.
std::optional<RegulationLimitChoice> typedRegulationLimit(const QString &text, const QString &field = {},
                                                          QString *error = nullptr);

} // namespace sagline
