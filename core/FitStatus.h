// Status of a fit: every degenerate input gets its own status and a message, never NaN.
#pragma once

#include <string>

namespace sagline {

enum class FitStatus {
    Ok,
    TooFewPoints,        // fewer than 2 usable points (or 3 for a quadratic)
    DegenerateCurrent,   // all currents equal (within rounding): no slope can be fitted
    NonFiniteValue,      // a reading or an uncertainty is NaN or infinite
    MissingUncertainty,  // the method needs a per-point uncertainty that is absent
    InvalidUncertainty,  // an uncertainty is zero or negative
    NotConverged,        // an iterative fit (York) did not converge
};

// "ok", "too-few-points", "degenerate-current", "non-finite-value", "missing-uncertainty",
// "invalid-uncertainty", "not-converged"
std::string toString(FitStatus status);

} // namespace sagline
