// The readings CSV of DESIGN.md: a header row, then one point per line, comma separated,
// '.' decimal point, SI units. A file with decimal commas separates its cells with ';' (or
// tabs) and may state its mark on a comment line before the header, "# decimal_mark: ,";
// unstated, the numbers must show it, and a number such as 1,250 that could be either a
// thousands separator or a decimal comma is refused with its line (core/CsvNumber.h). Lines
// starting with '#' are comments. Columns (any order): current_a, voltage_v (required),
// u_current_a, u_voltage_v (optional standard uncertainties; a blank cell means "not known"),
// and the export's step, time_utc, flags, excluded (optional), and the primary side
// primary_voltage_v, primary_current_a, primary_power_w, primary_power_factor,
// primary_reactive_power_var with u_ before any of them for its standard uncertainty (each
// optional, a blank cell meaning "not read"). Tolerates a UTF-8 BOM, CRLF line
// ends, blank lines, spaces around cells and double-quoted cells. Never throws.
#pragma once

#include "CsvNumber.h"
#include "FieldError.h"
#include "FitSummary.h"
#include "Reading.h"

#include <string>
#include <string_view>
#include <vector>

namespace sagline {

struct ReadingsCsvParse {
    std::vector<Reading> readings; // one per data line, in file order (empty if errors)
    std::vector<int> lineNumbers;  // the 1-based file line of each reading, parallel to readings
    bool hasCurrentUncertainty = false; // the u_current_a column is present
    bool hasVoltageUncertainty = false; // the u_voltage_v column is present
    DecimalMark decimalMark = DecimalMark::Point; // the mark the numbers were read with
    std::string decimalMarkBasis;  // how it is known: "stated on line 1", "'.' in a comma-separated file", ...
    FieldErrors errors;            // each names "line N, column NAME" (or "file") and the rule

    bool ok() const { return errors.empty(); }
};

// Parses CSV text. Rules per cell: current_a and voltage_v finite and >= 0 (RMS values);
// u_* finite and > 0 or blank; step an integer >= 0 or blank; flags names joined by '|'
// (see flagsToString); excluded true/false/1/0/yes/no or blank. At most 100 errors are listed.
ReadingsCsvParse parseReadingsCsv(std::string_view text);

// The same file checked by the same rules, the readings kept only as the fit's columns
// (33 bytes a reading instead of 144): for `fit` of a large CSV.
struct ReadingColumnsCsvParse {
    ReadingColumns columns;        // one row per data line, in file order (empty if errors)
    std::vector<int> lineNumbers;  // the 1-based file line of each row
    bool hasCurrentUncertainty = false;
    bool hasVoltageUncertainty = false;
    FieldErrors errors;

    bool ok() const { return errors.empty(); }
};

ReadingColumnsCsvParse parseReadingColumnsCsv(std::string_view text);
ReadingColumnsCsvParse loadReadingColumnsCsv(const std::string &path);

// Reads the file, then parses it; an unreadable file is an error on the field "file".
ReadingsCsvParse loadReadingsCsv(const std::string &path);

} // namespace sagline
