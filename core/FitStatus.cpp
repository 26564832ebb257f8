#include "FitStatus.h"

namespace sagline {

std::string toString(FitStatus status)
{
    switch (status) {
    case FitStatus::Ok: return "ok";
    case FitStatus::TooFewPoints: return "too-few-points";
    case FitStatus::DegenerateCurrent: return "degenerate-current";
    case FitStatus::NonFiniteValue: return "non-finite-value";
    case FitStatus::MissingUncertainty: return "missing-uncertainty";
    case FitStatus::InvalidUncertainty: return "invalid-uncertainty";
    case FitStatus::NotConverged: return "not-converged";
    }
    return "unknown";
}

} // namespace sagline
