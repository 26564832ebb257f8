// Readings from a file (an import, a fit with a nameplate) that no sweep of this transformer
// could have recorded: a slip of the decimal point or the unit (417 for 0.417 A, 196 for 19.6 V).
// A live sweep never records them (its hard limits stop it first, and a typed value gets a
// second look); a file must not bring them in, or a fit and a verdict would rest on them.
// Readings marked excluded are left alone: they are kept, out of the fit, with their reason.
#pragma once

#include "FieldError.h"
#include "Reading.h"
#include "Setup.h"

#include <vector>

namespace sagline {

// The factor beyond which a reading is refused: twice the sweep's own limit, so a reading
// taken just past a limit (the one that stopped a sweep) still comes in, and a factor of 10 or
// 1000 does not (common practice for a gross-error screen).
inline constexpr double implausibleBeyondFactor = 2.0;

// One error per implausible, included reading, in file order; field "line N, column current_a"
// (or voltage_v), from `lineNumbers` (the CSV line of each reading). Refused: output VA above
// implausibleBeyondFactor x rated VA x overload factor (the sweep's hard limit), or a voltage
// above implausibleBeyondFactor x the nameplate's no-load voltage.
FieldErrors implausibleReadings(const std::vector<Reading> &readings, const std::vector<int> &lineNumbers,
                                const Setup &setup);

} // namespace sagline
