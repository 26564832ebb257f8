// The first look at the open-circuit step: a no-load reading far from the nameplate's
// no-load voltage usually means a wrong tap, the wrong winding or the wrong meter range, not
// a bad transformer. The person is asked before the sweep goes on.
#pragma once

#include <optional>
#include <string>

namespace sagline {

// Supply voltages vary by ±10 % about nominal (IEC 60038 tolerance for 230 V systems, from
// memory), and the secondary's no-load voltage follows the primary: a reading within this of
// the nameplate is not questioned.
inline constexpr double noLoadTolerancePercent = 10.0;

// A question for the person when `measuredV` lies more than `tolerancePercent` from
// `expectedV`; nothing otherwise (or when either value is not a positive, finite number).
// E.g. "the no-load reading is 19.6 V where the nameplate gives 26.4 V (-25.8 %, more than
// ±10 %): check the tap, the winding and the meter's range".
std::optional<std::string> noLoadQuestion(double expectedV, double measuredV,
                                          double tolerancePercent = noLoadTolerancePercent);

} // namespace sagline
