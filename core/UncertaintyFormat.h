// A result with its expanded uncertainty as people read it: "1.952 Ω ± 0.023 Ω". The
// uncertainty keeps two significant digits and the value is rounded to the same decimal place
// (GUM, JCGM 100:2008, 7.2.6); an SI prefix keeps the numbers short.
#pragma once

#include <optional>
#include <string>

namespace sagline {

// formatWithUncertainty(1.95234, 0.02312, "Ω") == "1.952 Ω ± 0.023 Ω";
// formatWithUncertainty(0.05234, 0.00231, "Ω") == "52.3 mΩ ± 2.3 mΩ".
// A zero or non-finite uncertainty prints the value with 4 significant digits alone.
std::string formatWithUncertainty(double value, double uncertainty, const std::string &unit);

// The same with the expanded uncertainty's own coverage factor, for a table where every row has
// its own: "1.952 Ω ± 0.023 Ω (k = 2.08)". Without U or k it is formatWithUncertainty's text.
std::string formatWithCoverage(double value, std::optional<double> expanded, std::optional<double> k,
                               const std::string &unit);

} // namespace sagline
