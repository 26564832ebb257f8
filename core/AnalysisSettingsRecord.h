// How the bench engineer chose to judge a session (the window's verdict settings), kept in the
// session file so the CLI, the comparison and the review judge it the same way. Like the
// supervision records (core/SupervisedRecords.h) it is a note by a fixed machine author whose
// text is one JSON object, so no schema change is needed and old readers just see a note.
#pragma once

#include "ConformityDecision.h"
#include "FieldError.h"
#include "SessionRecords.h"
#include "TemperatureCorrection.h"

#include <optional>
#include <string>
#include <vector>

namespace sagline {

inline constexpr const char *analysisSettingsNoteAuthor = "sagline/analysis-settings";
inline constexpr int analysisSettingsVersion = 1;

struct AnalysisSettings {
    std::optional<double> regulationLimitPercent;          // a stated limit, %; absent: see below
    bool regulationLimitNameplate = false;                 // the nameplate's own regulation chosen as the limit
    DecisionRule rule = DecisionRule::NonBinary;            // ILAC-G8:09/2019 §4.2
    std::optional<double> referenceTemperatureC;           // absent: the reader's default, °C
    std::optional<TemperatureConstant> temperatureConstant; // absent: from the winding material
    bool operator==(const AnalysisSettings &) const = default;
};

// {"analysis_settings": 1, "regulation_limit_percent": 5 | "nameplate" | null (= the setup's
//  specification: earlier records meant the nameplate by null, which is no longer a default), "rule":
//  "simple" | "guarded" | "non-binary",
//  "reference_temperature_c": 75 | null, "temperature_constant": "copper-iec" | null}
std::string analysisSettingsNoteText(const AnalysisSettings &settings);

struct AnalysisSettingsParse {
    std::optional<AnalysisSettings> settings; // set when errors is empty
    FieldErrors errors;                       // each names the key and the rule
};
AnalysisSettingsParse parseAnalysisSettings(const std::string &text);

// The latest readable record among a session's notes (notes in the store's order, oldest
// first). A record that does not parse is skipped and said in `notices`; never throws.
struct RecordedAnalysisSettings {
    std::optional<AnalysisSettings> settings;
    std::string recordedUtc;             // time of the note used
    std::vector<std::string> notices;    // "analysis settings note 12 ignored: rule: ..."
};
RecordedAnalysisSettings latestAnalysisSettings(const std::vector<NoteRecord> &notes);

// Where a setting a reader used came from.
enum class SettingSource { Default, SessionRecord, Option };
std::string toString(SettingSource source); // "default", "session record", "option"

} // namespace sagline
