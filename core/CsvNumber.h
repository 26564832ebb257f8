// Numbers in a readings CSV and the file's decimal mark. A cell such as "1,250" may be a
// thousands separator (one thousand two hundred and fifty) or a decimal comma (one and a
// quarter): Sagline never guesses. The mark is '.' for a comma-separated file (the CSV
// contract); a file separated by ';' or tabs may state it on a comment line
// "# decimal_mark: ," (or "."), else every number that shows a mark must agree on it, and a
// number that could be read either way with nothing in the file to decide is refused with its
// line. Thousands separators are never accepted.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace sagline {

enum class DecimalMark { Point, Comma };

char toChar(DecimalMark mark); // '.' or ','

// What one number cell says about the decimal mark of its file.
enum class MarkEvidence {
    None,      // no '.' or ',' ("26", "1e-3")
    Point,     // one '.' that is not in a thousands position ("24.15", "0.250", "1.2e-3")
    Comma,     // one ',' that is not in a thousands position ("24,15", "0,250")
    Ambiguous, // one mark followed by exactly three digits after 1 to 3 digits, no leading 0 ("1,250", "26.400")
    Grouped,   // both marks, or one mark twice ("1.250,5", "1,250,000"): a thousands separator
};

MarkEvidence markEvidence(std::string_view cell);

// A comment line's statement of the decimal mark: "# decimal_mark: ," or "# decimal_mark: .".
// Not such a comment: isStatement false. A statement with another mark: mark empty, problem set.
struct DecimalMarkStatement {
    bool isStatement = false;
    std::optional<DecimalMark> mark;
    std::string problem;
};

DecimalMarkStatement parseDecimalMarkComment(std::string_view line);

// Reads a finite number with the given decimal mark (an optional leading '+' is allowed, no
// thousands separators). On failure returns nothing and says why in `problem` (without the
// cell, which the caller quotes).
std::optional<double> parseCsvNumber(std::string_view cell, DecimalMark mark, std::string &problem);

} // namespace sagline
