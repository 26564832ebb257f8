// Long demo sessions for the benchmarks and the tests of opening a session: a session file of
// any number of invented readings on the plan's straight line (a little noise), recorded in
// rising, falling or shuffled current order. Demo data only.
#pragma once

#include <QString>

#include <cstddef>

namespace sagline {

struct Setup;

enum class CurrentOrder { Rising, Falling, Random };

// "rising", "falling", "random"
const char *toString(CurrentOrder order);

// Writes a new session file at `path` (which must not exist) for `setup`, holding `count`
// readings with currents spread evenly from 0 to the plan's top step, in `order` (seeded, so
// the same arguments give the same file). Returns "" or what went wrong.
QString writeDemoSession(const QString &path, const Setup &setup, std::size_t count, CurrentOrder order);

} // namespace sagline
