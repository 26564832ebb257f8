// The open session as the window sees it: the setup and its plan (core's planner), the
// session file (core's store, always committed), the sweep (the instruments layer's
// controller, with the virtual bench, meters or typed-in readings), and the fits (core's live
// LineFit for every point and FitSummary for residuals, outliers and curvature). The window
// only shows what this class reports; it never computes.
#pragma once

#include "AnalysisSettingsRecord.h"
#include "BackgroundFit.h"
#include "FieldError.h"
#include "FitSummary.h"
#include "LineFit.h"
#include "PlanGates.h"
#include "PrimarySideAnalysis.h"
#include "Planner.h"
#include "Reading.h"
#include "SessionProgress.h"
#include "SessionRecords.h"
#include "SessionSeal.h"
#include "SetupForm.h"

#include <QElapsedTimer>
#include <QTimer>
#include <QObject>
#include <QString>

#include <limits>
#include <memory>
#include <optional>
#include <vector>

namespace sagline {

class SessionStore;
class SweepRun;

enum class ReadingSource { VirtualBench, SerialPort, Lan, TypedIn };

// What a run started on an open session changes from a fresh sweep.
struct SweepOptionsOverride {
    bool resumed = false;
    std::vector<int> recordedSteps;
    int firstStep = 0;
};

struct SourceChoice {
    ReadingSource source = ReadingSource::VirtualBench;
    QString serialPort;  // "/dev/ttyUSB0": one meter in both roles, or the voltmeter (below)
    QString lanAddress;  // "192.168.1.20:5025": likewise
    // A separate ammeter, in either form ("/dev/ttyUSB1", "192.168.1.21:5025"); the port or
    // address above is then the voltmeter. Empty: that one meter reads both.
    QString ammeterAddress = {};
    // Serial settings for the ports above as "BAUD,FORMAT,FLOW" ("9600,8N1,none"); empty: the
    // link's defaults (9600 8N1, no flow control). An address that carries its own wins.
    QString serialFormat = {};
    // An optional programmable load (serial or LAN address); it then sets each step itself.
    QString loadAddress = {};
};

// What an open session holds besides its readings, read from its file when it is opened (and
// updated as this window adds to it): the one source every view of the session is drawn from.
struct SessionRecords {
    SessionInfo info;
    std::vector<TemperatureRecord> temperatures;
    std::vector<InstrumentRecord> instruments;
    std::vector<ExclusionRecord> exclusions;
    std::vector<SafetyStopRecord> safetyStops;
    std::vector<SweepEventRecord> sweepEvents;
    std::vector<SupersessionRecord> supersessions;
    SealReport seal;
    bool fromFile = false; // opened from a file, rather than created by this window
};

// The reply to a typed-in reading.
struct TypedOutcome {
    QString refusal;      // "field: rule" when refused; "" otherwise
    QString confirmField; // a value that needs a second look: its field ("reading.current_a")...
    QString question;     // ...and what was typed against what was expected
    bool taken() const { return refusal.isEmpty() && question.isEmpty(); }
};

// How to get past a plan's unsafe steps (core/PlanGates.h); both are recorded in the session.
struct LimitChoice {
    enum Kind { None, Truncate, Override } kind = None;
    QString reason; // for Override: why, from the person deciding it
};

// The session details as the file holds them (operator, serial, latest temperatures).
SessionDetails sessionDetailsFrom(const SessionRecords &records);

class SweepWorkspace : public QObject {
    Q_OBJECT
public:
    explicit SweepWorkspace(QObject *parent = nullptr);
    ~SweepWorkspace() override;

    // Reads the setup JSON and plans it; planChanged() follows either way.
    void setSetupJson(const QString &json);
    const std::optional<Setup> &setup() const { return m_setup; }
    const std::optional<Plan> &plan() const { return m_plan; }
    const FieldErrors &errors() const { return m_errors; }

    // The plan's steps the bench cannot take, and how the person chose to get past them.
    std::vector<UnsafeStep> unsafeSteps() const;
    void setLimitChoice(const LimitChoice &choice) { m_limitChoice = choice; }
    const LimitChoice &limitChoice() const { return m_limitChoice; }
    // "" when the plan can be accepted; else why not (no plan, or the unsafe steps named).
    QString acceptRefusal() const;

    // The person making changes (asked once per session; never the operator field), recorded
    // with the OS account on every record. Set before a change; "" until then.
    void setPerson(const QString &person);
    QString person() const { return m_person; }

    // The next session's file name inside the session folder ("" = "<serial>-<UTC time>.sagline");
    // a supervised session names it from the student, the unit and the time. Used once.
    void setNextSessionFileName(const QString &name) { m_nextFileName = name; }
    // Creates the session file and starts the sweep. Returns "" or what is wrong, naming the field.
    QString startSweep(const SessionDetails &details, const QString &sessionPath, const SourceChoice &source);
    // Continues an open session that stopped or was interrupted at its first step without a
    // reading, the load checked again first; recorded in the session. "" or why not.
    QString resumeSweep(const SourceChoice &source);
    // Typed-in readings: taken, refused (naming the field and the rule), or a question about a
    // value far from what the step expects; submit again with `confirmed` to record it flagged.
    TypedOutcome submitTyped(const QString &currentText, const QString &voltageText, bool confirmed = false);
    // Takes the step of reading `row` again: the next reading of that step supersedes it (kept,
    // marked superseded with the reason). A running sweep goes there at once; an ended one is
    // resumed for it. "" or why not.
    QString retake(int row, const QString &reason, const SourceChoice &source);
    // Lifts the sign-off in force (with the person and the reason recorded). "" or why not.
    QString reopen(const QString &reason);
    // Instruments: the operator has set the load for this step; the meters read it.
    void confirmLoadSet();
    void pauseOrResume();
    void stop();
    bool isRunning() const;
    bool isPaused() const { return m_paused; }
    bool isTypedIn() const { return m_source.source == ReadingSource::TypedIn; }
    // The virtual bench on a clock that jumps ahead instead of waiting (tests, screenshots).
    void setSimulatedTime(bool simulated) { m_simulatedTime = simulated; }
    SweepRun *run() const { return m_run.get(); }

    // Opens a saved session (review and continuation of notes/exclusions). "" or the reason.
    QString openSession(const QString &path);
    QString sessionPath() const;
    // Why the open session is shown read-only ("" when it can be written): an older file, one
    // another program is writing, a newer one.
    QString readOnlyReason() const { return m_readOnlyReason; }
    SessionStore *store() const { return m_store.get(); }

    // The open session's records, its progress (k of N steps; "in progress" while running) and
    // whether it may be changed (not read-only, not sealed by a sign-off).
    const SessionRecords &records() const { return m_records; }
    SessionProgress progress() const;
    bool isChangeable() const;
    QString exclusionReason(std::int64_t readingId) const; // the reason in force, "" if none
    QString supersededReason(std::int64_t readingId) const; // the retake's reason, "" if none

    QString exclude(int row, const QString &reason);
    QString restore(int row, const QString &reason);
    QString addNote(const QString &text);
    // A temperature measured later, by the person (core's recordPersonTemperature); "" when recorded.
    QString recordTemperature(TemperatureKind kind, double celsius, const QString &source);
    // Stores how results are judged in the open session (an analysis-settings note, see
    // core/AnalysisSettingsRecord.h) when it differs from the settings last stored or read.
    // "" when stored or nothing to do (no session, read-only, unchanged); else why not
    // (a typed value that does not parse is not stored, naming its field).
    QString recordAnalysisSettings(const VerdictSettings &settings);
    // The session's latest readable record (read on open, updated on each write).
    const std::optional<AnalysisSettings> &recordedAnalysisSettings() const { return m_recordedSettings; }
    QString operatorName() const { return m_details.operatorName; }

    const std::vector<Reading> &readings() const { return m_readings; }
    const LineFit &liveFit() const { return m_fit; }
    // The full fit (residuals, outliers, curvature): computed here after each change up to
    // 5 000 points; above that on a worker thread at most once a second, returning the last
    // one meanwhile (fitChanged() when a new one arrives). The live fit is always current.
    const FitSummary &summary();
    // The primary side of the readings so far (core's analysis on the fit of the readings referred
    // to the rated supply), recomputed when the readings changed; empty without primary values.
    struct PrimarySideView {
        SupplyAssessment supply;
        FitSummary fit;                           // on the referred readings (or raw, without V1)
        std::optional<PrimarySideResult> result;
    };
    const PrimarySideView &primarySide();
    double residualOf(double currentA, double voltageV) const;
    std::optional<double> nextCurrentA() const { return m_nextCurrentA; }

    // For the controller (instruments) and for tests: a reading that the store has committed.
    void acceptRecorded(const Reading &reading);

signals:
    void planChanged();
    void sessionChanged();                 // a session was created, opened, reopened or closed
    void sessionDiscarded();               // the empty file a failed start made is gone
    void readingRecorded(int row);
    void readingChanged(int row);          // excluded or restored
    void fitChanged();
    void stepChanged(int step, const QString &instruction);
    void safetyStopped(const QString &text);
    void notice(const QString &text);
    void runningChanged(bool running);
    void sweepStateChanged();              // the controller moved (settling, measuring, paused, ...)
    void instrumentStatus(const QString &status); // connecting, connected (identities), lost, failed

private:
    friend class SweepRun;
    void resetReadings();
    void discardUnusedSession(); // a session file a failed start left empty
    void fitUpdated(); // after every change to m_fit
    void backgroundSummaryArrived(std::uint64_t fitChange, const FitSummary &summary);
    void setNextStep(int stepIndex);
    QString loadRecords();           // m_records from m_store
    QString startRun(const SourceChoice &source, const SweepOptionsOverride &overrides);
    void recordGateChoice();         // the truncation or override, into a new session

    std::optional<Setup> m_setup;
    std::optional<Plan> m_plan;
    FieldErrors m_errors;
    SessionDetails m_details;
    SourceChoice m_source;
    std::unique_ptr<SessionStore> m_store;
    std::unique_ptr<SweepRun> m_run;
    std::vector<Reading> m_readings;
    LineFit m_fit;
    struct Line {
        double slope = 0.0;
        double intercept = std::numeric_limits<double>::quiet_NaN(); // NaN: no fit yet
    };
    Line m_line;                 // the live fit's line, cached for per-row residuals
    FitSummary m_summary;
    PrimarySideView m_primary;
    std::uint64_t m_primaryAt = std::numeric_limits<std::uint64_t>::max(); // m_fitChanges it was made at
    QElapsedTimer m_summaryClock;
    bool m_summaryStale = true;
    BackgroundFit *m_backgroundFit;
    QTimer m_summaryDue; // asks for the views again when a deferred summary may start
    std::uint64_t m_fitChanges = 0;       // counts fitUpdated(); tags background fits
    std::uint64_t m_readingsReplacedAt = 0; // m_fitChanges when the readings were last cleared
    bool m_paused = false;
    bool m_simulatedTime = false;
    std::optional<double> m_nextCurrentA;
    std::optional<AnalysisSettings> m_recordedSettings;
    SessionRecords m_records;
    std::optional<int> m_retakeRow; // the row a retake under way will supersede
    QString m_person;
    LimitChoice m_limitChoice;
    QString m_readOnlyReason;
    QString m_nextFileName;
};

} // namespace sagline
