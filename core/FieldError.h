// A validation failure that names the field (or line) and the rule it broke.
#pragma once

#include <string>
#include <vector>

namespace sagline {

struct FieldError {
    std::string field; // dotted path such as "nameplate.rated_power_va", or "line 7, column voltage_v"
    std::string rule;  // what is wrong and what is expected, e.g. "must be above zero, got -5"

    // Printable whatever the field or the value quoted in the rule holds (valid UTF-8, control
    // characters shown, not obeyed), so a hostile file cannot drive the terminal.
    std::string message() const;
};

using FieldErrors = std::vector<FieldError>;

} // namespace sagline
