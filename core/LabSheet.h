// A lab sheet: what a lab lead hands students for a supervised session. It carries a setup
// (nameplate and bench, DESIGN.md) plus locks and limits the student cannot change: the plan is
// fixed, the load may not go above a fraction of rated current, a given fuse must be fitted,
// readings are typed in by hand, and instructions text. Saved as JSON of our own:
//
//   {"format": "sagline-lab-sheet", "version": 1, "title": "...",
//    "setup": { ...the setup file's object... },
//    "locks": {"plan_fixed": true, "max_load_fraction": 0.8,
//              "required_fuse": {"rating_a": 0.315, "type": "time-lag"}, "typed_in_only": true,
//              "supervisor_pin": {"scheme": "pbkdf2-hmac-sha256", "iterations": 100000,
//                                 "salt": "<32 hex>", "hash": "<64 hex>"}},     (optional)
//    "instructions": "..."}
//
// Parsing collects every invalid field, each error naming the field ("locks.max_load_fraction")
// and the rule. The limit checks are pure: the UI and the sweep refuse what they reject.
#pragma once

#include "FieldError.h"
#include "Planner.h"
#include "Setup.h"
#include "SupervisorPin.h"

#include <optional>
#include <string>
#include <string_view>

namespace sagline {

inline constexpr const char *labSheetFormatName = "sagline-lab-sheet";
inline constexpr int labSheetFormatVersion = 1;

// A typed-in reading may exceed the highest allowed load current by this fraction before it is
// refused: a rheostat set by hand lands within a few percent of the planned step (common practice).
inline constexpr double labSheetReadingAllowance = 0.05;

struct LabSheetLocks {
    bool planFixed = true;          // the student cannot edit the setup or the plan
    double maxLoadFraction = 1.0;   // highest load current allowed, as a fraction of rated secondary current
    FuseSpec requiredFuse;          // the primary fuse that must be fitted (rating and type)
    bool typedInOnly = true;        // no instrument link: readings are typed in by hand
    // When set, the supervisor confirms the set-up with this PIN as well as their name.
    std::optional<SupervisorPinLock> supervisorPin;
};

struct LabSheet {
    std::string title;              // e.g. "Lab 3: load test of a 50 VA toroid"; required
    Setup setup;                    // the setup the plan is made from (its bench.fuse is the required fuse)
    LabSheetLocks locks;
    std::string instructions;       // free text for the student, shown beside the entry
};

struct LabSheetParse {
    std::optional<LabSheet> sheet;  // set when errors is empty
    FieldErrors errors;             // every invalid field, each naming the field and the rule
};

LabSheetParse parseLabSheetJson(std::string_view text);
// Reads the file; an unreadable file is an error on the field named by the path.
LabSheetParse loadLabSheetFile(const std::string &path);
// Canonical JSON (all fields present, SI numbers); parseLabSheetJson(labSheetToJson(s)) == s.
std::string labSheetToJson(const LabSheet &sheet);
// A short fingerprint of the canonical JSON (16 hex digits, FNV-1a 64), so the review can tell
// whether two sessions came from the same sheet even if the titles match.
std::string labSheetFingerprint(const LabSheet &sheet);

// The highest load current the sheet allows, A: maxLoadFraction × rated secondary current.
double labSheetMaxCurrentA(const LabSheet &sheet);

struct LimitCheck {
    bool allowed = true;
    std::string rule;               // "lab-sheet-max-load", "lab-sheet-fuse"; empty when allowed
    std::string message;            // what was refused and why, with values and units
};

// Is a planned step within the sheet's load limit? (A step beyond it is refused, not skipped silently.)
LimitCheck checkStepAgainstSheet(const LabSheet &sheet, const PlanStep &step);
// Is a typed-in reading within the sheet's load limit (with labSheetReadingAllowance)?
LimitCheck checkReadingAgainstSheet(const LabSheet &sheet, double currentA);
// Does the fuse the student says is fitted match the required one?
LimitCheck checkFuseAgainstSheet(const LabSheet &sheet, const FuseSpec &fitted);

} // namespace sagline
