// The uncertainty budgets of an analysis as text tables, one per result, for every place that
// prints them (the CLI's --budget, the window's budget table, the PDF report), so they read
// the same everywhere. Numbers come from the analysis; this only words and formats them.
#pragma once

#include "ResultAnalysis.h"

#include <string>
#include <vector>

namespace sagline {

struct BudgetTableRow {
    std::string source;              // what the input is
    std::string type;                // "A" or "B"
    std::string distribution;        // "normal", "rectangular"
    std::string standardUncertainty; // u(x_i) with its unit, "2.1 mV"
    std::string sensitivity;         // c_i with its unit, "-0.1955 V/%"
    std::string contribution;        // |c_i|·u(x_i) in the result's unit
    std::string degreesOfFreedom;    // "6", "∞"
};

struct BudgetTable {
    std::string key;                 // "series_resistance_ohm", as in fit --json's results
    std::string title;               // "Series resistance R"
    std::string summary;             // "0.4231 Ω; u = 2.6 mΩ, ν_eff = 37, U (k = 2.03, 95 %) = 5.3 mΩ"
    std::vector<BudgetTableRow> rows;
};

inline constexpr const char *budgetColumnTitles[] = {"source", "type", "distribution", "u(xᵢ)", "cᵢ",
                                                     "contribution", "ν"};

BudgetTable budgetTable(const std::string &key, const std::string &title, const UncertainValue &value,
                        const std::string &unit);
// Every result of the analysis with an uncertainty, in reading order: R, V0, full-load voltage,
// regulation, copper loss, R referred to the primary, then the results at the reference temperature.
std::vector<BudgetTable> budgetTables(const AnalysisResult &analysis);
// R and V0 only (a fit without a nameplate).
std::vector<BudgetTable> budgetTables(const LineResults &results);

// One line: "0.4231 Ω ± 0.0053 Ω, U (k = 2.03, 95 %)", or the value alone without U.
std::string valueWithExpandedUncertainty(const UncertainValue &value, const std::string &unit);

} // namespace sagline
