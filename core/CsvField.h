// Writing one CSV cell, for every CSV that core exports (session readings and fit, comparison).
#pragma once

#include <string>

namespace sagline {

// CSV field quoting (RFC 4180): quoted when it holds a comma, quote or line break.
std::string csvField(const std::string &text);

} // namespace sagline
