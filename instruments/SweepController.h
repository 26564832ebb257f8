// Runs a planned load sweep step by step, headless, for the desktop app and the CLI alike.
//
// At each step it says what to set ("set the load to about 82 Ω; expect about 11.9 V and
// 145 mA"), sets a programmable load or waits for the operator to confirm, waits the dwell,
// then reads the secondary voltmeter and ammeter repeatedly until k consecutive pairs agree
// (stable) or the maximum time passes (unstable). A pair counts only if V and I were taken
// within the pairing window. Every reading is checked against the hard limits; a tripped limit
// records the reading and a safety stop, opens the load and ends the sweep. The accepted point
// is checked against the live fit's prediction interval (far outside: flagged), committed to
// the session store, and only then reported as recorded and added to the fit. A lost link
// pauses the sweep, keeps every recorded point, and resumes at the same step once all meters
// are back; nobody watched the load meanwhile, so the operator confirms it again for that step
// (a programmable load is set again) before anything is read; the same after an operator's
// pause, since the load may have been changed while the sweep was paused. Without meters
// (manual entry) each step waits for typed-in values instead.
// Time comes from an injected Clock so tests and simulated sweeps do not sleep.
#pragma once

#include "Clock.h"
#include "LiveFit.h"
#include "ManualEntry.h"
#include "MeterRole.h"
#include "Planner.h"
#include "PointSink.h"
#include "Reading.h"
#include "SafetyLimits.h"
#include "StabilityRule.h"

#include <QMetaType>
#include <QObject>
#include <QPointer>
#include <QString>

#include <map>
#include <memory>
#include <optional>
#include <set>
#include <vector>

namespace sagline {

class InstrumentRig;
struct MeterValue;

struct SweepOptions {
    std::int64_t dwellMs = 10000;       // wait after the load is set, before reading
    std::int64_t readIntervalMs = 500;  // between repeated readings of one step
    std::int64_t pairWindowMs = 1000;   // V and I of one pair must be taken within this
    StabilityRule stability;            // k readings agreeing within a tolerance, or a maximum time
    double predictionLevel = 0.99;      // flag a point outside the fit's prediction interval at this level
    SafetyLimits limits;                // usually safetyLimitsFor(plan)
    int firstStep = 0;                  // to continue an interrupted sweep
    bool resumed = false;               // continues a stopped or interrupted session: the first step's load is checked again
    std::vector<int> recordedSteps;     // steps the session already holds (a resumed session): not taken again
    bool simulated = false;             // readings come from the virtual bench (flagged so)
    // A pause nobody resolves (a load or meter that stopped answering, no valid reading, a
    // link counted as lost) ends the sweep after this long, switching a programmable load off:
    // outcome GaveUp. 0 = wait for ever (the window: its operator decides, and is shown how
    // long it has waited).
    std::int64_t giveUpAfterMs = 0;
    // A link that drops and comes back more often than this during one step counts as lost:
    // the sweep stays paused (and may give up) instead of resuming again and again.
    int maxLinkReturnsPerStep = 3;
};

// Options for a plan with the setup's dwell and the plan's limits.
SweepOptions sweepOptionsFor(const Setup &setup, const Plan &plan);

enum class SweepState {
    Idle,
    SettingLoad,       // programmable load being set
    WaitingForLoad,    // the operator must set the load and confirm (confirmLoadSet)
    Settling,          // dwell
    Measuring,         // reading the meters
    WaitingForEntry,   // manual entry: waiting for submitManualReading
    Paused,            // link lost, commit failed, or paused by the operator
    Finished,          // every step recorded
    Stopped,           // safety stop, or stopped by the operator
};
QString toString(SweepState state);

enum class SweepOutcome { Completed, SafetyStop, StoppedByOperator, Failed, GaveUp };
QString toString(SweepOutcome outcome);

class SweepController : public QObject {
    Q_OBJECT
public:
    // `rig` null = manual entry. None of the pointers is owned; all must outlive the controller.
    SweepController(const Plan &plan, const SweepOptions &options, InstrumentRig *rig, PointSink *sink,
                    LiveFit *fit, Clock *clock, QObject *parent = nullptr);
    ~SweepController() override;

    void start();            // from options.firstStep; the rig must be connected (isReady)
    void confirmLoadSet();   // the operator has set the load for the current step
    // Manual entry: validated against the roles ("13,8 V", "145 mA"); returns the refusal, or
    // an empty string when the reading was taken (it is then checked, committed and reported).
    // `confirmed`: the person confirmed a value outside what the step expects (flagged so).
    QString submitManualReading(const QString &voltageText, const QString &currentText, bool confirmed = false);
    // Takes `step` again: the reading it records supersedes reading `supersededId` (kept in
    // the session, marked superseded with `reason`), then the sweep goes on at the first step
    // still without a reading. Before start() it makes the sweep begin with that step.
    // Returns the refusal, or "" when the step starts.
    QString retake(int step, std::int64_t supersededId, const QString &reason);
    bool isRetaking() const { return m_retake.has_value(); }
    void pause();            // by the operator; the current step restarts on resume()
    void resume();           // after pause(), or to retry a failed commit
    void stop();             // by the operator: opens a programmable load, records the event
    // Ends a paused sweep that cannot go on (a headless run whose disk is full): the reason is
    // recorded where it still can be, a programmable load is switched off; outcome Failed.
    void abandon(const QString &reason);

    SweepState state() const { return m_state; }
    int currentStep() const { return m_step; }       // plan step index
    int stepCount() const;
    bool isManual() const { return m_rig == nullptr; }
    bool hasProgrammableLoad() const;
    const Plan &plan() const { return m_plan; }
    const SweepOptions &options() const { return m_options; }
    QString instruction(int step) const;             // the text stepStarted carries
    // The text stepStarted carries when a step starts again after a lost link came back.
    QString restoredInstruction(int step) const;
    // The text stepStarted carries when a step starts again after an operator's pause.
    QString resumedInstruction(int step) const;
    int recordedCount() const { return m_recorded; }
    QString pauseReason() const { return m_pauseReason; }
    // How long the sweep has been paused, on its clock; -1 when it is not paused.
    std::int64_t pausedForMs() const;
    // While the step settles (the dwell): how long until the meters are read, on the sweep's
    // clock; -1 in any other state.
    std::int64_t settlingRemainingMs() const;
    bool isLinkDown() const { return m_linkDown; }          // paused because a meter's link is lost
    bool isOperatorPaused() const { return m_operatorPaused; }

signals:
    void stateChanged(sagline::SweepState state);
    void stepStarted(int step, const QString &instruction);
    void pointRecorded(const sagline::Reading &reading, const sagline::LiveFitSnapshot &fit);
    void safetyStop(const sagline::SafetyTrip &trip, const sagline::Reading &reading);
    void linkLost(const QString &message);
    void linkRestored(const QString &message);
    void notice(const QString &message);             // instrument errors, unreadable replies, flagged points
    void paused(const QString &reason);
    void finished(sagline::SweepOutcome outcome);
    // After a stop or the end of the sweep: whether the programmable load confirmed that it
    // is switched off. Only with a programmable load.
    void loadSwitchedOff(bool ok, const QString &error);

private:
    struct PendingRead;
    void setState(SweepState state);
    void beginStep();
    void loadReady();
    void startMeasuring();
    void readPair();
    void handleValues(const std::map<MeterRole, std::pair<MeterValue, std::int64_t>> &values);
    void handlePair(const MeterValue &voltage, std::int64_t voltageMs, const MeterValue &current,
                    std::int64_t currentMs, const QString &raw);
    void scheduleRead();
    void acceptPoint(Reading reading);
    bool commitAndReport(Reading reading);
    void markLoadInDoubtUntilResumed();
    bool retryHeldCommit();
    void tripSafety(const SafetyTrip &trip, Reading reading);
    void nextStep();
    void finish(SweepOutcome outcome);
    void cancelTimers();
    void openLoad();
    void handleRigLost(const QString &message);
    void handleRigRestored(const QString &message);
    void giveUp();
    void endPaused(const QString &reason, SweepOutcome outcome);
    void event(const QString &text);
    const PlanStep *planStep(int step) const; // by plan step index; null if the plan has none
    Reading makeReading(double currentA, double voltageV) const;
    static QString primaryRawLabel(MeterRole role);
    void setPrimaryValue(MeterRole role, double value);
    double expectedVoltage() const;

    Plan m_plan;
    SweepOptions m_options;
    InstrumentRig *m_rig;
    PointSink *m_sink;
    LiveFit *m_fit;
    Clock *m_clock;
    StabilityTracker m_tracker;
    SweepState m_state = SweepState::Idle;
    int m_stepIndex = 0;      // index into m_plan.steps
    int m_step = 0;           // m_plan.steps[m_stepIndex].index
    int m_recorded = 0;
    int m_timer = 0;          // pending clock callback, 0 if none
    int m_readSerial = 0;     // bumps to drop replies of an abandoned read
    bool m_loadConfirmed = false;
    bool m_loadInDoubt = false;   // a link was lost during this step: the load is checked again
    bool m_confirmedBeforeLoss = false; // the operator had confirmed this step's load before the loss
    bool m_pauseInDoubt = false;  // paused by the operator during this step: the load is checked again on resume
    bool m_confirmedBeforePause = false; // the operator had confirmed this step's load before the pause
    bool m_linkDown = false;
    std::int64_t m_settleEndsMs = -1; // clock time the dwell ends, while Settling
    bool m_operatorPaused = false;
    std::optional<Reading> m_uncommitted; // a reading whose commit failed; retried on resume()
    std::optional<std::pair<double, double>> m_lastPair; // (V, I) of the last good read
    std::shared_ptr<void> m_readChain;                   // keeps the current read's continuation alive
    QString m_lastRaw;
    PrimaryReading m_pendingPrimary; // the primary meters' values with the latest secondary pair
    PrimaryReading m_lastPrimary;    // ... with m_lastPair
    QString m_pauseReason;
    struct Retake {
        std::int64_t supersededId = 0;
        QString reason;
    };
    std::optional<Retake> m_retake;   // the step being taken again, until its reading is committed
    std::set<int> m_recordedSteps;    // plan steps with a reading: the sweep goes to the first without
    int m_firstUnrecorded = 0;        // plan position below which every step has a reading
    std::int64_t m_pausedAtMs = -1;   // clock time the current pause began, -1 when not paused
    int m_giveUpTimer = 0;            // pending give-up callback, 0 if none
    int m_linkReturnsThisStep = 0;    // restored links since the step's last recorded point
};

} // namespace sagline

Q_DECLARE_METATYPE(sagline::Reading)
Q_DECLARE_METATYPE(sagline::LiveFitSnapshot)
Q_DECLARE_METATYPE(sagline::SafetyTrip)
