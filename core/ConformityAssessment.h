// The one place where a fit becomes what is signed: the analysis at rated current with its
// uncertainty budgets (core/ResultAnalysis.h) and the verdict against the specification's
// limits (core/ConformityDecision.h). The CLI, the window, the report, the export, compare and
// the review all call assessFit, so they show the same numbers.
//
// Limits come from the setup's `specification` section (each judged when present). The
// regulation limit may instead be given (an option or the session's analysis-settings record)
// or the nameplate's own regulation chosen explicitly, and is then labelled so. With no limit
// there is no pass or fail: `not-judged`, and the measured regulation is set beside the
// nameplate's as information. When a reference temperature is set and the winding temperature
// is known, regulation, full-load voltage and series resistance are judged as referred to it.
#pragma once

#include "ConformityDecision.h"
#include "FitSummary.h"
#include "ResultAnalysis.h"
#include "Setup.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

// Where the regulation limit comes from.
struct RegulationLimitChoice {
    enum class Kind {
        Specification, // the setup's specification.regulation_max_percent, if any
        Stated,        // a number given for this judgement (percent)
        Nameplate,     // the nameplate's own regulation, chosen explicitly
    };
    Kind kind = Kind::Specification;
    double percent = 0.0; // for Stated
    bool operator==(const RegulationLimitChoice &) const = default;
};

// "nameplate", or a percentage ("5", "5 %"); nothing when the text is neither.
std::optional<RegulationLimitChoice> regulationLimitFromText(std::string_view text);
std::string toString(const RegulationLimitChoice &choice); // "specification", "nameplate", "5 %"

struct AssessmentOptions {
    DecisionRule rule = DecisionRule::NonBinary;
    RegulationLimitChoice regulationLimit;
    std::optional<double> windingTemperatureC;  // T_m during the sweep, °C
    std::optional<double> referenceTemperatureC; // T_ref, °C: results also referred to it
    bool judgeAtReferenceTemperature = true;     // false: T_ref is only a default; judge as measured
    std::optional<TemperatureConstant> temperatureConstant; // absent: from the winding material
    // On a fit of readings referred to the rated primary: SupplyAssessment::referralGainUPercent.
    std::optional<double> referralGainUPercent;
};

struct SpecificationVerdict {
    ConformityOutcome outcome = ConformityOutcome::NotJudged; // the worst of the judged limits
    std::optional<double> conformanceProbability; // the lowest of the judged limits' (JCGM 106 §7)
    std::vector<ConformityDecision> limits;       // one per judged limit
    DecisionRule rule = DecisionRule::NonBinary;
    std::string ruleName;                         // describe(rule)
    std::string limitsSource;                     // where the limits come from, for every output
    bool atReferenceTemperature = false;          // judged on results referred to the reference temperature
    std::optional<double> referenceTemperatureC;
    // Information shown when nothing is judged (and beside a judged regulation):
    std::optional<double> nameplateRegulationPercent;
    std::optional<double> regulationMinusNameplatePercent; // measured - nameplate, percentage points
    std::string explanation;                      // one sentence for reports
};

struct Assessment {
    AnalysisResult analysis;                      // check analysis.ok()
    SpecificationVerdict verdict;
};

// fit must be ok (else analysis carries the error and the verdict is not-judged).
Assessment assessFit(const FitSummary &fit, const Setup &setup, const AssessmentOptions &options);

} // namespace sagline
