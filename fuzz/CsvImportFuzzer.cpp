// libFuzzer target: a readings CSV from anywhere (the first step of `sagline-cli import`).
// Parsing must never crash; a file that parses must survive export and re-parse unchanged
// (readingsToCsv writes what parseReadingsCsv reads), and the fit of it must give either a
// result or a status, never a NaN slope.
#include "CsvReadings.h"
#include "FitSummary.h"
#include "SessionExport.h"

#include <cmath>
#include <cstdint>
#include <string_view>

using namespace sagline;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t *data, std::size_t size)
{
    const std::string_view text(reinterpret_cast<const char *>(data), size);
    const ReadingsCsvParse parsed = parseReadingsCsv(text);
    if (!parsed.ok()) {
        for (const FieldError &error : parsed.errors)
            if (error.field.empty() || error.rule.empty())
                __builtin_trap(); // every error names a place and a rule
        return 0;
    }
    const std::string exported = readingsToCsv(parsed.readings);
    const ReadingsCsvParse again = parseReadingsCsv(exported);
    if (!again.ok() || again.readings.size() != parsed.readings.size())
        __builtin_trap();
    for (std::size_t i = 0; i < parsed.readings.size(); ++i) {
        const Reading &a = parsed.readings[i];
        const Reading &b = again.readings[i];
        if (a.currentA != b.currentA || a.voltageV != b.voltageV || a.uCurrentA != b.uCurrentA ||
            a.uVoltageV != b.uVoltageV || a.excluded != b.excluded || a.flags != b.flags || a.step != b.step)
            __builtin_trap();
    }
    const FitSummary fit = fitReadings(parsed.readings, FitMethod::Ols);
    if (fit.ok() && (!std::isfinite(fit.slope) || !std::isfinite(fit.intercept)))
        __builtin_trap();
    return 0;
}
