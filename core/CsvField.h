// Writing one CSV cell, for every CSV that core exports (session readings and fit, comparison).
#pragma once

#include <string>

namespace sagline {

// CSV field quoting (RFC 4180): quoted when it holds a comma, quote or line break. A cell that
// a spreadsheet would run as a formula (text starting with =, +, -, @, a tab or a carriage
// return; OWASP, "CSV Injection") is quoted with a leading apostrophe, so names, reasons and
// notes from a session are shown as text, never executed. A cell that is a plain number
// ("-0.5", "1e-06") is written as it is.
std::string csvField(const std::string &text);

} // namespace sagline
