// Text ordered as people read numbers in it: runs of digits compare by value (whole numbers),
// the rest byte by byte. "20 VA ..." < "60 VA ..." < "100 VA ...", where a plain text order puts
// "100 VA" first. Used for the order of designs (compare, the review's table).
#pragma once

#include <string_view>

namespace sagline {

bool naturalLess(std::string_view a, std::string_view b);

} // namespace sagline
